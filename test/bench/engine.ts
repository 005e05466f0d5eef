/**
 * Engine benchmark: nominal flights per second in one thread for each demo scenario with
 * turbulence on (and the demo club rocket flown both as its rigid body and as a point mass), the
 * integrator steps per flight and, for rockets, which phase of the flight takes them, and landing
 * accuracy against the odex reference integration at tight tolerance.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { loadScenarioFile } from '../../src/scenario/file.js';
import type { Scenario } from '../../src/scenario/types.js';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { InputDrawer, readSpreadUniforms } from '../../src/dispersion/draw.js';
import { planModes } from '../../src/dispersion/modes.js';
import { SampleStream } from '../../src/dispersion/random.js';
import { MotorModel } from '../../src/physics/motor.js';
import { UNCERTAINTY_NAMES } from '../../src/scenario/types.js';
import { odexFlight } from '../reference/odex-flight.js';

export interface StepPhases {
  rail: number;
  burn: number;
  coast: number;
  descent: number;
  /** Tried steps the error control turned down (counted in `steps`, not in the phases). */
  rejected: number;
}

export interface EngineFigures {
  scenario: string;
  flightsPerSecond: number;
  /** The same from this thread's CPU time: less sensitive to other jobs taking the core away. */
  flightsPerCpuSecond: number;
  medianSteps: number;
  meanEvaluations: number;
  /** Jacobians of the stiff stepper per flight (each costs about one evaluation). */
  meanJacobians: number;
  /** Mean accepted steps per phase (rockets; null for other vehicles) over the check flights. */
  phases: StepPhases | null;
  maxLandingError_m: number;
  /** odex at 1e-11, the reference itself. */
  odexFlightsPerSecond: number;
  /** The loosest odex tolerance (of 1e-3 … 1e-10) whose landings all stay within 1 m of the reference. */
  odexEqualTolerance: number;
  odexEqualFlightsPerSecond: number;
  odexEqualMaxError_m: number;
}

/** The scenario's nominal flight with turbulence on (gust as given, or the Dryden light default). */
export function nominalWithTurbulence(sc: Scenario): Scenario {
  return { ...sc, uncertainty: {}, failures: [], weather: { ...sc.weather, turbulence: true } };
}

