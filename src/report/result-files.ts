import type { AnalysisResult } from '../analysis/index.js';
import type { LandingSet } from '../analysis/types.js';
import type { Scenario } from '../scenario/types.js';
import type { RunSummary } from './run-summary.js';
import { buildSheet } from './sheet/index.js';
import { resultDataFiles, type FileContent, type ResultFileOptions } from './result-data-files.js';

export type { FileContent, ResultFileOptions, SheetJob } from './result-data-files.js';

/**
 * Every file of a results folder, by name, in a fixed order, the sheet drawn in this thread. Used
 * by the web page (offered as downloads) and the event's item folders; `strewn run` writes the same
 * files from `resultDataFiles` and draws the sheet in a worker thread (src/cli/sheet-thread.ts),
 * so all give the same bytes.
 */
export function buildResultFiles(
  scenario: Scenario,
  set: LandingSet,
  analysis: AnalysisResult | null,
  summary: RunSummary,
  options: ResultFileOptions = {},
): [string, FileContent][] {
  const { files, sheet: job } = resultDataFiles(scenario, set, analysis, summary, options);
  const sheet = buildSheet(job.input, job.choices);
  files.push(['map.svg', sheet.svg], ['sheet.pdf', sheet.pdf]);
  return files;
}
