import type { StiffSystem, Stepper } from './stepper.js';
import { firstStepSize } from './first-step.js';

/**
 * RODAS: a linearly implicit (Rosenbrock) method of order 4 with an embedded method of order 3,
 * six stages, stiffly accurate and L-stable, for the stretches of a flight under a canopy.
 *
 * Why: under a canopy, drag pulls the air-relative velocity toward its terminal value at a rate
 * λ ≈ 2g / v_t (3.6 /s under a 5.5 m/s main). An explicit method is stable only for h·λ below a
 * constant (about 3.3 for Dormand–Prince), so it crawls down in steps under a second however smooth
 * the descent is. A Rosenbrock method solves one linear system with the Jacobian per stage instead
 * and has no such limit; its step follows the accuracy asked for.
 *
 * Method and coefficients: Hairer & Wanner, Solving Ordinary Differential Equations II (2nd ed.,
 * 1996), §IV.7 (Rosenbrock-type methods; RODAS, γ = 1/4, the coefficients as in their RODAS code),
 * written in their transformed variables U_i = Σ_j γ_ij k_j, which need no matrix products:
 *
 *   (1/(hγ) I − J) U_i = f(y + Σ_{j<i} a_ij U_j) + Σ_{j<i} (c_ij / h) U_j,
 *   y_{n+1} = y + Σ m_i U_i (= the last stage's argument plus U_6), error estimate U_6.
 *
 * The digits are quoted from memory; test/flight/rosenbrock.test.ts checks them against the order
 * conditions of their Table IV.7.1 (order 4, embedded order 3) and the stability function at −∞.
 * Rosenbrock methods need the exact Jacobian for their order, and the term ∂f/∂t for an equation
 * with explicit time: the system here must be autonomous where this is used (after burnout).
 *
 * The system is mechanical: y = [x, v, held…], x' = v, v' = a(x, v), so J = [[0, I], [P, A]] with
 * P = ∂a/∂x and A = ∂a/∂v, and (I − g J) [p; q] = [r; s] (g = hγ) reduces to one 3 × 3 system:
 * (I − g A − g² P) q = s + g P r, p = r + g q. Components past the sixth are held as they are.
 *
 * Dense output: the cubic Hermite interpolant of the states and derivatives at both ends of the
 * step (order 3, as RODAS's own continuous extension). The derivative at the end is the next step's
 * first stage, so it costs nothing extra on a flight that goes on.
 */

const GAMMA = 0.25;
const A21 = 1.544;
const A31 = 0.9466785280815826, A32 = 0.2557011698983284;
const A41 = 3.314825187068521, A42 = 2.896124015972201, A43 = 0.9986419139977817;
const A51 = 1.221224509226641, A52 = 6.019134481288629, A53 = 12.53708332932087, A54 = -0.687886036105895;
// Stage 6 takes stage 5's argument plus U_5 (a_6j = a_5j, a_65 = 1); y_{n+1} = stage 6's argument + U_6.
const C21 = -5.6688;
const C31 = -2.430093356833875, C32 = -0.2063599157091915;
const C41 = -0.1073529058151375, C42 = -9.594562251023355, C43 = -20.47028614809616;
const C51 = 7.496443313967647, C52 = -10.24680431464352, C53 = -33.99990352819905, C54 = 11.7089089320616;
const C61 = 8.083246795921522, C62 = -7.981132988064893, C63 = -31.52159432874371, C64 = 16.31930543123136,
  C65 = -6.058818238834054;
/** Stage times as fractions of the step (α_i = Σ_j α_ij of the untransformed method). */
const T2 = 0.386, T3 = 0.21, T4 = 0.63;

/** The coefficients as matrices, for the order-condition test. */
export const RODAS_TABLEAU = {
  gamma: GAMMA,
  a: [
    [0, 0, 0, 0, 0, 0],
    [A21, 0, 0, 0, 0, 0],
    [A31, A32, 0, 0, 0, 0],
    [A41, A42, A43, 0, 0, 0],
    [A51, A52, A53, A54, 0, 0],
    [A51, A52, A53, A54, 1, 0],
  ],
  c: [
    [0, 0, 0, 0, 0, 0],
    [C21, 0, 0, 0, 0, 0],
    [C31, C32, 0, 0, 0, 0],
    [C41, C42, C43, 0, 0, 0],
    [C51, C52, C53, C54, 0, 0],
    [C61, C62, C63, C64, C65, 0],
  ],
  m: [A51, A52, A53, A54, 1, 1],
  e: [0, 0, 0, 0, 0, 1],
  stageTimes: [0, T2, T3, T4, 1, 1],
} as const;