/** The same rocket without its shape: flown as a point mass. */
export function asPointMass(sc: Scenario): Scenario {
  return { ...sc, vehicle: { ...sc.vehicle, shape: undefined } };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/**
 * The uniform a release route consumes (the share of the operation flown), read back from the
 * sample's stream: it follows the spreads' uniforms and the two extra direction uniforms (see
 * InputDrawer.draw).
 */
function routeShare(seed: string, index: number): number {
  const s = new SampleStream();
  s.select(seed, index);
  readSpreadUniforms(s, new Float64Array(UNCERTAINTY_NAMES.length));
  s.uniform();
  s.uniform();
  return s.uniform();
}

/** Flights per second, steps, and the worst landing error against odex over a few samples. */
export function measureEngine(name: string, scenario: Scenario, seconds = 3): EngineFigures {
  const sc = nominalWithTurbulence(scenario);
  const runner = new DispersionRunner(sc, { samples: 1_000_000, seed: 'bench' });
  runner.runChunk(0, 400); // warm up the JIT
  const steps: number[] = [];
  let flights = 0;
  const start = performance.now();
  const cpuStart = process.cpuUsage();
  while (performance.now() - start < seconds * 1000) {
    const chunk = runner.runChunk(flights, 200);
    for (let i = 0; i < chunk.count; i++) steps.push(chunk.steps[i]);
    flights += chunk.count;
  }
  const wall = (performance.now() - start) / 1000;
  const cpu = process.cpuUsage(cpuStart);
  const flightsPerSecond = flights / wall;
  const flightsPerCpuSecond = flights / ((cpu.user + cpu.system) / 1e6);

  // Accuracy: the same flights (same inputs, same turbulence stream) integrated by odex at 1e-11.
  const model = new FlightModel(sc);
  const drawer = new InputDrawer(sc, planModes([], 1));
  const inputs = emptyInputs(sc.recovery.length);
  const stream = new SampleStream();
  const released = sc.launch.kind === 'release' && sc.launch.path !== undefined;
  if (sc.launch.kind === 'release' && sc.launch.area !== undefined) throw new Error(`${name}: the odex reference does not model a release over an area`);
  let maxError = 0;
  let odexTime = 0;
  const checks = 8;
  const references: { east: number; north: number }[] = [];
  /** Runs odex on check flight i (same inputs and turbulence as the engine's) at a tolerance. */
  const odexCheck = (i: number, tolerance: number) => {
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    const t0 = performance.now();
    const ref = odexFlight(sc, {
      tolerance,
      sigmaW: inputs.sigmaW,
      normal: () => stream.normal(),
      misalignmentDirection: inputs.misalignmentDirection,
      releaseShare: released ? routeShare('bench-accuracy', i) : undefined,
    });
    return { ref, ms: performance.now() - t0 };
  };
  const phases: StepPhases = { rail: 0, burn: 0, coast: 0, descent: 0, rejected: 0 };
  const rocket = sc.vehicle.kind === 'rocket' && sc.launch.kind === 'rocket';
  const burnTime = rocket && sc.vehicle.motor ? new MotorModel(sc.vehicle.motor).burnTime : 0;
  const railLength = sc.launch.kind === 'rocket' ? sc.launch.rail : 0;
  const evaluationsBefore = model.evaluations;
  const jacobiansBefore = model.jacobians;
  for (let i = 0; i < checks; i++) {
    stream.select('bench-accuracy', i);
    drawer.draw(stream, 0, model.wind, inputs);
    // Accepted steps by phase, from the state after each step (the first call is the start).
    let accepted = -1;
    let left = false;
    let descending = false;
    const r = {
      ...model.fly(inputs, () => stream.normal(), emptyResult(), (t, y) => {
        accepted++;
        if (accepted === 0) return;
        if (!left && Math.hypot(y[0], y[1], y[2]) < railLength - 1e-9) phases.rail++;
        else if (t <= burnTime) { left = true; phases.burn++; }
        else if (!descending && y[5] > 0) { left = true; phases.coast++; }
        else { left = true; descending = true; phases.descent++; }
      }),
    };
    phases.rejected += r.steps - accepted;
    const { ref, ms } = odexCheck(i, 1e-11);
    odexTime += ms;
    references.push(ref);
    maxError = Math.max(maxError, Math.hypot(r.east - ref.east, r.north - ref.north));
  }
  const meanEvaluations = (model.evaluations - evaluationsBefore) / checks;
  const meanJacobians = (model.jacobians - jacobiansBefore) / checks;
  for (const k of Object.keys(phases) as (keyof StepPhases)[]) phases[k] /= checks;
  // odex at equal accuracy: the loosest tolerance that keeps every check landing within 1 m.
  let equal = { tolerance: NaN, flightsPerSecond: NaN, maxError: NaN };
  for (const tolerance of [1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10]) {
    let worst = 0;
    for (let i = 0; i < checks; i++) {
      const c = odexCheck(i, tolerance);
      worst = Math.max(worst, Math.hypot(c.ref.east - references[i].east, c.ref.north - references[i].north));
    }
    if (worst <= 1) {
      // Time it again over more repetitions now that the tolerance is fixed.
      let total = 0;
      const reps = 3;
      for (let k = 0; k < reps; k++) for (let i = 0; i < checks; i++) total += odexCheck(i, tolerance).ms;
      equal = { tolerance, flightsPerSecond: (reps * checks) / (total / 1000), maxError: worst };
      break;
    }
  }
  return {
    scenario: name,
    flightsPerSecond,
    flightsPerCpuSecond,
    medianSteps: median(steps),
    meanEvaluations,
    meanJacobians,
    phases: rocket ? phases : null,
    maxLandingError_m: maxError,
    odexFlightsPerSecond: checks / (odexTime / 1000),
    odexEqualTolerance: equal.tolerance,
    odexEqualFlightsPerSecond: equal.flightsPerSecond,
    odexEqualMaxError_m: equal.maxError,
  };
}

export function demoScenarios(folder: string): { name: string; scenario: Scenario }[] {
  return readdirSync(folder)
    .filter((f) => f.endsWith('.json') && !f.endsWith('.event.json'))
    .sort()
    .map((f) => ({ name: f, scenario: loadScenarioFile(join(folder, f)).scenario }));
}

/** Column heads of the engine table (one thread, turbulence on). */
export function engineHeader(): string[] {
  return [
    '(flights/s by the clock and by this thread\'s CPU time; steps: median per flight, and for rockets the mean accepted steps',
    ' on the rail / in the burn / coasting up / coming down, + rejected tries; evals: derivative evaluations per flight',
    ' + Jacobians of the stiff stepper under a canopy; landing error against odex at 1e-11;',
    ' odex "equal accuracy" is its loosest tolerance keeping every landing within 1 m)',
    'scenario                       flights/s  per CPU s  steps  evals+jac  rail/burn/coast/down+rej   landing error  odex tol  odex flights/s  engine/odex',
  ];
}

export function engineRow(f: EngineFigures): string {
  const p = f.phases;
  const phases = p === null ? '-' : `${p.rail.toFixed(0)}/${p.burn.toFixed(0)}/${p.coast.toFixed(0)}/${p.descent.toFixed(0)}+${p.rejected.toFixed(0)}`;
  return `${f.scenario.padEnd(30)} ${f.flightsPerSecond.toFixed(0).padStart(9)}  ${f.flightsPerCpuSecond.toFixed(0).padStart(9)}  ${String(f.medianSteps).padStart(5)}  ${`${f.meanEvaluations.toFixed(0)}+${f.meanJacobians.toFixed(0)}`.padStart(9)}  ${phases.padEnd(24)}  ${f.maxLandingError_m.toFixed(3).padStart(11)} m  ${f.odexEqualTolerance.toExponential(0).padStart(8)}  ${f.odexEqualFlightsPerSecond.toFixed(0).padStart(14)}  ${(f.flightsPerSecond / f.odexEqualFlightsPerSecond).toFixed(1).padStart(10)}×`;
}

/** Whether a figure meets its target, for the bench lines. */
export function verdict(ok: boolean): string {
  return ok ? 'meets target' : 'MISSES target';
}
