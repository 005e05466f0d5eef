/**
 * areas.csv: one row per site area (RFC 4180 quoting: fields with a comma, quote or line break are
 * quoted, quotes doubled).
 *
 * @example
 *   writeAreasCsv(result.areas)
 *   // name,kind,hits,probability,upper95,intersects_keep_out,area_m2,people,people_per_m2,sheltered,
 *   // expected_casualties,expected_casualties_upper95,max_individual_risk,note
 */
import type { AreaResult } from './areas.js';
import { neutraliseFormula } from '../scenario/safe-text.js';

/** One CSV cell: RFC 4180 quoting, and text that a spreadsheet would run as a formula neutralised (safe-text.ts). */
export function csvField(value: string | number | boolean | undefined | null): string {
  if (value === undefined || value === null) return '';
  const text = typeof value === 'string' ? neutraliseFormula(value) : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const AREAS_CSV_HEADER =
  'name,kind,hits,probability,upper95,intersects_keep_out,area_m2,people,people_per_m2,sheltered,' +
  'expected_casualties,expected_casualties_upper95,max_individual_risk,note';

const sig = (x: number | undefined, digits = 3) => (x === undefined ? undefined : x.toPrecision(digits));

export function writeAreasCsv(areas: AreaResult[]): string {
  const rows = areas.map((a) =>
    [
      a.name,
      a.kind,
      a.hits,
      a.probability.toPrecision(6),
      a.upper95.toPrecision(6),
      a.intersectsKeepOut,
      a.area_m2.toFixed(1),
      a.people,
      sig(a.peoplePerM2, 4),
      a.sheltered,
      sig(a.expectedCasualties),
      sig(a.casualtiesUpper95),
      sig(a.maxIndividualRisk),
      a.note,
    ]
      .map(csvField)
      .join(','),
  );
  return [AREAS_CSV_HEADER, ...rows].join('\n') + '\n';
}
