/**
 * What each landing means for a person it could strike: casualty area, casualty chance and the
 * risk weight w_i A_c,i P_i (probability per flight the landing stands for × casualty area ×
 * casualty chance), the weight of the individual-risk density.
 *
 * @example
 *   const harm = impactHarm(set, riskSettings(scenario));
 *   harm.weight[i]  // m² per flight
 */
import type { LandingSet } from '../analysis/types.js';
import { casualtyArea } from './casualty-area.js';
import { casualtyChance } from './harm.js';
import type { RiskSettings } from './settings.js';
import { perFlightWeight } from '../analysis/parts.js';

export interface ImpactHarm {
  chance: Float64Array;
  /** A_c × P per landing, m² (what one landing inside an area exposes). */
  exposure: Float64Array;
  /** Probability per flight × A_c × P, m² (a sample's weight over the per-flight weight, pieces each counted). */
  weight: Float64Array;
}

/**
 * Casualty area of landing i, m²: from its impact angle (none recorded: vertical, the smallest,
 * as scenario-format.md says) and the radius of what landed (a fragment's own, else the object's).
 */
export function landingCasualtyArea(set: LandingSet, settings: RiskSettings, i: number): number {
  const angle = set.impactAngle && Number.isFinite(set.impactAngle[i]) ? set.impactAngle[i] : 90;
  const partRadius = set.part && set.partRadius ? set.partRadius[set.part[i]] : NaN;
  const radius = Number.isFinite(partRadius) ? partRadius : settings.objectRadius;
  return casualtyArea(settings.personRadius, radius, settings.personHeight, angle);
}

export function impactHarm(set: LandingSet, settings: RiskSettings): ImpactHarm {
  const n = set.east.length;
  const energy = set.impactEnergy;
  if (energy === undefined) throw new Error('the risk model needs the impact energy of every landing');
  // Per flight: with pieces a sample's rows share its weight (analysis/parts.ts).
  const total = perFlightWeight(set);
  // No column of casualty areas: at millions of landings each column is tens of megabytes.
  const out: ImpactHarm = {
    chance: new Float64Array(n),
    exposure: new Float64Array(n),
    weight: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    out.chance[i] = casualtyChance(energy[i], settings);
    out.exposure[i] = landingCasualtyArea(set, settings, i) * out.chance[i];
    out.weight[i] = (set.weight[i] / total) * out.exposure[i];
  }
  return out;
}