/** Moving components: position and velocity. */
const M = 6;

export class Rodas implements Stepper {
  readonly n: number;
  readonly y: Float64Array;
  readonly yNew: Float64Array;
  /** Absolute tolerance per component (the first six are used) and the shared relative tolerance. */
  readonly atol: Float64Array;
  rtol = 1e-6;
  evaluations = 0;
  /** Jacobian evaluations since construction (each costs about one derivative evaluation). */
  jacobians = 0;

  private readonly u1: Float64Array;
  private readonly u2: Float64Array;
  private readonly u3: Float64Array;
  private readonly u4: Float64Array;
  private readonly u5: Float64Array;
  private readonly u6: Float64Array;
  /** f at the start of the step (the first stage) and at its end (for dense output). */
  private readonly f0: Float64Array;
  private readonly f1: Float64Array;
  private readonly fs: Float64Array;
  private readonly arg: Float64Array;
  private readonly rhs = new Float64Array(M);
  private readonly time = new Float64Array(1);
  /** ∂a/∂x, ∂a/∂v at the start of the step, and the inverse of I − gA − g²P. */
  private readonly dadx = new Float64Array(9);
  private readonly dadv = new Float64Array(9);
  private readonly inv = new Float64Array(9);
  /** Dense output: the states and derivatives at both ends of the last accepted step. */
  private readonly yA: Float64Array;
  private readonly yB: Float64Array;
  private readonly fA: Float64Array;
  private readonly fB: Float64Array;
  private f0Valid = false;
  private jacobianValid = false;
  private f1Valid = false;
  private t0 = 0;
  private h = 0;
  /** h γ of the current try (a field, so that the solves take no boxed number). */
  private g = 0;
  private rejected = false;

  constructor(n: number) {
    if (n < M) throw new Error(`the Rosenbrock stepper needs at least ${M} components, got ${n}`);
    this.n = n;
    const make = () => new Float64Array(n);
    this.y = make();
    this.yNew = make();
    this.atol = make().fill(1e-6);
    this.u1 = make(); this.u2 = make(); this.u3 = make(); this.u4 = make(); this.u5 = make(); this.u6 = make();
    this.f0 = make(); this.f1 = make(); this.fs = make(); this.arg = make();
    this.yA = make(); this.yB = make(); this.fA = make(); this.fB = make();
  }

  reset(y: ArrayLike<number>): void {
    for (let i = 0; i < this.n; i++) this.y[i] = y[i];
    this.f0Valid = false;
    this.jacobianValid = false;
    this.rejected = false;
  }

