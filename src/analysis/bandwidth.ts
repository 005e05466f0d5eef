/**
 * Kernel bandwidth for the 2-D landing density.
 *
 * Rule: Scott's normal-reference rule for d = 2 dimensions, h_i = s_i n^(−1/6) per axis
 * (D. W. Scott, Multivariate Density Estimation, 1992: h_i = σ_i n^(−1/(d+4)) with d = 2), where s_i is the
 * robust scale min(σ_i, IQR_i / 1.34) that Silverman (Density Estimation for Statistics and Data
 * Analysis, 1986, rule of thumb) recommends so that a far, rare failure mode does not widen the kernel of
 * the main cloud. With weighted samples n is Kish's effective sample size (Σw)² / Σw².
 *
 * @example
 *   const h = scottBandwidth(set.east, set.north, set.weight);
 *   // h.east, h.north in metres; h.rule names the rule for reports
 */
import { effectiveSampleSize, weightedMeanSd, weightedQuantile } from './weightedStats.js';

export interface Bandwidth {
  east: number;
  north: number;
  /** Effective sample size used in the rule. */
  effectiveN: number;
  rule: string;
  /** True when the caller fixed the bandwidth. */
  overridden: boolean;
  /** True when the landings were too tightly packed along an axis and a floor was used. */
  floored: boolean;
  /** True when they are packed within the floor along both axes. */
  packed: boolean;
}

/** Largest ratio of the two axes' bandwidths. */
export const MAX_AXIS_RATIO = 50;

/** Smallest bandwidth used, m: below this the landings are treated as one point. */
export const MIN_BANDWIDTH_M = 0.5;

export const BANDWIDTH_RULE =
  'Scott (1992) 2-D normal reference h = s n^(-1/6) per axis, s = min(sd, IQR/1.34) (Silverman 1986), n = effective sample size';

function robustScale(values: Float64Array, weights: Float64Array): number {
  const { sd } = weightedMeanSd(values, weights);
  const iqr = weightedQuantile(values, weights, 0.75) - weightedQuantile(values, weights, 0.25);
  // An IQR of zero (more than half the weight on one value) says nothing about the spread of the rest.
  return iqr > 0 ? Math.min(sd, iqr / 1.34) : sd;
}

export function scottBandwidth(
  east: Float64Array,
  north: Float64Array,
  weights: Float64Array,
  override?: { east: number; north: number } | number,
): Bandwidth {
  const effectiveN = effectiveSampleSize(weights);
  if (override !== undefined) {
    const he = typeof override === 'number' ? override : override.east;
    const hn = typeof override === 'number' ? override : override.north;
    if (!(he > 0 && hn > 0)) throw new Error('bandwidth override must be positive');
    return { east: he, north: hn, effectiveN, rule: 'set by the caller', overridden: true, floored: false, packed: false };
  }
  const factor = Math.pow(Math.max(effectiveN, 1), -1 / 6);
  const he = robustScale(east, weights) * factor;
  const hn = robustScale(north, weights) * factor;
  const floored = !(he >= MIN_BANDWIDTH_M && hn >= MIN_BANDWIDTH_M);
  // Landings on one line (every north the same, say) give that axis no scale at all; a kernel
  // kilometres long and half a metre wide draws contours of no area. Neither axis is let fall
  // below 1/MAX_AXIS_RATIO of the other (common practice, no source: real dispersions are far
  // rounder than that).
  const wide = Math.max(he || 0, hn || 0) / MAX_AXIS_RATIO;
  return {
    east: Math.max(he || 0, MIN_BANDWIDTH_M, wide),
    north: Math.max(hn || 0, MIN_BANDWIDTH_M, wide),
    effectiveN,
    rule: BANDWIDTH_RULE,
    overridden: false,
    floored,
    packed: !(he >= MIN_BANDWIDTH_M) && !(hn >= MIN_BANDWIDTH_M),
  };
}
