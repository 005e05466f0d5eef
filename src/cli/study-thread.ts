import { dirname, join } from 'node:path';
import { Worker } from 'node:worker_threads';
import type { AnalysisResult } from '../analysis/index.js';
import type { RunResult } from '../dispersion/results.js';
import type { Scenario } from '../scenario/types.js';
import type { StudySensitivity } from '../sensitivity/study.js';
import { nodeWorkerScript } from '../pool/node.js';

export type StudyTaskName = 'analysis' | 'sensitivity' | 'landings';

/** A part of a finished study done in another thread (workers/study-entry.ts). */
export type StudyTask =
  | { task: 'analysis'; scenario: Scenario; run: RunResult }
  | { task: 'sensitivity'; scenario: Scenario; run: RunResult }
  /** Writes landings.csv, landings.geojson and landings.fgb into `folder` (the staging folder). */
  | { task: 'landings'; scenario: Scenario; run: RunResult; folder: string };

export type StudyTaskReply =
  | { analysis: AnalysisResult | null }
  | { sensitivity: StudySensitivity | undefined }
  | { written: true };

/** A task that failed in the thread: its message, and for a file, the system error code and the file name. */
export class StudyTaskError extends Error {
  constructor(
    message: string,
    readonly code: string | undefined,
    readonly file: string | undefined,
  ) {
    super(message);
    this.name = 'StudyTaskError';
  }
}

interface Pending {
  resolve(reply: StudyTaskReply): void;
  reject(error: unknown): void;
}

/**
 * A worker thread for parts of a finished study. Started while the samples fly (`start`), it loads
 * the code of its tasks meanwhile; `run` hands it a task and resolves with the reply. Tasks given
 * to one thread are done one after another. A cancelled command ends the thread at once; `stop`
 * waits until it has ended, so nothing it writes can come after the folder is removed.
 */
export class StudyThread {
  private readonly thread: Worker;
  private ended = false;
  private readonly pending: Pending[] = [];
  private readonly exited: Promise<void>;

  private constructor(script: string, preload: StudyTaskName[]) {
    this.thread = new Worker(script, { workerData: { preload } });
    this.thread.unref();
    this.exited = new Promise((resolve) => this.thread.once('exit', () => resolve()));
    this.thread.on('message', (reply: StudyTaskReply | { error: string; code?: string; file?: string }) => {
      const next = this.pending.shift();
      if (this.pending.length === 0) this.thread.unref();
      if (!next) return;
      if ('error' in reply) next.reject(new StudyTaskError(reply.error, reply.code, reply.file));
      else next.resolve(reply);
    });
    this.thread.once('error', (error) => this.fail(new Error(`a study thread crashed: ${error.message}`)));
    this.thread.once('exit', (code) => {
      if (!this.ended) this.fail(new Error(`a study thread stopped unexpectedly (exit code ${code})`));
    });
  }

  /** Starts a thread now (from the compiled dist/workers/study-entry.js) that loads the code of `preload`. */
  static start(preload: StudyTaskName[]): StudyThread {
    return new StudyThread(join(dirname(nodeWorkerScript()), 'study-entry.js'), preload);
  }

  /** Hands the thread one task; rejects with the signal's reason as soon as `signal` aborts (the thread is ended). */
  run<R extends StudyTaskReply>(task: StudyTask, signal?: AbortSignal): Promise<R> {
    signal?.throwIfAborted();
    if (this.ended) return Promise.reject(new Error('internal error: a task for a study thread that has ended'));
    const answer = new Promise<StudyTaskReply>((resolve, reject) => {
      const onAbort = () => {
        reject(signal!.reason);
        this.dispose(signal!.reason);
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      const settle = () => signal?.removeEventListener('abort', onAbort);
      this.pending.push({
        resolve: (reply) => (settle(), resolve(reply)),
        reject: (error) => (settle(), reject(error)),
      });
    });
    this.thread.ref();
    this.thread.postMessage(task);
    return answer as Promise<R>;
  }

  private fail(error: Error): void {
    for (const p of this.pending.splice(0)) p.reject(error);
  }


  /** Ends the thread now (safe to call more than once); tasks not yet answered reject with `reason`. */
  dispose(reason: unknown = new Error('internal error: the study thread was ended')): void {
    if (this.ended) return;
    this.ended = true;
    for (const p of this.pending.splice(0)) p.reject(reason);
    void this.thread.terminate();
  }

  /** Ends the thread and resolves once it has stopped. */
  async stop(): Promise<void> {
    this.dispose();
    await this.exited;
  }
}
