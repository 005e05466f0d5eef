/**
 * review.json: the analysis figures the review sheet shows that summary.json does not carry (per
 * area: head count, polygon area, overlap with the zone, expected casualties of the risk model; the part
 * of the zone outside the site boundary), and when the results were computed. Written by every
 * run, so `strewn sheet` can redraw the sheet from the results folder without flying again.
 *
 * @example
 *   const facts = reviewFacts(analysis, new Date());
 *   writeFileSync('review.json', JSON.stringify(facts, null, 2));
 */
import type { AnalysisResult } from '../../analysis/index.js';

export interface ReviewArea {
  name: string;
  people: number | null;
  area_m2: number;
  intersectsKeepOut: boolean;
  /** People per m² the risk model used; null without people or density. */
  peoplePerM2: number | null;
  /** Expected casualties per flight (risk model); null without people or density. */
  expectedCasualties: number | null;
  /** Its one-sided 95 % upper bound. */
  casualtiesUpper95: number | null;
  /** Largest individual risk per flight in the area; null without the risk model. */
  maxIndividualRisk: number | null;
}

export interface ReviewFacts {
  /** Format version of this file. */
  strewnReview: 1;
  /** When the results were computed (ISO 8601, whole seconds, UTC). */
  computedAt: string;
  /** Kish effective sample size of the landing weights (null when too few landed to analyse). */
  effectiveSamples: number | null;
  areas: ReviewArea[];
  /** Part of the keep-out zone outside site.boundary; null without a boundary or an analysis. */
  keepOutOutsideBoundary: { area_m2: number; share: number } | null;
}

/** The date a run records: SOURCE_DATE_EPOCH when set (reproducible builds' convention), else now. */
export function runDate(now: () => Date = () => new Date()): Date {
  const env = typeof process !== 'undefined' ? process.env?.SOURCE_DATE_EPOCH : undefined;
  if (env !== undefined && /^\d+$/.test(env)) return new Date(Number(env) * 1000);
  return now();
}

/** ISO 8601 without milliseconds: a record, not a stopwatch. */
export function isoSeconds(date: Date): string {
  return date.toISOString().replace(/\.\d{3}Z$/, 'Z');
}

export function reviewFacts(analysis: AnalysisResult | null, computedAt: Date): ReviewFacts {
  return {
    strewnReview: 1,
    computedAt: isoSeconds(computedAt),
    effectiveSamples: analysis ? Math.round(analysis.effectiveSamples * 10) / 10 : null,
    areas: (analysis?.areas ?? []).map((a) => ({
      name: a.name,
      people: a.people ?? null,
      area_m2: Math.round(a.area_m2 * 10) / 10,
      intersectsKeepOut: a.intersectsKeepOut,
      peoplePerM2: a.peoplePerM2 ?? null,
      expectedCasualties: a.expectedCasualties ?? null,
      casualtiesUpper95: a.casualtiesUpper95 ?? null,
      maxIndividualRisk: a.maxIndividualRisk ?? null,
    })),
    keepOutOutsideBoundary: analysis?.keepOutOutsideBoundary
      ? { area_m2: Math.round(analysis.keepOutOutsideBoundary.area_m2 * 10) / 10, share: analysis.keepOutOutsideBoundary.share }
      : null,
  };
}
