/**
 * One-sided exact binomial upper bound (C. J. Clopper & E. S. Pearson, Biometrika 26:404, 1934):
 * the largest probability p for which seeing k or fewer hits in n trials still has chance at least
 * 1 − confidence. It is the confidence-quantile of Beta(k + 1, n − k); with no hits it is
 * 1 − (1 − confidence)^(1/n), about 3/n at 95 % ("rule of three", Hanley & Lippman-Hand,
 * JAMA 249:1743, 1983).
 *
 * @example
 *   clopperPearsonUpper(0, 1000)   // 0.002991
 *   clopperPearsonUpper(5, 200)    // 0.05184
 */
import { inverseRegularizedBeta } from './betaFunction.js';

export function clopperPearsonUpper(hits: number, trials: number, confidence = 0.95): number {
  if (!(trials > 0)) return 1;
  if (hits < 0 || hits > trials) throw new Error(`hits ${hits} outside 0..${trials}`);
  if (hits >= trials) return 1;
  if (hits === 0) return 1 - Math.pow(1 - confidence, 1 / trials);
  return inverseRegularizedBeta(confidence, hits + 1, trials - hits);
}

/**
 * Upper bound for a weighted share. Weighted samples (over-sampled rare modes weighted back) carry
 * less information than their raw count, so the bound uses Kish's effective sample size
 * n_eff = (Σw)² / Σw² as the number of trials and share × n_eff as the (possibly fractional) hit
 * count; the Beta quantile is defined for fractional counts too. With equal weights this is the
 * plain Clopper–Pearson bound.
 */
export function weightedUpperBound(share: number, effectiveN: number, confidence = 0.95): number {
  const trials = effectiveN;
  const hits = Math.min(trials, Math.max(0, share * trials));
  return clopperPearsonUpper(hits, trials, confidence);
}
