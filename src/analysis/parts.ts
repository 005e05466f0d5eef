import type { LandingSet } from './types.js';

/**
 * Landings of objects that break into pieces (scenario `breakup`): one sample (flight) may yield
 * many landings. Every landing row carries its sample's weight (the probability per flight the
 * sample stands for), so the weights of a breaking mode's rows add up to count × P(mode): the
 * expected number of landings per flight. Figures per flight (chances, expected casualties) are
 * therefore divided by the weight that stands for one flight, Σ over samples of the sample weight
 * (each sample once), not by the sum over rows; with one landing per sample the two are equal.
 *
 * @example
 *   perFlightWeight(set)   // 1 for a run's own landing set (its modes' probabilities add up to 1)
 */

/** Whether some sample of the set has more than one landing row (a `part` column says so). */
export function hasParts(set: LandingSet): boolean {
  return set.part !== undefined && set.sample !== undefined;
}

/** The weight of each distinct sample (first row's weight), in order of first appearance. */
export function sampleWeightsOf(set: LandingSet): Float64Array {
  if (!hasParts(set)) return set.weight;
  const seen = new Set<number>();
  const out: number[] = [];
  for (let i = 0; i < set.east.length; i++) {
    const s = set.sample![i];
    if (seen.has(s)) continue;
    seen.add(s);
    out.push(set.weight[i]);
  }
  return Float64Array.from(out);
}

/** The total weight that stands for one flight (see above). */
export function perFlightWeight(set: LandingSet): number {
  const w = sampleWeightsOf(set);
  let total = 0;
  for (let i = 0; i < w.length; i++) total += w[i];
  return total;
}

/**
 * Chance per flight that at least one landing of a sample falls where `inside(i)` holds:
 * Σ over samples with a row inside of the sample weight, over the per-flight weight.
 */
export function chanceOfAny(set: LandingSet, inside: (i: number) => boolean, perFlight = perFlightWeight(set)): number {
  if (!hasParts(set)) {
    let w = 0;
    for (let i = 0; i < set.east.length; i++) if (inside(i)) w += set.weight[i];
    return w / perFlight;
  }
  const counted = new Set<number>();
  let w = 0;
  for (let i = 0; i < set.east.length; i++) {
    const s = set.sample![i];
    if (counted.has(s) || !inside(i)) continue;
    counted.add(s);
    w += set.weight[i];
  }
  return w / perFlight;
}

/** summary.json's per-part figures: landings written and expected landings per flight, by mode. */
export interface PartFigures {
  name: string;
  /** Landing rows of this part. */
  landings: number;
  /** Expected landings of this part per flight (all modes). */
  expectedLandings: number;
  /** Expected landings per flight from each mode, indexed like the set's modes. */
  byMode: { mode: string; expectedLandings: number }[];
}

/**
 * Landings per part and per mode. For a run, a part's expected landings per flight add up to
 * count × Σ P(modes that break up) for a fragment class (less what failed or landed before the
 * break) and to P(modes that land whole) for the whole object.
 */
export function partFigures(set: LandingSet): PartFigures[] | undefined {
  if (!hasParts(set) || !set.partNames) return undefined;
  const perFlight = perFlightWeight(set);
  return set.partNames.map((name, k) => {
    let landings = 0;
    const byMode = new Float64Array(set.modeNames.length);
    for (let i = 0; i < set.east.length; i++) {
      if (set.part![i] !== k) continue;
      landings++;
      byMode[set.mode[i]] += set.weight[i];
    }
    const total = byMode.reduce((a, b) => a + b, 0);
    return {
      name,
      landings,
      expectedLandings: total / perFlight,
      byMode: set.modeNames.map((mode, m) => ({ mode, expectedLandings: byMode[m] / perFlight })),
    };
  });
}
