import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import * as Comlink from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import type { EngineWorkerApi, PoolWorker, PoolWorkerFactory } from './protocol.js';

/** Node side of the pool: workers are worker_threads speaking comlink through its Node adapter. */

/** Default worker count: every core the process may use. */
export function nodeWorkerCount(): number {
  return availableParallelism();
}

/**
 * The compiled worker entry. Node threads cannot load TypeScript, so this is always the built
 * file in dist/, found from the project root; that works both from dist/src/pool/node.js and from
 * src/pool/node.ts (as tests import it).
 */
export function nodeWorkerScript(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  while (!existsSync(join(folder, 'package.json'))) {
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`cannot find the project folder above ${dirname(fileURLToPath(import.meta.url))}`);
    folder = parent;
  }
  return join(folder, 'dist', 'workers', 'node-entry.js');
}

export function nodeWorkerFactory(script = nodeWorkerScript()): PoolWorkerFactory {
  if (!existsSync(script)) throw new Error(`the worker script ${script} is missing; run "npm run build" first`);
  return () => {
    const thread = new Worker(script);
    let terminated = false;
    const stopped = new Promise<never>((_, reject) => {
      thread.once('error', (error) => {
        if (!terminated) reject(new Error(`worker crashed: ${error.message}`));
      });
      thread.once('exit', (code) => {
        if (!terminated) reject(new Error(`worker thread stopped unexpectedly (exit code ${code})`));
      });
    });
    stopped.catch(() => {});
    return {
      engine: Comlink.wrap<EngineWorkerApi>(nodeEndpoint(thread)),
      stopped,
      terminate() {
        if (terminated) return;
        terminated = true;
        void thread.terminate();
      },
    } satisfies PoolWorker;
  };
}

/**
 * Starts `count` worker threads now, so they load their code while the main thread is still
 * reading the scenario; the pool then takes these first. `dispose` stops any it did not take.
 */
export function prestartWorkers(factory: PoolWorkerFactory, count: number): { createWorker: PoolWorkerFactory; dispose(): void } {
  const ready = Array.from({ length: count }, () => factory());
  return {
    createWorker: () => ready.shift() ?? factory(),
    dispose() {
      for (const worker of ready.splice(0)) worker.terminate();
    },
  };
}
