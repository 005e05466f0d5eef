import type { Breakup, Scenario } from '../scenario/types.js';
import { FlightModel, emptyResult, type FlightOptions, type FlightResult, type TrackSink } from '../flight/flight.js';
import { emptyInputs, type FlightInputs } from '../flight/inputs.js';
import { FlightStatus } from '../flight/status.js';
import type { SampleStream } from './random.js';
import type { ModePlan } from './modes.js';

/** Piece status of a sample that did not break up (its pieces were never flown). */
export const PIECE_NOT_FLOWN = 255;

/** Pieces each sample yields: Σ count over the fragment classes (0 without a breakup). */
export function piecesPerSample(scenario: Pick<Scenario, 'breakup'>): number {
  return scenario.breakup ? scenario.breakup.fragments.reduce((s, f) => s + f.count, 0) : 0;
}

/** Class index of every piece slot of a sample: classes in file order, `count` slots each. */
export function pieceClasses(breakup: Breakup): Uint8Array {
  const out = new Uint8Array(breakup.fragments.reduce((s, f) => s + f.count, 0));
  let k = 0;
  breakup.fragments.forEach((f, c) => {
    for (let i = 0; i < f.count; i++) out[k++] = c;
  });
  return out;
}

/** When each mode breaks up: NaN never (effect 'skip'), −1 at the breakup's own trigger, else that time. */
export function breakTimes(breakup: Breakup, scenario: Pick<Scenario, 'failures'>, plan: ModePlan): Float64Array {
  return Float64Array.from(plan.names, (_, m) => {
    if (m === 0) return -1;
    const f = scenario.failures[m - 1];
    if (f === undefined || f.stage !== breakup.name) return -1;
    return f.effect === 'early' ? (f.time ?? NaN) : NaN;
  });
}

/**
 * Breakup of one sample into its fragment classes, and the flights of the pieces.
 *
 * The object's flight is flown as usual, with a track sink (the flight API's per-step callback)
 * that records every accepted state and its acceleration; the break state at the break time T
 * is the cubic Hermite interpolant of position and velocity between the two recorded states
 * around T (exact at a recorded state, so a break at apogee takes the apogee state the flight
 * located). The object's flight after T is not used.
 *
 * Every piece then flies as a point mass of its class (own mass, drag coefficient and area, no
 * recovery) from the break position with the object's velocity plus `speed` in a direction
 * uniform over the sphere (two uniforms per piece, cos θ = 2u₁ − 1, φ = 2πu₂). Draw order: the
 * pieces' uniforms come after every draw of the object's flight (its spreads and its turbulence),
 * class by class in file order; a scenario without a breakup draws nothing more. The pieces fly
 * through the turbulence the object flew through: the object's gust draws are logged and
 * replayed to each piece's gust field (one field per sample, as for the object); a piece that
 * climbs above every height the field has reached draws the field's next nodes from the stream
 * after all the piece uniforms, logged, so later pieces see the same air.
 *
 * Typed arrays reused between samples; one closure each for the sink and the two normal streams
 * for the flyer's lifetime, none per sample.
 */
export class BreakupFlyer {
  readonly breakup: Breakup;
  /** Pieces per sample. */
  readonly pieces: number;
  readonly classOf: Uint8Array;
  /** Per mode: NaN no breakup, −1 at the trigger, else the time of an 'early' breakup. */
  readonly modeBreak: Float64Array;
  private readonly models: FlightModel[];
  private readonly pieceInputs: FlightInputs = emptyInputs(0);
  private readonly pieceResult: FlightResult = emptyResult();
  private readonly stream: SampleStream;
  private readonly parent: FlightModel;

  // The object's recorded track: time, state (6) and acceleration (3) per accepted step.
  private tt = new Float64Array(256);
  private ys = new Float64Array(256 * 6);
  private as = new Float64Array(256 * 3);
  private n = 0;
  private readonly dy: Float64Array;
  /** The time handed to the model's derivative (a one-element array, as the stepper does). */
  private readonly time = new Float64Array(1);
  readonly sink: TrackSink;

  // The object's gust normals, replayed to the pieces.
  private log = new Float64Array(1024);
  private logged = 0;
  private cursor = 0;
  readonly loggingNormal: () => number;
  private readonly replayNormal: () => number;

  /** Break state of the current sample: t, east, north, up, v_east, v_north, v_up. */
  readonly state = new Float64Array(7);
  /** Highest point of the object up to the break, m above the pad. */
  private riseTop = 0;
  // Per piece of the current sample.
  readonly east: Float64Array;
  readonly north: Float64Array;
  readonly flightTime: Float64Array;
  readonly impactSpeed: Float64Array;
  readonly impactAngle: Float64Array;
  readonly status: Uint8Array;
  private readonly apogee: Float64Array;
  private readonly dirScratch: Float64Array;

