import type { Scenario } from '../scenario/types.js';
import { G0 } from '../physics/constants.js';
import { AirModel, type Air } from '../physics/air.js';
import { MeanWind } from '../physics/wind.js';
import { GustField } from '../physics/gust-field.js';
import { DragCurve, addDragAcceleration } from '../physics/drag.js';
import { MotorModel } from '../physics/motor.js';
import { Dopri5, type OdeSystem } from './dopri5.js';
import type { FlightInputs } from './inputs.js';
import { FlightStatus } from './status.js';
import { RecoverySchedule } from './recovery-schedule.js';
import { locateCrossing } from './locate-crossing.js';

const DEG = Math.PI / 180;

/** Integration settings. Defaults keep landing points within a metre of a tight reference. */
export interface FlightOptions {
  rtol: number;
  /** Absolute tolerance on position (m) and velocity (m/s). */
  atolPosition: number;
  atolVelocity: number;
  maxTime: number;
  maxSteps: number;
  /** Smallest step before the flight is declared failed, s. */
  minStep: number;
  /** Replaces the scenario's atmosphere (tests against constant-density closed forms). */
  air?: Air;
}

export const DEFAULT_FLIGHT_OPTIONS: FlightOptions = {
  rtol: 1e-6,
  atolPosition: 1e-2,
  atolVelocity: 1e-3,
  maxTime: 3600,
  maxSteps: 200_000,
  minStep: 1e-9,
};

/** What one flight produced. Reused between flights. */
export interface FlightResult {
  status: number;
  east: number;
  north: number;
  apogee: number;
  apogeeTime: number;
  flightTime: number;
  impactSpeed: number;
  /** Angle of the ground-relative velocity at impact above the horizontal, deg (90 = straight down). */
  impactAngle: number;
  /** Mass that reaches the ground, kg: the mass without propellant (rockets), the object's mass otherwise. */
  impactMass: number;
  /** Speed along the rail when the rocket left it, m/s (NaN when there is no rail). */
  railExitSpeed: number;
  steps: number;
}

export function emptyResult(): FlightResult {
  return {
    status: 0, east: 0, north: 0, apogee: 0, apogeeTime: 0, flightTime: 0,
    impactSpeed: 0, impactAngle: 0, impactMass: 0, railExitSpeed: NaN, steps: 0,
  };
}

/** Receives the state after every accepted step (for ground tracks); not used in Monte-Carlo runs. */
export type TrackSink = (t: number, y: Float64Array) => void;

// State events, located on the dense output.
const EV_NONE = -1;
const EV_RAIL = 0;
const EV_APOGEE = 1;
const EV_GROUND = 2;
const EV_STAGE = 3; // + stage index

/**
 * Equations of motion of a point mass with gravity, thrust, and drag on the air-relative velocity,
 * and the flight's state machine: rail, powered flight, coast, apogee, recovery stages, ground.
 *
 * State y = [east, north, up, v_east, v_north, v_up], metres from the pad and m/s; t from ignition
 * or release. One instance per scenario per thread; `fly` reconfigures it for each sample.
 */
export class FlightModel implements OdeSystem {
  readonly air: Air;
  readonly wind: MeanWind;
  readonly gusts: GustField;
  private readonly scenario: Scenario;
  private readonly dragCurve: DragCurve;
  private readonly motor: MotorModel | null;
  /** Step onto every thrust-curve point (short curves); long curves rely on error control alone. */
  private readonly stopAtKnots: boolean;
  private readonly referenceArea: number;
  private readonly options: FlightOptions;
  private readonly solver = new Dopri5(6);

  private readonly recovery: RecoverySchedule;

  // Per-sample configuration read by `derivative`.
  private dryMass = 1;
  private cdScale = 1;
  private onRail = false;
  private railX = 0;
  private railY = 0;
  private railZ = 1;
  private railLength = 0;
  // The event being located: kind and level, read by `eventAt`.
  private eventKind = 0;
  private eventLevel = 0;
  /** The event function on the dense output; one closure for the model's lifetime. */
  private readonly eventAt = (t: number): number => this.eventValue(this.eventKind, t, this.eventLevel);

  private readonly w = new Float64Array(3);
  private readonly acc = new Float64Array(3);
  private readonly probe = new Float64Array(6);

