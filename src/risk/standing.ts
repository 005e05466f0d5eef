/**
 * Where people may stand: for each compass octant the distance from the pad beyond which the
 * individual risk stays under the criterion (the farthest reach, in that octant, of the region at
 * or over it; 0 where no point of the octant is over it), and a ring through those distances for
 * the map.
 *
 * @example
 *   standingDistances(surface, 1e-6)  // { N: 120, NE: 240, ... }
 */
import { traceRegion } from '../analysis/contours.js';
import { OCTANT_NAMES, octantReach } from '../analysis/octants.js';
import type { Ring } from '../analysis/rings.js';
import type { OctantDistances } from '../analysis/types.js';
import type { RiskSurface } from './individual.js';

export type StandingDistances = Record<keyof OctantDistances, number>;

export function standingDistances(surface: RiskSurface | null, criterion: number): StandingDistances {
  const reach = surface === null ? null : octantReach(traceRegion(surface.grid, criterion));
  const out = {} as StandingDistances;
  for (const name of OCTANT_NAMES) out[name] = reach?.[name] ?? 0;
  return out;
}

/**
 * A closed ring, east/north metres: an arc at each octant's distance across its 45°, joined by
 * radial steps where neighbouring octants differ. Null when every distance is 0.
 */
export function standingRing(distances: StandingDistances, pointsPerOctant = 8): Ring | null {
  if (OCTANT_NAMES.every((name) => distances[name] === 0)) return null;
  const ring: Ring = [];
  OCTANT_NAMES.forEach((name, k) => {
    const r = distances[name];
    for (let p = 0; p <= pointsPerOctant; p++) {
      const azimuth = ((-22.5 + 45 * k + (45 * p) / pointsPerOctant) * Math.PI) / 180;
      ring.push([r * Math.sin(azimuth), r * Math.cos(azimuth)]);
    }
  });
  ring.push([...ring[0]] as [number, number]);
  // Clockwise as drawn (azimuth grows clockwise); RFC 7946 wants exteriors counter-clockwise.
  return ring.reverse();
}
