/**
 * Farthest reach of a region from the pad in each compass octant (N covers azimuths −22.5°..22.5°,
 * NE 22.5°..67.5°, and so on clockwise).
 *
 * Each edge is split where it crosses an octant border ray; distance from the pad is convex along
 * a straight piece, so the piece's farthest point is one of its ends. The result is exact for the
 * polygon, including an octant that the outline only crosses without a vertex in it.
 *
 * @example
 *   octantReach([[[[0, 10], [-10, -10], [10, -10], [0, 10]]]]).N  // 10
 */
import type { Ring } from './rings.js';
import type { OctantDistances } from './types.js';

export const OCTANT_NAMES = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/** Octant index 0..7 of a direction given as east, north. */
function octantOf(east: number, north: number): number {
  const azimuth = (Math.atan2(east, north) * 180) / Math.PI; // −180..180, clockwise from north
  return Math.floor((((azimuth + 22.5) % 360) + 360) % 360 / 45) % 8;
}

/** Parameters t in (0, 1) where the segment a→b crosses one of the eight border rays. */
function borderCrossings(ax: number, ay: number, bx: number, by: number): number[] {
  const ts: number[] = [];
  for (let k = 0; k < 8; k++) {
    const azimuth = ((22.5 + 45 * k) * Math.PI) / 180;
    const ux = Math.sin(azimuth);
    const uy = Math.cos(azimuth);
    // Signed distance of the segment's points to the ray's line; the ray is the half with u·p > 0.
    const da = ux * ay - uy * ax;
    const db = ux * by - uy * bx;
    if (da === db || (da > 0) === (db > 0)) continue;
    const t = da / (da - db);
    if (!(t > 0 && t < 1)) continue;
    const px = ax + t * (bx - ax);
    const py = ay + t * (by - ay);
    if (px * ux + py * uy > 0) ts.push(t);
  }
  return ts.sort((a, b) => a - b);
}

export function octantReach(polygons: Ring[][]): OctantDistances {
  const best: (number | null)[] = new Array(8).fill(null);
  const offer = (octant: number, distance: number) => {
    if (best[octant] === null || distance > (best[octant] as number)) best[octant] = distance;
  };
  for (const rings of polygons) {
    for (const ring of rings) {
      for (let k = 0; k + 1 < ring.length; k++) {
        const [ax, ay] = ring[k];
        const [bx, by] = ring[k + 1];
        const cuts = [0, ...borderCrossings(ax, ay, bx, by), 1];
        for (let c = 0; c + 1 < cuts.length; c++) {
          const t0 = cuts[c];
          const t1 = cuts[c + 1];
          const mid = (t0 + t1) / 2;
          const octant = octantOf(ax + mid * (bx - ax), ay + mid * (by - ay));
          offer(octant, Math.hypot(ax + t0 * (bx - ax), ay + t0 * (by - ay)));
          offer(octant, Math.hypot(ax + t1 * (bx - ax), ay + t1 * (by - ay)));
        }
      }
    }
  }
  const out = {} as OctantDistances;
  OCTANT_NAMES.forEach((name, k) => {
    out[name] = best[k];
  });
  return out;
}
