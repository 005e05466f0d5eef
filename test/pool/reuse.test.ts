import { describe, expect, it } from 'vitest';
import { resolve } from 'node:path';
import { runInPool } from '../../src/pool/pool.js';
import { nodeWorkerFactory } from '../../src/pool/node.js';
import { reusableWorkers } from '../../src/pool/reuse.js';
import type { PoolWorkerFactory } from '../../src/pool/protocol.js';
import { loadScenarioFile } from '../../src/scenario/file.js';

const scenario = loadScenarioFile(resolve(import.meta.dirname, '../../scenarios/display-shell.json')).scenario;

describe('reusing workers between runs', () => {
  it('starts the threads once for many runs, and the results equal fresh threads', async () => {
    let started = 0;
    const base = nodeWorkerFactory();
    const counting: PoolWorkerFactory = () => {
      started++;
      return base();
    };
    const keeper = reusableWorkers(counting);
    try {
      const jobs = ['a', 'b', 'c'].map((seed) => ({ scenario, samples: 300, seed }));
      for (const job of jobs) {
        const kept = await runInPool(job, { workers: 2, createWorker: keeper.createWorker, chunkSize: 50 });
        const fresh = await runInPool(job, { workers: 2, createWorker: base, chunkSize: 50 });
        expect(Array.from(kept.east)).toEqual(Array.from(fresh.east));
        expect(Array.from(kept.north)).toEqual(Array.from(fresh.north));
      }
      expect(started).toBe(2);
    } finally {
      keeper.close();
    }
  });

  it('a cancelled run does not hand its workers back', async () => {
    let started = 0;
    const base = nodeWorkerFactory();
    const keeper = reusableWorkers(() => {
      started++;
      return base();
    });
    try {
      const controller = new AbortController();
      const run = runInPool({ scenario, samples: 200_000, seed: 'x' }, { workers: 2, createWorker: keeper.createWorker, signal: controller.signal });
      setTimeout(() => controller.abort(new Error('stop')), 300);
      await expect(run).rejects.toThrow('stop');
      await runInPool({ scenario, samples: 100, seed: 'y' }, { workers: 2, createWorker: keeper.createWorker, chunkSize: 50 });
      expect(started).toBe(4);
    } finally {
      keeper.close();
    }
  });
});
