import type { OdeSystem } from './stepper.js';

/**
 * A first step size after a restart, by the estimate of Hairer, Nørsett & Wanner (Solving ODEs I,
 * §II.4, "starting step size"): one explicit Euler trial of size h0 measures how fast the
 * derivative changes, and the step is chosen so that the leading error term is about 0.01 of the
 * tolerance. Shared by both steppers; `exponent` is 1/(q + 1) for an error estimate of order q.
 *
 * Example: `firstStepSize(sys, time, 0, 0.01, 1, y, f0, scratch, f1, atol, 1e-6, 6, 6, 0.2)`
 * returns a step in (0, 1]; f0 must hold y' at (t, y) and `scratch`, `f1` are overwritten.
 *
 * Only the first `normCount` components enter the error norm (the stiff stepper leaves out the
 * held components its error control ignores too). Costs one derivative evaluation.
 */
export function firstStepSize(
  sys: OdeSystem,
  time: Float64Array,
  t: number,
  h0: number,
  hMax: number,
  y: Float64Array,
  f0: Float64Array,
  scratch: Float64Array,
  f1: Float64Array,
  atol: Float64Array,
  rtol: number,
  n: number,
  normCount: number,
  exponent: number,
): number {
  const h = h0 < hMax ? h0 : hMax;
  for (let i = 0; i < n; i++) scratch[i] = y[i] + h * f0[i];
  time[0] = t + h;
  sys.derivative(time, scratch, f1);
  let d1 = 0;
  let d2 = 0;
  for (let i = 0; i < normCount; i++) {
    const sk = atol[i] + rtol * Math.abs(y[i]);
    d1 += (f0[i] / sk) ** 2;
    d2 += ((f1[i] - f0[i]) / sk) ** 2;
  }
  const der = Math.max(Math.sqrt(d2) / h, Math.sqrt(d1));
  const h1 = der <= 1e-15 ? Math.max(1e-6, h * 1e-3) : Math.exp(exponent * Math.log(0.01 / der));
  return Math.min(100 * h, h1, hMax);
}