  attempt(sys: StiffSystem, t: number, h: number): number {
    const n = this.n, y = this.y, arg = this.arg, fs = this.fs, time = this.time;
    const u1 = this.u1, u2 = this.u2, u3 = this.u3, u4 = this.u4, u5 = this.u5, u6 = this.u6;
    if (!this.f0Valid) {
      time[0] = t;
      sys.derivative(time, y, this.f0);
      this.evaluations++;
      this.f0Valid = true;
    }
    if (!this.jacobianValid) {
      time[0] = t;
      sys.accelerationJacobian(time, y, this.dadx, this.dadv);
      this.jacobians++;
      this.jacobianValid = true;
    }
    this.g = h * GAMMA;
    this.factor();
    const ih = 1 / h;
    // Held components stay as they are in every stage argument.
    for (let i = M; i < n; i++) arg[i] = y[i];

    this.solve(this.f0, u1);

    for (let i = 0; i < M; i++) arg[i] = y[i] + A21 * u1[i];
    time[0] = t + T2 * h;
    sys.derivative(time, arg, fs);
    for (let i = 0; i < M; i++) fs[i] += ih * C21 * u1[i];
    this.solve(fs, u2);

    for (let i = 0; i < M; i++) arg[i] = y[i] + A31 * u1[i] + A32 * u2[i];
    time[0] = t + T3 * h;
    sys.derivative(time, arg, fs);
    for (let i = 0; i < M; i++) fs[i] += ih * (C31 * u1[i] + C32 * u2[i]);
    this.solve(fs, u3);

    for (let i = 0; i < M; i++) arg[i] = y[i] + A41 * u1[i] + A42 * u2[i] + A43 * u3[i];
    time[0] = t + T4 * h;
    sys.derivative(time, arg, fs);
    for (let i = 0; i < M; i++) fs[i] += ih * (C41 * u1[i] + C42 * u2[i] + C43 * u3[i]);
    this.solve(fs, u4);

    for (let i = 0; i < M; i++) arg[i] = y[i] + A51 * u1[i] + A52 * u2[i] + A53 * u3[i] + A54 * u4[i];
    time[0] = t + h;
    sys.derivative(time, arg, fs);
    for (let i = 0; i < M; i++) fs[i] += ih * (C51 * u1[i] + C52 * u2[i] + C53 * u3[i] + C54 * u4[i]);
    this.solve(fs, u5);

    for (let i = 0; i < M; i++) arg[i] += u5[i];
    sys.derivative(time, arg, fs);
    for (let i = 0; i < M; i++) fs[i] += ih * (C61 * u1[i] + C62 * u2[i] + C63 * u3[i] + C64 * u4[i] + C65 * u5[i]);
    this.solve(fs, u6);
    this.evaluations += 5;

    const yNew = this.yNew, atol = this.atol, rtol = this.rtol;
    let sum = 0;
    for (let i = 0; i < M; i++) {
      const v = arg[i] + u6[i];
      yNew[i] = v;
      const scale = atol[i] + rtol * Math.max(Math.abs(y[i]), Math.abs(v));
      const r = u6[i] / scale;
      sum += r * r;
    }
    for (let i = M; i < n; i++) yNew[i] = y[i];
    this.t0 = t;
    this.h = h;
    const err = Math.sqrt(sum / M);
    this.f1Valid = false;
    if (err <= 1) {
      // The derivative at the end: the dense output's, and the next step's first stage.
      time[0] = t + h;
      sys.derivative(time, yNew, this.f1);
      this.evaluations++;
      this.f1Valid = true;
    }
    return err;
  }

  /** Inverts I − gA − g²P (3 × 3) for this step's g = hγ. */
  private factor(): void {
    const g = this.g, A = this.dadv, P = this.dadx, inv = this.inv;
    const g2 = g * g;
    const m00 = 1 - g * A[0] - g2 * P[0], m01 = -g * A[1] - g2 * P[1], m02 = -g * A[2] - g2 * P[2];
    const m10 = -g * A[3] - g2 * P[3], m11 = 1 - g * A[4] - g2 * P[4], m12 = -g * A[5] - g2 * P[5];
    const m20 = -g * A[6] - g2 * P[6], m21 = -g * A[7] - g2 * P[7], m22 = 1 - g * A[8] - g2 * P[8];
    const c00 = m11 * m22 - m12 * m21, c01 = m02 * m21 - m01 * m22, c02 = m01 * m12 - m02 * m11;
    const c10 = m12 * m20 - m10 * m22, c11 = m00 * m22 - m02 * m20, c12 = m02 * m10 - m00 * m12;
    const c20 = m10 * m21 - m11 * m20, c21 = m01 * m20 - m00 * m21, c22 = m00 * m11 - m01 * m10;
    const d = 1 / (m00 * c00 + m01 * c10 + m02 * c20);
    inv[0] = c00 * d; inv[1] = c01 * d; inv[2] = c02 * d;
    inv[3] = c10 * d; inv[4] = c11 * d; inv[5] = c12 * d;
    inv[6] = c20 * d; inv[7] = c21 * d; inv[8] = c22 * d;
  }

