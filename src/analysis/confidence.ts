/**
 * How much each result rests on: samples in each contour's outer band, and the share of landings
 * outside the keep-out zone with its 95 % upper bound.
 *
 * A contour's outer band is the ring between it and the next level down (for the lowest level, the
 * whole region). Since every region is { f ≥ t_p }, a sample is in the band of level p_i exactly
 * when t_i ≤ f(sample) < t_(i−1), so no polygon test is needed.
 *
 * @example
 *   const bands = contourBands(f, set.weight, [0.5, 0.9, 0.99], thresholds);
 *   const warning = topLevelWarning(bands, set.east.length); // null or { message, suggestedSamples }
 */
import { weightedUpperBound } from './clopperPearson.js';
import { effectiveSampleSize } from './weightedStats.js';

/** Fewest samples beyond the next level down that the top contour should rest on. */
export const MIN_BAND_SAMPLES = 100;

export interface ContourBand {
  level: number;
  /** The next level down (0 for the lowest). */
  innerLevel: number;
  /** Landed samples in the band. */
  samples: number;
  /** Their weighted share of all landings. */
  share: number;
  /** Kish effective size of the band's samples. */
  effectiveSamples: number;
}

export function contourBands(
  densityAtSamples: Float64Array,
  weights: Float64Array,
  levels: number[],
  thresholds: number[],
): ContourBand[] {
  let total = 0;
  for (let i = 0; i < weights.length; i++) total += weights[i];
  const order = levels.map((_, k) => k).sort((a, b) => levels[a] - levels[b]);
  const bands: ContourBand[] = [];
  order.forEach((k, rank) => {
    const upper = rank === 0 ? Infinity : thresholds[order[rank - 1]];
    const lower = thresholds[k];
    let samples = 0;
    let weight = 0;
    let squares = 0;
    for (let i = 0; i < densityAtSamples.length; i++) {
      const f = densityAtSamples[i];
      if (f >= lower && f < upper) {
        samples++;
        weight += weights[i];
        squares += weights[i] * weights[i];
      }
    }
    bands.push({
      level: levels[k],
      innerLevel: rank === 0 ? 0 : levels[order[rank - 1]],
      samples,
      share: weight / total,
      // Kish effective size of the band's samples, (Σw)² / Σw².
      effectiveSamples: squares > 0 ? (weight * weight) / squares : 0,
    });
  });
  return bands;
}

/** Round up to two significant figures, so a suggestion reads as a sample count people would pick. */
function roundUpNicely(n: number): number {
  if (n <= 100) return Math.ceil(n);
  const magnitude = Math.pow(10, Math.floor(Math.log10(n)) - 1);
  return Math.ceil(n / magnitude) * magnitude;
}

export interface BandWarning {
  level: number;
  samples: number;
  suggestedSamples: number;
  message: string;
}

/**
 * Warn when the highest level's band holds fewer than MIN_BAND_SAMPLES samples. The band's count
 * grows in proportion to the sample count, so the suggestion scales the current count up to reach
 * the minimum; with an empty band it falls back to the band's probability.
 */
export function topLevelWarning(bands: ContourBand[], totalSamples: number): BandWarning | null {
  if (bands.length === 0) return null;
  const top = bands[bands.length - 1];
  if (top.samples >= MIN_BAND_SAMPLES) return null;
  const perSample = top.samples > 0 ? top.samples / totalSamples : top.level - top.innerLevel;
  const suggestedSamples = roundUpNicely(MIN_BAND_SAMPLES / perSample);
  return {
    level: top.level,
    samples: top.samples,
    suggestedSamples,
    message:
      `The ${top.level} contour rests on only ${top.samples} samples beyond the ${top.innerLevel} contour ` +
      `(fewer than ${MIN_BAND_SAMPLES}); its outline is uncertain. About ${suggestedSamples} samples would fix this.`,
  };
}

export interface OutsideShare {
  /** Landed samples outside the zone. */
  samples: number;
  /** Weighted share of landings outside. */
  share: number;
  /** One-sided 95 % Clopper–Pearson upper bound on that share, on the effective sample size. */
  upper95: number;
}

/** Share of landings outside a region, given a 0/1 inside mask. */
export function outsideShare(inside: Uint8Array, weights: Float64Array): OutsideShare {
  let total = 0;
  let outside = 0;
  let samples = 0;
  for (let i = 0; i < inside.length; i++) {
    total += weights[i];
    if (!inside[i]) {
      outside += weights[i];
      samples++;
    }
  }
  const share = outside / total;
  return { samples, share, upper95: weightedUpperBound(share, effectiveSampleSize(weights)) };
}
