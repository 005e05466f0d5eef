/**
 * The regularised incomplete beta function I_x(a, b) and its inverse in x.
 *
 * ln Γ by Stirling's series (coefficients B_2k / (2k (2k − 1)) from the Bernoulli numbers) after
 * shifting the argument above 15 with Γ(x + 1) = x Γ(x); I_x(a, b) by its continued fraction
 * (Abramowitz & Stegun 26.5.8) evaluated with the modified Lentz method, using
 * I_x(a, b) = 1 − I_{1−x}(b, a) on the side where the fraction converges fast; the inverse by
 * bisection, which is slow but cannot miss for a function that only increases.
 *
 * @example
 *   regularizedBeta(0.5, 2, 2)        // 0.5
 *   inverseRegularizedBeta(0.95, 1, 1000)  // 1 − 0.05^(1/1000) ≈ 0.002991
 */

const HALF_LN_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/** ln Γ(x) for x > 0, to about 1e-15 relative. */
export function lnGamma(x: number): number {
  if (!(x > 0)) throw new Error(`lnGamma needs a positive argument, got ${x}`);
  let product = 1;
  let z = x;
  while (z < 15) {
    product *= z;
    z += 1;
  }
  const inv = 1 / z;
  const inv2 = inv * inv;
  // Stirling series: 1/12, −1/360, 1/1260, −1/1680, 1/1188, −691/360360.
  const series =
    inv * (1 / 12 + inv2 * (-1 / 360 + inv2 * (1 / 1260 + inv2 * (-1 / 1680 + inv2 * (1 / 1188 + inv2 * (-691 / 360360))))));
  return (z - 0.5) * Math.log(z) - z + HALF_LN_TWO_PI + series - Math.log(product);
}

/** ln B(a, b). */
export function lnBeta(a: number, b: number): number {
  return lnGamma(a) + lnGamma(b) - lnGamma(a + b);
}

const TINY = 1e-300;

/** Continued fraction of I_x(a, b) (A&S 26.5.8), modified Lentz. */
function betaFraction(x: number, a: number, b: number): number {
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 100000; m++) {
    const m2 = 2 * m;
    // Even step.
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    // Odd step.
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) return h;
  }
  return h;
}

/** I_x(a, b) for a, b > 0 and 0 ≤ x ≤ 1. */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const lnFront = a * Math.log(x) + b * Math.log1p(-x) - lnBeta(a, b);
  if (x < (a + 1) / (a + b + 2)) return (Math.exp(lnFront) * betaFraction(x, a, b)) / a;
  return 1 - (Math.exp(lnFront) * betaFraction(1 - x, b, a)) / b;
}

/** The x with I_x(a, b) = q, by bisection to about 1e-15 relative. */
export function inverseRegularizedBeta(q: number, a: number, b: number): number {
  if (q <= 0) return 0;
  if (q >= 1) return 1;
  let lo = 0;
  let hi = 1;
  for (let step = 0; step < 200; step++) {
    const mid = 0.5 * (lo + hi);
    if (regularizedBeta(mid, a, b) < q) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-15 * hi) break;
  }
  return 0.5 * (lo + hi);
}
