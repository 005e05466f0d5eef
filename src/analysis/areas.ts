/**
 * What the landings mean for each place the user marked (spectators, parking, roads, ...).
 *
 * For each area: how many samples land inside, their weighted probability, the one-sided 95 %
 * Clopper–Pearson upper bound (meaningful with 0 hits too), whether the area touches the keep-out
 * zone. Expected casualties and individual risk come from the risk model (src/risk), which
 * analyze() adds to these rows when the landings carry impact energies.
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
import { chanceOfAny, hasParts, perFlightWeight } from './parts.js';

export interface AreaResult {
  name: string;
  kind: Area['kind'];
  /** Landed samples inside the area. */
  hits: number;
  /** Weighted probability per flight of landing inside (with pieces: that at least one piece lands inside). */
  probability: number;
  /** Expected landings inside per flight (pieces each counted); present when the landings have parts. */
  expectedLandings?: number;
  /** One-sided 95 % upper bound on `probability` (Clopper–Pearson on the effective sample size). */
  upper95: number;
  /** The area overlaps the keep-out zone. */
  intersectsKeepOut: boolean;
  /** Area of the polygon, m². */
  area_m2: number;
  people?: number;
  /** People per m² used by the risk model (head count over the polygon's area, or `density`). */
  peoplePerM2?: number;
  /** Share of the people under cover. */
  sheltered?: number;
  /** Expected casualties per flight, from the risk model (only with people or a density). */
  expectedCasualties?: number;
  /** One-sided 95 % upper bound on `expectedCasualties` (see src/risk/areas.ts for the method). */
  casualtiesUpper95?: number;
  /** Largest individual risk per flight in the area, from the risk model. */
  maxIndividualRisk?: number;
  note?: string;
}

export interface AreaInput {
  areas: Area[];
  set: LandingSet;
  frame: LocalFrame;
  keepOut: KeepOutFeature;
  /** Kish effective sample size of all landings. */
  effectiveN: number;
}

export function assessAreas(input: AreaInput): AreaResult[] {
  const { set, frame } = input;
  const total = perFlightWeight(set);
  const parts = hasParts(set);
  return input.areas.map((area) => {
    const metres = polygonsToEastNorth(frame, area.geometry);
    const index = createPolygonIndex(metres);
    let hits = 0;
    let weight = 0;
    const inside = new Uint8Array(set.east.length);
    for (let i = 0; i < set.east.length; i++) {
      if (!index.contains(set.east[i], set.north[i])) continue;
      hits++;
      inside[i] = 1;
      weight += set.weight[i];
    }
    const probability = parts ? chanceOfAny(set, (i) => inside[i] === 1, total) : weight / total;
    const areaM2 = polygonsArea(metres);
    const result: AreaResult = {
      name: area.name,
      kind: area.kind,
      hits,
      probability,
      upper95: weightedUpperBound(probability, input.effectiveN),
      intersectsKeepOut: booleanIntersects(area.geometry, input.keepOut),
      area_m2: areaM2,
    };
    if (parts) result.expectedLandings = weight / total;
    if (area.people !== undefined) result.people = area.people;
    return result;
  });
}
