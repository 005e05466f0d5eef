/**
 * Convex hull of a subset of points held in typed arrays.
 *
 * Andrew's monotone chain (A. M. Andrew, Inf. Process. Lett. 9, 1979) after the Akl–Toussaint
 * filter (Inf. Process. Lett. 7, 1978): points strictly inside the octagon of the eight extreme
 * points cannot be on the hull, which for a landing cloud removes nearly all of them before the
 * sort.
 *
 * @example
 *   convexHull(east, north, (i) => mode[i] === 0)  // counter-clockwise, closed: [[e, n], ...]
 */
import type { Ring } from './rings.js';

function cross(ox: number, oy: number, ax: number, ay: number, bx: number, by: number): number {
  return (ax - ox) * (by - oy) - (ay - oy) * (bx - ox);
}

/**
 * Hull of the points i with `keep(i)` true, counter-clockwise and closed. Fewer than three distinct
 * non-collinear points give the distinct points found (1 or 2, or the two ends of the line).
 */
export function convexHull(xs: Float64Array, ys: Float64Array, keep: (i: number) => boolean = () => true): Ring {
  // Eight extremes: min/max of x, y, x + y, x − y.
  const extreme = new Int32Array(8).fill(-1);
  const key = (i: number, d: number) => {
    const x = xs[i];
    const y = ys[i];
    switch (d) {
      case 0: return -x;
      case 1: return -x - y;
      case 2: return -y;
      case 3: return x - y;
      case 4: return x;
      case 5: return x + y;
      case 6: return y;
      default: return y - x;
    }
  };
  let any = false;
  for (let i = 0; i < xs.length; i++) {
    if (!keep(i)) continue;
    any = true;
    for (let d = 0; d < 8; d++) if (extreme[d] < 0 || key(i, d) > key(extreme[d], d)) extreme[d] = i;
  }
  if (!any) return [];
  // Octagon through the extremes in counter-clockwise order (directions are listed that way).
  const octagon: number[] = [];
  for (const i of extreme) if (octagon[octagon.length - 1] !== i && octagon[0] !== i) octagon.push(i);
  const candidates: number[] = [];
  for (let i = 0; i < xs.length; i++) {
    if (!keep(i)) continue;
    let strictlyInside = octagon.length >= 3;
    for (let k = 0; k < octagon.length && strictlyInside; k++) {
      const a = octagon[k];
      const b = octagon[(k + 1) % octagon.length];
      if (cross(xs[a], ys[a], xs[b], ys[b], xs[i], ys[i]) <= 0) strictlyInside = false;
    }
    if (!strictlyInside) candidates.push(i);
  }
  candidates.sort((a, b) => xs[a] - xs[b] || ys[a] - ys[b]);
  const lower: number[] = [];
  for (const i of candidates) {
    while (lower.length >= 2) {
      const a = lower[lower.length - 2];
      const b = lower[lower.length - 1];
      if (cross(xs[a], ys[a], xs[b], ys[b], xs[i], ys[i]) > 0) break;
      lower.pop();
    }
    lower.push(i);
  }
  const upper: number[] = [];
  for (let k = candidates.length - 1; k >= 0; k--) {
    const i = candidates[k];
    while (upper.length >= 2) {
      const a = upper[upper.length - 2];
      const b = upper[upper.length - 1];
      if (cross(xs[a], ys[a], xs[b], ys[b], xs[i], ys[i]) > 0) break;
      upper.pop();
    }
    upper.push(i);
  }
  const chain = lower.slice(0, -1).concat(upper.slice(0, -1));
  const ring: Ring = [];
  for (const i of chain) {
    const last = ring[ring.length - 1];
    if (!last || last[0] !== xs[i] || last[1] !== ys[i]) ring.push([xs[i], ys[i]]);
  }
  if (ring.length === 0) ring.push([xs[candidates[0]], ys[candidates[0]]]);
  if (ring.length >= 3) ring.push([...ring[0]]);
  return ring;
}
