/**
 * The one place the event reads harm to people from a flown item. Everything the event sums
 * (expected casualties per area and in total, individual risk by place) comes from this small
 * interface, so the casualty model behind it can change without touching the event code.
 *
 * Today it reads the run's indicative area figures (src/analysis/areas.ts: modes that come down
 * without a parachute, people spread evenly over each area, an assumed lethal area per impact),
 * and gives each such landing the same lethal area as its "exposure" for individual risk. That
 * keeps the event's per-area sums equal to the sums of the item sheets. The casualty model of
 * the risk issue (energy threshold, casualty area by impact angle, density, shelter) plugs in
 * here when it is available.
 */
import type { AnalysisResult } from '../analysis/index.js';
import { DEFAULT_LETHAL_AREA_M2 } from '../analysis/areas.js';
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

/** Reads an item's harm figures from its analysed landings. */
export function itemHarm(set: LandingSet, analysis: AnalysisResult): ItemHarm {
  const areas = analysis.areas
    .filter((a) => a.expectedCasualties !== undefined)
    .map((a) => ({ name: a.name, expectedCasualties: a.expectedCasualties! }));
  const exposure = new Float64Array(set.east.length);
  let total = 0;
  for (let i = 0; i < set.weight.length; i++) total += set.weight[i];
  for (let i = 0; i < set.east.length; i++) {
    const underCanopy = set.modeCarriesParachute?.[set.mode[i]] ?? false;
    exposure[i] = underCanopy ? 0 : (set.weight[i] / total) * DEFAULT_LETHAL_AREA_M2;
  }
  return {
    areas,
    total: areas.reduce((s, a) => s + a.expectedCasualties, 0),
    exposure,
    model: `indicative: impacts without a parachute, lethal area ${DEFAULT_LETHAL_AREA_M2} m² per impact, people spread evenly over each area`,
  };
}
