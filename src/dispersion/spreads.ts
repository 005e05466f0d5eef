import jstatModule from 'jstat';
import type { Spread } from '../scenario/types.js';

const { jStat } = jstatModule;

/**
 * The offset a spread gives for one uniform number u in (0, 1), by the inverse CDF. Every
 * parameter consumes exactly one uniform whatever its distribution, so the same sample index sees
 * the same underlying numbers in every scenario variant (common random numbers).
 *
 * `nominal` scales relative spreads ("8 %").
 *
 * @example
 * spreadOffset({ kind: 'normal', sd: 2, relative: false }, 10, 0.5) // 0 (the median)
 * spreadOffset({ kind: 'uniform', lo: -1, hi: 3, relative: false }, 10, 0.25) // 0
 */
export function spreadOffset(spread: Spread, nominal: number, u: number): number {
  const unit = spread.relative ? Math.abs(nominal) : 1;
  if (spread.kind === 'uniform') return unit * (spread.lo + u * (spread.hi - spread.lo));
  if (spread.sd === 0) return 0;
  let p = u;
  if (spread.limit !== undefined) {
    // Truncated normal: map u onto the CDF range inside ±limit.
    const lo = jStat.normal.cdf(-spread.limit, 0, 1);
    p = lo + u * (1 - 2 * lo);
  }
  return unit * spread.sd * jStat.normal.inv(p, 0, 1);
}
