import type { Scenario } from '../scenario/types.js';
import { AirModel, type Air } from '../physics/air.js';
import { EarthModel, addCoriolis, type Earth } from '../physics/earth.js';
import { MeanWind } from '../physics/wind.js';
import { GustField } from '../physics/gust-field.js';
import { DragCurve, addDragAcceleration } from '../physics/drag.js';
import { MotorModel } from '../physics/motor.js';
import { Dopri5 } from './dopri5.js';
import { Rodas } from './rosenbrock.js';
import type { StiffSystem, Stepper } from './stepper.js';
import type { FlightInputs } from './inputs.js';
import { FlightStatus } from './status.js';
import { RecoverySchedule } from './recovery-schedule.js';
import { locateCrossing } from './locate-crossing.js';
import { GroundHeight } from './ground.js';
import { launchDirection } from './launch-direction.js';
import { aeroTable, finMachFactor, massLayout } from '../physics/aero.js';

const DEG = Math.PI / 180;
/**
 * Under a stage whose drag relaxes the velocity at 2g/v_t of at least this (1/s), i.e. descending
 * at 9.8 m/s or slower, the stiff stepper flies it. Measured on the demo club rocket with
 * turbulence: its drogue (22 m/s, 0.9 /s) takes fewer evaluations with Dormand–Prince, whose steps
 * there follow the gusts; its main (5.5 m/s, 3.6 /s) far fewer with RODAS, since Dormand–Prince
 * is held to h < 3.3/λ ≈ 0.9 s there.
 */
const STIFF_RATE = 2;
/**
 * ... and only for a descent of at least this long (s, height over terminal speed): the stiff
 * stepper's gain is per second of steady descent, while the ramp-up after the deployment and the
 * approach to the ground cost both steppers alike. Measured: the club rocket's main (150 m at
 * 5.5 m/s, 27 s) gains; a drone's canopy from 50 m at 6.5 m/s (8 s) does not.
 */
const STIFF_DESCENT = 15;
/** Under a canopy a step ends at most this many times the time to the ground ahead (see fly). */
const GROUND_REACH = 1.2;

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
  /** Rigid body: absolute tolerance on the axis and misalignment unit vectors, and on the angular rate (rad/s). */
  atolAttitude: number;
  atolRate: number;
  /** Rigid body: multiplies every normal-force slope (and the aerodynamic damping) — for tests only. */
  normalForceScale: number;
  /** Rigid body: multiplies the transverse inertia — for tests only. */
  inertiaScale: number;
  /** Rigid body: false turns off both damping moments — for tests only. */
  damping: boolean;
  /** Rigid body: multiplies both damping moments — for tests only. */
  dampingScale: number;
  /** Replaces the scenario's atmosphere (tests against constant-density closed forms). */
  air?: Air;
  /** Replaces the rotating WGS 84 Earth at the pad (tests against uniform-gravity closed forms). */
  earth?: Earth;
}

/**
 * 3 mm/s on velocity: a velocity error is either integrated into position (checked at 1 cm) or,
 * under a canopy, damped out by drag within about a second; 1 mm/s cost 14 % more evaluations on
 * the demo club rocket for no gain in landing accuracy against the odex reference (0.05 m either
 * way over eight turbulent flights; the rigid body 0.05 → 0.10 m, within the 0.5 m checked).
 */
export const DEFAULT_FLIGHT_OPTIONS: FlightOptions = {
  rtol: 1e-6,
  atolPosition: 1e-2,
  atolVelocity: 3e-3,
  maxTime: 3600,
  maxSteps: 200_000,
  minStep: 1e-9,
  atolAttitude: 1e-5,
  atolRate: 1e-4,
  normalForceScale: 1,
  inertiaScale: 1,
  damping: true,
  dampingScale: 1,
};

/** What one flight produced. Reused between flights. */
export interface FlightResult {
  status: number;
  east: number;
  north: number;
  apogee: number;
  apogeeTime: number;
  /** Where the apogee was, m east and north of the pad (0, 0 until it is reached). */
  apogeeEast: number;
  apogeeNorth: number;
  flightTime: number;
  impactSpeed: number;
  /** Angle of the ground-relative velocity at impact above the horizontal, deg (90 = straight down). */
  impactAngle: number;
  /** Mass that reaches the ground, kg: the mass without propellant (rockets), the object's mass otherwise. */
  impactMass: number;
  /** Speed along the rail when the rocket left it, m/s (NaN when there is no rail). */
  railExitSpeed: number;
  steps: number;
  /** Highest Mach number at the accepted steps (rigid-body rockets only; 0 otherwise). */
  maxMach: number;
}

