/**
 * Time at which a function crosses zero between ta and tb, given its values ga and gb of opposite
 * signs there: the Illinois variant of regula falsi (superlinear, and it never leaves the bracket).
 * Returns the bracket end past the crossing, so an event is never reported before it happens.
 *
 * @example
 * locateCrossing((t) => t * t - 2, 1, 2, -1, 2) // ≈ 1.4142135624
 */
export function locateCrossing(g: (t: number) => number, ta: number, tb: number, ga: number, gb: number, tolerance = 1e-10): number {
  if (ga === 0) return ta;
  let a = ta, b = tb, fa = ga, fb = gb;
  let side = 0;
  for (let iter = 0; iter < 60; iter++) {
    if (!(Math.abs(b - a) > tolerance)) break;
    const c = (a * fb - b * fa) / (fb - fa);
    const fc = g(c);
    if (fc === 0) return c;
    if (fc > 0 === fb > 0) {
      b = c;
      fb = fc;
      if (side === -1) fa *= 0.5;
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side === 1) fb *= 0.5;
      side = 1;
    }
  }
  return b;
}
