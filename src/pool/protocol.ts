import type { ChunkResult } from '../dispersion/runner.js';
import type { Scenario } from '../scenario/types.js';
import { resultColumns } from '../dispersion/columns.js';

/**
 * What the pool and its workers say to each other. Only plain data crosses the boundary: the
 * normalised scenario is JSON-like, and a chunk's typed arrays are transferred, not copied.
 */

/** One run: every worker builds a single engine for exactly this and then flies chunks of it. */
export interface EngineJob {
  scenario: Scenario;
  samples: number;
  seed: string;
}

/** The functions a worker exposes (through comlink). */
export interface EngineWorkerApi {
  /** Builds the worker's engine for the job; called once, before any chunk. */
  start(job: EngineJob): void;
  /**
   * Flies samples [start, start + count). `attempt` counts from 0 and is 1 when the pool retries a
   * chunk that failed before; the engine ignores it, only the test fault hook reads it.
   */
  runChunk(start: number, count: number, attempt: number): ChunkResult;
}

/** The same functions as the pool calls them: every call answers asynchronously. */
export interface RemoteEngine {
  start(job: EngineJob): Promise<void>;
  runChunk(start: number, count: number, attempt: number): Promise<ChunkResult>;
}

/**
 * One worker as the pool sees it, whatever runs it (a Node thread or a Web Worker). The adapters in
 * node.ts and browser.ts build these.
 */
export interface PoolWorker {
  readonly engine: RemoteEngine;
  /**
   * Rejects, with the cause, when the worker stops by itself (crash, exit, script that fails to
   * load). A call in flight on a dead worker would otherwise never answer. Never settles after
   * `terminate()`.
   */
  readonly stopped: Promise<never>;
  /** Stops the worker at once, even in the middle of a chunk. */
  terminate(): void;
  /**
   * Hands a healthy worker back after a run that ended well, for the next run to reuse (see
   * reuse.ts); workers without it are terminated instead.
   */
  release?(): void;
}

export type PoolWorkerFactory = () => PoolWorker;

/** The typed arrays of a chunk, listed so they can be handed over without a copy. */
export function chunkBuffers(chunk: ChunkResult): ArrayBuffer[] {
  return resultColumns(chunk).map(([, array]) => array.buffer as ArrayBuffer);
}
