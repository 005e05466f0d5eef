import { compareStudies, type Comparison, type CompareSide } from '../../../src/compare/compare.js';
import { COMPARED_FILES, ResultsFolderError, savedRunFromTexts } from '../../../src/compare/saved-run.js';
import { CAUTION } from '../../../src/report/caution.js';
import { resultsFromTexts } from '../../../src/report/sheet/results-texts.js';
import type { Study } from '../study/compose.js';
import { Cell } from '../event/cell.js';

/**
 * The saved run the page compares the current run with (`strewn compare SAVED CURRENT`): picked as
 * the files of a results folder (or the folder itself, or its summary.json alone), checked by
 * the same code as the command line's, and compared with the current run's own result files.
 */
export interface CompareState {
  saved: CompareSide | null;
  /** What the user picked, for the page's words: the folder's name or the file's. */
  savedLabel: string;
  problem: string | null;
  comparison: Comparison | null;
  /** The current side, as read back from the current run's files. */
  current: CompareSide | null;
  /** The study the comparison was made with. */
  study: Study | null;
  onMap: boolean;
}

export const NO_COMPARISON: CompareState = { saved: null, savedLabel: '', problem: null, comparison: null, current: null, study: null, onMap: true };

export type CompareCell = Cell<CompareState>;

/** The folder a set of picked files came from (a folder pick gives relative paths), else ''. */
function folderOf(files: readonly File[]): string {
  const rel = files.map((f) => (f as File & { webkitRelativePath?: string }).webkitRelativePath ?? '').find((p) => p.includes('/'));
  return rel ? rel.slice(0, rel.lastIndexOf('/')) : '';
}

/** Reads the picked files into a saved run, or says plainly what is wrong with them. */
export async function readSavedRun(files: readonly File[]): Promise<{ ok: true; saved: CompareSide; label: string } | { ok: false; problem: string }> {
  const texts: Record<string, string> = {};
  for (const f of files) if ((COMPARED_FILES as readonly string[]).includes(f.name) && texts[f.name] === undefined) texts[f.name] = await f.text();
  const folder = folderOf(files);
  const label = folder || (files.length === 1 ? files[0]!.name : 'the picked files');
  try {
    return { ok: true, saved: savedRunFromTexts(folder, texts), label };
  } catch (error) {
    if (error instanceof ResultsFolderError) return { ok: false, problem: error.message };
    throw error;
  }
}

/** The current run as a results folder would give it back: read from the files it made. */
export async function currentSide(study: Study): Promise<CompareSide> {
  const texts: Record<string, string> = {};
  for (const name of COMPARED_FILES) {
    const file = study.files.find((f) => f.name === name);
    if (file) texts[name] = await file.blob.text();
  }
  const input = resultsFromTexts('current run', texts);
  return { summary: input.summary, scenario: input.scenario, review: input.review, keepOut: input.keepOut };
}

export function compareWithCurrent(saved: CompareSide, current: CompareSide): Comparison {
  return compareStudies(saved, current, CAUTION);
}

export function compareCell(): CompareCell {
  return new Cell<CompareState>(NO_COMPARISON);
}
