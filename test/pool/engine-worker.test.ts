import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { createEngineWorkerApi } from '../../workers/engine-worker.js';
import { parseTestFault } from '../../workers/test-fault.js';
import { ROOT } from './cli-helpers.js';

/** The worker's code called directly, in this thread. */

const { scenario } = loadScenarioFile(join(ROOT, 'scenarios/club-rocket.json'));
const job = { scenario, samples: 100, seed: 'worker-api' };

class Ended extends Error {}
const end = (): never => {
  throw new Ended('ended');
};

describe('the worker module', () => {
  it('flies the samples it is asked for with one engine for the job', () => {
    const api = createEngineWorkerApi(null, end);
    api.start(job);
    const got = api.runChunk(40, 7, 0);
    const want = new DispersionRunner(scenario, { samples: 100, seed: 'worker-api' }).runChunk(40, 7);
    expect([got.start, got.count]).toEqual([40, 7]);
    expect(Array.from(got.east)).toEqual(Array.from(want.east));
    expect(Array.from(got.steps)).toEqual(Array.from(want.steps));
  });

  it('refuses a chunk before start', () => {
    expect(() => createEngineWorkerApi(null, end).runChunk(0, 1, 0)).toThrow('runChunk was called before start');
  });

  it('the test fault throws on the first attempt at the chunk holding its sample, not on the retry', () => {
    const api = createEngineWorkerApi(parseTestFault('throw@45'), end);
    api.start(job);
    expect(api.runChunk(0, 40, 0).count).toBe(40);
    expect(() => api.runChunk(40, 10, 0)).toThrow('test fault at sample 45');
    expect(api.runChunk(40, 10, 1).count).toBe(10);
  });

  it('the exit fault ends the worker instead of answering', () => {
    const api = createEngineWorkerApi(parseTestFault('exit@45x2'), end);
    api.start(job);
    expect(() => api.runChunk(40, 10, 0)).toThrow(Ended);
    expect(() => api.runChunk(40, 10, 1)).toThrow(Ended);
    expect(api.runChunk(40, 10, 2).count).toBe(10);
  });
});
