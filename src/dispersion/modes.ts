import type { FailureMode } from '../scenario/types.js';

/**
 * How a run's samples are shared between the nominal flight and the failure modes.
 *
 * Samples are assigned by index in blocks (nominal first, then each failure mode in file order),
 * so the assignment depends only on the sample count. A rare mode gets at least a minimum number
 * of samples so its footprint is resolved, and every sample carries the weight
 * probability / count of its mode: weighted sums then give each mode exactly its probability.
 */
export interface ModePlan {
  names: string[];
  probability: Float64Array;
  /** Samples assigned to each mode. */
  counts: Int32Array;
  /** Weight of one sample of each mode (0 for a mode with no samples). */
  weight: Float64Array;
  /** First sample index of each mode's block. */
  first: Int32Array;
  /** For each mode, the stage it stops ("all" or a name); "" for nominal. */
  stops: string[];
}

/** The smallest number of samples a mode with non-zero probability receives. */
export function minimumModeSamples(samples: number, modes: number): number {
  return Math.min(100, Math.floor(samples / (2 * modes)));
}

export function planModes(failures: readonly FailureMode[], samples: number): ModePlan {
  const k = failures.length + 1;
  const names = ['nominal', ...failures.map((f) => f.name)];
  const probability = new Float64Array(k);
  probability[0] = Math.max(0, 1 - failures.reduce((s, f) => s + f.probability, 0));
  failures.forEach((f, i) => (probability[i + 1] = f.probability));
  const counts = proportionalCounts(probability, samples);
  const floor = minimumModeSamples(samples, k);
  let moved = 0;
  for (let i = 1; i < k; i++) {
    if (probability[i] > 0 && counts[i] < floor) {
      moved += floor - counts[i];
      counts[i] = floor;
    }
  }
  // Take the extra samples from whichever modes have the most to spare above their own minimum.
  // The floor keeps k · floor ≤ samples / 2, so there is always enough to spare.
  const minimum = (i: number) => (probability[i] <= 0 ? 0 : i === 0 ? 1 : floor);
  while (moved > 0) {
    let donor = -1;
    let surplus = 0;
    for (let i = 0; i < k; i++) {
      const spare = counts[i] - minimum(i);
      if (spare > surplus) {
        donor = i;
        surplus = spare;
      }
    }
    if (donor < 0) break;
    const take = Math.min(surplus, moved);
    counts[donor] -= take;
    moved -= take;
  }
  const weight = new Float64Array(k);
  const first = new Int32Array(k);
  let start = 0;
  for (let i = 0; i < k; i++) {
    first[i] = start;
    start += counts[i];
    weight[i] = counts[i] > 0 ? probability[i] / counts[i] : 0;
  }
  return { names, probability, counts, weight, first, stops: ['', ...failures.map((f) => f.stage)] };
}

/** Mode index of a sample. */
export function modeOfSample(plan: ModePlan, index: number): number {
  let m = 0;
  for (let i = 1; i < plan.first.length; i++) if (plan.counts[i] > 0 && index >= plan.first[i]) m = i;
  return m;
}

/** Largest-remainder apportionment of `total` in proportion to `shares`. */
function proportionalCounts(shares: Float64Array, total: number): Int32Array {
  const sum = shares.reduce((s, v) => s + v, 0);
  const counts = new Int32Array(shares.length);
  if (sum <= 0) return counts;
  const remainders: [number, number][] = [];
  let given = 0;
  shares.forEach((s, i) => {
    const exact = (s / sum) * total;
    counts[i] = Math.floor(exact);
    given += counts[i];
    remainders.push([exact - counts[i], i]);
  });
  remainders.sort((a, b) => b[0] - a[0] || a[1] - b[1]);
  for (let j = 0; given < total; j++, given++) counts[remainders[j % remainders.length][1]]++;
  return counts;
}