  constructor(scenario: Scenario, plan: ModePlan, parent: FlightModel, stream: SampleStream, flight?: Partial<FlightOptions>) {
    const breakup = scenario.breakup;
    if (breakup === undefined) throw new Error('internal error: a breakup flyer for a scenario without a breakup');
    this.breakup = breakup;
    this.classOf = pieceClasses(breakup);
    this.pieces = this.classOf.length;
    this.modeBreak = breakTimes(breakup, scenario, plan);
    this.parent = parent;
    this.stream = stream;
    this.dy = new Float64Array(parent.rigid ? 15 : 6);
    // One point-mass model per class: the scenario's site and weather, the piece's own drag.
    this.models = breakup.fragments.map(
      (f) =>
        new FlightModel(
          {
            ...scenario,
            vehicle: { kind: 'projectile', mass: f.mass, referenceArea: f.referenceArea, drag: { mach: [0], cd: [f.drag] } },
            launch: { kind: 'projectile', speed: 0, elevation: 0, azimuth: 0, height: 0 },
            recovery: [],
            failures: [],
            uncertainty: {},
          },
          flight,
        ),
    );
    const n = this.pieces;
    this.east = new Float64Array(n);
    this.north = new Float64Array(n);
    this.flightTime = new Float64Array(n);
    this.impactSpeed = new Float64Array(n);
    this.impactAngle = new Float64Array(n);
    this.status = new Uint8Array(n).fill(PIECE_NOT_FLOWN);
    this.apogee = new Float64Array(n);
    this.dirScratch = new Float64Array(3 * n);
    this.sink = (t, y) => this.record(t, y);
    this.loggingNormal = () => this.push(this.stream.normal());
    this.replayNormal = () => (this.cursor < this.logged ? this.log[this.cursor++] : (this.cursor++, this.push(this.stream.normal())));
  }

  /** Whether samples of this mode are flown with the breakup machinery. */
  breaksIn(mode: number): boolean {
    return !Number.isNaN(this.modeBreak[mode]);
  }

  /**
   * Starts a sample: empties the recorded track and the gust log, marks every piece not flown
   * (NaN figures, so nothing of an earlier sample is left in its columns).
   */
  begin(): void {
    this.n = 0;
    this.logged = 0;
    this.status.fill(PIECE_NOT_FLOWN);
    this.east.fill(NaN);
    this.north.fill(NaN);
    this.flightTime.fill(NaN);
    this.impactSpeed.fill(NaN);
    this.impactAngle.fill(NaN);
  }

  /**
   * After the object's flight (flown with `sink` and `loggingNormal`): finds the break, flies the
   * pieces, and rewrites `result` for the sample as a whole. Returns whether the object broke up.
   *
   * A broken sample's own figures: position, impact speed, angle, mass and flight time of its
   * piece that landed farthest from the pad (so the farthest landing and the sensitivity see the
   * pieces), apogee the highest point of the object or any piece, steps the sum of all flights;
   * it counts as landed when at least one piece landed. An object that lands (or fails) before
   * its break time lands whole.
   */
  finish(mode: number, inputs: FlightInputs, result: FlightResult): boolean {
    if (result.status !== FlightStatus.LANDED) return false;
    const rule = this.modeBreak[mode];
    const b = this.breakup;
    const T = rule >= 0 ? rule : b.trigger === 'time' ? (b.time ?? 0) : result.apogeeTime + b.delay;
    if (!(T < result.flightTime) || !this.stateAt(T)) return false;
    const s = this.state;
    const parentSteps = result.steps;
    // Every piece's direction first (the draw order is fixed whatever the flights do).
    const dirs = this.directions();
    const input = this.pieceInputs;
    input.windSpeed = inputs.windSpeed;
    input.windTurn = inputs.windTurn;
    input.sigmaW = inputs.sigmaW;
    input.east = s[1];
    input.north = s[2];
    input.height = Math.max(0, s[3]);
    input.leanAcross = 0;
    input.cdScale = 1;
    let far = -1;
    let farDistance = -1;
    let top = this.riseTop;
    let steps = parentSteps;
    for (let p = 0; p < this.pieces; p++) {
      const f = b.fragments[this.classOf[p]];
      const ve = s[4] + f.speed * dirs[3 * p];
      const vn = s[5] + f.speed * dirs[3 * p + 1];
      const vu = s[6] + f.speed * dirs[3 * p + 2];
      const horizontal = Math.hypot(ve, vn);
      input.speed = Math.hypot(horizontal, vu);
      input.elevation = (Math.atan2(vu, horizontal) * 180) / Math.PI;
      input.azimuth = (Math.atan2(ve, vn) * 180) / Math.PI;
      input.mass = f.mass;
      this.cursor = 0;
      const r = this.models[this.classOf[p]].fly(input, this.replayNormal, this.pieceResult, null);
      steps += r.steps;
      this.status[p] = r.status;
      this.east[p] = r.east;
      this.north[p] = r.north;
      this.flightTime[p] = T + r.flightTime;
      this.impactSpeed[p] = r.impactSpeed;
      this.impactAngle[p] = r.impactAngle;
      this.apogee[p] = r.apogee;
      if (r.status !== FlightStatus.LANDED) continue;
      if (r.apogee > top) top = r.apogee;
      const d = Math.hypot(r.east, r.north);
      if (d > farDistance) {
        farDistance = d;
        far = p;
      }
    }
    result.apogee = top;
    result.steps = steps;
    if (far < 0) {
      // No piece landed: the sample failed as its first piece did.
      result.status = this.status[0];
      return true;
    }
    const f = b.fragments[this.classOf[far]];
    result.east = this.east[far];
    result.north = this.north[far];
    result.flightTime = this.flightTime[far];
    result.impactSpeed = this.impactSpeed[far];
    result.impactAngle = this.impactAngle[far];
    result.impactMass = f.mass;
    return true;
  }

