/**
 * Dormand–Prince 5(4) embedded Runge–Kutta stepper with its fourth-order continuous extension
 * (dense output), after Hairer, Nørsett & Wanner, Solving Ordinary Differential Equations I, §II.5–6.
 *
 * The stepper does one trial step at a time and leaves step-size control and event handling to the
 * caller; it allocates nothing after construction. The last stage is evaluated at the new point
 * and reused as the next step's first stage (FSAL).
 */

import type { OdeSystem, Stepper } from './stepper.js';
import { firstStepSize } from './first-step.js';

export type { OdeSystem } from './stepper.js';

const C2 = 1 / 5, C3 = 3 / 10, C4 = 4 / 5, C5 = 8 / 9;
const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const A71 = 35 / 384, A73 = 500 / 1113, A74 = 125 / 192, A75 = -2187 / 6784, A76 = 11 / 84;
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;
const D1 = -12715105075 / 11282082432, D3 = 87487479700 / 32700410799, D4 = -10690763975 / 1880347072,
  D5 = 701980252875 / 199316789632, D6 = -1453857185 / 822651844, D7 = 69997945 / 29380423;

export class Dopri5 implements Stepper {
  readonly n: number;
  /** State at the start of the current step. */
  readonly y: Float64Array;
  /** Trial state at the end of the step. */
  readonly yNew: Float64Array;
  private readonly k1: Float64Array;
  private readonly k2: Float64Array;
  private readonly k3: Float64Array;
  private readonly k4: Float64Array;
  private readonly k5: Float64Array;
  private readonly k6: Float64Array;
  private readonly k7: Float64Array;
  private readonly tmp: Float64Array;
  /** The stage time handed to the system (see OdeSystem). */
  private readonly time = new Float64Array(1);
  private readonly r1: Float64Array;
  private readonly r2: Float64Array;
  private readonly r3: Float64Array;
  private readonly r4: Float64Array;
  private readonly r5: Float64Array;
  /** Absolute tolerance per component and the shared relative tolerance. */
  readonly atol: Float64Array;
  rtol = 1e-6;
  /** Derivative evaluations since construction. */
  evaluations = 0;
  private t0 = 0;
  private h = 0;
  private fsalValid = false;
  /** Step-size controller memory: the last accepted error norm, and whether the last try failed. */
  private logErrOld = LOG_ERR_START;
  private rejected = false;

  constructor(n: number) {
    this.n = n;
    const make = () => new Float64Array(n);
    this.y = make();
    this.yNew = make();
    this.k1 = make(); this.k2 = make(); this.k3 = make(); this.k4 = make();
    this.k5 = make(); this.k6 = make(); this.k7 = make();
    this.tmp = make();
    this.r1 = make(); this.r2 = make(); this.r3 = make(); this.r4 = make(); this.r5 = make();
    this.atol = make().fill(1e-6);
  }

  /** Sets the state; the next step evaluates the derivative afresh (a discontinuity may lie here). */
  reset(y: ArrayLike<number>): void {
    for (let i = 0; i < this.n; i++) this.y[i] = y[i];
    this.fsalValid = false;
    this.logErrOld = LOG_ERR_START;
    this.rejected = false;
  }