  /** U = (1/(hγ) I − J)⁻¹ R, i.e. (I − gJ) U = g R with g = hγ, by the 3 × 3 reduction. */
  private solve(R: Float64Array, U: Float64Array): void {
    const g = this.g, P = this.dadx, inv = this.inv;
    const r0 = g * R[0], r1 = g * R[1], r2 = g * R[2];
    const s0 = g * R[3] + g * (P[0] * r0 + P[1] * r1 + P[2] * r2);
    const s1 = g * R[4] + g * (P[3] * r0 + P[4] * r1 + P[5] * r2);
    const s2 = g * R[5] + g * (P[6] * r0 + P[7] * r1 + P[8] * r2);
    const q0 = inv[0] * s0 + inv[1] * s1 + inv[2] * s2;
    const q1 = inv[3] * s0 + inv[4] * s1 + inv[5] * s2;
    const q2 = inv[6] * s0 + inv[7] * s1 + inv[8] * s2;
    U[0] = r0 + g * q0;
    U[1] = r1 + g * q1;
    U[2] = r2 + g * q2;
    U[3] = q0;
    U[4] = q1;
    U[5] = q2;
  }

  accept(): void {
    const n = this.n, y = this.y, yNew = this.yNew;
    const yA = this.yA, yB = this.yB, fA = this.fA, fB = this.fB, f0 = this.f0, f1 = this.f1;
    for (let i = 0; i < n; i++) {
      yA[i] = y[i];
      yB[i] = yNew[i];
      fA[i] = f0[i];
      fB[i] = f1[i];
      y[i] = yNew[i];
      f0[i] = f1[i];
    }
    this.f0Valid = this.f1Valid;
    this.jacobianValid = false;
  }

  /** Hairer's first-step estimate (as Dopri5.initialStep) for a method of order 4. */
  initialStep(sys: StiffSystem, t: number, h0: number, hMax: number): number {
    const y = this.y, f0 = this.f0, arg = this.arg, fs = this.fs, atol = this.atol, time = this.time;
    if (!this.f0Valid) {
      time[0] = t;
      sys.derivative(time, y, f0);
      this.evaluations++;
      this.f0Valid = true;
    }
    const h = firstStepSize(sys, time, t, h0, hMax, y, f0, arg, fs, atol, this.rtol, this.n, M, 0.25);
    this.evaluations++;
    return h;
  }

  /**
   * The next step after an accepted one: h (0.9 / err)^(1/4) (the error estimate is of order h⁴),
   * growing at most 5-fold and not at all right after a rejection. A plain controller: the method
   * is L-stable, so the steps do not sit on a stability boundary that a proportional-integral
   * controller would have to smooth (Dopri5.nextAfterAccept).
   */
  nextAfterAccept(h: number, err: number): number {
    const e = err > 1e-10 ? err : 1e-10;
    let fac = Math.exp(0.25 * Math.log(e)) / SAFETY;
    fac = fac < 0.2 ? 0.2 : fac > 5 ? 5 : fac;
    let next = h / fac;
    if (this.rejected && next > h) next = h;
    this.rejected = false;
    return next;
  }

  nextAfterReject(h: number, err: number): number {
    this.rejected = true;
    if (!(err < Infinity)) return h * 0.25;
    const fac = Math.exp(0.25 * Math.log(err)) / SAFETY;
    return h / (fac < 5 ? fac : 5);
  }

  get stepStart(): number {
    return this.t0;
  }
  get stepLength(): number {
    return this.h;
  }

  denseComponent(i: number, t: number): number {
    const s = (t - this.t0) / this.h;
    const s1 = 1 - s;
    const h = this.h;
    return (1 + 2 * s) * s1 * s1 * this.yA[i] + s * s1 * s1 * h * this.fA[i] + s * s * (3 - 2 * s) * this.yB[i] - s * s * s1 * h * this.fB[i];
  }

  dense(t: number, out: Float64Array): void {
    const s = (t - this.t0) / this.h;
    const s1 = 1 - s;
    const h = this.h;
    const c0 = (1 + 2 * s) * s1 * s1, c1 = s * s1 * s1 * h, c2 = s * s * (3 - 2 * s), c3 = -s * s * s1 * h;
    for (let i = 0; i < this.n; i++) out[i] = c0 * this.yA[i] + c1 * this.fA[i] + c2 * this.yB[i] + c3 * this.fB[i];
  }
}

const SAFETY = 0.9;
