import { dirname } from 'node:path';
import { ScenarioError } from './errors.js';
import { hashScenario } from './hash.js';
import { parseJsonText } from './json-text.js';
import { parseScenario } from './load.js';
import { confineToFolder, InputFileError, readRegularFile, readRegularFileBytes, SIZE_LIMITS } from './open-file.js';
import { resolveRelativePath } from './thrust.js';
import { readDem, type Dem } from '../terrain/dem.js';
import type { Issue, Scenario } from './types.js';

/** Loading a scenario file in Node: the file system side of load.ts. */

export interface FileOptions {
  /** Highest `run.samples` accepted (default 10,000,000). */
  maxSamples?: number;
  /** Let the scenario name files outside its own folder (`--allow-outside-files`). */
  allowOutsideFiles?: boolean;
}

export interface LoadedScenario {
  scenario: Scenario;
  warnings: Issue[];
  /** SHA-256 of the canonical normalised scenario (see hash.ts). */
  hash: string;
  /** Every file read: the scenario and the files it names (a results folder must never hold them). */
  inputFiles: string[];
}

/**
 * Reads, validates and normalises a scenario file; CSV thrust curves are read relative to the
 * file's folder, and only from that folder or below it unless `allowOutsideFiles`. Every input
 * problem (unreadable file, JSON syntax, invalid content) is thrown as a `ScenarioError` whose
 * heading names the file.
 */
export function loadScenarioFile(path: string, options: FileOptions = {}, dems?: ReadonlyMap<string, Dem | Error>): LoadedScenario {
  const text = readScenarioText(path);
  const json = parseJsonText(text, path);
  const baseDir = dirname(path);
  const inputFiles = [path];
  const readCurve = (file: string): string => {
    inputFiles.push(file);
    confineToFolder(baseDir, file, options.allowOutsideFiles === true);
    return readRegularFile(file, SIZE_LIMITS.thrustCsv);
  };
  try {
    const { scenario, warnings } = parseScenario(json, {
      baseDir,
      readText: readCurve,
      readBytes: (p) => {
        inputFiles.push(p);
        confineToFolder(baseDir, p, options.allowOutsideFiles === true);
        return readRegularFileBytes(p, SIZE_LIMITS.forecast);
      },
      maxSamples: options.maxSamples,
      dems,
    });
    return { scenario, warnings, hash: hashScenario(scenario), inputFiles };
  } catch (error) {
    if (error instanceof ScenarioError) throw new ScenarioError(error.issues, `${path} has problems`);
    throw error;
  }
}

function readScenarioText(path: string): string {
  try {
    return readRegularFile(path, SIZE_LIMITS.scenario);
  } catch (error) {
    const reason = error instanceof InputFileError ? error.message : error instanceof Error ? error.message : String(error);
    throw new ScenarioError([{ path, message: `cannot read the file: ${reason}` }], 'The scenario file cannot be read');
  }
}

/**
 * `loadScenarioFile` for scenarios that may name a `site.terrain` GeoTIFF: the model is decoded
 * first (geotiff reads asynchronously), then the scenario is loaded with it.
 */
export async function loadScenarioFileWithTerrain(path: string, options: FileOptions = {}): Promise<LoadedScenario> {
  const dems = new Map<string, Dem | Error>();
  let raw: unknown;
  try {
    raw = JSON.parse(readRegularFile(path, SIZE_LIMITS.scenario));
  } catch {
    // loadScenarioFile reports unreadable files and JSON errors with their own messages.
    return loadScenarioFile(path, options);
  }
  const spec = (raw as { site?: { terrain?: unknown } } | null)?.site?.terrain;
  if (typeof spec === 'string') {
    const resolved = resolveRelativePath(dirname(path), spec);
    try {
      confineToFolder(dirname(path), resolved, options.allowOutsideFiles === true);
      dems.set(spec, await readDem(readRegularFileBytes(resolved, SIZE_LIMITS.terrain)));
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const reason = code === 'ENOENT' ? `no such file (looked for ${resolved})` : error instanceof Error ? error.message : String(error);
      dems.set(spec, new Error(reason));
    }
  }
  return loadScenarioFile(path, options, dems);
}
