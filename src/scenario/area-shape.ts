import { kinks } from '@turf/kinks';

/**
 * A polygon of the site (an area, the boundary) must enclose some ground and must not cross
 * itself: a zero-size area can never be hit, and a self-crossing ring has no agreed inside, so
 * the share of landings in it would depend on the algorithm. Both are input errors.
 * Self-crossings are found by @turf/kinks (a sweep-line segment intersection).
 */

/** Twice the signed area of a ring in degrees² (shoelace formula), enough to tell zero from not. */
function ringArea2(ring: number[][]): number {
  let sum = 0;
  for (let i = 0; i + 1 < ring.length; i++) sum += ring[i]![0]! * ring[i + 1]![1]! - ring[i + 1]![0]! * ring[i]![1]!;
  return sum;
}

/** The first problem of the polygon's shape, with the ring it is in; undefined when it is fine. */
export function polygonShapeProblem(rings: number[][][]): { ring: number; message: string } | undefined {
  for (let r = 0; r < rings.length; r++) {
    const ring = rings[r]!;
    const crossing = kinks({ type: 'Polygon', coordinates: [ring] }).features[0];
    if (crossing !== undefined) {
      const [lon, lat] = crossing.geometry.coordinates;
      return { ring: r, message: `the ring crosses itself near [${Number(lon!.toFixed(6))}, ${Number(lat!.toFixed(6))}]; redraw it so its edges meet only at corners` };
    }
    // About 1 m² at the equator is 1e-10 degree²: anything smaller is no area at all.
    if (!(Math.abs(ringArea2(ring)) / 2 > 1e-12)) {
      return { ring: r, message: 'the ring encloses no area (its points lie on one line or on one spot); draw the area with at least three corners apart' };
    }
  }
  return undefined;
}
