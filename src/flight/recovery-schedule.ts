import type { RecoveryStage } from '../scenario/types.js';
import type { FlightInputs } from './inputs.js';

const TRIGGER_APOGEE = 0;
const TRIGGER_ALTITUDE = 1;
const TRIGGER_TIME = 2;

/**
 * When each recovery stage deploys during one flight, and which drag area acts.
 *
 * A stage deploys its `delay` after its trigger: apogee, the first crossing of its altitude on the
 * way down (an altitude already below the apogee counts as crossed at apogee), or a time after
 * launch. A stage that this sample's failure mode stops never deploys. The drag area in force is
 * that of the latest stage in file order that has deployed: a later stage replaces an earlier one,
 * never the other way round.
 *
 * Typed arrays, reset per flight; no allocation while flying.
 */
export class RecoverySchedule {
  readonly count: number;
  private readonly trigger: Uint8Array;
  private readonly altitude: Float64Array;
  private readonly time: Float64Array;
  private readonly delay: Float64Array;
  private readonly dragArea: Float64Array;
  private readonly deployAt: Float64Array;
  private readonly deployed: Uint8Array;
  /** 1 while an altitude stage still waits for its altitude on the way down. */
  private readonly armed: Uint8Array;
  private skip: Uint8Array;
  private delayOffset = 0;
  private rateFactor = 1;
  private active = -1;
  /** Drag area in force (m²), 0 while no stage has deployed. */
  activeDragArea = 0;

  constructor(stages: readonly RecoveryStage[]) {
    const n = stages.length;
    this.count = n;
    this.trigger = Uint8Array.from(stages, (s) => (s.trigger === 'apogee' ? TRIGGER_APOGEE : s.trigger === 'altitude' ? TRIGGER_ALTITUDE : TRIGGER_TIME));
    this.altitude = Float64Array.from(stages, (s) => s.altitude ?? 0);
    this.time = Float64Array.from(stages, (s) => s.time ?? 0);
    this.delay = Float64Array.from(stages, (s) => s.delay);
    this.dragArea = Float64Array.from(stages, (s) => s.dragArea);
    this.deployAt = new Float64Array(n);
    this.deployed = new Uint8Array(n);
    this.armed = new Uint8Array(n);
    this.skip = new Uint8Array(n);
  }

  /** Starts a flight with this sample's delay offset, descent-rate factor and stopped stages. */
  reset(inputs: FlightInputs): void {
    this.skip = inputs.skipStage;
    this.delayOffset = inputs.delayOffset;
    this.rateFactor = inputs.rateFactor;
    this.active = -1;
    this.activeDragArea = 0;
    for (let i = 0; i < this.count; i++) {
      this.deployed[i] = 0;
      this.armed[i] = this.trigger[i] === TRIGGER_ALTITUDE ? 1 : 0;
      this.deployAt[i] = this.trigger[i] === TRIGGER_TIME ? this.time[i] + this.delayOf(i) : Infinity;
    }
  }

  private delayOf(i: number): number {
    return Math.max(0, this.delay[i] + this.delayOffset);
  }

  private live(i: number): boolean {
    return this.deployed[i] === 0 && this.skip[i] === 0;
  }

  /** Apogee at time t and height z: schedules apogee stages and altitude stages already passed. */
  onApogee(t: number, z: number): void {
    for (let i = 0; i < this.count; i++) {
      if (this.trigger[i] === TRIGGER_APOGEE) this.deployAt[i] = t + this.delayOf(i);
      else if (this.armed[i] === 1 && z <= this.altitude[i]) this.onAltitude(i, t);
    }
  }

  /** Stage i's altitude was crossed on the way down at time t. */
  onAltitude(i: number, t: number): void {
    this.armed[i] = 0;
    this.deployAt[i] = t + this.delayOf(i);
  }

  /** The altitude stage i waits for, or NaN when it waits for none (another trigger, done, or stopped). */
  awaitedAltitude(i: number): number {
    return this.armed[i] === 1 && this.live(i) ? this.altitude[i] : NaN;
  }

  /** The earliest scheduled deployment still to come (Infinity when none). */
  nextDeployment(): number {
    let next = Infinity;
    for (let i = 0; i < this.count; i++) if (this.live(i) && this.deployAt[i] < next) next = this.deployAt[i];
    return next;
  }

  /** Whether a stage is due at time t. */
  isDue(t: number): boolean {
    for (let i = 0; i < this.count; i++) if (this.live(i) && this.deployAt[i] <= t) return true;
    return false;
  }

  /** Deploys every stage due at time t. */
  deployDue(t: number): void {
    for (let i = 0; i < this.count; i++) if (this.live(i) && this.deployAt[i] <= t) this.deploy(i);
  }

  private deploy(i: number): void {
    this.deployed[i] = 1;
    if (i > this.active) {
      this.active = i;
      // A drawn descent rate r·v means a drag area divided by r².
      this.activeDragArea = this.dragArea[i] / (this.rateFactor * this.rateFactor);
    }
  }
}