  constructor(scenario: Scenario, options: Partial<FlightOptions> = {}) {
    this.scenario = scenario;
    this.options = { ...DEFAULT_FLIGHT_OPTIONS, ...options };
    const weather = scenario.weather;
    this.air = this.options.air ?? new AirModel(scenario.site.pad.elevation, weather.temperature, weather.pressure);
    this.wind = new MeanWind(weather.wind);
    this.gusts = new GustField();
    this.dragCurve = new DragCurve(scenario.vehicle.drag);
    this.motor = scenario.vehicle.kind === 'rocket' && scenario.vehicle.motor ? new MotorModel(scenario.vehicle.motor) : null;
    this.stopAtKnots = this.motor !== null && this.motor.knots <= 256;
    this.referenceArea = scenario.vehicle.referenceArea;
    this.recovery = new RecoverySchedule(scenario.vehicle.kind === 'projectile' ? [] : scenario.recovery);
    const atol = this.solver.atol;
    atol[0] = atol[1] = atol[2] = this.options.atolPosition;
    atol[3] = atol[4] = atol[5] = this.options.atolVelocity;
    this.solver.rtol = this.options.rtol;
  }

  get evaluations(): number {
    return this.solver.evaluations;
  }

  derivative(t: number, y: Float64Array, dy: Float64Array): void {
    const z = y[2];
    const w = this.w;
    this.wind.at(z, w);
    w[2] = 0;
    this.gusts.addAt(z, w);
    const vx = y[3] - w[0];
    const vy = y[4] - w[1];
    const vz = y[5] - w[2];
    const speed = Math.sqrt(vx * vx + vy * vy + vz * vz);
    let mass = this.dryMass;
    let thrust = 0;
    if (this.motor !== null) {
      this.motor.evaluate(t);
      mass += this.motor.propellantNow;
      thrust = this.motor.thrustNow;
    }
    const rho = this.air.densityAt(z);
    let cda: number;
    const stageArea = this.recovery.activeDragArea;
    if (stageArea > 0) {
      cda = stageArea;
    } else {
      const mach = speed / this.air.speedOfSoundAt(z);
      cda = this.cdScale * this.dragCurve.at(mach) * this.referenceArea;
    }
    // Vector drag on the air-relative velocity (see physics/drag.ts), written into dy[3..5].
    const acc = this.acc;
    acc[0] = 0;
    acc[1] = 0;
    acc[2] = -G0;
    addDragAcceleration((rho * cda) / (2 * mass), vx, vy, vz, acc, 0);
    let ax = acc[0];
    let ay = acc[1];
    let az = acc[2];
    if (thrust > 0) {
      const f = thrust / mass;
      if (this.onRail || speed < 1e-9) {
        ax += f * this.railX;
        ay += f * this.railY;
        az += f * this.railZ;
      } else {
        // Off the rail the vehicle weathercocks: thrust points along the air-relative velocity.
        const g = f / speed;
        ax += g * vx;
        ay += g * vy;
        az += g * vz;
      }
    }
    if (this.onRail) {
      // The rail carries every force across it: only the component along the rail moves the
      // vehicle, and it cannot slide back through the pad.
      let along = ax * this.railX + ay * this.railY + az * this.railZ;
      const s = y[0] * this.railX + y[1] * this.railY + y[2] * this.railZ;
      const vs = y[3] * this.railX + y[4] * this.railY + y[5] * this.railZ;
      if (s <= 0 && vs <= 0 && along < 0) along = 0;
      ax = along * this.railX;
      ay = along * this.railY;
      az = along * this.railZ;
    }
    dy[0] = y[3];
    dy[1] = y[4];
    dy[2] = y[5];
    dy[3] = ax;
    dy[4] = ay;
    dy[5] = az;
  }

