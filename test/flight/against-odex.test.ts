import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs, type FlightInputs } from '../../src/flight/inputs.js';
import { FlightStatus } from '../../src/flight/status.js';
import { SampleStream } from '../../src/dispersion/random.js';
import type { ReleaseLaunch, Scenario } from '../../src/scenario/types.js';
import { ReleaseRoute } from '../../src/dispersion/release-route.js';
import { body, scenario } from '../helpers/build.js';
import { odexFlight } from '../reference/odex-flight.js';

// Reference: the same equations integrated by the npm `odex` package (Hairer & Wanner's ODEX
// extrapolation code, Solving Ordinary Differential Equations I) at tolerance 1e-11.

/** An invented mid-power rocket: Mach-dependent drag, a drogue at apogee + 1 s, a main at 150 m. */
function rocket(windFrom: number, windSpeed: number, tilt: number): Scenario {
  return scenario({
    vehicle: {
      kind: 'rocket',
      mass: 1.9,
      referenceArea: (Math.PI * 0.066 ** 2) / 4,
      drag: { mach: [0, 0.5, 0.9, 1.1, 1.5], cd: [0.45, 0.42, 0.5, 0.7, 0.6] },
      motor: { source: 'inline', propellantMass: 0.32, thrust: { time: [0, 0.05, 0.3, 1.2, 1.8, 2.0], thrust: [0, 420, 360, 300, 120, 0] } },
    },
    launch: { kind: 'rocket', rail: 1.5, tilt, azimuth: 60 },
    recovery: [
      { name: 'drogue', trigger: 'apogee', delay: 1, dragArea: 0.09 },
      { name: 'main', trigger: 'altitude', delay: 0, altitude: 150, dragArea: 0.9 },
    ],
    wind: { speed: windSpeed, from: windFrom, height: 10, shear: 0.14 },
    elevation: 300,
  });
}

function inputsFor(sc: Scenario, sigmaW: number): FlightInputs {
  const l = sc.launch;
  const inputs = emptyInputs(sc.recovery.length);
  Object.assign(inputs, { mass: sc.vehicle.mass, windSpeed: sc.weather.wind.speed, sigmaW });
  if (l.kind === 'rocket') Object.assign(inputs, { tilt: l.tilt, azimuth: l.azimuth });
  return inputs;
}

function both(sc: Scenario, sigmaW = 0) {
  const stream = new SampleStream();
  stream.select('odex-check', 7);
  const model = new FlightModel(sc);
  const engine = { ...model.fly(inputsFor(sc, sigmaW), () => stream.normal(), emptyResult()) };
  stream.select('odex-check', 7);
  const reference = odexFlight(sc, { tolerance: 1e-11, sigmaW, normal: () => stream.normal() });
  return { engine, reference, jacobians: model.jacobians };
}

describe('full rocket flight against the odex integration of the same equations', () => {
  const cases: [string, number, number, number][] = [
    ['calm, vertical', 0, 0, 0],
    ['wind from 250° at 6 m/s, rail tilted 5°', 250, 6, 5],
    ['wind from 20° at 9 m/s, rail tilted 12°', 20, 9, 12],
  ];
  it.each(cases)('%s: landing within 0.5 m at default tolerances', (_name, from, speed, tilt) => {
    const { engine, reference } = both(rocket(from, speed, tilt));
    expect(engine.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
    expect(Math.abs(engine.apogee - reference.apogee)).toBeLessThan(0.5);
    expect(Math.abs(engine.flightTime - reference.flightTime)).toBeLessThan(0.05);
  });

  it('with Dryden turbulence from the same random stream: landing within 0.5 m', () => {
    const { engine, reference, jacobians } = both(rocket(250, 6, 5), 0.8);
    expect(engine.status).toBe(FlightStatus.LANDED);
    // The main (5.9 m/s from 150 m) is flown by the stiff stepper, so this checks it too.
    expect(jacobians).toBeGreaterThan(0);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
  });
});

describe('release along a path flown back and forth, against the odex integration', () => {
  // The reference folds the distance flown onto the path as a triangle wave and places the
  // object with plain arrays; the engine counts legs (src/dispersion/release-route.ts). Both fly
  // the load from there under its canopy in a 6 m/s wind.
  const pad = { lat: 47.3, lon: 8.0 };
  const sc: Scenario = {
    ...scenario({
      vehicle: body('release', 0.9, 1.05, 0.045),
      launch: {
        kind: 'release',
        height: 60,
        speed: 6,
        heading: 0,
        east: 0,
        north: 0,
        // Two legs, about 490 m east then 230 m north-east; flown for 300 s, a little over two passes.
        path: { type: 'LineString', coordinates: [[7.9968, 47.3], [8.0032, 47.3], [8.0054, 47.3015]] },
        duration: 300,
      },
      recovery: [{ name: 'canopy', trigger: 'time', time: 1.5, delay: 0, dragArea: 0.35 }],
      wind: { speed: 6, from: 280 },
    }),
  };
  sc.site = { ...sc.site, pad: { ...sc.site.pad, ...pad } };

  it.each([0.1, 0.37, 0.62, 0.93])('released after %s of the operation: landing within 0.5 m', (share) => {
    const stream = new SampleStream();
    // The route's uniform is the last drawn before turbulence: give both the same share.
    const route = ReleaseRoute.of(sc.launch as ReleaseLaunch, sc.site)!;
    route.placeOnPath(share);
    const inputs = emptyInputs(1);
    Object.assign(inputs, { mass: 0.9, windSpeed: 6, height: 60, speed: 6, east: route.east, north: route.north, heading: route.heading });
    const engine = { ...new FlightModel(sc).fly(inputs, () => stream.normal(), emptyResult()) };
    const reference = odexFlight(sc, { tolerance: 1e-11, releaseShare: share });
    expect(engine.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
  });
});
