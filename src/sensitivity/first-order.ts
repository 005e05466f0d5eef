/**
 * First-order variance-based sensitivity indices from given data: S_j = Var(E[Y | X_j]) / Var(Y),
 * estimated from the same samples the study already flew, with no extra model runs.
 *
 * The method is the binned correlation ratio of the "given data" approach (E. Plischke,
 * E. Borgonovo & C. L. Smith, Global sensitivity measures from given data, European Journal of
 * Operational Research 226 (2013) 536–550): sort the samples into equal-probability classes of X_j,
 * and compare the variance of the class means with the total variance. Because every spread in a
 * study is drawn from a uniform number u_j by its inverse CDF, classes of u_j are classes of X_j of
 * equal probability, with no sorting.
 *
 * With finite samples the spread of class means contains noise even for an input that does nothing;
 * the ANOVA ε² correction (T. L. Kelley, An unbiased correlation ratio measure, PNAS 21 (1935) 554)
 * subtracts its expectation: ε² = (SS_between − (M − 1)·MS_within) / SS_total, floored at 0.
 *
 * Weights (rare failure modes over-sampled and weighted back) enter every sum.
 *
 * @example
 * // u[j][i]: the uniform number of input j in sample i; y[i]: the output
 * firstOrderIndex(u[0], y, weights, 22) // ≈ S_1
 */
export function firstOrderIndex(
  classOf: (i: number) => number,
  classes: number,
  y: Float64Array,
  weights: Float64Array | null = null,
): number {
  const n = y.length;
  const sumW = new Float64Array(classes);
  const sumY = new Float64Array(classes);
  let total = 0;
  let mean = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    const w = weights === null ? 1 : weights[i];
    if (!(w > 0)) continue;
    const c = classOf(i);
    sumW[c] += w;
    sumY[c] += w * y[i];
    total += w;
    mean += w * y[i];
    count++;
  }
  if (total <= 0 || count < 2) return NaN;
  mean /= total;
  let ssTotal = 0;
  let ssWithin = 0;
  for (let i = 0; i < n; i++) {
    const w = weights === null ? 1 : weights[i];
    if (!(w > 0)) continue;
    const c = classOf(i);
    const d = y[i] - mean;
    const e = y[i] - sumY[c] / sumW[c];
    ssTotal += w * d * d;
    ssWithin += w * e * e;
  }
  if (!(ssTotal > 0)) return 0;
  let used = 0;
  for (let c = 0; c < classes; c++) if (sumW[c] > 0) used++;
  // Effective sample size of the weights (Kish), for the degrees of freedom of the correction.
  let sw = 0;
  let sw2 = 0;
  for (let i = 0; i < n; i++) {
    const w = weights === null ? 1 : weights[i];
    if (w > 0) {
      sw += w;
      sw2 += w * w;
    }
  }
  const nEff = (sw * sw) / sw2;
  const ssBetween = ssTotal - ssWithin;
  const msWithin = ssWithin / Math.max(1, nEff - used);
  const corrected = (ssBetween - (used - 1) * msWithin * (total / nEff)) / ssTotal;
  return Math.min(1, Math.max(0, corrected));
}

/**
 * Number of equal-probability classes for n samples: about √n / 1.5 (30 at 2,000 samples), at
 * least 4. More classes follow a wiggly E[Y | X] better (less bias); fewer leave more samples per
 * class (less noise); on the Ishigami function this balance gave the smallest error at 2,000.
 */
export function defaultClassCount(n: number): number {
  return Math.max(4, Math.round(Math.sqrt(n) / 1.5));
}

/** Class of a uniform number u in (0, 1) among `classes` equal-probability classes. */
export function uniformClass(u: number, classes: number): number {
  const c = Math.floor(u * classes);
  return c < 0 ? 0 : c >= classes ? classes - 1 : c;
}