  /**
   * Tries a step of size h from (t, y). Returns the scaled error norm (accept when ≤ 1).
   * Writes the trial state to `yNew`; call `accept()` to make it the current state.
   */
  attempt(sys: OdeSystem, t: number, h: number): number {
    const n = this.n, y = this.y, tmp = this.tmp, time = this.time;
    const k1 = this.k1, k2 = this.k2, k3 = this.k3, k4 = this.k4, k5 = this.k5, k6 = this.k6, k7 = this.k7;
    if (!this.fsalValid) {
      time[0] = t;
      sys.derivative(time, y, k1);
      this.evaluations++;
      this.fsalValid = true;
    }
    for (let i = 0; i < n; i++) tmp[i] = y[i] + h * A21 * k1[i];
    time[0] = t + C2 * h;
    sys.derivative(time, tmp, k2);
    for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
    time[0] = t + C3 * h;
    sys.derivative(time, tmp, k3);
    for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
    time[0] = t + C4 * h;
    sys.derivative(time, tmp, k4);
    for (let i = 0; i < n; i++) tmp[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
    time[0] = t + C5 * h;
    sys.derivative(time, tmp, k5);
    for (let i = 0; i < n; i++)
      tmp[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
    time[0] = t + h;
    sys.derivative(time, tmp, k6);
    const yNew = this.yNew;
    for (let i = 0; i < n; i++)
      yNew[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
    sys.derivative(time, yNew, k7);
    this.evaluations += 6;
    let sum = 0;
    for (let i = 0; i < n; i++) {
      const e = h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
      const scale = this.atol[i] + this.rtol * Math.max(Math.abs(y[i]), Math.abs(yNew[i]));
      const r = e / scale;
      sum += r * r;
    }
    this.t0 = t;
    this.h = h;
    return Math.sqrt(sum / n);
  }

  /**
   * A first step size from (t, y) after a restart, after the way Hairer's DOPRI5 code chooses it
   * (ODE I, §II.4): one Euler step of the trial size `h0` estimates the second derivative, then
   * the step whose fifth-order term would be 1 % of the tolerance, never more than 100 h0 nor
   * `hMax`. The code's first guess from |y|/|f| is left out: it would make the step depend on state
   * components that do not move (a rigid body's misalignment direction, drawn per sample, when
   * there is no misalignment), so equal flights would no longer be flown equally. Costs one
   * evaluation; the first stage is kept (FSAL).
   */
  initialStep(sys: OdeSystem, t: number, h0: number, hMax: number): number {
    const n = this.n, y = this.y, k1 = this.k1, k2 = this.k2, tmp = this.tmp, atol = this.atol, time = this.time;
    if (!this.fsalValid) {
      time[0] = t;
      sys.derivative(time, y, k1);
      this.evaluations++;
      this.fsalValid = true;
    }
    const h = firstStepSize(sys, time, t, h0, hMax, y, k1, tmp, k2, atol, this.rtol, n, n, 0.2);
    this.evaluations++;
    return h;
  }

  /**
   * Accepts the last attempt: prepares dense output over [t, t + h] and moves the state forward.
   */
  accept(): void {
    const n = this.n, h = this.h, y = this.y, yNew = this.yNew;
    const k1 = this.k1, k3 = this.k3, k4 = this.k4, k5 = this.k5, k6 = this.k6, k7 = this.k7;
    for (let i = 0; i < n; i++) {
      const dy = yNew[i] - y[i];
      const bspl = h * k1[i] - dy;
      this.r1[i] = y[i];
      this.r2[i] = dy;
      this.r3[i] = bspl;
      this.r4[i] = dy - h * k7[i] - bspl;
      this.r5[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i] + D7 * k7[i]);
      y[i] = yNew[i];
      k1[i] = k7[i];
    }
  }

  /** Start time and length of the last accepted step (the dense-output interval). */
  get stepStart(): number {
    return this.t0;
  }
  get stepLength(): number {
    return this.h;
  }

  /** Component i of the dense-output solution at time t within the last accepted step. */
  denseComponent(i: number, t: number): number {
    const s = (t - this.t0) / this.h;
    const s1 = 1 - s;
    return this.r1[i] + s * (this.r2[i] + s1 * (this.r3[i] + s * (this.r4[i] + s1 * this.r5[i])));
  }

  /** The whole dense-output state at time t within the last accepted step. */
  dense(t: number, out: Float64Array): void {
    const s = (t - this.t0) / this.h;
    const s1 = 1 - s;
    for (let i = 0; i < this.n; i++)
      out[i] = this.r1[i] + s * (this.r2[i] + s1 * (this.r3[i] + s * (this.r4[i] + s1 * this.r5[i])));
  }

  /** Step-size factor from an error norm (safety 0.9, limited to [0.2, 5]). */
  static factor(err: number): number {
    if (err === 0) return 5;
    return Math.min(5, Math.max(0.2, 0.9 * Math.exp(-0.2 * Math.log(err))));
  }

  /**
   * The next step size after an accepted step of size h with error norm err: the proportional-
   * integral controller of Hairer, Nørsett & Wanner (ODE I, §II.4, and their DOPRI5 code:
   * exponents 0.2 − 0.75 β and β with β = 0.04, safety 0.9, growth at most 10, shrink at most 5,
   * no growth right after a rejection). Steps that sit on the stability boundary (a canopy
   * descent, where drag relaxes the velocity within a fraction of a second) then settle instead of
   * alternating between accepted and rejected.
   */
  nextAfterAccept(h: number, err: number): number {
    const e = err > 1e-10 ? err : 1e-10;
    let fac = Math.exp(PI_EXPONENT * Math.log(e) - PI_BETA * this.logErrOld) / SAFETY;
    fac = fac < 0.1 ? 0.1 : fac > 5 ? 5 : fac;
    let next = h / fac;
    if (this.rejected && next > h) next = h;
    // Its logarithm is what the next step needs (one logarithm a step saved).
    this.logErrOld = Math.log(err > 1e-4 ? err : 1e-4);
    this.rejected = false;
    return next;
  }

  /** The step size to retry with after a rejected step of size h with error norm err (> 1). */
  nextAfterReject(h: number, err: number): number {
    this.rejected = true;
    if (!(err < Infinity)) return h * 0.25;
    const fac = Math.exp(PI_EXPONENT * Math.log(err)) / SAFETY;
    return h / (fac < 5 ? fac : 5);
  }
}

const PI_BETA = 0.04;
const LOG_ERR_START = Math.log(1e-4);
const PI_EXPONENT = 0.2 - 0.75 * PI_BETA;
const SAFETY = 0.9;