export function emptyResult(): FlightResult {
  return {
    status: 0, east: 0, north: 0, apogee: 0, apogeeTime: 0, apogeeEast: 0, apogeeNorth: 0, flightTime: 0,
    impactSpeed: 0, impactAngle: 0, impactMass: 0, railExitSpeed: NaN, steps: 0, maxMach: 0,
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
 * Equations of motion of a point mass (or, for a rocket with a shape, a rigid body) with gravity,
 * thrust, and drag on the air-relative velocity, and the flight's state machine: rail, powered
 * flight, coast, apogee, recovery stages, ground.
 *
 * State y = [east, north, up, v_east, v_north, v_up], metres from the pad and m/s (a rigid body
 * adds nine attitude components, see `derivative`); t from ignition or release. One instance per
 * scenario per thread; `fly` reconfigures it for each sample.
 */
export class FlightModel implements StiffSystem {
  readonly air: Air;
  readonly earth: Earth;
  readonly wind: MeanWind;
  readonly gusts: GustField;
  private readonly scenario: Scenario;
  private readonly dragCurve: DragCurve;
  private readonly motor: MotorModel | null;
  /** Step onto every thrust-curve point (short curves); long curves rely on error control alone. */
  private readonly stopAtKnots: boolean;
  /** The motor's burn time (Infinity without a motor). */
  private readonly burnTime: number;
  private readonly referenceArea: number;
  private readonly options: FlightOptions;
  /** The explicit stepper, for everything but the descent under a canopy. */
  private readonly explicit: Dopri5;
  /** The linearly implicit stepper, for the descent under a canopy (stiff: see rosenbrock.ts). */
  private readonly stiff: Rodas;
  /** The stepper of the current stretch of the flight (one of the two). */
  private solver: Stepper;
  /** A rocket with a shape: state of 15 (position, velocity, body axis, angular rate, misalignment direction). */
  readonly rigid: boolean;
  // Rigid body, per scenario: Barrowman moment sums (body; fins at Mach 0) and geometry.
  private readonly b0: number = 0;
  private readonly b1: number = 0;
  private readonly b2: number = 0;
  private readonly f0: number = 0;
  private readonly f1: number = 0;
  private readonly f2: number = 0;
  private readonly motorEnd: number = 0;
  private readonly propellantAt: number = 0;
  private readonly nominalDryInertia: number = 0;
  // Rigid body, per sample.
  private dryCg = 0;
  private dryInertia = 0;
  private sinMis = 0;
  private cosMis = 1;

  private readonly recovery: RecoverySchedule;
  /** Ground height above the pad under a point (terrain, or level ground). */
  private readonly ground: GroundHeight;

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
  /** The wind's slope in height, for the Jacobian. */
  private readonly ws = new Float64Array(3);
  /** Hands the shared terms to `turningBody` and its acceleration back (see there). */
  private readonly forces = new Float64Array(11);
  private readonly probe: Float64Array;
  private readonly direction = new Float64Array(3);

  constructor(scenario: Scenario, options: Partial<FlightOptions> = {}) {
    this.scenario = scenario;
    this.options = { ...DEFAULT_FLIGHT_OPTIONS, ...options };
    const weather = scenario.weather;
    this.air = this.options.air ?? new AirModel(scenario.site.pad.elevation, weather.temperature, weather.pressure, weather.air);
    this.earth = this.options.earth ?? new EarthModel(scenario.site.pad.lat, scenario.site.pad.elevation);
    this.wind = new MeanWind(weather.wind);
    this.gusts = new GustField();
    this.dragCurve = new DragCurve(scenario.vehicle.drag);
    this.motor = scenario.vehicle.kind === 'rocket' && scenario.vehicle.motor ? new MotorModel(scenario.vehicle.motor) : null;
    this.stopAtKnots = this.motor !== null && this.motor.knots <= 256;
    this.burnTime = this.motor !== null ? this.motor.burnTime : Infinity;
    this.referenceArea = scenario.vehicle.referenceArea;
    this.ground = new GroundHeight(scenario.site.terrain);
    this.recovery = new RecoverySchedule(scenario.vehicle.kind === 'projectile' ? [] : scenario.recovery);
    const v = scenario.vehicle;
    this.rigid = v.kind === 'rocket' && v.shape !== undefined && v.diameter !== undefined && v.motor?.length !== undefined;
    const n = this.rigid ? 15 : 6;
    this.explicit = new Dopri5(n);
    this.stiff = new Rodas(n);
    this.solver = this.explicit;
    this.probe = new Float64Array(n);
    if (this.rigid) {
      const shape = v.shape!;
      const table = aeroTable(shape, v.diameter!);
      const k = this.options.normalForceScale;
      this.b0 = k * table.b0;
      this.b1 = k * table.b1;
      this.b2 = k * table.b2;
      this.f0 = k * table.f0;
      this.f1 = k * table.f1;
      this.f2 = k * table.f2;
      this.motorEnd = shape.motorEnd;
      this.propellantAt = shape.motorEnd - v.motor!.length! / 2;
      this.nominalDryInertia = massLayout(v.mass, v.motor!.propellantMass, shape.cg, shape.inertia, this.propellantAt).dryInertia;
    }
    for (const stepper of [this.explicit, this.stiff]) {
      const atol = stepper.atol;
      atol[0] = atol[1] = atol[2] = this.options.atolPosition;
      atol[3] = atol[4] = atol[5] = this.options.atolVelocity;
      if (this.rigid) {
        atol[6] = atol[7] = atol[8] = this.options.atolAttitude;
        atol[9] = atol[10] = atol[11] = this.options.atolRate;
        atol[12] = atol[13] = atol[14] = this.options.atolAttitude;
      }
      stepper.rtol = this.options.rtol;
    }
  }

  get evaluations(): number {
    return this.explicit.evaluations + this.stiff.evaluations;
  }

  /** Jacobian evaluations of the stiff stepper since construction. */
  get jacobians(): number {
    return this.stiff.jacobians;
  }

  /**
   * Starts the integration afresh from state y at time t (after a jump in the equations) with the
   * stepper this stretch of the flight calls for: the stiff one under a canopy once the motor is
   * out and the rail left (where the equations are autonomous, as the Rosenbrock method needs),
   * the explicit one otherwise.
   */
  private restart(t: number, y: Float64Array): Stepper {
    const motorOut = this.motor === null || t >= this.motor.burnTime;
    const area = this.recovery.activeDragArea;
    let next: Stepper = this.explicit;
    if (area > 0 && motorOut && !this.onRail) {
      // Terminal speed under this stage here, and the rate 2g/v_t at which drag pulls the
      // air-relative velocity back along its line (k|u| = g/v_t across it).
      const g = this.earth.gravityAt(y[2]);
      const vt = Math.sqrt((2 * this.dryMass * g) / (this.air.densityAt(y[2]) * area));
      const rate = (2 * g) / vt;
      const descent = (y[2] - this.ground.at(y[0], y[1])) / vt;
      if (rate >= STIFF_RATE && descent >= STIFF_DESCENT) {
        next = this.stiff;
        // A velocity error across the line decays at g/v_t and moves the landing by the error
        // times v_t/g: weigh it as the position error it becomes.
        const atol = this.stiff.atol;
        atol[3] = atol[4] = atol[5] = Math.max(this.options.atolVelocity, (this.options.atolPosition * g) / vt);
      }
    }
    next.reset(y);
    this.solver = next;
    return next;
  }

  /**
   * ∂a/∂x and ∂a/∂v of the acceleration `derivative` gives, for the stiff stepper, which is used
   * only under a deployed stage (drag area fixed, no thrust, off the rail: the point-mass branch).
   * a = −g(z) ẑ − 2Ω × v − k(z) |u| u with u = v − w(z), k = ρ(z) CdA / (2m):
   * ∂a/∂v = −k (|u| I + u uᵀ/|u|) − 2[Ω]×, and only height enters through x:
   * ∂a/∂z = −k'(z) |u| u + k (|u| I + u uᵀ/|u|) w'(z) − g'(z) ẑ.
   */
  accelerationJacobian(time: Float64Array, y: Float64Array, dadx: Float64Array, dadv: Float64Array): void {
    const z = y[2];
    const w = this.w, ws = this.ws;
    this.wind.at(z, w);
    w[2] = 0;
    this.gusts.addAt(z, w);
    this.wind.slopeAt(z, ws);
    ws[2] = 0;
    this.gusts.addSlopeAt(z, ws);
    const ux = y[3] - w[0], uy = y[4] - w[1], uz = y[5] - w[2];
    const speed = Math.sqrt(ux * ux + uy * uy + uz * uz);
    let propellant = 0;
    if (this.motor !== null) {
      this.motor.evaluate(time[0]);
      propellant = this.motor.propellantNow;
    }
    const mass = this.dryMass + propellant;
    const cda = this.recovery.activeDragArea;
    const k = (this.air.densityAt(z) * cda) / (2 * mass);
    const kz = (this.air.densitySlopeAt(z) * cda) / (2 * mass);
    // D = k (|u| I + u uᵀ / |u|), symmetric.
    const ks = speed > 0 ? k / speed : 0;
    const d00 = k * speed + ks * ux * ux, d11 = k * speed + ks * uy * uy, d22 = k * speed + ks * uz * uz;
    const d01 = ks * ux * uy, d02 = ks * ux * uz, d12 = ks * uy * uz;
    const on2 = 2 * this.earth.omegaNorth, ou2 = 2 * this.earth.omegaUp;
    dadv[0] = -d00; dadv[1] = -d01 + ou2; dadv[2] = -d02 - on2;
    dadv[3] = -d01 - ou2; dadv[4] = -d11; dadv[5] = -d12;
    dadv[6] = -d02 + on2; dadv[7] = -d12; dadv[8] = -d22;
    const kzs = kz * speed;
    dadx[0] = 0; dadx[1] = 0; dadx[2] = -kzs * ux + d00 * ws[0] + d01 * ws[1] + d02 * ws[2];
    dadx[3] = 0; dadx[4] = 0; dadx[5] = -kzs * uy + d01 * ws[0] + d11 * ws[1] + d12 * ws[2];
    dadx[6] = 0; dadx[7] = 0; dadx[8] = -kzs * uz + d02 * ws[0] + d12 * ws[1] + d22 * ws[2] - this.earth.gravitySlopeAt(z);
  }

  /**
   * Equations of motion, one piece for both vehicles (the air-relative velocity, mass and thrust,
   * gravity and Coriolis, drag, and the rail constraint are written once).
   *
   * Point mass: drag on the air-relative velocity; thrust along the rail on it, else along the
   * air-relative velocity (the vehicle weathercocks at once).
   *
   * Rigid body (the format's "vehicle.shape"): y[6..8] the body axis u (nose forward, unit),
   * y[9..11] the angular rate ω (across the axis: no roll), y[12..14] a body-fixed unit vector p
   * across the axis, toward which the misaligned thrust leans. Forces: gravity and Coriolis as the
   * point mass, drag along −v_rel, the normal force −½ρ|v_rel| A ΣCNα v_rel⊥ (= q A CNα sin α
   * against the cross-flow), thrust along cos δ u + sin δ p. Moments about the current balance
   * point: the parts' normal forces at their CPs, aerodynamic and jet damping, the misaligned
   * thrust. On the rail the attitude is held; under a deployed stage the vehicle is the point
   * mass, attitude frozen.
   */
  derivative(time: Float64Array, y: Float64Array, dy: Float64Array): void {
    const t = time[0];
    const z = y[2];
    const w = this.w;
    this.wind.at(z, w);
    w[2] = 0;
    this.gusts.addAt(z, w);
    const vx = y[3] - w[0];
    const vy = y[4] - w[1];
    const vz = y[5] - w[2];
    const speed = Math.sqrt(vx * vx + vy * vy + vz * vz);
    let propellant = 0;
    let thrust = 0;
    const motor = this.motor;
    // After burnout the motor gives no thrust and no propellant is left: skip the curve.
    if (motor !== null && t < this.burnTime) {
      motor.evaluate(t);
      propellant = motor.propellantNow;
      thrust = motor.thrustNow;
    }
    const mass = this.dryMass + propellant;
    const rho = this.air.densityAt(z);
    // Gravity, and Coriolis −2Ω × v on the velocity over the ground (the frame turns with the
    // Earth): Ω × v = (Ωn vu − Ωu vn, Ωu ve, −Ωn ve) with Ω = (0, Ωn, Ωu).
    const on = this.earth.omegaNorth;
    const ou = this.earth.omegaUp;
    let ax = 0 - 2 * (on * y[5] - ou * y[4]);
    let ay = 0 - 2 * (ou * y[3]);
    let az = -this.earth.gravityAt(z) + 2 * (on * y[3]);
    const stageArea = this.recovery.activeDragArea;
    // Under a stage its drag area acts; otherwise the body's drag by Mach number.
    let mach = 0;
    let cda = stageArea;
    if (stageArea <= 0) {
      mach = speed / this.air.speedOfSoundAt(z);
      cda = this.cdScale * this.dragCurve.at(mach) * this.referenceArea;
    }
    // Drag on the air-relative velocity (see physics/drag.ts): −(ρ Cd A / 2m) |v_rel| v_rel.
    const k = ((rho * cda) / (2 * mass)) * speed;
    ax -= k * vx;
    ay -= k * vy;
    az -= k * vz;
    if (this.rigid && stageArea <= 0) {
      const f = this.forces;
      f[0] = ax; f[1] = ay; f[2] = az;
      f[3] = vx; f[4] = vy; f[5] = vz;
      f[6] = speed; f[7] = rho; f[8] = propellant; f[9] = thrust; f[10] = mach;
      this.turningBody(y, dy);
      ax = f[0];
      ay = f[1];
      az = f[2];
    } else {
      // Point mass (or a rigid body under a canopy, attitude frozen).
      if (thrust > 0) {
        const g = thrust / mass;
        if (this.onRail || speed < 1e-9) {
          ax += g * this.railX;
          ay += g * this.railY;
          az += g * this.railZ;
        } else {
          // Off the rail the point mass weathercocks: thrust along the air-relative velocity.
          const gs = g / speed;
          ax += gs * vx;
          ay += gs * vy;
          az += gs * vz;
        }
      }
      if (this.rigid) {
        for (let i = 6; i < 15; i++) dy[i] = 0;
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
   * The rigid body's own terms, off a canopy: the normal force, thrust along the (misaligned) body
   * axis, and the attitude equations. Reads and writes `forces` (the acceleration so far in [0..2],
   * then v_rel, |v_rel|, ρ, propellant, thrust, Mach: passed in an array so that no number is
   * boxed at this call, which the compiler does not inline); writes dy[6..14].
   */
  private turningBody(y: Float64Array, dy: Float64Array): void {
    const f = this.forces;
    const vx = f[3], vy = f[4], vz = f[5];
    const speed = f[6], rho = f[7], propellant = f[8], thrust = f[9], mach = f[10];
    const dry = this.dryMass;
    const mass = dry + propellant;
    const motor = this.motor;
    const A = this.referenceArea;
    // Body axis (renormalised against drift) and the misalignment direction.
    let ux = y[6], uy = y[7], uz = y[8];
    const un = 1 / Math.sqrt(ux * ux + uy * uy + uz * uz);
    ux *= un;
    uy *= un;
    uz *= un;
    const px = y[12], py = y[13], pz = y[14];
    // Balance point and inertia with the propellant left (format: mass rules).
    const xp = this.propellantAt;
    const xcg = (dry * this.dryCg + propellant * xp) / mass;
    // Barrowman sums at this Mach number: Σ CNα, Σ CNα (X − Xcg), Σ CNα (X − Xcg)².
    const k = finMachFactor(mach);
    const c0 = this.b0 + k * this.f0;
    const c1 = this.b1 + k * this.f1;
    const c2 = this.b2 + k * this.f2;
    const s1 = c1 - xcg * c0;
    // Cross-flow: the part of v_rel across the axis.
    const va = vx * ux + vy * uy + vz * uz;
    const cx = vx - va * ux, cy = vy - va * uy, cz = vz - va * uz;
    const hq = 0.5 * rho * speed * A;
    const fn = (hq * c0) / mass;
    let ax = f[0] - fn * cx;
    let ay = f[1] - fn * cy;
    let az = f[2] - fn * cz;
    if (thrust > 0) {
      const g = thrust / mass;
      ax += g * (this.cosMis * ux + this.sinMis * px);
      ay += g * (this.cosMis * uy + this.sinMis * py);
      az += g * (this.cosMis * uz + this.sinMis * pz);
    }
    f[0] = ax;
    f[1] = ay;
    f[2] = az;
    if (this.onRail) {
      for (let i = 6; i < 15; i++) dy[i] = 0;
      return;
    }
    // Moment of the normal forces: ½ρ|v|A Σ CNα_i (X_i − X_cg) (u × v⊥).
    let mx = hq * s1 * (uy * cz - uz * cy);
    let my = hq * s1 * (uz * cx - ux * cz);
    let mz = hq * s1 * (ux * cy - uy * cx);
    if (thrust > 0) {
      // The lateral thrust acts at the nozzle exit: (X_cg − motorEnd) u × (T sin δ p).
      const arm = thrust * this.sinMis * (xcg - this.motorEnd);
      mx += arm * (uy * pz - uz * py);
      my += arm * (uz * px - ux * pz);
      mz += arm * (ux * py - uy * px);
    }
    const wx = y[9], wy = y[10], wz = y[11];
    if (this.options.damping) {
      // Aerodynamic and jet damping on the rate across the axis.
      const s2 = c2 - 2 * xcg * c1 + xcg * xcg * c0;
      const totalImpulse = motor !== null ? motor.totalImpulse : 1;
      const mdot = motor !== null && totalImpulse > 0 ? (motor.propellantMass * thrust) / totalImpulse : 0;
      const jet = this.motorEnd - xcg;
      const c = this.options.dampingScale * (hq * s2 + mdot * jet * jet);
      const wa = wx * ux + wy * uy + wz * uz;
      mx -= c * (wx - wa * ux);
      my -= c * (wy - wa * uy);
      mz -= c * (wz - wa * uz);
    }
    const inertia = this.options.inertiaScale * (this.dryInertia + dry * (this.dryCg - xcg) ** 2 + propellant * (xp - xcg) ** 2);
    const ii = 1 / inertia;
    dy[9] = mx * ii;
    dy[10] = my * ii;
    dy[11] = mz * ii;
    // Body-fixed vectors turn with the body: du/dt = ω × u, dp/dt = ω × p.
    dy[6] = wy * y[8] - wz * y[7];
    dy[7] = wz * y[6] - wx * y[8];
    dy[8] = wx * y[7] - wy * y[6];
    // p matters only with a misalignment; held still otherwise, so its drawn direction cannot
    // change the step sizes (every sample without a misalignment flies the same flight).
    if (this.sinMis !== 0) {
      dy[12] = wy * pz - wz * py;
      dy[13] = wz * px - wx * pz;
      dy[14] = wx * py - wy * px;
    } else {
      dy[12] = dy[13] = dy[14] = 0;
    }
  }

  /**
   * Flies one sample. `normal` draws N(0, 1) from the sample's own stream (for turbulence).
   * Writes the outcome to `out` and returns it.
   */
  fly(inputs: FlightInputs, normal: () => number, out: FlightResult, track: TrackSink | null = null): FlightResult {
    const sc = this.scenario;
    const opts = this.options;
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
    out.apogeeEast = 0;
    out.apogeeNorth = 0;
    out.steps = 0;
    out.maxMach = 0;

    let apogeeReached = false;
    let burning = this.motor !== null;
    const burnTime = this.motor !== null ? this.motor.burnTime : 0;
    const kind = sc.vehicle.kind;
    const dir = this.direction;
    if (kind === 'rocket') {
      launchDirection(inputs.tilt, inputs.azimuth, inputs.leanAcross, true, dir);
      this.railX = dir[0];
      this.railY = dir[1];
      this.railZ = dir[2];
      this.railLength = sc.launch.kind === 'rocket' ? sc.launch.rail : 0;
      this.onRail = this.railLength > 0;
      y0.fill(0);
      if (this.rigid) this.startRigid(inputs, dir, y0);
    } else if (kind === 'projectile') {
      this.onRail = false;
      launchDirection(inputs.elevation, inputs.azimuth, inputs.leanAcross, false, dir);
      // 0, 0 for a launched projectile (draw.ts); a fragment starts where its object broke up.
      y0[0] = inputs.east;
      y0[1] = inputs.north;
      y0[2] = inputs.height;
      y0[3] = inputs.speed * dir[0];
      y0[4] = inputs.speed * dir[1];
      y0[5] = inputs.speed * dir[2];
    } else {
      this.onRail = false;
      launchDirection(0, inputs.heading, 0, false, dir);
      y0[0] = inputs.east;
      y0[1] = inputs.north;
      y0[2] = inputs.height;
      y0[3] = inputs.speed * dir[0];
      y0[4] = inputs.speed * dir[1];
      y0[5] = 0;
    }
    let t = 0;
    out.apogee = y0[2];
    if (track !== null) track(t, y0);
    if (kind !== 'rocket' && y0[5] <= 0) {
      apogeeReached = true;
      out.apogeeEast = y0[0];
      out.apogeeNorth = y0[1];
      recovery.onApogee(t, y0[2]);
      recovery.deployDue(t);
    }
    let solver = this.restart(t, y0);
    let y = solver.y;

    let h = kind === 'rocket' ? 0.01 : 0.05;
    let steps = 0;
    while (true) {
      if (steps >= opts.maxSteps) return this.fail(out, FlightStatus.MAX_STEPS, t, steps);
      // The next moment something happens on the clock: burnout, a timed deployment, the time limit.
      let tNext = opts.maxTime;
      if (burning) tNext = Math.min(tNext, this.stopAtKnots ? this.motor!.nextKnotAfter(t) : burnTime);
      tNext = Math.min(tNext, recovery.nextDeployment());
      let hTry = h;
      const hPlanned = h;
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
            solver = this.solver;
            y = solver.y;
          }
          continue;
        }
        return this.fail(out, FlightStatus.STEP_UNDERFLOW, t, steps);
      }
      steps++;
      if (solver === this.stiff && y[5] < 0) {
        // Under a canopy, end the step a little past where the ground is expected rather than
        // far below it: the wind profile ends at the ground and the Jacobian the Rosenbrock
        // step leans on changes abruptly there, so a longer try is only rejected.
        const reach = (GROUND_REACH * (y[2] - this.ground.at(y[0], y[1]))) / -y[5];
        if (reach < hTry && reach > opts.minStep) {
          hTry = reach;
          hitsClock = false;
        }
      }
      const err = solver.attempt(this, t, hTry);
      if (!(err <= 1)) {
        if (!Number.isFinite(err) && hTry <= opts.minStep * 16) return this.fail(out, FlightStatus.NON_FINITE, t, steps);
        h = solver.nextAfterReject(hTry, err);
        continue;
      }
      const yNew = solver.yNew;
      if (!allFinite(yNew)) return this.fail(out, FlightStatus.NON_FINITE, t, steps);
      const tNew = hitsClock ? tNext : t + hTry;
      const yPrevZ = y[2];
      // Height above the ground under the object (the pad's level without terrain).
      const yPrevG = y[2] - this.ground.at(y[0], y[1]);
      const yPrevVz = y[5];
      const yPrevS = this.onRail ? y[0] * this.railX + y[1] * this.railY + y[2] * this.railZ : 0;
      solver.accept();
      h = solver.nextAfterAccept(hTry, err);
      if (this.rigid) this.trackMach(y, out);

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
        // Ground contact from the very first step: a flight that starts on the ground and moves
        // down lands where it first goes below it (at once), rather than flying underground. The
        // ground is the terrain under the object (level at the pad without terrain).
        const g = y[2] - this.ground.at(y[0], y[1]);
        if ((g <= 0 && yPrevG > 0) || (g < 0 && yPrevG === 0)) {
          const te = this.locate(EV_GROUND, 0, t, tNew, yPrevG, g);
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
        if (hitsClock) {
          if (this.isDiscontinuity(t, burning, burnTime)) {
            if (this.clockEvent(t, out, steps)) return out;
            burning = burning && t < burnTime;
            solver = this.solver;
            y = solver.y;
            h = solver.initialStep(this, t, Math.min(h, 0.05), opts.maxTime - t);
          } else if (h < hPlanned) {
            // A thrust-curve point only cut this step short: carry on with the step planned before.
            h = hPlanned;
          }
        }
        continue;
      }

      // Move to the event on the dense output and restart the integration there.
      const ye = this.probe;
      const dragBefore = recovery.activeDragArea;
      solver.dense(tEvent, ye);
      t = tEvent;
      if (ye[2] > out.apogee) out.apogee = ye[2];
      if (event === EV_GROUND) {
        ye[2] = this.ground.at(ye[0], ye[1]);
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
        out.apogeeEast = ye[0];
        out.apogeeNorth = ye[1];
        recovery.deployDue(t);
      } else {
        recovery.onAltitude(event - EV_STAGE, t);
        recovery.deployDue(t);
      }
      if (track !== null) track(t, ye);
      solver = this.restart(t, ye);
      y = solver.y;
      // Leaving the rail and a stage's drag make the derivative jump: choose a first step afresh.
      // The apogee is only a moment of the flight (smooth there): keep the step size.
      if (event !== EV_APOGEE || recovery.activeDragArea !== dragBefore) h = solver.initialStep(this, t, Math.min(h, 0.05), opts.maxTime - t);
    }
  }

  /**
   * Per-sample mass layout and the initial attitude: the axis along the rail, no rate, and the
   * misalignment direction p at `misalignmentDirection` degrees around the axis, clockwise seen
   * from behind, from the axis-normal direction nearest north (east for an axis along north).
   */
  private startRigid(inputs: FlightInputs, rail: Float64Array, y0: Float64Array): void {
    const v = this.scenario.vehicle;
    const shape = v.shape!;
    const mp = v.motor!.propellantMass;
    const cg = inputs.cg === inputs.cg ? inputs.cg : shape.cg;
    const dry = this.dryMass;
    this.dryCg = ((dry + mp) * cg - mp * this.propellantAt) / dry;
    // The dry rocket's own inertia scales with its drawn mass (the shape stays).
    this.dryInertia = (this.nominalDryInertia * dry) / v.mass;
    this.sinMis = Math.sin(inputs.misalignment * DEG);
    this.cosMis = Math.cos(inputs.misalignment * DEG);
    const ux = rail[0], uy = rail[1], uz = rail[2];
    // a: north (or east) with its part along the axis removed; b = a × u.
    let rx = 0, ry = 1, rz = 0;
    if (Math.abs(uy) > 0.9) { rx = 1; ry = 0; }
    const along = rx * ux + ry * uy + rz * uz;
    let ax = rx - along * ux, ay = ry - along * uy, az = rz - along * uz;
    const an = 1 / Math.sqrt(ax * ax + ay * ay + az * az);
    ax *= an;
    ay *= an;
    az *= an;
    const bx = ay * uz - az * uy, by = az * ux - ax * uz, bz = ax * uy - ay * ux;
    const c = Math.cos(inputs.misalignmentDirection * DEG);
    const s = Math.sin(inputs.misalignmentDirection * DEG);
    y0[6] = ux;
    y0[7] = uy;
    y0[8] = uz;
    y0[9] = y0[10] = y0[11] = 0;
    y0[12] = c * ax + s * bx;
    y0[13] = c * ay + s * by;
    y0[14] = c * az + s * bz;
  }

  /** Highest Mach number over the accepted steps (the stability estimates are subsonic). */
  private trackMach(y: Float64Array, out: FlightResult): void {
    const w = this.w;
    this.wind.at(y[2], w);
    const vx = y[3] - w[0], vy = y[4] - w[1], vz = y[5];
    const mach = Math.sqrt(vx * vx + vy * vy + vz * vz) / this.air.speedOfSoundAt(y[2]);
    if (mach > out.maxMach) out.maxMach = mach;
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
    this.restart(t, this.solver.y);
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
      case EV_GROUND:
        return s.denseComponent(2, t) - this.ground.at(s.denseComponent(0, t), s.denseComponent(1, t));
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
