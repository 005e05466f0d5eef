import type { Scenario, Spread, UncertaintyName } from '../scenario/types.js';
import { UNCERTAINTY_NAMES } from '../scenario/types.js';
import type { FlightInputs } from '../flight/inputs.js';
import { drydenAt, sigmaWFromGustRatio, sigmaWFromW20 } from '../physics/dryden.js';
import { referenceSpeed, type MeanWind } from '../physics/wind.js';
import { RHO_SEA_LEVEL, G0 } from '../physics/constants.js';
import { spreadOffset } from './spreads.js';
import type { SampleStream } from './random.js';
import type { ModePlan } from './modes.js';
import { ReleaseRoute } from './release-route.js';

/** Height of the Dryden reference wind W20, m (20 ft). */
const W20_HEIGHT = 6.096;

/**
 * Nominal values of each spread parameter, and how a drawn value becomes a flight input.
 * Computed once per scenario.
 */
export class InputDrawer {
  private readonly scenario: Scenario;
  private readonly spreads: (Spread | undefined)[];
  private readonly nominal: Float64Array;
  /** Stage index of each failure mode's stopped stage (−1: all). */
  private readonly modeStops: Int16Array[];
  /** Release along a path or over an area: its uniforms are drawn after every other draw. */
  private readonly route: ReleaseRoute | null;
  /** Dryden σ_u/σ_w at the wind's reference height, for the gust-based turbulence strength. */
  private readonly gustRatio: number;

  constructor(scenario: Scenario, plan: ModePlan) {
    this.scenario = scenario;
    this.gustRatio = drydenAt(scenario.weather.wind.height).sigmaRatioU;
    this.spreads = UNCERTAINTY_NAMES.map((n) => scenario.uncertainty[n]);
    this.nominal = Float64Array.from(UNCERTAINTY_NAMES.map((n) => nominalValue(scenario, n)));
    this.route = scenario.launch.kind === 'release' ? ReleaseRoute.of(scenario.launch, scenario.site) : null;
    const stageNames = scenario.recovery.map((s) => s.name);
    this.modeStops = plan.stops.map((stop) => {
      if (stop === '') return new Int16Array(0);
      if (stop === 'all') return Int16Array.from(stageNames.map((_, i) => i));
      return Int16Array.from([stageNames.indexOf(stop)].filter((i) => i >= 0));
    });
  }

  /**
   * Draws one sample's inputs. Every parameter consumes exactly one uniform, in the fixed order of
   * UNCERTAINTY_NAMES, whether or not it has a spread; then, always consumed and in this order, the
   * direction of a thrust misalignment around the body axis and the launch lean across the plane
   * of the nominal lean; turbulence draws come after.
   */
  draw(stream: SampleStream, mode: number, wind: MeanWind, inputs: FlightInputs): void {
    const sc = this.scenario;
    const v = drawScratch;
    readSpreadUniforms(stream, uniformScratch);
    for (let i = 0; i < UNCERTAINTY_NAMES.length; i++) {
      const spread = this.spreads[i];
      v[i] = spread === undefined ? this.nominal[i] : this.nominal[i] + spreadOffset(spread, this.nominal[i], uniformScratch[i]);
    }
    const misalignmentDirection = stream.uniform();
    const acrossUniform = stream.uniform();
    const launch = sc.launch;
    inputs.windSpeed = Math.max(0, v[0]);
    inputs.windTurn = v[1] - sc.weather.wind.from;
    inputs.misalignmentDirection = 360 * misalignmentDirection;
    // The lean is never clamped: a draw past the vertical leans the other way (the flight turns
    // the two angles into a direction), so a vertical launch scatters round about the pad.
    inputs.tilt = v[3];
    inputs.azimuth = v[4];
    inputs.heading = v[4];
    inputs.speed = Math.max(0, v[5]);
    inputs.elevation = v[6];
    const lean = this.spreads[launch.kind === 'rocket' ? 3 : 6];
    inputs.leanAcross = lean !== undefined && launch.kind !== 'release' ? spreadOffset(lean, 0, acrossUniform) : 0;
    inputs.height = Math.max(0, v[7]);
    inputs.east = launch.kind === 'release' ? launch.east : 0;
    inputs.north = launch.kind === 'release' ? launch.north : 0;
    const impulse = this.nominal[8];
    inputs.impulseScale = impulse > 0 ? Math.max(0, v[8] / impulse) : 1;
    inputs.mass = Math.max(1e-3 * sc.vehicle.mass, v[9]);
    inputs.cdScale = Math.max(0.01, v[10] / this.nominal[10]);
    inputs.delayOffset = v[11] - this.nominal[11];
    inputs.rateFactor = this.nominal[12] > 0 ? Math.max(0.05, v[12] / this.nominal[12]) : 1;
    // A drawn misalignment below 0 is the same tilt of the thrust line turned half round.
    inputs.misalignment = v[13];
    inputs.cg = v[14];

    // Last of all the uniforms: where along the route or in the area the object is released.
    const route = this.route;
    if (route !== null) {
      route.place(stream);
      inputs.east = route.east;
      inputs.north = route.north;
      // A launch.azimuth spread turns the heading the route gives.
      inputs.heading = route.heading + (v[4] - this.nominal[4]);
    }

    // Turbulence strength: from the gust when one is given, else the Dryden light default.
    if (!sc.weather.turbulence) inputs.sigmaW = 0;
    else {
      wind.setSample(inputs.windSpeed, inputs.windTurn);
      const gust = sc.weather.wind.gust !== undefined || sc.uncertainty['wind.gust'] !== undefined ? v[2] : NaN;
      inputs.sigmaW =
        gust === gust
          ? sigmaWFromGustRatio(gust, inputs.windSpeed, this.gustRatio)
          : sigmaWFromW20(wind.speedAt(W20_HEIGHT));
    }

    inputs.skipStage.fill(0);
    const stops = this.modeStops[mode];
    for (let i = 0; i < stops.length; i++) inputs.skipStage[stops[i]] = 1;
  }
}

