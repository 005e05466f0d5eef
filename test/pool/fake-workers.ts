import { allocateChunk, type ChunkResult } from '../../src/dispersion/runner.js';
import type { EngineJob, PoolWorker, PoolWorkerFactory } from '../../src/pool/protocol.js';

/**
 * In-process stand-ins for workers, to test the pool's bookkeeping (order, retries, cancellation)
 * without threads. Every sample's values are a fixed function of its index, so a sample placed at
 * the wrong index or lost is visible.
 */

export function fakeChunk(start: number, count: number): ChunkResult {
  const c = allocateChunk(start, count);
  for (let j = 0; j < count; j++) {
    const i = start + j;
    c.east[j] = i * 1.5 + 0.25;
    c.north[j] = -i;
    c.apogee[j] = i % 97;
    c.flightTime[j] = i / 7;
    c.impactSpeed[j] = i % 13;
    c.mode[j] = 0;
    c.status[j] = i % 11 === 0 ? 1 : 0;
    c.steps[j] = i;
  }
  return c;
}

export interface FakeCall {
  worker: number;
  start: number;
  count: number;
  attempt: number;
}

/** How a fake worker misbehaves on a call; `undefined` means it answers normally. */
export type Misbehaviour = 'throw' | 'die' | 'hang' | 'wrong-size' | undefined;

export interface FakeOptions {
  /** Milliseconds before a chunk answers; varied per call so chunks finish out of order. */
  delay?: (call: FakeCall) => number;
  onChunk?: (call: FakeCall) => Misbehaviour;
  failStart?: (worker: number) => boolean;
}

export class FakeWorkers {
  created = 0;
  readonly terminated = new Set<number>();
  readonly calls: FakeCall[] = [];
  readonly starts: { worker: number; job: EngineJob }[] = [];
  maxAlive = 0;

  constructor(private readonly options: FakeOptions = {}) {}

  alive(): number {
    return this.created - this.terminated.size;
  }

  readonly factory: PoolWorkerFactory = () => {
    const id = this.created++;
    this.maxAlive = Math.max(this.maxAlive, this.alive());
    let die!: (cause: Error) => void;
    const stopped = new Promise<never>((_, reject) => (die = reject));
    stopped.catch(() => {});
    const worker: PoolWorker = {
      stopped,
      terminate: () => {
        this.terminated.add(id);
      },
      engine: {
        start: async (job) => {
          this.starts.push({ worker: id, job });
          await pause(1);
          if (this.options.failStart?.(id)) throw new Error(`start failed on worker ${id}`);
        },
        runChunk: async (start, count, attempt) => {
          if (this.terminated.has(id)) throw new Error(`worker ${id} was used after terminate()`);
          const call = { worker: id, start, count, attempt };
          this.calls.push(call);
          await pause(this.options.delay?.(call) ?? 1);
          switch (this.options.onChunk?.(call)) {
            case 'throw':
              throw new Error(`bad chunk on worker ${id}`);
            case 'die':
              die(new Error(`worker ${id} stopped unexpectedly`));
              return new Promise<never>(() => {});
            case 'hang':
              return new Promise<never>(() => {});
            case 'wrong-size':
              return fakeChunk(start, count - 1);
            default:
              return fakeChunk(start, count);
          }
        },
      },
    };
    return worker;
  };
}

function pause(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}
