import * as Comlink from 'comlink';
import type { EngineWorkerApi, PoolWorker, PoolWorkerFactory } from './protocol.js';

/**
 * Browser side of the pool: module Web Workers speaking comlink. Meant to be bundled from source
 * (Vite sees `new Worker(new URL(…), { type: 'module' })` and builds the worker entry with it).
 */

/** Default worker count: the logical processors the browser reports (2 when it does not say). */
export function browserWorkerCount(): number {
  const cores = typeof navigator === 'undefined' ? undefined : navigator.hardwareConcurrency;
  return typeof cores === 'number' && cores >= 1 ? cores : 2;
}

export function browserWorkerFactory(): PoolWorkerFactory {
  return () => {
    const worker = new Worker(new URL('../../workers/browser-entry.ts', import.meta.url), { type: 'module', name: 'strewn-engine' });
    let terminated = false;
    const stopped = new Promise<never>((_, reject) => {
      // An uncaught error in the worker (or a script that fails to load) arrives here, not as a
      // rejected call: without this the pool would wait forever for the chunk.
      worker.addEventListener('error', (event) => {
        event.preventDefault();
        if (!terminated) reject(new Error(`worker crashed: ${event.message || 'the worker script failed to load or run'}`));
      });
      worker.addEventListener('messageerror', () => {
        if (!terminated) reject(new Error('worker answered with a message that could not be read'));
      });
    });
    stopped.catch(() => {});
    return {
      engine: Comlink.wrap<EngineWorkerApi>(worker),
      stopped,
      terminate() {
        if (terminated) return;
        terminated = true;
        worker.terminate();
      },
    } satisfies PoolWorker;
  };
}
