import { describe, expect, it } from 'vitest';
import type { Progress } from '../../src/dispersion/execute.js';
import { ChunkFailedError } from '../../src/pool/errors.js';
import { runInPool } from '../../src/pool/pool.js';
import type { EngineJob } from '../../src/pool/protocol.js';
import { body, scenario } from '../helpers/build.js';
import { FakeWorkers, fakeChunk } from './fake-workers.js';

const job = (samples: number): EngineJob => ({
  scenario: scenario({ vehicle: body('release', 1, 0.5, 0.01), launch: { kind: 'release', height: 100, speed: 0, heading: 0, east: 0, north: 0 } }),
  samples,
  seed: 'pool-test',
});

/** Every array of the run equals the fake's value for each sample index. */
function expectEverySampleInPlace(run: Awaited<ReturnType<typeof runInPool>>, samples: number): void {
  const whole = fakeChunk(0, samples);
  expect(run.count).toBe(samples);
  for (const key of ['east', 'north', 'apogee', 'flightTime', 'impactSpeed', 'impactAngle', 'impactMass', 'mode', 'status', 'steps'] as const) {
    expect(Array.from(run[key]), key).toEqual(Array.from(whole[key]));
  }
}

describe('runInPool bookkeeping (in-process fake workers)', () => {
  it.each([1, 3, 8])('places every sample by index when chunks finish out of order (%i workers)', async (workers) => {
    // Later chunks answer sooner, so completion order is the reverse of sample order.
    const fakes = new FakeWorkers({ delay: (c) => 1 + ((1000 - c.start) % 7) });
    const run = await runInPool(job(1000), { workers, chunkSize: 37, createWorker: fakes.factory });
    expectEverySampleInPlace(run, 1000);
    expect(run.seed).toBe('pool-test');
    expect(fakes.calls.map((c) => c.start).sort((a, b) => a - b)).toEqual(Array.from({ length: 28 }, (_, k) => k * 37));
    expect(fakes.created).toBe(workers);
    expect(fakes.terminated.size).toBe(workers);
  });

  it('never starts more workers than there are chunks', async () => {
    const fakes = new FakeWorkers();
    await runInPool(job(100), { workers: 8, chunkSize: 50, createWorker: fakes.factory });
    expect(fakes.created).toBe(2);
  });

  it('starts each worker once, with the whole job', async () => {
    const fakes = new FakeWorkers();
    await runInPool(job(500), { workers: 3, chunkSize: 20, createWorker: fakes.factory });
    expect(fakes.starts.map((s) => s.worker).sort()).toEqual([0, 1, 2]);
    for (const s of fakes.starts) expect([s.job.samples, s.job.seed]).toEqual([500, 'pool-test']);
  });

  it('reports progress per chunk, ending at the total', async () => {
    const fakes = new FakeWorkers();
    const seen: Progress[] = [];
    await runInPool(job(260), { workers: 2, chunkSize: 50, createWorker: fakes.factory, onProgress: (p) => seen.push({ ...p }) });
    expect(seen.length).toBe(6);
    expect(seen.map((p) => p.done)).toEqual([...seen.map((p) => p.done)].sort((a, b) => a - b));
    expect(seen.at(-1)!.done).toBe(260);
    for (const p of seen) {
      expect(p.total).toBe(260);
      expect(p.rate).toBeGreaterThan(0);
    }
  });

  it.each(['throw', 'die', 'wrong-size'] as const)('retries a chunk once on a fresh worker when the first attempt ends in %s', async (how) => {
    const fakes = new FakeWorkers({ onChunk: (c) => (c.start === 100 && c.attempt === 0 ? how : undefined) });
    const run = await runInPool(job(300), { workers: 2, chunkSize: 50, createWorker: fakes.factory });
    expectEverySampleInPlace(run, 300);
    const attempts = fakes.calls.filter((c) => c.start === 100);
    expect(attempts.map((c) => c.attempt)).toEqual([0, 1]);
    expect(attempts[1].worker).not.toBe(attempts[0].worker);
    expect(attempts[1].worker).toBeGreaterThanOrEqual(2); // a worker created for the retry
    expect(fakes.created).toBe(3);
    expect(fakes.alive()).toBe(0);
  });

  it('a worker that fails to start counts as a failed attempt at its chunk', async () => {
    const fakes = new FakeWorkers({ failStart: (w) => w === 0 });
    const run = await runInPool(job(200), { workers: 1, chunkSize: 50, createWorker: fakes.factory });
    expectEverySampleInPlace(run, 200);
    expect(fakes.calls[0]).toMatchObject({ worker: 1, start: 0, attempt: 1 });
  });

  it('a second failure of the same chunk ends the run naming its samples and the cause', async () => {
    const fakes = new FakeWorkers({ onChunk: (c) => (c.start === 150 ? (c.attempt === 0 ? 'throw' : 'die') : undefined), delay: () => 5 });
    const failure = runInPool(job(400), { workers: 2, chunkSize: 50, createWorker: fakes.factory });
    await expect(failure).rejects.toBeInstanceOf(ChunkFailedError);
    await expect(failure).rejects.toThrow(/^samples 150 to 199 failed twice, on two workers \(first: bad chunk on worker \d; then: worker \d stopped unexpectedly\)$/);
    expect(fakes.alive()).toBe(0);
  });

  it('a failure in one chunk does not make other chunks retry: only the failing one is named', async () => {
    const fakes = new FakeWorkers({ onChunk: (c) => (c.start === 0 ? 'throw' : c.start === 50 ? 'hang' : undefined) });
    await expect(runInPool(job(400), { workers: 2, chunkSize: 50, createWorker: fakes.factory })).rejects.toThrow(/^samples 0 to 49 failed twice, on two workers \(first: bad chunk on worker 0; then: bad chunk on worker 2\)$/);
    expect(fakes.calls.filter((c) => c.attempt > 0).every((c) => c.start === 0)).toBe(true);
    expect(fakes.alive()).toBe(0);
  });

  it('cancelling stops every worker at once and rejects with the signal reason', async () => {
    const fakes = new FakeWorkers({ onChunk: () => 'hang' });
    const controller = new AbortController();
    const running = runInPool(job(1000), { workers: 3, chunkSize: 50, createWorker: fakes.factory, signal: controller.signal });
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(fakes.alive()).toBe(3);
    const reason = Object.assign(new Error('cancelled'), { name: 'AbortError' });
    controller.abort(reason);
    await expect(running).rejects.toBe(reason);
    expect(fakes.alive()).toBe(0);
  });

  it('an already cancelled signal starts no worker', async () => {
    const fakes = new FakeWorkers();
    const controller = new AbortController();
    controller.abort();
    await expect(runInPool(job(100), { workers: 2, createWorker: fakes.factory, signal: controller.signal })).rejects.toHaveProperty('name', 'AbortError');
    expect(fakes.created).toBe(0);
  });

  it('rejects a worker count that is not a whole number of at least 1', async () => {
    const fakes = new FakeWorkers();
    await expect(runInPool(job(100), { workers: 0, createWorker: fakes.factory })).rejects.toThrow(/workers: expected a whole number of at least 1, got 0/);
  });
});
