/**
 * Adds samples in rounds until the farthest reach of the requested individual-risk line moves less
 * than 2 % between rounds and the samples resolve that line (src/risk/individual.ts), or the next
 * round would pass the cap. Two rounds can agree by chance while the line still rests on a handful
 * of samples, hence the second condition. Each round doubles the sample
 * count and flies the whole run again (the mode plan depends on the count), so the final result is
 * exactly what a plain run with that many samples gives.
 *
 * @example
 *   const { outcome, rounds, stopped } = await untilStable(2000, 200_000, async (n) => {
 *     const o = await study(n);
 *     return { outcome: o, reach: farthestReach(o.analysis.risk), resolved: o.analysis.risk.standingLine.resolved };
 *   });
 */
import type { RiskResult } from './index.js';

export const STABLE_TOLERANCE = 0.02;
export const DEFAULT_STABLE_CAP = 200_000;

export interface StableRound {
  samples: number;
  /** Farthest reach of the line, m (0: nowhere over the level). */
  reach_m: number;
  /** Relative move from the previous round (null for the first). */
  moved: number | null;
  resolved: boolean;
}

export interface StableResult<T> {
  outcome: T;
  rounds: StableRound[];
  /** 'stable': the reach moved less than 2 % and the line is resolved; 'cap': stopped at the cap before that. */
  stopped: 'stable' | 'cap';
}

/** Farthest reach of the region at the standing level, over all octants, m. */
export function farthestReach(risk: RiskResult | undefined): number {
  if (risk === undefined) return 0;
  return Math.max(0, ...Object.values(risk.standingDistance_m));
}

export async function untilStable<T>(
  start: number,
  cap: number,
  study: (samples: number) => Promise<{ outcome: T; reach: number; resolved: boolean }>,
  onRound: (round: StableRound) => void = () => {},
): Promise<StableResult<T>> {
  const rounds: StableRound[] = [];
  let samples = Math.min(start, cap);
  let previous: number | null = null;
  while (true) {
    const { outcome, reach, resolved } = await study(samples);
    const moved = previous === null ? null : reach === previous ? 0 : Math.abs(reach - previous) / Math.max(reach, previous);
    const round = { samples, reach_m: reach, moved, resolved };
    rounds.push(round);
    onRound(round);
    if (moved !== null && moved < STABLE_TOLERANCE && resolved) return { outcome, rounds, stopped: 'stable' };
    if (samples * 2 > cap) return { outcome, rounds, stopped: 'cap' };
    previous = reach;
    samples *= 2;
  }
}
