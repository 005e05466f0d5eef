import { dirname, join } from 'node:path';
import { Worker } from 'node:worker_threads';
import type { SheetJob } from '../report/result-data-files.js';
import { nodeWorkerScript } from '../pool/node.js';

export interface DrawnSheet {
  svg: string;
  pdf: Uint8Array;
}

/**
 * A worker thread that draws the review sheet. Started early (`SheetThread.start`), it loads the
 * sheet code while the samples fly; `draw` hands it the sheet's input and resolves with the files.
 * A cancelled command ends the thread at once, however long the drawing would still take.
 */
export class SheetThread {
  private readonly thread: Worker;
  private ended = false;
  private readonly stopped: Promise<never>;

  private constructor(script: string) {
    this.thread = new Worker(script);
    // Nothing keeps the process alive for a thread that is not drawing.
    this.thread.unref();
    this.stopped = new Promise<never>((_, reject) => {
      this.thread.once('error', (error) => reject(new Error(`the sheet thread crashed: ${error.message}`)));
      this.thread.once('exit', (code) => {
        if (!this.ended) reject(new Error(`the sheet thread stopped unexpectedly (exit code ${code})`));
      });
    });
    this.stopped.catch(() => {});
  }

  /** Starts the thread now (from the compiled dist/workers/sheet-entry.js). */
  static start(): SheetThread {
    return new SheetThread(join(dirname(nodeWorkerScript()), 'sheet-entry.js'));
  }

  /** Draws one sheet; rejects with the signal's reason as soon as `signal` aborts. */
  draw(job: SheetJob, signal?: AbortSignal): Promise<DrawnSheet> {
    signal?.throwIfAborted();
    this.thread.ref();
    const answer = new Promise<DrawnSheet>((resolve, reject) => {
      const onAbort = () => {
        this.dispose();
        reject(signal!.reason);
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      this.thread.once('message', (reply: DrawnSheet | { error: string }) => {
        signal?.removeEventListener('abort', onAbort);
        this.thread.unref();
        if ('error' in reply) reject(new Error(`drawing the review sheet failed: ${reply.error}`));
        else resolve({ svg: reply.svg, pdf: new Uint8Array(reply.pdf.buffer, reply.pdf.byteOffset, reply.pdf.byteLength) });
      });
    });
    this.thread.postMessage(job);
    return Promise.race([answer, this.stopped]);
  }

  /** Ends the thread (safe to call more than once). */
  dispose(): void {
    if (this.ended) return;
    this.ended = true;
    void this.thread.terminate();
  }
}
