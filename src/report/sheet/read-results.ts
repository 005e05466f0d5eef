/**
 * Reads a results folder back into a sheet input, checking each file enough that a damaged or
 * foreign folder gives a message naming the file and the field, never a stack trace or a sheet
 * drawn from nonsense. The scenario is checked against summary.json's hash, so files of two
 * different runs are not mixed. The checks themselves work on texts (results-texts.ts), so the
 * page checks a saved run the user picks with the same code.
 *
 * @example
 *   const input = readResultsFolder('results/club-rocket');  // throws ResultsFolderError
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { SheetInput } from './sheet-input.js';
import { ResultsFolderError, resultsFromTexts } from './results-texts.js';

export { Check, parse, ResultsFolderError } from './results-texts.js';

/** landings.geojson above this size is not drawn (a million points would not show more). */
export const MAX_LANDINGS_FILE_BYTES = 200 * 1024 * 1024;

/** A file of a folder as text; a missing or unreadable file is a ResultsFolderError naming it. */
export function readText(folder: string, name: string): string {
  const path = join(folder, name);
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'the file is missing' : code === 'EISDIR' ? 'it is a folder' : error instanceof Error ? error.message : String(error);
    throw new ResultsFolderError(`${path}: cannot read it: ${reason}`);
  }
}

const FILES = ['summary.json', 'scenario.json', 'review.json', 'contours.geojson', 'keepout.geojson'];

/** Reads and checks every file the sheet needs; landings.geojson is optional. */
export function readResultsFolder(folder: string): SheetInput {
  if (!existsSync(folder)) throw new ResultsFolderError(`${folder}: no such folder`);
  if (!statSync(folder).isDirectory()) throw new ResultsFolderError(`${folder}: is a file; expected a results folder`);
  const texts: Record<string, string | undefined> = {};
  // summary.json is read (and its errors reported) even when missing; the others only when present,
  // and the checks say which one a run should have had.
  texts['summary.json'] = readText(folder, 'summary.json');
  for (const name of FILES.slice(1)) if (existsSync(join(folder, name))) texts[name] = readText(folder, name);
  const landingsPath = join(folder, 'landings.geojson');
  if (existsSync(landingsPath) && statSync(landingsPath).size <= MAX_LANDINGS_FILE_BYTES) texts['landings.geojson'] = readText(folder, 'landings.geojson');
  return resultsFromTexts(folder, texts);
}