  /**
   * Flies one sample. `normal` draws N(0, 1) from the sample's own stream (for turbulence).
   * Writes the outcome to `out` and returns it.
   */
  fly(inputs: FlightInputs, normal: () => number, out: FlightResult, track: TrackSink | null = null): FlightResult {
    const sc = this.scenario;
    const opts = this.options;
    const solver = this.solver;
    const y0 = this.probe;

    const recovery = this.recovery;
    this.dryMass = inputs.mass;
    this.cdScale = inputs.cdScale;
    recovery.reset(inputs);
    this.wind.setSample(inputs.windSpeed, inputs.windTurn);
    this.gusts.reset(inputs.sigmaW, normal);
    if (this.motor !== null) this.motor.setImpulseScale(inputs.impulseScale);

    out.status = FlightStatus.LANDED;
    out.railExitSpeed = NaN;
    out.apogee = 0;
    out.apogeeTime = 0;
    out.steps = 0;

    let apogeeReached = false;
    let burning = this.motor !== null;
    const burnTime = this.motor !== null ? this.motor.burnTime : 0;
    const kind = sc.vehicle.kind;
    if (kind === 'rocket') {
      const tilt = inputs.tilt * DEG;
      const az = inputs.azimuth * DEG;
      this.railX = Math.sin(tilt) * Math.sin(az);
      this.railY = Math.sin(tilt) * Math.cos(az);
      this.railZ = Math.cos(tilt);
      this.railLength = sc.launch.kind === 'rocket' ? sc.launch.rail : 0;
      this.onRail = this.railLength > 0;
      y0.fill(0);
    } else if (kind === 'projectile') {
      this.onRail = false;
      const el = inputs.elevation * DEG;
      const az = inputs.azimuth * DEG;
      y0[0] = 0;
      y0[1] = 0;
      y0[2] = inputs.height;
      y0[3] = inputs.speed * Math.cos(el) * Math.sin(az);
      y0[4] = inputs.speed * Math.cos(el) * Math.cos(az);
      y0[5] = inputs.speed * Math.sin(el);
    } else {
      this.onRail = false;
      const hd = inputs.heading * DEG;
      y0[0] = inputs.east;
      y0[1] = inputs.north;
      y0[2] = inputs.height;
      y0[3] = inputs.speed * Math.sin(hd);
      y0[4] = inputs.speed * Math.cos(hd);
      y0[5] = 0;
    }
    solver.reset(y0);
    const y = solver.y;
    let t = 0;
    out.apogee = y[2];
    if (track !== null) track(t, y);
    if (kind !== 'rocket' && y[5] <= 0) {
      apogeeReached = true;
      recovery.onApogee(t, y[2]);
      recovery.deployDue(t);
    }

    let h = kind === 'rocket' ? 0.01 : 0.05;
    let steps = 0;
    while (true) {
      if (steps >= opts.maxSteps) return this.fail(out, FlightStatus.MAX_STEPS, t, steps);
      // The next moment something happens on the clock: burnout, a timed deployment, the time limit.
      let tNext = opts.maxTime;
      if (burning) tNext = Math.min(tNext, this.stopAtKnots ? this.motor!.nextKnotAfter(t) : burnTime);
      tNext = Math.min(tNext, recovery.nextDeployment());
      let hTry = h;
      let hitsClock = false;
      if (t + hTry >= tNext) {
        hTry = tNext - t;
        hitsClock = true;
      }
      if (hTry < opts.minStep) {
        if (hitsClock) {
          // Already at the clock event (within rounding): handle it without stepping.
          t = tNext;
          if (this.isDiscontinuity(t, burning, burnTime)) {
            if (this.clockEvent(t, out, steps)) return out;
            burning = burning && t < burnTime;
          }
          continue;
        }
        return this.fail(out, FlightStatus.STEP_UNDERFLOW, t, steps);
      }
      const err = solver.attempt(this, t, hTry);
      steps++;
      if (!(err <= 1)) {
        if (!Number.isFinite(err) && hTry <= opts.minStep * 16) return this.fail(out, FlightStatus.NON_FINITE, t, steps);
        h = Number.isFinite(err) ? hTry * Dopri5.factor(err) : hTry * 0.25;
        continue;
      }
      const yNew = solver.yNew;
      if (!allFinite(yNew)) return this.fail(out, FlightStatus.NON_FINITE, t, steps);
      const tNew = hitsClock ? tNext : t + hTry;
      const yPrevZ = y[2];
      const yPrevVz = y[5];
      const yPrevS = this.onRail ? y[0] * this.railX + y[1] * this.railY + y[2] * this.railZ : 0;
      solver.accept();
      h = hTry * Dopri5.factor(err);

      // Find the earliest state event inside the step.
      let event = EV_NONE;
      let tEvent = tNew;
      if (this.onRail) {
        const s = y[0] * this.railX + y[1] * this.railY + y[2] * this.railZ;
        if (s >= this.railLength) {
          const te = this.locate(EV_RAIL, 0, t, tNew, yPrevS - this.railLength, s - this.railLength);
          if (te <= tEvent) { event = EV_RAIL; tEvent = te; }
        } else if (!burning && s <= 0 && y[3] * this.railX + y[4] * this.railY + y[5] * this.railZ <= 0) {
          return this.fail(out, FlightStatus.NO_LIFTOFF, tNew, steps);
        }
      } else {
        if (!apogeeReached && y[5] <= 0 && yPrevVz > 0) {
          const te = this.locate(EV_APOGEE, 0, t, tNew, yPrevVz, y[5]);
          if (te <= tEvent) { event = EV_APOGEE; tEvent = te; }
        } else if (!apogeeReached && y[5] <= 0 && yPrevVz <= 0) {
          // Left the rail already descending (a very weak motor): apogee is the rail exit.
          event = EV_APOGEE;
          tEvent = t;
        }
        if (y[2] <= 0 && yPrevZ > 0) {
          const te = this.locate(EV_GROUND, 0, t, tNew, yPrevZ, y[2]);
          if (te < tEvent || (te === tEvent && event !== EV_APOGEE)) { event = EV_GROUND; tEvent = te; }
        }
        if (apogeeReached) {
          for (let i = 0; i < recovery.count; i++) {
            const alt = recovery.awaitedAltitude(i);
            if (y[2] <= alt && yPrevZ > alt) {
              const te = this.locate(EV_STAGE, alt, t, tNew, yPrevZ - alt, y[2] - alt);
              if (te < tEvent) { event = EV_STAGE + i; tEvent = te; }
            }
          }
        }
      }

      if (event === EV_NONE) {
        t = tNew;
        if (y[2] > out.apogee) out.apogee = y[2];
        if (track !== null) track(t, y);
        if (hitsClock && this.isDiscontinuity(t, burning, burnTime)) {
          if (this.clockEvent(t, out, steps)) return out;
          burning = burning && t < burnTime;
          h = Math.min(h, 0.05);
        }
        continue;
      }

      // Move to the event on the dense output and restart the integration there.
      const ye = this.probe;
      solver.dense(tEvent, ye);
      t = tEvent;
      if (ye[2] > out.apogee) out.apogee = ye[2];
      if (event === EV_GROUND) {
        ye[2] = 0;
        if (track !== null) track(t, ye);
        out.east = ye[0];
        out.north = ye[1];
        out.flightTime = t;
        out.impactSpeed = Math.sqrt(ye[3] * ye[3] + ye[4] * ye[4] + ye[5] * ye[5]);
        out.impactAngle = (Math.atan2(-ye[5], Math.hypot(ye[3], ye[4])) * 180) / Math.PI;
        out.impactMass = this.dryMass;
        out.steps = steps;
        return out;
      }
      if (event === EV_RAIL) {
        // Snap onto the rail's end exactly; the speed along it is the rail-exit speed.
        const vs = ye[3] * this.railX + ye[4] * this.railY + ye[5] * this.railZ;
        ye[0] = this.railLength * this.railX;
        ye[1] = this.railLength * this.railY;
        ye[2] = this.railLength * this.railZ;
        ye[3] = vs * this.railX;
        ye[4] = vs * this.railY;
        ye[5] = vs * this.railZ;
        out.railExitSpeed = vs;
        this.onRail = false;
      } else if (event === EV_APOGEE) {
        apogeeReached = true;
        out.apogee = Math.max(out.apogee, ye[2]);
        recovery.onApogee(t, ye[2]);
        out.apogeeTime = t;
        recovery.deployDue(t);
      } else {
        recovery.onAltitude(event - EV_STAGE, t);
        recovery.deployDue(t);
      }
      if (track !== null) track(t, ye);
      solver.reset(ye);
      h = Math.min(h, 0.05);
    }
  }

