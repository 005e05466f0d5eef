import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs, type FlightInputs } from '../../src/flight/inputs.js';
import { FlightStatus } from '../../src/flight/status.js';
import { SampleStream } from '../../src/dispersion/random.js';
import type { Scenario } from '../../src/scenario/types.js';
import { shapedRocket } from './shaped-rocket.js';
import { odexFlight } from '../reference/odex-flight.js';

// Reference: the same rigid-body equations (scenario format, "vehicle.shape") integrated by the
// npm `odex` package (Hairer & Wanner's ODEX extrapolation code, Solving Ordinary Differential
// Equations I) at tolerance 1e-11, with the attitude as a quaternion and the parts summed one by
// one (test/reference/odex-flight.ts) — an implementation independent of the engine's.

function inputsFor(sc: Scenario, sigmaW: number, misalignment = 0, direction = 0): FlightInputs {
  const l = sc.launch;
  const inputs = emptyInputs(sc.recovery.length);
  Object.assign(inputs, { mass: sc.vehicle.mass, windSpeed: sc.weather.wind.speed, sigmaW, misalignment, misalignmentDirection: direction });
  if (l.kind === 'rocket') Object.assign(inputs, { tilt: l.tilt, azimuth: l.azimuth });
  return inputs;
}

function both(sc: Scenario, sigmaW = 0, misalignment = 0, direction = 0) {
  const stream = new SampleStream();
  stream.select('odex-rigid', 3);
  const engine = { ...new FlightModel(sc).fly(inputsFor(sc, sigmaW, misalignment, direction), () => stream.normal(), emptyResult()) };
  stream.select('odex-rigid', 3);
  const reference = odexFlight(sc, { tolerance: 1e-11, sigmaW, normal: () => stream.normal(), misalignment, misalignmentDirection: direction });
  return { engine, reference };
}

describe('rigid-body rocket against the odex integration of the same equations', () => {
  const cases: [string, number, number, number, boolean, number, number][] = [
    ['calm, vertical, no recovery', 0, 0, 0, false, 0, 0],
    ['6 m/s into the 5° rail, no recovery', 45, 6, 5, false, 0, 0],
    ['6 m/s into the 5° rail, dual deploy', 45, 6, 5, true, 0, 0],
    ['9 m/s across the rail, 0.5° misalignment toward 120°, no recovery', 300, 9, 5, false, 0.5, 120],
  ];
  it.each(cases)('%s: landing within 0.5 m at default tolerances', (_n, from, speed, tilt, rec, mis, dir) => {
    const { engine, reference } = both(shapedRocket(from, speed, tilt, rec), 0, mis, dir);
    expect(engine.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
    expect(Math.abs(engine.apogee - reference.apogee)).toBeLessThan(0.5);
  });

  it('with Dryden turbulence from the same random stream: landing within 0.5 m', () => {
    const { engine, reference } = both(shapedRocket(45, 6, 5, false), 0.8);
    expect(engine.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(engine.east - reference.east, engine.north - reference.north)).toBeLessThan(0.5);
  });
});
