import type { ChunkResult } from './runner.js';
import { allocateChunk } from './runner.js';
import type { ModePlan } from './modes.js';

/** A whole run's samples, indexed by sample number, with the mode plan that weights them. */
export interface RunResult extends ChunkResult {
  plan: ModePlan;
  seed: string;
}

/** Places chunks (in any order) into one result indexed by sample. Throws if a sample is missing. */
export function assembleChunks(samples: number, chunks: readonly ChunkResult[], plan: ModePlan, seed: string): RunResult {
  const all = allocateChunk(0, samples);
  const filled = new Uint8Array(samples);
  for (const c of chunks) {
    all.east.set(c.east, c.start);
    all.north.set(c.north, c.start);
    all.apogee.set(c.apogee, c.start);
    all.flightTime.set(c.flightTime, c.start);
    all.impactSpeed.set(c.impactSpeed, c.start);
    all.impactAngle.set(c.impactAngle, c.start);
    all.impactMass.set(c.impactMass, c.start);
    all.mode.set(c.mode, c.start);
    all.status.set(c.status, c.start);
    all.steps.set(c.steps, c.start);
    filled.fill(1, c.start, c.start + c.count);
  }
  const missing = filled.indexOf(0);
  if (missing >= 0) throw new Error(`internal error: sample ${missing} was never flown`);
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
