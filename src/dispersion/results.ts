import type { ChunkResult } from './runner.js';
import { allocateChunk } from './runner.js';
import type { ModePlan } from './modes.js';
import { placeColumns } from './columns.js';

/** A whole run's samples, indexed by sample number, with the mode plan that weights them. */
export interface RunResult extends ChunkResult {
  plan: ModePlan;
  seed: string;
}

/**
 * Places chunks (in any order) into one result indexed by sample. Throws if a sample is missing.
 * `range` ([first sample, count]) assembles only part of the run, as a shard does; the result's
 * `start` is then the range's first sample.
 */
export function assembleChunks(
  samples: number,
  chunks: readonly ChunkResult[],
  plan: ModePlan,
  seed: string,
  range: readonly [number, number] = [0, samples],
): RunResult {
  // Pieces per sample, as the chunks were flown (0 without a breakup).
  const pieces = chunks.length > 0 && chunks[0].count > 0 ? chunks[0].pieceStatus.length / chunks[0].count : 0;
  const all = allocateChunk(range[0], range[1], pieces);
  const filled = new Uint8Array(range[1]);
  for (const c of chunks) {
    placeColumns(all, c);
    filled.fill(1, c.start - range[0], c.start - range[0] + c.count);
  }
  const missing = filled.indexOf(0);
  if (missing >= 0) throw new Error(`internal error: sample ${range[0] + missing} was never flown`);
  return { ...all, plan, seed };
}

/**
 * Weight of each sample: its mode's probability shared among the mode's landed samples, 0 for a
 * failed sample. Failed samples are reported, not silently dropped; the weights of each mode's
 * landed samples still add up to the mode's probability.
 */
export function sampleWeights(run: RunResult): Float64Array {
  const modes = run.plan.names.length;
  const landed = new Int32Array(modes);
  for (let i = 0; i < run.count; i++) if (run.status[i] === 0) landed[run.mode[i]]++;
  const w = new Float64Array(run.count);
  for (let i = 0; i < run.count; i++) {
    const m = run.mode[i];
    if (run.status[i] === 0) w[i] = run.plan.probability[m] / landed[m];
  }
  return w;
}
