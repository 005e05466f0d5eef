/**
 * The one place the event reads harm to people from a flown item. Everything the event sums
 * (expected casualties per area and in total, individual risk by place) comes from this small
 * interface, so the casualty model behind it can change without touching the event code.
 *
 * It reads the risk model's figures (src/risk: casualty when the impact energy reaches the
 * threshold or by the table, casualty area from each impact's angle, people by head count or
 * density less the sheltered share, all modes counted). Per landing, the exposure is the
 * landing's probability per flight × casualty area × casualty chance, whose density is the
 * individual risk per flight.
 */
import type { AnalysisResult } from '../analysis/index.js';
import type { LandingSet } from '../analysis/types.js';

export interface ItemHarm {
  /** Expected casualties per flight in each named area that has people, in site order. */
  areas: { name: string; expectedCasualties: number }[];
  /** Sum over the areas, per flight. */
  total: number;
  /**
   * Per landing: weight × area around the impact within which a person is harmed, m². Their
   * kernel density is the individual risk per flight (chance per flight that a person standing
   * at a place is harmed).
   */
  exposure: Float64Array;
  /** One line saying which model gave the figures, for the sheet and event.json. */
  model: string;
}

/** Reads an item's harm figures from its analysed landings (zero where the risk model could not run). */
export function itemHarm(set: LandingSet, analysis: AnalysisResult): ItemHarm {
  const risk = analysis.risk;
  if (risk === undefined) {
    return {
      areas: [],
      total: 0,
      exposure: new Float64Array(set.east.length),
      model: 'not assessed: the landings carry no impact energy, so the risk model could not run',
    };
  }
  const areas = analysis.areas
    .filter((a) => a.expectedCasualties !== undefined)
    .map((a) => ({ name: a.name, expectedCasualties: a.expectedCasualties! }));
  const st = risk.settings;
  return {
    areas,
    total: areas.reduce((sum, a) => sum + a.expectedCasualties, 0),
    exposure: Float64Array.from(risk.harm.weight),
    model: `risk model: casualty at ${st.casualtyProbability ? 'the chance by impact energy from the table' : `${st.casualtyEnergy} J or more`}, casualty area from each impact's angle, people spread evenly over each area`,
  };
}
