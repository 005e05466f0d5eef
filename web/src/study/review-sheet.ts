import type { Paper } from '../../../src/report/sheet/index.js';
import type { UnitSystem } from '../units/systems.js';
import type { Study } from './compose.js';
import type { EnvelopeRecord } from '../../../src/envelope/sheet-page.js';

/**
 * The review sheet redrawn from a run's result files on another paper size or in other units,
 * as `strewn sheet <folder> --paper … --units … [--envelope …]` redraws it from a results folder;
 * the wind-limits page is added when `envelope` is given (the caller checks it is of the same scenario).
 */
export async function redrawReviewSheet(study: Study, paper: Paper, units: UnitSystem, envelope?: EnvelopeRecord): Promise<Uint8Array> {
  return (await redrawSheet(study, paper, units, envelope)).pdf;
}

/** The sheet's map page alone as SVG, in `units` on `paper` (the command line's map.svg, redrawn). */
export async function redrawMapSvg(study: Study, paper: Paper, units: UnitSystem): Promise<string> {
  return (await redrawSheet(study, paper, units)).svg;
}

async function redrawSheet(study: Study, paper: Paper, units: UnitSystem, envelope?: EnvelopeRecord): Promise<{ svg: string; pdf: Uint8Array }> {
  const text = async (name: string): Promise<string | null> => (await study.files.find((f) => f.name === name)?.blob.text()) ?? null;
  const [summary, scenario, review, contours, keepOut] = await Promise.all(['summary.json', 'scenario.json', 'review.json', 'contours.geojson', 'keepout.geojson'].map(text));
  if (summary === null || scenario === null || review === null) throw new Error('the run has no summary, scenario or review file to draw the sheet from');
  // Loaded on demand, like the result writers (see compose.ts).
  await import('../exports/pdf-fonts.js');
  const [{ buildSheet }, { sheetInputFromTexts }] = await Promise.all([import('../../../src/report/sheet/index.js'), import('../../../src/report/sheet/sheet-input.js')]);
  return buildSheet(sheetInputFromTexts({ summary, scenario, review, contours, keepOut }, study.set), { paper, units, envelope });
}
