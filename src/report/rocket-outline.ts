import type { RocketShape } from '../scenario/types.js';

/**
 * The rocket's side view, to scale, as plain geometry in metres: x from the nose tip toward the
 * tail, y up from the body axis. The review sheet and the page's Setup tab both draw THIS, each in
 * its own medium, so the rocket printed on the record page and the one on screen are the same.
 *
 * The body is the nose (its form's profile), then the body tube at `diameter`, changed by each
 * transition (linear in radius over its length); fins are drawn in the plane of the view: a
 * 4-fin set shows one fin above and one below at full span; a 3-fin set one above at full span
 * and, below, the other two seen edge-on at 120° from it, so their span appears halved
 * (cos 60°) — geometry, no source needed.
 *
 * @example
 *   const o = rocketOutline(shape, 0.054);
 *   o.body      // closed polygon [[0, 0], [0.01, 0.004], …, [0.01, -0.004]]
 *   o.fins[0]   // [[0.82, 0.027], [0.87, 0.09], [0.92, 0.09], [0.92, 0.027]]
 */
export interface RocketOutline {
  /** Nose tip to aft end, m. */
  length: number;
  /** Largest half-height, fins included, m (for fitting a drawing). */
  halfHeight: number;
  /** Closed outline of the body (upper profile nose to tail, then the lower one back), m. */
  body: Array<[number, number]>;
  /** One closed quadrilateral per drawn fin, m. */
  fins: Array<Array<[number, number]>>;
}

/** Points along the nose profile; enough for a smooth curve at the sizes the views use. */
const NOSE_POINTS = 24;

/** Radius of the nose at distance x from the tip, for base radius R and length L. */
export function noseRadius(form: RocketShape['nose']['form'], x: number, R: number, L: number): number {
  const t = Math.min(1, Math.max(0, x / L));
  if (t === 0) return 0;
  if (form === 'cone') return R * t;
  if (form === 'parabola') return R * (2 * t - t * t);
  // Tangent ogive: a circular arc of radius rho meeting the body tube tangentially.
  const rho = (R * R + L * L) / (2 * R);
  return Math.max(0, Math.sqrt(Math.max(0, rho * rho - (L - x) ** 2)) + R - rho);
}

/** Radius of the body (nose, tube and transitions) at distance x from the tip. */
export function bodyRadius(shape: RocketShape, diameter: number, x: number): number {
  const L = shape.nose.length;
  if (x <= L) return noseRadius(shape.nose.form, x, diameter / 2, L);
  let r = diameter / 2;
  for (const t of sortedTransitions(shape)) {
    if (x < t.position) break;
    if (x <= t.position + t.length) {
      const f = t.length > 0 ? (x - t.position) / t.length : 1;
      return t.foreDiameter / 2 + f * (t.aftDiameter - t.foreDiameter) / 2;
    }
    r = t.aftDiameter / 2;
  }
  return r;
}

function sortedTransitions(shape: RocketShape) {
  return [...shape.transitions].sort((a, b) => a.position - b.position);
}

export function rocketOutline(shape: RocketShape, diameter: number): RocketOutline {
  const upper: Array<[number, number]> = [];
  const L = shape.nose.length;
  for (let i = 0; i <= NOSE_POINTS; i++) {
    const x = (L * i) / NOSE_POINTS;
    upper.push([x, noseRadius(shape.nose.form, x, diameter / 2, L)]);
  }
  // Each transition's ends (a step where a transition's fore diameter differs from the tube's).
  let r = diameter / 2;
  for (const t of sortedTransitions(shape)) {
    if (t.position + t.length <= L || t.position >= shape.length) continue;
    upper.push([t.position, r]);
    upper.push([t.position, t.foreDiameter / 2]);
    upper.push([Math.min(shape.length, t.position + t.length), bodyRadius(shape, diameter, Math.min(shape.length, t.position + t.length))]);
    r = t.aftDiameter / 2;
  }
  upper.push([shape.length, bodyRadius(shape, diameter, shape.length)]);
  const body: Array<[number, number]> = [...upper];
  for (let i = upper.length - 1; i >= 0; i--) {
    const [x, y] = upper[i]!;
    if (y > 0 || i > 0) body.push([x, -y]);
  }
  const fins: Array<Array<[number, number]>> = [];
  let halfHeight = Math.max(...upper.map((p) => p[1]));
  for (const f of shape.fins) {
    const root = bodyRadius(shape, diameter, f.position);
    const below = f.count === 4 ? 1 : 0.5;
    for (const side of [1, -below]) {
      const tip = root + Math.abs(side) * f.span;
      fins.push([
        [f.position, Math.sign(side) * root],
        [f.position + f.sweep, Math.sign(side) * tip],
        [f.position + f.sweep + f.tipChord, Math.sign(side) * tip],
        [f.position + f.rootChord, Math.sign(side) * root],
      ]);
      halfHeight = Math.max(halfHeight, tip);
    }
  }
  return { length: shape.length, halfHeight, body, fins };
}
