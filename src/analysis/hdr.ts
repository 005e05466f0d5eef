/**
 * Density thresholds of highest-density regions.
 *
 * The p-region is { x : f(x) ≥ t_p }, the smallest region holding probability p. The threshold is
 * taken as the density quantile of the samples themselves (R. J. Hyndman, "Computing and graphing
 * highest density regions", The American Statistician 50(2), 1996): t_p is the density at which the
 * samples, taken from the densest down, accumulate weight p. Using the samples rather than the
 * smoothed grid's own mass keeps the region's coverage at p even though smoothing widens the
 * estimate by the kernel.
 *
 * @example
 *   const f = densityAt(grid, set.east, set.north);
 *   const [t50, t90] = hdrThresholds(f, set.weight, [0.5, 0.9]); // t50 > t90
 *   gridMassThreshold(grid.values, grid.dx * grid.dy, 0.9)        // fallback for tied samples
 */
import { weightedQuantile } from './weightedStats.js';

export function hdrThresholds(densityAtSamples: Float64Array, weights: Float64Array, levels: number[]): number[] {
  // The densest-first cumulative weight reaching p is the ascending cumulative of −f reaching p.
  const negated = new Float64Array(densityAtSamples.length);
  for (let k = 0; k < negated.length; k++) negated[k] = -densityAtSamples[k];
  return levels.map((p) => {
    if (!(p > 0 && p < 1)) throw new Error(`probability level must be between 0 and 1, got ${p}`);
    return -weightedQuantile(negated, weights, p);
  });
}

/**
 * Fallback threshold from the smoothed grid itself: the density at which the grid nodes, densest
 * first, accumulate mass p. Used when many samples share one landing point (a mode without any
 * spread): their common density is the peak, and the sample quantile would give an empty region.
 * The smoothed grid is wider than the data by the kernel, so this region is somewhat larger.
 */
export function gridMassThreshold(values: Float64Array, cellArea: number, p: number): number {
  const mass = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) mass[k] = values[k] * cellArea;
  const negated = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) negated[k] = -values[k];
  return -weightedQuantile(negated, mass, p);
}
