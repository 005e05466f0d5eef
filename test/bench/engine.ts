/**
 * Engine benchmark: nominal flights per second in one thread for each demo scenario with
 * turbulence on, the median integrator steps per flight, and landing accuracy against the odex
 * reference integration at tight tolerance.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { loadScenarioFile } from '../../src/scenario/file.js';
import type { Scenario } from '../../src/scenario/types.js';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { InputDrawer } from '../../src/dispersion/draw.js';
import { planModes } from '../../src/dispersion/modes.js';
import { SampleStream } from '../../src/dispersion/random.js';
import { odexFlight } from '../reference/odex-flight.js';

export interface EngineFigures {
  scenario: string;
  flightsPerSecond: number;
  medianSteps: number;
  maxLandingError_m: number;
  odexFlightsPerSecond: number;
}

/** The scenario's nominal flight with turbulence on (gust as given, or the Dryden light default). */
export function nominalWithTurbulence(sc: Scenario): Scenario {
  return { ...sc, uncertainty: {}, failures: [], weather: { ...sc.weather, turbulence: true } };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Flights per second, median steps, and the worst landing error against odex over a few samples. */
export function measureEngine(name: string, scenario: Scenario, seconds = 3): EngineFigures {
  const sc = nominalWithTurbulence(scenario);
  const runner = new DispersionRunner(sc, { samples: 1_000_000, seed: 'bench' });
  runner.runChunk(0, 200); // warm up the JIT
  const steps: number[] = [];
  let flights = 0;
  const start = performance.now();
  while (performance.now() - start < seconds * 1000) {
    const chunk = runner.runChunk(flights, 200);
    for (let i = 0; i < chunk.count; i++) steps.push(chunk.steps[i]);
    flights += chunk.count;
  }
  const flightsPerSecond = flights / ((performance.now() - start) / 1000);

  // Accuracy: the same flights (same inputs, same turbulence stream) integrated by odex at 1e-11.
  const model = new FlightModel(sc);
  const drawer = new InputDrawer(sc, planModes([], 1));
  const inputs = emptyInputs(sc.recovery.length);
  const stream = new SampleStream();
  let maxError = 0;
  let odexTime = 0;
  const checks = 8;
  for (let i = 0; i < checks; i++) {
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    const r = { ...model.fly(inputs, () => stream.normal(), emptyResult()) };
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    const t0 = performance.now();
    const ref = odexFlight(sc, { tolerance: 1e-11, sigmaW: inputs.sigmaW, normal: () => stream.normal() });
    odexTime += performance.now() - t0;
    maxError = Math.max(maxError, Math.hypot(r.east - ref.east, r.north - ref.north));
  }
  return { scenario: name, flightsPerSecond, medianSteps: median(steps), maxLandingError_m: maxError, odexFlightsPerSecond: checks / (odexTime / 1000) };
}

export function demoScenarios(folder: string): { name: string; scenario: Scenario }[] {
  return readdirSync(folder)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => ({ name: f, scenario: loadScenarioFile(join(folder, f)).scenario }));
}