const drawScratch = new Float64Array(UNCERTAINTY_NAMES.length);
const uniformScratch = new Float64Array(UNCERTAINTY_NAMES.length);

/**
 * The uniform numbers a sample's spreads are drawn from, one per name of UNCERTAINTY_NAMES in that
 * order: the first draws of the sample's stream. Sensitivity analysis reads them back this way.
 */
export function readSpreadUniforms(stream: SampleStream, out: Float64Array): void {
  for (let i = 0; i < UNCERTAINTY_NAMES.length; i++) out[i] = stream.uniform();
}

/** The nominal value of a spread parameter in the scenario (0 where it does not apply). */
export function nominalValue(sc: Scenario, name: UncertaintyName): number {
  const l = sc.launch;
  const w = sc.weather.wind;
  switch (name) {
    case 'wind.speed':
      return referenceSpeed(w);
    case 'wind.from':
      return w.from;
    case 'wind.gust':
      return w.gust ?? referenceSpeed(w);
    case 'launch.tilt':
      return l.kind === 'rocket' ? l.tilt : 0;
    case 'launch.azimuth':
      return l.kind === 'rocket' || l.kind === 'projectile' ? l.azimuth : l.heading;
    case 'launch.speed':
      return l.kind === 'rocket' ? 0 : l.speed;
    case 'launch.elevation':
      return l.kind === 'projectile' ? l.elevation : 0;
    case 'launch.height':
      return l.kind === 'rocket' ? 0 : l.height;
    case 'motor.impulse':
      return sc.vehicle.motor ? totalImpulse(sc.vehicle.motor.thrust.time, sc.vehicle.motor.thrust.thrust) : 0;
    case 'vehicle.mass':
      return sc.vehicle.mass;
    case 'vehicle.drag':
      return sc.vehicle.drag.cd[0];
    case 'recovery.delay':
      return sc.recovery.length > 0 ? sc.recovery.reduce((s, r) => s + r.delay, 0) / sc.recovery.length : 0;
    case 'motor.misalignment':
      return 0;
    case 'vehicle.cg':
      return sc.vehicle.shape?.cg ?? 0;
    case 'recovery.rate': {
      // The sea-level descent rate of the last stage stands for all stages; every drag area is
      // scaled by (nominal / drawn)², which scales every stage's descent rate by the same factor.
      const last = sc.recovery[sc.recovery.length - 1];
      return last ? Math.sqrt((2 * sc.vehicle.mass * G0) / (RHO_SEA_LEVEL * last.dragArea)) : 0;
    }
  }
}

function totalImpulse(time: number[], thrust: number[]): number {
  let s = 0;
  for (let i = 1; i < time.length; i++) s += 0.5 * (thrust[i] + thrust[i - 1]) * (time[i] - time[i - 1]);
  return s;
}
