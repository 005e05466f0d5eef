import type { Motor } from '../scenario/types.js';

/**
 * A solid motor from its thrust curve: thrust linear between curve points, zero after the last.
 * Propellant mass falls in proportion to the impulse delivered so far, so the mass at burnout is
 * the mass without propellant whatever the curve's shape.
 *
 * A sample may scale the total impulse (`setImpulseScale`): thrust scales, burn time stays.
 */
export class MotorModel {
  readonly burnTime: number;
  readonly nominalImpulse: number;
  readonly propellantMass: number;
  private readonly time: Float64Array;
  private readonly thrust: Float64Array;
  /** Impulse delivered up to each curve point, N s (nominal). */
  private readonly impulse: Float64Array;
  private scale = 1;
  private hint = 0;

  constructor(motor: Motor) {
    this.time = Float64Array.from(motor.thrust.time);
    this.thrust = Float64Array.from(motor.thrust.thrust);
    this.impulse = new Float64Array(this.time.length);
    for (let i = 1; i < this.time.length; i++) {
      this.impulse[i] =
        this.impulse[i - 1] + 0.5 * (this.thrust[i] + this.thrust[i - 1]) * (this.time[i] - this.time[i - 1]);
    }
    this.burnTime = this.time[this.time.length - 1];
    this.nominalImpulse = this.impulse[this.impulse.length - 1];
    this.propellantMass = motor.propellantMass;
  }

  /**
   * The first curve point strictly after t (the burn time when none is left). Thrust is linear
   * between points, so its slope jumps at each one; an integrator that steps exactly onto them
   * keeps its full order through the burn.
   */
  nextKnotAfter(t: number): number {
    const time = this.time;
    const i = this.segment(t);
    for (let k = i; k < time.length; k++) if (time[k] > t) return time[k];
    return this.burnTime;
  }

  /** Number of points on the curve. */
  get knots(): number {
    return this.time.length;
  }

  setImpulseScale(scale: number): void {
    this.scale = scale;
  }

  get totalImpulse(): number {
    return this.nominalImpulse * this.scale;
  }

  /** Index i with time[i] <= t < time[i+1]; remembers the last answer since t mostly increases. */
  private segment(t: number): number {
    const time = this.time;
    let i = this.hint;
    if (i >= time.length - 1 || time[i] > t) i = 0;
    while (i < time.length - 2 && time[i + 1] <= t) i++;
    this.hint = i;
    return i;
  }

  /** Thrust at time t after ignition, N. */
  thrustAt(t: number): number {
    if (!(t >= 0) || t >= this.burnTime) return 0;
    const i = this.segment(t);
    const f = (t - this.time[i]) / (this.time[i + 1] - this.time[i]);
    return this.scale * (this.thrust[i] + f * (this.thrust[i + 1] - this.thrust[i]));
  }

  /**
   * Thrust (N) and propellant left (kg) at time t, in one search of the curve: the equations of
   * motion need both at every evaluation. Results in `thrust` and `propellant`.
   */
  evaluate(t: number): void {
    if (!(t > 0)) {
      this.thrustNow = t === 0 ? this.scale * this.thrust[0] : 0;
      this.propellantNow = this.propellantMass;
      return;
    }
    if (t >= this.burnTime || this.nominalImpulse <= 0) {
      this.thrustNow = 0;
      this.propellantNow = 0;
      return;
    }
    const i = this.segment(t);
    const dt = t - this.time[i];
    const f = dt / (this.time[i + 1] - this.time[i]);
    const nominal = this.thrust[i] + f * (this.thrust[i + 1] - this.thrust[i]);
    this.thrustNow = this.scale * nominal;
    const delivered = this.impulse[i] + 0.5 * (this.thrust[i] + nominal) * dt;
    this.propellantNow = this.propellantMass * (1 - delivered / this.nominalImpulse);
  }

  /** Results of the last `evaluate`. */
  thrustNow = 0;
  propellantNow = 0;

  /** Propellant mass left at time t, kg. */
  propellantAt(t: number): number {
    if (!(t > 0)) return this.propellantMass;
    if (t >= this.burnTime || this.nominalImpulse <= 0) return 0;
    const i = this.segment(t);
    const dt = t - this.time[i];
    const f = dt / (this.time[i + 1] - this.time[i]);
    const thrustNow = this.thrust[i] + f * (this.thrust[i + 1] - this.thrust[i]);
    const delivered = this.impulse[i] + 0.5 * (this.thrust[i] + thrustNow) * dt;
    return this.propellantMass * (1 - delivered / this.nominalImpulse);
  }
}
