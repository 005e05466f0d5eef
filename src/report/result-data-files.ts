import type { AnalysisResult } from '../analysis/index.js';
import type { LandingSet } from '../analysis/types.js';
import { createLocalFrame } from '../analysis/geodesy.js';
import { writeContoursGeoJSON, writeKeepOutGeoJSON, landingsGeoJSONChunks } from '../analysis/geojsonWriters.js';
import { writeAreasCsv } from '../analysis/areasCsv.js';
import { writeKml } from '../analysis/kml.js';
import { writeRiskGeoJSON } from '../risk/geojson.js';
import type { Scenario } from '../scenario/types.js';
import { landingsCsvChunks } from './landings-csv.js';
import { landingsFlatGeobufChunks } from '../analysis/flatgeobuf.js';
import { landingSubset } from '../analysis/thinning.js';
import type { RunSummary } from './run-summary.js';
import { reviewFacts, runDate } from './sheet/review-facts.js';
import { sheetInputFromTexts, type SheetInput } from './sheet/sheet-input.js';
import type { Paper } from './sheet/page-parts.js';
import type { UnitSystem } from './format-number.js';

export type FileContent = string | Uint8Array | Iterable<string | Uint8Array>;

export interface ResultFileOptions {
  /** When the results were computed (default: SOURCE_DATE_EPOCH when set, else now). */
  computedAt?: Date;
  /** Units and paper of the sheet (default: the scenario's run.units / run.paper, else metric and A4). */
  units?: UnitSystem;
  paper?: Paper;
  /** Leave out the landings files (`landingFiles`), which the command line writes in another thread. */
  withoutLandings?: boolean;
}

/** The names of the files `landingFiles` gives. */
export const LANDING_FILE_NAMES = ['landings.csv', 'landings.geojson', 'landings.fgb'] as const;

/**
 * The files of every landing (landings.csv, landings.geojson, landings.fgb), streamed in pieces:
 * they depend on the landings and the scenario alone, not on the analysis, so they can be
 * formatted while the analysis runs.
 */
export function landingFiles(scenario: Scenario, set: LandingSet): [string, FileContent][] {
  return [
    ['landings.csv', landingsCsvChunks(set, createLocalFrame(scenario.site.pad))],
    ['landings.geojson', landingsGeoJSONChunks(set, scenario.site.pad, landingSubset(set))],
    ['landings.fgb', landingsFlatGeobufChunks(set, scenario.site.pad, `Strewn landings: ${scenario.name}`)],
  ];
}

/** What the review sheet (map.svg, sheet.pdf) is drawn from: plain data, so it can go to another thread. */
export interface SheetJob {
  input: SheetInput;
  choices: { units: UnitSystem; paper: Paper };
}

/**
 * Every file of a results folder but the sheet, by name, in a fixed order, and what the sheet is
 * drawn from. Kept apart from the sheet code (pdfkit and the fonts) so the command line can draw
 * the sheet in a worker thread while this thread writes the files, without loading that code here.
 *
 * scenario.json (the normalised scenario as loaded; its hash is summary.scenarioHash) and
 * review.json (figures summary.json lacks) let `strewn sheet` redraw sheet.pdf and map.svg from the
 * folder alone; the sheet is drawn from the same texts, so both give the same bytes.
 */
export function resultDataFiles(
  scenario: Scenario,
  set: LandingSet,
  analysis: AnalysisResult | null,
  summary: RunSummary,
  options: ResultFileOptions = {},
): { files: [string, FileContent][]; sheet: SheetJob } {
  const summaryText = JSON.stringify(summary, null, 2) + '\n';
  const scenarioText = JSON.stringify(scenario, null, 2) + '\n';
  const reviewText = JSON.stringify(reviewFacts(analysis, options.computedAt ?? runDate()), null, 2) + '\n';
  // The order of old: landings.csv, summary.json, landings.geojson, landings.fgb, ...
  const landings = options.withoutLandings ? [] : landingFiles(scenario, set);
  const files: [string, FileContent][] = [
    ...landings.slice(0, 1),
    ['summary.json', summaryText],
    ...landings.slice(1),
    ['scenario.json', scenarioText],
    ['review.json', reviewText],
  ];
  let contoursText: string | null = null;
  let keepOutText: string | null = null;
  if (analysis !== null) {
    contoursText = writeContoursGeoJSON(analysis);
    keepOutText = writeKeepOutGeoJSON(analysis);
    files.push(
      ['contours.geojson', contoursText],
      ['keepout.geojson', keepOutText],
      ['areas.csv', writeAreasCsv(analysis.areas)],
      ['result.kml', writeKml(analysis, scenario.site, scenario.name)],
    );
    if (analysis.risk) files.push(['risk.geojson', writeRiskGeoJSON(analysis.risk, scenario.site.pad)]);
  }
  const input = sheetInputFromTexts({ summary: summaryText, scenario: scenarioText, review: reviewText, contours: contoursText, keepOut: keepOutText }, set);
  return {
    files,
    sheet: { input, choices: { units: options.units ?? scenario.run.units ?? 'metric', paper: options.paper ?? scenario.run.paper ?? 'a4' } },
  };
}
