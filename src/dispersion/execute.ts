import type { Scenario } from '../scenario/types.js';
import { DispersionRunner, type ChunkResult } from './runner.js';
import { assembleChunks, type RunResult } from './results.js';

export interface Progress {
  done: number;
  total: number;
  /** Flights per second since the start. */
  rate: number;
}

export interface ExecuteOptions {
  samples: number;
  seed: string;
  /** Samples per chunk (progress and cancellation happen between chunks). */
  chunkSize?: number;
  onProgress?: (p: Progress) => void;
  signal?: AbortSignal;
}

/** Splits [0, samples) into chunks of at most `size` samples. */
export function chunkRanges(samples: number, size: number): [number, number][] {
  const ranges: [number, number][] = [];
  for (let start = 0; start < samples; start += size) ranges.push([start, Math.min(size, samples - start)]);
  return ranges;
}

/**
 * A sensible chunk size: large enough that a chunk's message costs well under 1 % of its flights,
 * small enough for smooth progress and for a short tail (the last chunks keep only some workers
 * busy, so about 64 chunks per worker keep them all busy to within about 1/64 of the run).
 */
export function defaultChunkSize(samples: number, workers: number): number {
  return Math.max(50, Math.min(2_000, Math.ceil(samples / (workers * 64))));
}

/** Flies every sample in this thread. Yields to the event loop between chunks so Ctrl-C is seen. */
export async function executeInThread(scenario: Scenario, options: ExecuteOptions): Promise<RunResult> {
  const runner = new DispersionRunner(scenario, { samples: options.samples, seed: options.seed });
  const chunks: ChunkResult[] = [];
  const started = Date.now();
  let done = 0;
  for (const [start, count] of chunkRanges(options.samples, options.chunkSize ?? defaultChunkSize(options.samples, 1))) {
    if (options.signal?.aborted) throw options.signal.reason ?? new Error('cancelled');
    chunks.push(runner.runChunk(start, count));
    done += count;
    options.onProgress?.({ done, total: options.samples, rate: done / Math.max(1e-3, (Date.now() - started) / 1000) });
    await new Promise((resolve) => setImmediate(resolve));
  }
  return assembleChunks(options.samples, chunks, runner.plan, options.seed);
}
