import type { EnvelopeResult } from '../../../src/envelope/envelope.js';
import { windEnvelope } from '../../../src/envelope/envelope.js';
import { windCase } from '../../../src/envelope/wind-case.js';
import { browserWorkerCount, browserWorkerFactory } from '../../../src/pool/browser.js';
import { runInPool } from '../../../src/pool/pool.js';
import { reusableWorkers } from '../../../src/pool/reuse.js';
import { hashScenario } from '../../../src/scenario/hash.js';
import type { Scenario } from '../../../src/scenario/types.js';

/**
 * The wind envelope in the page: the same `windEnvelope` as `strewn envelope`, its grid points
 * flown in Web Workers through the same pool, so the page and the command line agree.
 */

export interface EnvelopeGrid {
  directions: number[];
  /** m/s at the reference height. */
  speeds: number[];
  samples: number;
}

export interface EnvelopeOutcome {
  envelope: EnvelopeResult;
  /** Hash of the scenario it was computed for (envelope.json's scenarioHash). */
  hash: string;
  /** The scenario with its mean wind set aside, to tell whether the limits still apply (see `limitsKey`). */
  key: string;
  computedAt: string;
}

export interface EnvelopeState {
  phase: 'idle' | 'running' | 'finished' | 'cancelled' | 'failed';
  /** The whole grid's progress, 0 to 1. */
  progress: number;
  /** Grid points flown and the most that may still be flown. */
  done: number;
  planned: number;
  message: string;
  outcome: EnvelopeOutcome | null;
}

export const IDLE_ENVELOPE: EnvelopeState = { phase: 'idle', progress: 0, done: 0, planned: 0, message: '', outcome: null };

/**
 * What the limits depend on: everything but the mean wind itself (every grid point replaces it).
 * Loading a grid point into the wind fields changes the scenario's hash but not this key, so the
 * chart stays current and only its forecast marker moves.
 */
export function limitsKey(scenario: Scenario): string {
  return hashScenario(windCase(scenario, 0, 1));
}

/** Grid points bisection flies at most: as `windEnvelope` plans them. */
export function plannedPoints(grid: Pick<EnvelopeGrid, 'directions' | 'speeds'>, exhaustive = false): number {
  const n = grid.speeds.length;
  const perDirection = exhaustive ? n : Math.min(n, 2 + Math.ceil(Math.log2(Math.max(1, n - 1))));
  return grid.directions.length * perDirection;
}

export interface EnvelopeRunOptions {
  signal: AbortSignal;
  /** Overall progress 0 to 1, with points flown and planned. */
  onProgress: (progress: number, done: number, planned: number) => void;
}

export async function computeEnvelope(scenario: Scenario, grid: EnvelopeGrid, options: EnvelopeRunOptions): Promise<EnvelopeResult> {
  let done = 0;
  let planned = plannedPoints(grid);
  // One set of workers for the whole grid: starting them per grid point costs more than flying.
  const keeper = reusableWorkers(browserWorkerFactory());
  const createWorker = keeper.createWorker;
  const workers = browserWorkerCount();
  try {
    return await windEnvelope(scenario, {
      directions: grid.directions,
      speeds: grid.speeds,
      samples: grid.samples,
      seed: scenario.run.seed,
      signal: options.signal,
      // Within a grid point the pool reports samples flown; the bar moves for those too.
      execute: (sc, samples, seed, signal) =>
        runInPool({ scenario: sc, samples, seed }, { workers, createWorker, signal, onProgress: (p) => options.onProgress((done + p.done / Math.max(1, p.total)) / planned, done, planned) }),
      onCase: (d, p) => {
        done = d;
        planned = p;
        options.onProgress(d / p, d, p);
      },
    });
  } finally {
    keeper.close();
  }
}
