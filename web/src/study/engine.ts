import type { Progress } from '../../../src/dispersion/execute.js';
import type { RunResult } from '../../../src/dispersion/results.js';
import { browserWorkerCount, browserWorkerFactory } from '../../../src/pool/browser.js';
import { runInPool } from '../../../src/pool/pool.js';
import type { Scenario } from '../../../src/scenario/types.js';

/**
 * Flies a scenario's samples in Web Workers through the same pool as the command line
 * (src/pool/pool.ts with its browser adapter), so a page run and `strewn run` with the same
 * scenario, seed and sample count give the same samples.
 */
export interface EngineRunOptions {
  samples: number;
  seed: string;
  onProgress?: (progress: Progress) => void;
  signal?: AbortSignal;
  /** Workers to use (default: the logical processors the browser reports). */
  workers?: number;
}

export function runEngine(scenario: Scenario, options: EngineRunOptions): Promise<RunResult> {
  return runInPool(
    { scenario, samples: options.samples, seed: options.seed },
    {
      workers: options.workers ?? browserWorkerCount(),
      createWorker: browserWorkerFactory(),
      onProgress: options.onProgress,
      signal: options.signal,
    },
  );
}

export function isCancellation(error: unknown): boolean {
  return error instanceof Error && error.name === 'AbortError';
}
