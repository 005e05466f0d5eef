import type { Scenario } from '../scenario/types.js';
import { FlightModel, emptyResult, type FlightOptions, type FlightResult, type TrackSink } from '../flight/flight.js';
import { emptyInputs, type FlightInputs } from '../flight/inputs.js';
import { SampleStream } from './random.js';
import { planModes, modeOfSample, type ModePlan } from './modes.js';
import { InputDrawer } from './draw.js';
import { BreakupFlyer, piecesPerSample } from './breakup.js';

/** Landing results of a contiguous range of samples, as typed arrays indexed from `start`. */
export interface ChunkResult {
  start: number;
  count: number;
  east: Float64Array;
  north: Float64Array;
  apogee: Float64Array;
  flightTime: Float64Array;
  impactSpeed: Float64Array;
  /** Impact angle above the horizontal, deg. */
  impactAngle: Float64Array;
  /** Mass that lands, kg. */
  impactMass: Float64Array;
  mode: Uint8Array;
  /** FlightStatus code: 0 landed; anything else a failed sample. */
  status: Uint8Array;
  /** Integrator steps per flight. */
  steps: Uint32Array;
  /** 1 when the object broke up (scenario `breakup`): its landings are its pieces'. */
  broken: Uint8Array;
  // Per piece, `pieces` entries per sample (sample-major; none without a breakup): see breakup.ts.
  pieceEast: Float64Array;
  pieceNorth: Float64Array;
  pieceFlightTime: Float64Array;
  pieceImpactSpeed: Float64Array;
  pieceImpactAngle: Float64Array;
  /** FlightStatus of each piece, or PIECE_NOT_FLOWN (255) when its sample did not break up. */
  pieceStatus: Uint8Array;
}

/** Columns for samples [start, start + count); `pieces` per sample for the piece columns. */
export function allocateChunk(start: number, count: number, pieces = 0): ChunkResult {
  const p = count * pieces;
  return {
    start,
    count,
    east: new Float64Array(count),
    north: new Float64Array(count),
    apogee: new Float64Array(count),
    flightTime: new Float64Array(count),
    impactSpeed: new Float64Array(count),
    impactAngle: new Float64Array(count),
    impactMass: new Float64Array(count),
    mode: new Uint8Array(count),
    status: new Uint8Array(count),
    steps: new Uint32Array(count),
    broken: new Uint8Array(count),
    pieceEast: new Float64Array(p),
    pieceNorth: new Float64Array(p),
    pieceFlightTime: new Float64Array(p),
    pieceImpactSpeed: new Float64Array(p),
    pieceImpactAngle: new Float64Array(p),
    pieceStatus: new Uint8Array(p),
  };
}

/**
 * Flies the samples of one run. A sample's result depends only on the scenario, the seed, the
 * total sample count (which fixes the mode plan) and its index, never on which chunk it is in.
 */
export class DispersionRunner {
  readonly scenario: Scenario;
  readonly samples: number;
  readonly seed: string;
  readonly plan: ModePlan;
  private readonly model: FlightModel;
  private readonly drawer: InputDrawer;
  private readonly stream = new SampleStream();
  private readonly inputs: FlightInputs;
  private readonly result: FlightResult = emptyResult();
  private readonly normal: () => number;
  /** Flies the pieces of a sample that breaks up (null without a breakup: nothing more is drawn). */
  private readonly breakup: BreakupFlyer | null;
  private broke = false;

  constructor(scenario: Scenario, options: { samples?: number; seed?: string; flight?: Partial<FlightOptions> } = {}) {
    this.scenario = scenario;
    this.samples = options.samples ?? scenario.run.samples;
    this.seed = options.seed ?? scenario.run.seed;
    this.plan = planModes(scenario.failures, this.samples);
    this.model = new FlightModel(scenario, options.flight);
    this.drawer = new InputDrawer(scenario, this.plan);
    this.inputs = emptyInputs(scenario.recovery.length);
    const stream = this.stream;
    // One closure for the runner's lifetime, not one per sample.
    this.normal = () => stream.normal();
    this.breakup = scenario.breakup ? new BreakupFlyer(scenario, this.plan, this.model, stream, options.flight) : null;
  }

  /** Flies samples [start, start + count) into a fresh chunk (or into `into`). */
  runChunk(start: number, count: number, into: ChunkResult = allocateChunk(start, count, piecesPerSample(this.scenario))): ChunkResult {
    for (let j = 0; j < count; j++) {
      const index = start + j;
      const mode = modeOfSample(this.plan, index);
      const r = this.flySample(index, mode);
      into.east[j] = r.east;
      into.north[j] = r.north;
      into.apogee[j] = r.apogee;
      into.flightTime[j] = r.flightTime;
      into.impactSpeed[j] = r.impactSpeed;
      into.impactAngle[j] = r.impactAngle;
      into.impactMass[j] = r.impactMass;
      into.mode[j] = mode;
      into.status[j] = r.status;
      into.steps[j] = r.steps;
      const b = this.breakup;
      if (b !== null) {
        into.broken[j] = this.broke ? 1 : 0;
        const at = j * b.pieces;
        into.pieceEast.set(b.east, at);
        into.pieceNorth.set(b.north, at);
        into.pieceFlightTime.set(b.flightTime, at);
        into.pieceImpactSpeed.set(b.impactSpeed, at);
        into.pieceImpactAngle.set(b.impactAngle, at);
        into.pieceStatus.set(b.status, at);
      }
    }
    return into;
  }

  /** Flies one sample with its own stream; the result object is reused by the next call. */
  flySample(index: number, mode: number, track: TrackSink | null = null): FlightResult {
    this.stream.select(this.seed, index);
    this.drawer.draw(this.stream, mode, this.model.wind, this.inputs);
    const b = this.breakup;
    this.broke = false;
    if (b === null) return this.model.fly(this.inputs, this.normal, this.result, track);
    b.begin();
    // A ground track (track given) shows the object's own flight, whole.
    if (track !== null || !b.breaksIn(mode)) return this.model.fly(this.inputs, this.normal, this.result, track);
    this.model.fly(this.inputs, b.loggingNormal, this.result, b.sink);
    this.broke = b.finish(mode, this.inputs, this.result);
    return this.result;
  }
}

/**
 * The nominal flight: every input at its nominal value, no turbulence, no failure. Used for the
 * rail-exit-speed warning and the ground track.
 */
export function flyNominal(scenario: Scenario, track: TrackSink | null = null, flight?: Partial<FlightOptions>): FlightResult {
  const calm: Scenario = { ...scenario, uncertainty: {}, failures: [], weather: { ...scenario.weather, turbulence: false } };
  const runner = new DispersionRunner(calm, { samples: 1, flight });
  return { ...runner.flySample(0, 0, track) };
}
