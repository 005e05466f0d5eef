import { chunkRanges, defaultChunkSize, type Progress } from '../dispersion/execute.js';
import { planModes } from '../dispersion/modes.js';
import type { RunResult } from '../dispersion/results.js';
import { allocateChunk, type ChunkResult } from '../dispersion/runner.js';
import { piecesPerSample } from '../dispersion/breakup.js';
import { COLUMN_TYPES, columnTypeName, placeColumns, resultColumns } from '../dispersion/columns.js';
import { ChunkFailedError, cancelledError } from './errors.js';
import type { EngineJob, PoolWorker, PoolWorkerFactory } from './protocol.js';

/**
 * The worker pool, independent of where it runs: the Node and browser adapters supply the workers.
 * Samples are split into chunks of consecutive indices; each worker takes the next chunk as soon
 * as it is free, and the results are placed by sample index, so the outcome never depends on the
 * number of workers or on which worker finished first.
 */

export interface PoolOptions {
  /** Most workers to use; fewer are started when there are fewer chunks. */
  workers: number;
  createWorker: PoolWorkerFactory;
  /** Samples per chunk (default: `defaultChunkSize`). */
  chunkSize?: number;
  /** Called after every finished chunk. */
  onProgress?: (p: Progress) => void;
  /** Aborting stops every worker at once; the run then rejects with the signal's reason. */
  signal?: AbortSignal;
  /**
   * Fly only samples [first, first + count) of the run (a shard). Each sample's result still
   * depends only on the scenario, seed, total sample count and its index.
   */
  range?: readonly [number, number];
  /**
   * Keep the run's columns in shared memory (SharedArrayBuffer), so threads that analyse and write
   * the results read them without a copy. Node only: a page that is not cross-origin isolated has
   * no SharedArrayBuffer.
   */
  sharedColumns?: boolean;
}

export async function runInPool(job: EngineJob, options: PoolOptions): Promise<RunResult> {
  const { samples, seed } = job;
  if (!Number.isInteger(options.workers) || options.workers < 1) throw new RangeError(`workers: expected a whole number of at least 1, got ${options.workers}`);
  const signal = options.signal;
  if (signal?.aborted) throw signal.reason ?? cancelledError();

  const range = options.range ?? ([0, samples] as const);
  if (!(Number.isInteger(range[0]) && Number.isInteger(range[1]) && range[0] >= 0 && range[1] >= 1 && range[0] + range[1] <= samples)) {
    throw new RangeError(`range: samples ${range[0]}+${range[1]} are not within the run's ${samples}`);
  }
  const chunkSize = options.chunkSize ?? defaultChunkSize(range[1], options.workers);
  const ranges = chunkRanges(range[1], chunkSize).map(([start, count]): [number, number] => [range[0] + start, count]);
  const laneCount = Math.min(options.workers, ranges.length);
  // Each chunk is copied into the run's columns as it arrives and then dropped, so a large run
  // never holds its samples twice.
  const all = allocateChunk(range[0], range[1], piecesPerSample(job.scenario));
  if (options.sharedColumns) shareColumns(all);
  const filled = new Uint8Array(range[1]);
  const live = new Set<PoolWorker>();
  const started = Date.now();
  let nextRange = 0;
  let done = 0;

  // Settles (rejects) once, on cancellation or on the first failure that ends the run; every
  // wait below races against it, so no lane keeps waiting on a worker that is being stopped.
  let halted = false;
  let haltReason: unknown;
  let halt!: (reason: unknown) => void;
  const halting = new Promise<never>((_, reject) => {
    halt = (reason) => {
      if (halted) return;
      halted = true;
      haltReason = reason;
      reject(reason);
      for (const worker of live) worker.terminate();
      live.clear();
    };
  });
  halting.catch(() => {});
  const onAbort = () => halt(signal?.reason ?? cancelledError());
  signal?.addEventListener('abort', onAbort, { once: true });

  const retire = (worker: PoolWorker) => {
    if (live.delete(worker)) worker.terminate();
  };
  const answer = <T>(call: Promise<T>, worker: PoolWorker): Promise<T> => Promise.race([call, worker.stopped, halting]);

  const lane = async (): Promise<void> => {
    let worker: PoolWorker | null = null;

    /** Flies one chunk; after a failure, once more on a fresh worker, since the old one is not trusted. */
    const fly = async (start: number, count: number): Promise<ChunkResult> => {
      let firstCause: unknown;
      for (let attempt = 0; ; attempt++) {
        try {
          if (!worker) {
            worker = options.createWorker();
            live.add(worker);
            await answer(worker.engine.start(job), worker);
          }
          const chunk = await answer(worker.engine.runChunk(start, count, attempt), worker);
          checkChunk(chunk, start, count);
          return chunk;
        } catch (cause) {
          if (halted) throw cause;
          if (worker) retire(worker);
          worker = null;
          if (attempt > 0) throw new ChunkFailedError(start, count, firstCause, cause);
          firstCause = cause;
        }
      }
    };

    try {
      while (nextRange < ranges.length && !halted) {
        const [start, count] = ranges[nextRange++];
        const chunk = await fly(start, count);
        placeColumns(all, chunk);
        filled.fill(1, chunk.start - range[0], chunk.start - range[0] + chunk.count);
        done += count;
        options.onProgress?.({ done, total: range[1], rate: done / Math.max(1e-3, (Date.now() - started) / 1000) });
      }
    } catch (error) {
      halt(error);
      throw error;
    } finally {
      // TypeScript cannot see the assignments made inside `fly`, hence the explicit type.
      const last = worker as PoolWorker | null;
      if (last) {
        // A worker that finished its share cleanly may serve the next run; any other is stopped.
        if (!halted && last.release && live.delete(last)) last.release();
        else retire(last);
      }
    }
  };

  try {
    await Promise.all(Array.from({ length: laneCount }, lane));
  } catch (error) {
    // The first failure (or the cancellation) is what the caller hears about.
    throw halted ? haltReason : error;
  } finally {
    signal?.removeEventListener('abort', onAbort);
    for (const worker of live) worker.terminate();
    live.clear();
  }
  const missing = filled.indexOf(0);
  if (missing >= 0) throw new Error(`internal error: sample ${range[0] + missing} was never flown`);
  return { ...all, plan: planModes(job.scenario.failures, samples), seed };
}

/** A worker that answers with the wrong samples must not slip through into the results. */
function checkChunk(chunk: ChunkResult, start: number, count: number): void {
  const arrays = resultColumns(chunk).map(([, a]) => a);
  // A sample's own columns hold one entry per sample; a breakup's piece columns a whole number per sample.
  if (chunk.start !== start || chunk.count !== count || arrays.length === 0 || arrays[0].length !== count || arrays.some((a) => a.length % count !== 0)) {
    throw new Error(`worker answered samples ${chunk.start}+${chunk.count} (arrays of ${arrays.map((a) => a.length).join('/')}) for ${start}+${count}`);
  }
}

/** Moves every (still empty) column of `chunk` into shared memory of the same type and length. */
function shareColumns(chunk: ChunkResult): void {
  const target = chunk as unknown as Record<string, unknown>;
  for (const [name, column] of resultColumns(chunk)) {
    const Type = COLUMN_TYPES[columnTypeName(column)] as new (buffer: ArrayBufferLike) => typeof column;
    target[name] = new Type(new SharedArrayBuffer(column.byteLength));
  }
}
