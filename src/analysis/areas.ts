/**
 * What the landings mean for each place the user marked (spectators, parking, roads, ...).
 *
 * For each area: how many samples land inside, their weighted probability, the one-sided 95 %
 * Clopper–Pearson upper bound (meaningful with 0 hits too), whether the area touches the keep-out
 * zone and, where a head count is given, an indicative expected-casualty figure for the modes that
 * come down without a parachute:
 *   E = P(landing in the area, no-parachute modes) × people × (lethal area / area of the polygon),
 * i.e. people spread evenly over the area and a casualty when one stands within the lethal area of
 * the impact. That is a rough screening number, not a compliance figure.
 *
 * @example
 *   const rows = assessAreas({ areas: site.areas, set, frame, keepOut, effectiveN });
 *   rows[0]  // { name, kind, hits, probability, upper95, intersectsKeepOut, ... }
 */
import { booleanIntersects } from '@turf/turf';
import type { Area } from '../scenario/types.js';
import { weightedUpperBound } from './clopperPearson.js';
import type { LocalFrame } from './geodesy.js';
import { createPolygonIndex } from './pointInPolygon.js';
import { polygonsArea, polygonsToEastNorth } from './projectGeometry.js';
import type { KeepOutFeature, LandingSet } from './types.js';

/**
 * Assumed lethal area of one impact, m²: about a person's footprint widened by a small falling
 * object. An assumption for an indicative figure (no source); callers can set their own.
 */
export const DEFAULT_LETHAL_AREA_M2 = 1;

export interface AreaResult {
  name: string;
  kind: Area['kind'];
  /** Landed samples inside the area. */
  hits: number;
  /** Weighted probability per flight of landing inside. */
  probability: number;
  /** One-sided 95 % upper bound on `probability` (Clopper–Pearson on the effective sample size). */
  upper95: number;
  /** The area overlaps the keep-out zone. */
  intersectsKeepOut: boolean;
  /** Area of the polygon, m². */
  area_m2: number;
  people?: number;
  /** Probability per flight of a landing inside by a mode without a parachute. */
  noParachuteProbability: number;
  /** Indicative expected casualties per flight (only when `people` is given). */
  expectedCasualties?: number;
  note?: string;
}

export interface AreaInput {
  areas: Area[];
  set: LandingSet;
  frame: LocalFrame;
  keepOut: KeepOutFeature;
  /** Kish effective sample size of all landings. */
  effectiveN: number;
  lethalArea_m2?: number;
}

export function assessAreas(input: AreaInput): AreaResult[] {
  const { set, frame } = input;
  const lethalArea = input.lethalArea_m2 ?? DEFAULT_LETHAL_AREA_M2;
  let total = 0;
  for (let i = 0; i < set.weight.length; i++) total += set.weight[i];
  const noChute = set.modeNames.map((_, m) => !(set.modeCarriesParachute?.[m] ?? false));
  return input.areas.map((area) => {
    const metres = polygonsToEastNorth(frame, area.geometry);
    const index = createPolygonIndex(metres);
    let hits = 0;
    let weight = 0;
    let noChuteWeight = 0;
    for (let i = 0; i < set.east.length; i++) {
      if (!index.contains(set.east[i], set.north[i])) continue;
      hits++;
      weight += set.weight[i];
      if (noChute[set.mode[i]] ?? true) noChuteWeight += set.weight[i];
    }
    const probability = weight / total;
    const areaM2 = polygonsArea(metres);
    const result: AreaResult = {
      name: area.name,
      kind: area.kind,
      hits,
      probability,
      upper95: weightedUpperBound(probability, input.effectiveN),
      intersectsKeepOut: booleanIntersects(area.geometry, input.keepOut),
      area_m2: areaM2,
      noParachuteProbability: noChuteWeight / total,
    };
    if (area.people !== undefined) {
      result.people = area.people;
      const exposedShare = Math.min(1, lethalArea / areaM2);
      result.expectedCasualties = result.noParachuteProbability * area.people * exposedShare;
      result.note =
        `Indicative only, not a compliance figure: modes without a parachute, ${area.people} people spread ` +
        `evenly over ${Math.round(areaM2)} m², assumed lethal area ${lethalArea} m² per impact.`;
    }
    return result;
  });
}
