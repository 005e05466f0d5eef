import { ScenarioError } from '../../../src/scenario/errors.js';
import { parseJsonText } from '../../../src/scenario/json-text.js';
import type { Issue } from '../../../src/scenario/types.js';
import type { ScenarioDocument } from './document.js';
import { validateDocument, type AcceptedScenario } from './validate.js';
import { isBinaryFile, readBinaryFiles, type BinaryFiles } from './ground-files.js';

/** What opening files gave: a scenario to use, or the problems of the file that was refused. */
export type OpenOutcome = { ok: true; accepted: AcceptedScenario } | { ok: false; fileName: string; issues: Issue[] };

/**
 * Opens a scenario from files the user picked or dropped: one .json scenario, and any files it
 * refers to (a CSV thrust curve) opened alongside. A broken file is refused with every problem
 * and its field path; the caller keeps the scenario it had.
 */
export async function openScenarioFiles(files: readonly File[]): Promise<OpenOutcome> {
  const scenarios = files.filter((f) => /\.json$/i.test(f.name));
  if (scenarios.length !== 1) {
    const names = files.map((f) => f.name).join(', ') || 'nothing';
    const message =
      scenarios.length === 0
        ? `no scenario (.json) among the opened files (${names})`
        : `${scenarios.length} scenario files were opened at once (${scenarios.map((f) => f.name).join(', ')}); open one at a time`;
    return { ok: false, fileName: names, issues: [{ path: '', message }] };
  }
  const main = scenarios[0]!;
  const attached: Record<string, string> = {};
  for (const file of files) if (file !== main && !isBinaryFile(file.name)) attached[file.name] = await file.text();
  // A forecast or terrain file opened with it is kept as bytes (and a GeoTIFF decoded).
  const binaries = files.some((f) => isBinaryFile(f.name)) ? await readBinaryFiles(files) : undefined;
  return openScenarioText(await main.text(), main.name, attached, binaries);
}

/** Same as openScenarioFiles, from text already read (the demos, the kept working copy). */
export function openScenarioText(text: string, fileName: string, files: Record<string, string>, binaries?: BinaryFiles): OpenOutcome {
  let json: unknown;
  try {
    json = parseJsonText(text, fileName);
  } catch (error) {
    if (error instanceof ScenarioError) return { ok: false, fileName, issues: error.issues };
    throw error;
  }
  const document: ScenarioDocument = binaries ? { json, files, fileName, binaries } : { json, files, fileName };
  const validation = validateDocument(document);
  return validation.ok ? validation : { ok: false, fileName, issues: validation.issues };
}
