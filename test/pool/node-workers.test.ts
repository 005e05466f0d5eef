import { afterEach, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { executeInThread } from '../../src/dispersion/execute.js';
import type { RunResult } from '../../src/dispersion/results.js';
import { ChunkFailedError } from '../../src/pool/errors.js';
import { nodeWorkerFactory, nodeWorkerScript } from '../../src/pool/node.js';
import { runInPool } from '../../src/pool/pool.js';
import type { PoolWorkerFactory } from '../../src/pool/protocol.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { ROOT } from './cli-helpers.js';

/** Real worker threads running the compiled dist/workers/node-entry.js (build first). */

const { scenario } = loadScenarioFile(join(ROOT, 'scenarios/club-rocket.json'));
const job = { scenario, samples: 400, seed: 'threads' };
const KEYS = ['east', 'north', 'apogee', 'flightTime', 'impactSpeed', 'impactAngle', 'impactMass', 'mode', 'status', 'steps'] as const;

function bytesOf(run: RunResult): Buffer[] {
  return KEYS.map((k) => Buffer.from(run[k].buffer, run[k].byteOffset, run[k].byteLength));
}

/** The Node factory, counting the workers it creates and the ones the pool terminates. */
function counted(): { factory: PoolWorkerFactory; created: () => number; terminated: () => number } {
  const inner = nodeWorkerFactory();
  let created = 0;
  let terminated = 0;
  const factory: PoolWorkerFactory = () => {
    const worker = inner();
    created++;
    return { engine: worker.engine, stopped: worker.stopped, terminate: () => (terminated++, worker.terminate()) };
  };
  return { factory, created: () => created, terminated: () => terminated };
}

afterEach(() => {
  delete process.env.STREWN_TEST_FAULT;
});

describe('the pool on Node worker threads', () => {
  it('finds the compiled worker entry from the TypeScript source', () => {
    expect(nodeWorkerScript()).toBe(join(ROOT, 'dist/workers/node-entry.js'));
  });

  it('names the missing worker script and how to build it', () => {
    expect(() => nodeWorkerFactory('/nowhere/node-entry.js')).toThrow('the worker script /nowhere/node-entry.js is missing; run "npm run build" first');
  });

  it('gives bit-identical results to the in-thread engine for 1, 2 and 3 workers', async () => {
    const reference = bytesOf(await executeInThread(scenario, { samples: job.samples, seed: job.seed }));
    for (const workers of [1, 2, 3]) {
      const pool = counted();
      const run = await runInPool(job, { workers, chunkSize: 30, createWorker: pool.factory });
      bytesOf(run).forEach((bytes, k) => expect(bytes.equals(reference[k]), `${KEYS[k]} with ${workers} workers`).toBe(true));
      expect(pool.created()).toBe(workers);
      expect(pool.terminated()).toBe(workers);
    }
  });

  it.each(['exit', 'throw'])('a worker fault (%s) is retried on a fresh thread and the results are unchanged', async (kind) => {
    const reference = bytesOf(await runInPool(job, { workers: 2, chunkSize: 30, createWorker: nodeWorkerFactory() }));
    process.env.STREWN_TEST_FAULT = `${kind}@123`;
    const pool = counted();
    const run = await runInPool(job, { workers: 2, chunkSize: 30, createWorker: pool.factory });
    bytesOf(run).forEach((bytes, k) => expect(bytes.equals(reference[k]), KEYS[k]).toBe(true));
    expect(pool.created()).toBe(3);
  });

  it.each([
    ['exit', /^samples 120 to 149 failed twice, on two workers \(both times: worker thread stopped unexpectedly \(exit code 70\)\)$/],
    ['throw', /^samples 120 to 149 failed twice, on two workers \(both times: test fault at sample 123\)$/],
  ])('a fault (%s) on both attempts ends the run naming the samples and the cause', async (kind, message) => {
    process.env.STREWN_TEST_FAULT = `${kind}@123x2`;
    const pool = counted();
    const failure = runInPool(job, { workers: 2, chunkSize: 30, createWorker: pool.factory });
    await expect(failure).rejects.toBeInstanceOf(ChunkFailedError);
    await expect(failure).rejects.toThrow(message);
    expect(pool.terminated()).toBe(pool.created());
  });

  it('cancelling stops the threads mid-chunk, well within a second', async () => {
    const pool = counted();
    const controller = new AbortController();
    const running = runInPool({ ...job, samples: 1_000_000 }, { workers: 2, createWorker: pool.factory, signal: controller.signal });
    await new Promise((resolve) => setTimeout(resolve, 500));
    const asked = performance.now();
    controller.abort(Object.assign(new Error('cancelled'), { name: 'AbortError' }));
    await expect(running).rejects.toHaveProperty('name', 'AbortError');
    expect(performance.now() - asked).toBeLessThan(1000);
    expect(pool.created()).toBe(2);
    expect(pool.terminated()).toBe(2);
  });
});
