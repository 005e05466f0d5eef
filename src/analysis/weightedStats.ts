/**
 * Weighted summary statistics on typed arrays, linear time (no full sort of a million points).
 *
 * @example
 *   effectiveSampleSize(new Float64Array([1, 1, 1, 1]))      // 4
 *   weightedQuantile(values, weights, 0.25)                  // lower quartile
 *   weightedQuantile(values, weights, 0.5, Uint32Array.of(0, 2, 5)) // median of entries 0, 2, 5
 */

/**
 * Kish's effective sample size (Σw)² / Σw²: the number of equally weighted samples that would give
 * the same variance of a weighted mean. Equals the count when all weights are equal.
 */
export function effectiveSampleSize(weights: Float64Array): number {
  let total = 0;
  let squares = 0;
  for (let i = 0; i < weights.length; i++) {
    total += weights[i];
    squares += weights[i] * weights[i];
  }
  return squares > 0 ? (total * total) / squares : 0;
}

/** Weighted mean and (population, i.e. divided by Σw) standard deviation. */
export function weightedMeanSd(values: Float64Array, weights: Float64Array): { mean: number; sd: number } {
  let total = 0;
  let first = 0;
  for (let i = 0; i < values.length; i++) {
    total += weights[i];
    first += weights[i] * values[i];
  }
  const mean = first / total;
  let second = 0;
  for (let i = 0; i < values.length; i++) {
    const d = values[i] - mean;
    second += weights[i] * d * d;
  }
  return { mean, sd: Math.sqrt(second / total) };
}

const BINS = 4096;
const SMALL = 512;

/**
 * Smallest value v such that the weight of all values ≤ v reaches q × Σw (0 < q ≤ 1).
 * Selection by repeated histograms: each pass keeps only the bin where the cumulative weight
 * crosses the target, so a million points take two or three linear passes.
 */
export function weightedQuantile(values: Float64Array, weights: Float64Array, q: number, subset: Uint32Array | null = null): number {
  // `subset`: the quantile of only these entries (ascending indices), with no copy of their values:
  // the same result as of the values and weights gathered in that order.
  const count = subset ? subset.length : values.length;
  if (count === 0) return NaN;
  let total = 0;
  for (let m = 0; m < count; m++) total += weights[subset ? subset[m] : m];
  const target = q * total;
  let members: Uint32Array | null = subset;
  let memberCount = count;
  let below = 0;
  const binWeight = new Float64Array(BINS);
  const binCount = new Uint32Array(BINS);
  for (;;) {
    let lo = Infinity;
    let hi = -Infinity;
    for (let m = 0; m < memberCount; m++) {
      const v = values[members ? members[m] : m];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    if (memberCount <= SMALL || !(hi > lo)) {
      return finishBySorting(values, weights, members, memberCount, below, target);
    }
    binWeight.fill(0);
    binCount.fill(0);
    const scale = BINS / (hi - lo);
    for (let m = 0; m < memberCount; m++) {
      const i = members ? members[m] : m;
      const b = Math.min(BINS - 1, Math.floor((values[i] - lo) * scale));
      binWeight[b] += weights[i];
      binCount[b]++;
    }
    let chosen = BINS - 1;
    for (let b = 0; b < BINS; b++) {
      if (below + binWeight[b] >= target) {
        chosen = b;
        break;
      }
      below += binWeight[b];
    }
    // Rounding can leave the target a hair above the total; the last non-empty bin then holds it.
    while (binCount[chosen] === 0 && chosen > 0) chosen--;
    const next = new Uint32Array(binCount[chosen]);
    let k = 0;
    for (let m = 0; m < memberCount; m++) {
      const i = members ? members[m] : m;
      if (Math.min(BINS - 1, Math.floor((values[i] - lo) * scale)) === chosen) next[k++] = i;
    }
    if (k === memberCount) {
      // Every member fell in one bin (values equal to rounding): finish exactly.
      return finishBySorting(values, weights, next, k, below, target);
    }
    members = next;
    memberCount = k;
  }
}

function finishBySorting(
  values: Float64Array,
  weights: Float64Array,
  members: Uint32Array | null,
  memberCount: number,
  below: number,
  target: number,
): number {
  const order = Array.from({ length: memberCount }, (_, m) => (members ? members[m] : m));
  order.sort((a, b) => values[a] - values[b]);
  let cumulative = below;
  for (const i of order) {
    cumulative += weights[i];
    if (cumulative >= target) return values[i];
  }
  return values[order[order.length - 1]];
}