  /**
   * Whether a clock stop at t is more than a thrust-curve point (where the derivative is continuous
   * and the stepper carries on as it was): burnout, a timed deployment, or the time limit.
   */
  private isDiscontinuity(t: number, burning: boolean, burnTime: number): boolean {
    return t >= this.options.maxTime || (burning && t >= burnTime) || this.recovery.isDue(t);
  }

  /** Handles burnout, timed deployments and the time limit at time t. Returns true when the flight ended. */
  private clockEvent(t: number, out: FlightResult, steps: number): boolean {
    if (t >= this.options.maxTime) {
      this.fail(out, FlightStatus.MAX_TIME, t, steps);
      return true;
    }
    this.recovery.deployDue(t);
    // Thrust stops or a stage's drag starts here: the derivative jumps, so restart the stepper
    // rather than reuse the last stage across the jump.
    this.solver.reset(this.solver.y);
    return false;
  }

  private fail(out: FlightResult, status: number, t: number, steps: number): FlightResult {
    out.status = status;
    out.flightTime = t;
    out.steps = steps;
    out.east = NaN;
    out.north = NaN;
    out.impactSpeed = NaN;
    out.impactAngle = NaN;
    out.impactMass = NaN;
    return out;
  }

  /** Value of an event function on the dense output at time t. */
  private eventValue(kind: number, t: number, level: number): number {
    const s = this.solver;
    switch (kind) {
      case EV_RAIL:
        return (
          s.denseComponent(0, t) * this.railX + s.denseComponent(1, t) * this.railY + s.denseComponent(2, t) * this.railZ - this.railLength
        );
      case EV_APOGEE:
        return s.denseComponent(5, t);
      default:
        return s.denseComponent(2, t) - level;
    }
  }

  /** Time of the crossing of an event function within the last step (see locate-crossing.ts). */
  private locate(kind: number, level: number, ta: number, tb: number, ga: number, gb: number): number {
    this.eventKind = kind;
    this.eventLevel = level;
    return locateCrossing(this.eventAt, ta, tb, ga, gb);
  }
}

function allFinite(y: Float64Array): boolean {
  for (let i = 0; i < y.length; i++) if (!Number.isFinite(y[i])) return false;
  return true;
}
