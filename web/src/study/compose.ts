import type { AnalysisResult } from '../../../src/analysis/index.js';
import type { LandingSet } from '../../../src/analysis/types.js';
import type { RunResult } from '../../../src/dispersion/results.js';
import type { RunSummary } from '../../../src/report/run-summary.js';
import { studyOutcome } from '../../../src/report/study.js';
import { blobParts, mimeType } from '../exports/download.js';
import type { AcceptedScenario } from '../scenario/validate.js';

/**
 * From a finished run to everything the page shows and exports: the same `studyOutcome` as
 * `strewn run`, then the same result files. The browser test compares the page with the command line.
 */

export interface ResultFile {
  name: string;
  blob: Blob;
}

export interface Study {
  accepted: AcceptedScenario;
  run: RunResult;
  set: LandingSet;
  analysis: AnalysisResult | null;
  summary: RunSummary;
  /** The results folder of the command line, as files to download; empty when they failed. */
  files: ResultFile[];
  /** Why the files could not be made, when they could not. */
  filesError: string | null;
  /** Wall time of the flights (workers), ms. */
  flightTime_ms: number;
  /** Wall time of the analysis and the files (this thread), ms. */
  analysisTime_ms: number;
}

/**
 * The writers, the review sheet and pdfkit are most of the page's code; they load with the first
 * finished run rather than with the page, so the map comes up sooner.
 */
async function resultWriters() {
  await import('../exports/pdf-fonts.js');
  return import('../../../src/report/result-files.js');
}

export async function composeStudy(accepted: AcceptedScenario, run: RunResult, flightTime_ms: number): Promise<Study> {
  const started = performance.now();
  const { scenario } = accepted;
  const { set, analysis, summary } = studyOutcome(scenario, accepted.hash, run, accepted.warnings);
  performance.mark('strewn:analysed');
  let files: ResultFile[] = [];
  let filesError: string | null = null;
  try {
    const { buildResultFiles } = await resultWriters();
    // Built once: some contents are generators that can be read only once, and the review sheet
    // takes a moment to draw. Blobs keep the bytes out of the way until a download asks for them.
    files = buildResultFiles(scenario, set, analysis, summary).map(([name, content]) => ({ name, blob: new Blob(blobParts(content), { type: mimeType(name) }) }));
  } catch (error) {
    filesError = error instanceof Error ? error.message : String(error);
  }
  return { accepted, run, set, analysis, summary, files, filesError, flightTime_ms, analysisTime_ms: performance.now() - started };
}
