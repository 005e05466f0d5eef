import type { LandingSet } from './types.js';

/**
 * Which landings a point file that map programs must open comfortably keeps when there are many:
 * a stratified systematic subset. Each failure mode is a stratum and keeps a share of the limit in
 * proportion to its landed count, but never fewer than `minPerMode` points (or all it has), so a
 * rare mode that sizes the keep-out zone stays visible. Within a mode the points kept are evenly
 * spaced in sample order; samples are independent draws, so that is an unbiased subset
 * (systematic sampling, W. G. Cochran, Sampling Techniques, 3rd ed. (1977), ch. 8, from memory).
 * Each kept point then stands for its mode's probability shared among the mode's kept points.
 */

export const GEOJSON_POINT_LIMIT = 100_000;
const MIN_PER_MODE = 2_000;

export interface LandingSubset {
  /** Indices into the landing set, ascending. */
  index: Uint32Array;
  /** Weight of each kept point (its mode's probability over the mode's kept count). */
  weight: Float64Array;
  /** What summary.json and the file say about it. */
  description: SubsetDescription;
}

export interface SubsetDescription {
  points: number;
  of: number;
  method: string;
}

export const SUBSET_METHOD =
  'stratified by failure mode (share of the limit in proportion to landed count, at least 2000 or all of a mode), evenly spaced in sample order; weight = mode probability / points kept of the mode';

/**
 * The subset, or null when every landing fits under the limit (then nothing is thinned).
 *
 * @example
 * const subset = landingSubset(set); // null below 100,000 landings
 */
export function landingSubset(set: LandingSet, limit = GEOJSON_POINT_LIMIT, minPerMode = MIN_PER_MODE): LandingSubset | null {
  const n = set.east.length;
  if (n <= limit) return null;
  const modes = set.modeNames.length;
  const landed = new Float64Array(modes);
  for (let i = 0; i < n; i++) landed[set.mode[i]]++;
  const keep = new Float64Array(modes);
  for (let m = 0; m < modes; m++) keep[m] = Math.min(landed[m], Math.max(Math.min(minPerMode, landed[m]), Math.floor((landed[m] * limit) / n)));
  // Within mode m the r-th landing (in sample order) is kept when it starts a new step of
  // landed/keep: floor(r·keep/landed) increases there.
  const rank = new Float64Array(modes);
  let total = 0;
  for (let m = 0; m < modes; m++) total += keep[m];
  const index = new Uint32Array(total);
  const weight = new Float64Array(total);
  let j = 0;
  for (let i = 0; i < n; i++) {
    const m = set.mode[i];
    const r = rank[m]++;
    if (keep[m] > 0 && (r === 0 || Math.floor((r * keep[m]) / landed[m]) !== Math.floor(((r - 1) * keep[m]) / landed[m]))) {
      index[j] = i;
      weight[j] = (set.modeProbability[m] ?? 0) / keep[m];
      j++;
    }
  }
  if (j !== total) throw new Error(`internal error: thinning kept ${j} points, planned ${total}`);
  return { index, weight, description: { points: total, of: n, method: SUBSET_METHOD } };
}
