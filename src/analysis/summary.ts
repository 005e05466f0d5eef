/**
 * The analysis parts of summary.json (the CLI adds samples, seed, hash, version, apogee, modes).
 *
 * @example
 *   const summary = { samples, seed, ...summaryParts(result) };
 *   // { contours: [{level, area_m2, maxDistance_m}], keepOut: {...}, areas: [{name, kind, hits, probability, upper95}] }
 */
import type { AnalysisResult } from './index.js';
import type { PartFigures } from './parts.js';

export interface SummaryParts {
  contours: { level: number; area_m2: number; maxDistance_m: number; samplesInBand: number }[];
  keepOut: {
    level: number;
    margin_m: number;
    area_m2: number;
    maxDistance_m: number;
    outsideShare: number;
    outsideUpper95: number;
  };
  /** With parts, `probability` is the chance that at least one piece lands inside, `expectedLandings` the pieces per flight. */
  areas: { name: string; kind: string; hits: number; probability: number; upper95: number; expectedLandings?: number }[];
  /** Per part (whole object and each fragment class), when the object may break up. */
  parts?: PartFigures[];
  warnings: string[];
}

export function summaryParts(result: AnalysisResult): SummaryParts {
  const bandOf = (level: number) => result.bands.find((b) => b.level === level)?.samples ?? 0;
  const k = result.keepOut.properties;
  return {
    contours: result.contours.features.map((f) => ({
      level: f.properties.level,
      area_m2: f.properties.area_m2,
      maxDistance_m: f.properties.maxDistance_m,
      samplesInBand: bandOf(f.properties.level),
    })),
    keepOut: {
      level: k.level,
      margin_m: k.margin_m,
      area_m2: k.area_m2,
      maxDistance_m: k.maxDistance_m,
      outsideShare: result.keepOutOutside.share,
      outsideUpper95: result.keepOutOutside.upper95,
    },
    areas: result.areas.map((a) => ({
      name: a.name,
      kind: a.kind,
      hits: a.hits,
      probability: a.probability,
      upper95: a.upper95,
      ...(a.expectedLandings !== undefined ? { expectedLandings: a.expectedLandings } : {}),
    })),
    ...(result.parts ? { parts: result.parts } : {}),
    warnings: result.warnings,
  };
}
