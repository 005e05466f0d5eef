import type { PoolWorker, PoolWorkerFactory } from './protocol.js';

/**
 * Keeps workers alive between runs, for callers that fly many runs in a row (the wind envelope
 * flies one per grid point): starting a thread and warming its compiler costs more than flying a
 * small run. A worker handed back after a clean run waits here; one that failed, was cancelled or
 * died is stopped as usual and never reused. Results do not change: each run starts the worker's
 * engine afresh for its own job.
 *
 * @example
 * const keeper = reusableWorkers(nodeWorkerFactory());
 * for (const job of jobs) await runInPool(job, { workers, createWorker: keeper.createWorker });
 * keeper.close();
 */
export function reusableWorkers(factory: PoolWorkerFactory): { createWorker: PoolWorkerFactory; close(): void } {
  const idle: { worker: PoolWorker; dead: () => boolean }[] = [];
  let closed = false;

  const lease = (entry: { worker: PoolWorker; dead: () => boolean }): PoolWorker => {
    const { worker } = entry;
    return {
      engine: worker.engine,
      stopped: worker.stopped,
      terminate: () => worker.terminate(),
      release: () => {
        if (closed || entry.dead()) worker.terminate();
        else idle.push(entry);
      },
    };
  };

  return {
    createWorker: () => {
      while (idle.length > 0) {
        const entry = idle.pop()!;
        if (!entry.dead()) return lease(entry);
        entry.worker.terminate();
      }
      const worker = factory();
      let dead = false;
      worker.stopped.catch(() => {
        dead = true;
      });
      return lease({ worker, dead: () => dead });
    },
    close: () => {
      closed = true;
      for (const { worker } of idle.splice(0)) worker.terminate();
    },
  };
}
