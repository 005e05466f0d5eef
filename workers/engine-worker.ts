import * as Comlink from 'comlink';
import { DispersionRunner } from '../src/dispersion/runner.js';
import { chunkBuffers, type EngineJob, type EngineWorkerApi } from '../src/pool/protocol.js';
import { faultHits, type TestFault } from './test-fault.js';

/**
 * The code every worker runs, whether a Node thread or a Web Worker: one engine for the job, then
 * chunks on request. All flight physics stays in src/; this only adapts it to messages.
 */
export function createEngineWorkerApi(fault: TestFault | null, endWorker: () => never): EngineWorkerApi {
  let runner: DispersionRunner | null = null;
  return {
    start(job: EngineJob): void {
      runner = new DispersionRunner(job.scenario, { samples: job.samples, seed: job.seed });
    },
    runChunk(start: number, count: number, attempt: number) {
      if (!runner) throw new Error('runChunk was called before start');
      if (faultHits(fault, start, count, attempt)) {
        // Fly up to the faulty sample first, so the fault strikes mid-chunk like a real one would.
        runner.runChunk(start, fault.sample - start);
        if (fault.kind === 'exit') endWorker();
        throw new Error(`test fault at sample ${fault.sample}`);
      }
      const chunk = runner.runChunk(start, count);
      return Comlink.transfer(chunk, chunkBuffers(chunk));
    },
  };
}
