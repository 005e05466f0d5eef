import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs, type FlightInputs } from '../../src/flight/inputs.js';
import { FlightStatus } from '../../src/flight/status.js';
import { SampleStream } from '../../src/dispersion/random.js';
import type { Scenario } from '../../src/scenario/types.js';
import { scenario } from '../helpers/build.js';
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
  const engine = { ...new FlightModel(sc).fly(inputsFor(sc, sigmaW), () => stream.normal(), emptyResult()) };
  stream.select('odex-check', 7);
  const reference = odexFlight(sc, { tolerance: 1e-11, sigmaW, normal: () => stream.normal() });
  return { engine, reference };
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
    const { engine, reference } = both(rocket(250, 6, 5), 0.8);
    expect(engine.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
  });
});
