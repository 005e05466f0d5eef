/**
 * Hatching as plain line segments clipped to a polygon, so every renderer (SVG, PDF, the page)
 * draws the same lines without pattern support of its own. Lines are laid on a grid anchored at
 * the origin, so a legend swatch and the shape it stands for share the same look.
 */
import type { PathCommand } from '../report/sheet/display-list.js';

/**
 * Segments of parallel lines `spacing` apart at `angle` degrees (0 = horizontal, counter-clockwise
 * on the page) inside the polygon `ring` (even-odd rule: holes and self-overlaps stay clear).
 */
export function hatchLines(ring: readonly (readonly [number, number])[], spacing: number, angle = 45): PathCommand[] {
  if (ring.length < 3 || !(spacing > 0)) return [];
  const a = (angle * Math.PI) / 180;
  const cos = Math.cos(a);
  const sin = Math.sin(a);
  // Turn the polygon so the hatch lines run along u; v is constant on each line.
  const turned = ring.map(([x, y]) => [x * cos - y * sin, x * sin + y * cos] as const);
  let lo = Infinity;
  let hi = -Infinity;
  for (const [, v] of turned) {
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const d: PathCommand[] = [];
  for (let v = Math.ceil(lo / spacing) * spacing; v <= hi; v += spacing) {
    const us: number[] = [];
    for (let i = 0; i < turned.length; i++) {
      const [u1, v1] = turned[i];
      const [u2, v2] = turned[(i + 1) % turned.length];
      // Half-open test: a line through a vertex counts it once.
      if (v1 <= v !== v2 <= v) us.push(u1 + ((v - v1) * (u2 - u1)) / (v2 - v1));
    }
    us.sort((p, q) => p - q);
    for (let k = 0; k + 1 < us.length; k += 2) {
      if (us[k + 1] - us[k] < 1e-6) continue;
      // Back to page coordinates (the inverse turn).
      d.push(['M', us[k] * cos + v * sin, -us[k] * sin + v * cos], ['L', us[k + 1] * cos + v * sin, -us[k + 1] * sin + v * cos]);
    }
  }
  return d;
}
