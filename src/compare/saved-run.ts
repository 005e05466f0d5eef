/**
 * A saved run to compare with, from the texts of the files the user picked (the page has no
 * folders, only files): a whole results folder is checked exactly as `strewn compare` checks one
 * (src/report/sheet/results-texts.ts); summary.json alone (perhaps with keepout.geojson) is
 * accepted too, its figures checked the same way, with no site and no inputs.
 *
 * @example
 *   const saved = savedRunFromTexts('results/club-rocket', { 'summary.json': text });
 *   compareStudies(saved, current, CAUTION)
 */
import { checkPolygonFeatures, checkSummary, parse, resultsFromTexts, ResultsFolderError, type FolderTexts } from '../report/sheet/results-texts.js';
import type { KeepOutProps } from '../report/sheet/sheet-input.js';
import type { CompareSide } from './compare.js';

export { ResultsFolderError };

/** The files of a results folder a comparison reads; anything else picked is ignored. */
export const COMPARED_FILES = ['summary.json', 'scenario.json', 'review.json', 'contours.geojson', 'keepout.geojson'] as const;

export function savedRunFromTexts(folder: string, texts: FolderTexts): CompareSide {
  if (texts['summary.json'] === undefined) {
    const given = Object.keys(texts).join(', ') || 'nothing';
    throw new ResultsFolderError(`${folder}: no summary.json among the files (${given}); pick the summary.json of a results folder, or all of its files`);
  }
  // The comparison does not draw landings: leave them out however many there are.
  const { 'landings.geojson': _landings, ...rest } = texts;
  if (rest['scenario.json'] !== undefined || rest['review.json'] !== undefined) {
    const input = resultsFromTexts(folder, rest);
    return { summary: input.summary, scenario: input.scenario, review: input.review, keepOut: input.keepOut };
  }
  const summary = checkSummary(folder, parse(folder, 'summary.json', rest['summary.json']!));
  const keepOutText = rest['keepout.geojson'];
  const keepOut = keepOutText === undefined ? null : checkPolygonFeatures<KeepOutProps>(folder, 'keepout.geojson', parse(folder, 'keepout.geojson', keepOutText), ['level', 'margin_m', 'area_m2', 'maxDistance_m']);
  return { summary, scenario: null, review: null, keepOut };
}
