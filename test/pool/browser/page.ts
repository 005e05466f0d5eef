import type { RunResult } from '../../../src/dispersion/results.js';
import { browserWorkerCount, browserWorkerFactory } from '../../../src/pool/browser.js';
import { runInPool } from '../../../src/pool/pool.js';
import type { Scenario } from '../../../src/scenario/types.js';

/**
 * A bare page that drives the pool on Web Workers, the way the web page will: the browser test
 * calls these functions through the automation bridge.
 */

const KEYS = ['east', 'north', 'apogee', 'flightTime', 'impactSpeed', 'impactAngle', 'impactMass', 'mode', 'status', 'steps'] as const;

function base64(array: ArrayBufferView): string {
  const bytes = new Uint8Array(array.buffer, array.byteOffset, array.byteLength);
  let text = '';
  for (let i = 0; i < bytes.length; i++) text += String.fromCharCode(bytes[i]);
  return btoa(text);
}

const api = {
  cores: browserWorkerCount(),
  async run(scenario: Scenario, samples: number, seed: string, workers: number) {
    const progress: number[] = [];
    const run: RunResult = await runInPool({ scenario, samples, seed }, { workers, chunkSize: 50, createWorker: browserWorkerFactory(), onProgress: (p) => progress.push(p.done) });
    return { arrays: Object.fromEntries(KEYS.map((k) => [k, base64(run[k])])), progress };
  },
  /** Starts a long run and cancels it after `ms`; answers how it ended and how long the stop took. */
  async cancelAfter(scenario: Scenario, ms: number) {
    const controller = new AbortController();
    const running = runInPool({ scenario, samples: 1_000_000, seed: 'cancel' }, { workers: 2, createWorker: browserWorkerFactory(), signal: controller.signal });
    await new Promise((resolve) => setTimeout(resolve, ms));
    const asked = performance.now();
    controller.abort(Object.assign(new Error('cancelled'), { name: 'AbortError' }));
    try {
      await running;
      return { ended: 'finished', stopMs: performance.now() - asked };
    } catch (error) {
      return { ended: (error as Error).name, stopMs: performance.now() - asked };
    }
  },
};

(window as unknown as { strewnPool: typeof api }).strewnPool = api;
