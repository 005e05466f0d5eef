import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ScenarioError } from '../../src/scenario/errors.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { hashScenario } from '../../src/scenario/hash.js';
import { findJsonError, lineAndColumn } from '../../src/scenario/json-text.js';
import { FIXTURES } from './helpers.js';

const scratch = mkdtempSync(join(tmpdir(), 'strewn-scenario-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** A small valid scenario written inline. */
const SMALL_PROJECTILE = {
  strewn: 1,
  name: 'Inline',
  site: { pad: { lat: 10, lon: 20 } },
  vehicle: { kind: 'projectile', mass: 1, diameter: 0.05, drag: 0.3 },
  launch: { speed: 50, elevation: 45, azimuth: 0 },
  weather: { wind: { speed: 2, from: 0 } },
};

function errorOf(run: () => unknown): ScenarioError {
  try {
    run();
  } catch (error) {
    if (error instanceof ScenarioError) return error;
    throw error;
  }
  throw new Error('expected a ScenarioError');
}

describe('loadScenarioFile', () => {
  it('loads the CSV-curve fixture, reading the curve beside the file', () => {
    const { scenario, warnings, hash } = loadScenarioFile(join(FIXTURES, 'minimal-rocket-csv.json'));
    expect(scenario.vehicle.motor?.thrust).toEqual({ time: [0, 0.1, 1.2], thrust: [0, 120, 0] });
    // Only the point-mass warning of a rocket without a shape (see shape.test.ts).
    expect(warnings.map((w) => w.path)).toEqual(['vehicle.shape']);
    expect(hash).toBe(hashScenario(scenario));
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('reports a JSON syntax error with the file, line and column', () => {
    const path = join(scratch, 'comma.json');
    writeFileSync(path, '{\n  "strewn": 1,\n  "name": "x",\n}\n');
    const error = errorOf(() => loadScenarioFile(path));
    expect(error.issues).toEqual([{ path, message: "line 4, column 1: a comma before '}' is not allowed in JSON" }]);
    expect(error.message).toContain(`${path}: line 4, column 1`);
  });

  it('names the file in the heading of content problems', () => {
    const path = join(scratch, 'empty-object.json');
    writeFileSync(path, '{}');
    const error = errorOf(() => loadScenarioFile(path));
    expect(error.message.split('\n')[0]).toBe(`${path} has problems (6 problems):`);
  });

  it('reports a missing file without a stack trace', () => {
    const path = join(scratch, 'nope.json');
    const error = errorOf(() => loadScenarioFile(path));
    expect(error.issues).toEqual([{ path, message: 'cannot read the file: no such file' }]);
  });

  it('applies maxSamples', () => {
    const path = join(scratch, 'big.json');
    writeFileSync(path, JSON.stringify({ ...SMALL_PROJECTILE, run: { samples: 12_000_000 } }));
    expect(errorOf(() => loadScenarioFile(path)).issues[0]!.path).toBe('run.samples');
    expect(loadScenarioFile(path, { maxSamples: 20_000_000 }).scenario.run.samples).toBe(12_000_000);
  });
});


describe('finding JSON syntax errors', () => {
  it.each([
    ['{"a": 1,}', 8, "a comma before '}'"],
    ['[1, 2,]', 6, "a comma before ']'"],
    ['{"a" 1}', 5, "expected ':'"],
    ['{"a": NaN}', 6, 'NaN and Infinity are not JSON numbers'],
    ["{'a': 1}", 1, 'expected a field name in double quotes'],
    ['{"a": \'x\'}', 6, 'double quotes, not single quotes'],
    ['{"a": "x', 6, 'no closing double quote'],
    ['{"a": "x\ny"}', 8, 'line break'],
    ['{"a": 1} x', 9, "unexpected 'x' after the end"],
    ['{"a": 1 // note\n}', 8, "expected ',' or '}'"],
    ['', 0, 'expected a value, found the end of the file'],
    ['{"a": 01}', 7, "expected ',' or '}'"],
    ['{"a": "\\x"}', 7, "'\\x' is not a JSON escape"],
  ])('%j → offset %i', (text, offset, fragment) => {
    const found = findJsonError(text);
    expect(found?.offset).toBe(offset);
    expect(found?.message).toContain(fragment);
  });

  it('agrees with JSON.parse on which texts are valid (property)', () => {
    const valid = (text: string): boolean => {
      try {
        JSON.parse(text);
        return true;
      } catch {
        return false;
      }
    };
    const nearJson = fc.tuple(fc.json(), fc.nat(), fc.constantFrom('', ',', '}', ']', '"', ':', ' ', '0', 'x', '\\', '\n')).map(
      ([text, at, insert]) => {
        const i = at % (text.length + 1);
        return text.slice(0, i) + insert + text.slice(i);
      },
    );
    fc.assert(
      fc.property(fc.oneof(fc.json(), nearJson, fc.string()), (text) => (findJsonError(text) === undefined) === valid(text)),
      { numRuns: 2000 },
    );
  });

  it('counts lines and columns from 1', () => {
    expect(lineAndColumn('ab\ncd\r\nef', 0)).toEqual({ line: 1, column: 1 });
    expect(lineAndColumn('ab\ncd\r\nef', 4)).toEqual({ line: 2, column: 2 });
    expect(lineAndColumn('ab\ncd\r\nef', 7)).toEqual({ line: 3, column: 1 });
  });
});
