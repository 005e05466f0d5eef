import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { ScenarioError } from './errors.js';
import { hashScenario } from './hash.js';
import { parseJsonText } from './json-text.js';
import { parseScenario } from './load.js';
import { resolveRelativePath } from './thrust.js';
import { readDem, type Dem } from '../terrain/dem.js';
import type { Issue, Scenario } from './types.js';

/** Loading a scenario file in Node: the file system side of load.ts. */

export interface FileOptions {
  /** Highest `run.samples` accepted (default 10,000,000). */
  maxSamples?: number;
}

export interface LoadedScenario {
  scenario: Scenario;
  warnings: Issue[];
  /** SHA-256 of the canonical normalised scenario (see hash.ts). */
  hash: string;
}

/**
 * Reads, validates and normalises a scenario file; CSV thrust curves are read relative to the
 * file's folder. Every input problem (unreadable file, JSON syntax, invalid content) is thrown as
 * a `ScenarioError` whose heading names the file.
 */
export function loadScenarioFile(path: string, options: FileOptions = {}, dems?: ReadonlyMap<string, Dem | Error>): LoadedScenario {
  const text = readText(path);
  const json = parseJsonText(text, path);
  try {
    const { scenario, warnings } = parseScenario(json, {
      baseDir: dirname(path),
      readText,
      readBytes: (p) => readFileSync(p),
      maxSamples: options.maxSamples,
      dems,
    });
    return { scenario, warnings, hash: hashScenario(scenario) };
  } catch (error) {
    if (error instanceof ScenarioError) throw new ScenarioError(error.issues, `${path} has problems`);
    throw error;
  }
}

function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : error instanceof Error ? error.message : String(error);
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
    raw = JSON.parse(readFileSync(path, 'utf8'));
  } catch {
    // loadScenarioFile reports unreadable files and JSON errors with their own messages.
    return loadScenarioFile(path, options);
  }
  const spec = (raw as { site?: { terrain?: unknown } } | null)?.site?.terrain;
  if (typeof spec === 'string') {
    const resolved = resolveRelativePath(dirname(path), spec);
    try {
      dems.set(spec, await readDem(readFileSync(resolved)));
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const reason = code === 'ENOENT' ? `no such file (looked for ${resolved})` : error instanceof Error ? error.message : String(error);
      dems.set(spec, new Error(reason));
    }
  }
  return loadScenarioFile(path, options, dems);
}
