import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { ScenarioError } from '../../src/scenario/errors.js';
import { parseScenario, type ParseOptions } from '../../src/scenario/load.js';
import type { Issue } from '../../src/scenario/types.js';

export const FIXTURES = join(dirname(fileURLToPath(import.meta.url)), 'fixtures');

/** A fresh, mutable copy of a fixture scenario. */
export function fixture(name: string): Record<string, any> {
  return JSON.parse(readFileSync(join(FIXTURES, name), 'utf8')) as Record<string, any>;
}

/** The issues parseScenario reports, or [] if it accepts the scenario. */
export function issuesOf(json: unknown, options: ParseOptions = {}): Issue[] {
  try {
    parseScenario(json, options);
    return [];
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues;
    throw error;
  }
}

/** Reads CSV curves from the fixture folder, as the Node loader would. */
export const fixtureReader: ParseOptions = {
  baseDir: FIXTURES,
  readText: (path) => readFileSync(path, 'utf8'),
};
