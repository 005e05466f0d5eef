/**
 * What the flight's integration loop asks of a one-step method with error control and dense
 * output. Two methods implement it: Dormand–Prince (dopri5.ts), explicit, for most of a flight, and
 * a Rosenbrock method (rosenbrock.ts) for stretches under a canopy, where drag makes the equations
 * stiff. Both allocate nothing after construction.
 */

export interface OdeSystem {
  /**
   * Writes dy/dt at (time[0], y) into dy. Must not keep references to its arguments. The time
   * comes in a one-element array rather than as a number: a number that is not a small integer,
   * passed to a function the compiler does not inline, is boxed on the heap at every call, and
   * this is called several times a step.
   */
  derivative(time: Float64Array, y: Float64Array, dy: Float64Array): void;
}

/**
 * A mechanical system y = [x (3), v (3), held components…], y' = [v, a(x, v), 0…], that also gives
 * the Jacobian of its acceleration: ∂a/∂x and ∂a/∂v, each 3 × 3 row-major. The acceleration must
 * not depend on time explicitly where the stiff stepper is used.
 */
export interface StiffSystem extends OdeSystem {
  accelerationJacobian(time: Float64Array, y: Float64Array, dadx: Float64Array, dadv: Float64Array): void;
}

export interface Stepper {
  /** State at the start of the current step. */
  readonly y: Float64Array;
  /** Trial state at the end of the step. */
  readonly yNew: Float64Array;
  /** Derivative evaluations since construction. */
  readonly evaluations: number;
  /** Sets the state; the next step evaluates everything afresh (a discontinuity may lie here). */
  reset(y: ArrayLike<number>): void;
  /** Tries a step of size h from (t, y); returns the scaled error norm (accept when ≤ 1). */
  attempt(sys: StiffSystem, t: number, h: number): number;
  /** Accepts the last attempt: prepares dense output over it and moves the state forward. */
  accept(): void;
  /** A first step size after a restart at (t, y). */
  initialStep(sys: StiffSystem, t: number, h0: number, hMax: number): number;
  /** The next step size after an accepted step of size h with error norm err. */
  nextAfterAccept(h: number, err: number): number;
  /** The step size to retry with after a rejected step of size h with error norm err (> 1). */
  nextAfterReject(h: number, err: number): number;
  /** Start time and length of the last accepted step (the dense-output interval). */
  readonly stepStart: number;
  readonly stepLength: number;
  /** Component i of the dense-output solution at time t within the last accepted step. */
  denseComponent(i: number, t: number): number;
  /** The whole dense-output state at time t within the last accepted step. */
  dense(t: number, out: Float64Array): void;
}