  /** Unit directions (east, north, up) of every piece, uniform over the sphere, from the stream. */
  private directions(): Float64Array {
    const out = this.dirScratch;
    for (let p = 0; p < this.pieces; p++) {
      const z = 2 * this.stream.uniform() - 1;
      const phi = 2 * Math.PI * this.stream.uniform();
      const r = Math.sqrt(Math.max(0, 1 - z * z));
      out[3 * p] = r * Math.cos(phi);
      out[3 * p + 1] = r * Math.sin(phi);
      out[3 * p + 2] = z;
    }
    return out;
  }

  /** Break state at time T into `state`, from the recorded track; false when T is outside it. */
  private stateAt(T: number): boolean {
    const n = this.n;
    if (n === 0 || T < this.tt[0] || T > this.tt[n - 1]) return false;
    // The last recorded state at or before T.
    let k = n - 1;
    while (k > 0 && this.tt[k] > T) k--;
    const s = this.state;
    s[0] = T;
    let top = 0;
    for (let i = 0; i <= k; i++) if (this.ys[6 * i + 2] > top) top = this.ys[6 * i + 2];
    if (this.tt[k] === T || k === n - 1) {
      for (let c = 0; c < 6; c++) s[1 + c] = this.ys[6 * k + c];
    } else {
      hermiteState(this.tt, this.ys, this.as, k, T, s);
    }
    this.riseTop = Math.max(top, s[3]);
    return true;
  }

  private record(t: number, y: Float64Array): void {
    const n = this.n;
    if (n === this.tt.length) this.grow();
    this.tt[n] = t;
    for (let c = 0; c < 6; c++) this.ys[6 * n + c] = y[c];
    // The acceleration at this state, for the Hermite interpolant of the velocity.
    this.time[0] = t;
    this.parent.derivative(this.time, y, this.dy);
    this.as[3 * n] = this.dy[3];
    this.as[3 * n + 1] = this.dy[4];
    this.as[3 * n + 2] = this.dy[5];
    this.n = n + 1;
  }

  private grow(): void {
    const size = this.tt.length * 2;
    const tt = new Float64Array(size);
    tt.set(this.tt);
    const ys = new Float64Array(size * 6);
    ys.set(this.ys);
    const as = new Float64Array(size * 3);
    as.set(this.as);
    this.tt = tt;
    this.ys = ys;
    this.as = as;
  }

  private push(v: number): number {
    if (this.logged === this.log.length) {
      const log = new Float64Array(this.log.length * 2);
      log.set(this.log);
      this.log = log;
    }
    this.log[this.logged++] = v;
    return v;
  }
}

/**
 * Cubic Hermite interpolation of position (with the velocities as slopes) and of velocity (with
 * the accelerations as slopes) between recorded states k and k + 1, at time T; into out[1..6].
 */
export function hermiteState(t: Float64Array, y: Float64Array, a: Float64Array, k: number, T: number, out: Float64Array): void {
  const h = t[k + 1] - t[k];
  const s = (T - t[k]) / h;
  const s2 = s * s;
  const s3 = s2 * s;
  const h00 = 2 * s3 - 3 * s2 + 1;
  const h10 = s3 - 2 * s2 + s;
  const h01 = -2 * s3 + 3 * s2;
  const h11 = s3 - s2;
  for (let c = 0; c < 3; c++) {
    const p0 = y[6 * k + c];
    const p1 = y[6 * (k + 1) + c];
    const v0 = y[6 * k + 3 + c];
    const v1 = y[6 * (k + 1) + 3 + c];
    out[1 + c] = h00 * p0 + h10 * h * v0 + h01 * p1 + h11 * h * v1;
    out[4 + c] = h00 * v0 + h10 * h * a[3 * k + c] + h01 * v1 + h11 * h * a[3 * (k + 1) + c];
  }
}

/**
 * Pieces of the run's broken samples that failed to fly to the ground (never written as
 * landings), with the reasons by status code: their share lowers the expected counts.
 */
export function failedPieces(run: { count: number; status: Uint8Array; broken: Uint8Array; pieceStatus: Uint8Array }): { flown: number; failed: Map<number, number> } {
  const pieces = run.count > 0 ? run.pieceStatus.length / run.count : 0;
  const failed = new Map<number, number>();
  let flown = 0;
  for (let i = 0; i < run.count; i++) {
    if (run.broken[i] !== 1) continue;
    for (let p = 0; p < pieces; p++) {
      const s = run.pieceStatus[i * pieces + p];
      if (s === PIECE_NOT_FLOWN) continue;
      flown++;
      if (s !== FlightStatus.LANDED) failed.set(s, (failed.get(s) ?? 0) + 1);
    }
  }
  return { flown, failed };
}
