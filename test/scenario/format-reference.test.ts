import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { strewn, tempDir } from '../cli/helpers.js';
import { writeFileSync, cpSync } from 'node:fs';

/**
 * The user reference (scenarios/README.md) cannot drift from the code: every ```json block in it
 * is extracted and validated. Blocks with "strewn" are full scenarios; the others are fragments,
 * put into the first full example in place of the top-level sections they hold.
 */
const SCENARIOS = join(import.meta.dirname, '../../scenarios');
const text = readFileSync(join(SCENARIOS, 'README.md'), 'utf8');
const blocks = [...text.matchAll(/```json\n([\s\S]*?)```/g)].map((m, i) => ({ index: i, body: m[1]! }));
const parsed = blocks.map((b) => ({ ...b, json: JSON.parse(b.body) as Record<string, unknown> }));
const full = parsed.filter((b) => b.json.strewn !== undefined);
const base = full[0]!.json;

const read = { baseDir: SCENARIOS, readText: (p: string) => readFileSync(p, 'utf8') };
function problems(json: unknown): string[] {
  try {
    parseScenario(json, read);
    return [];
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues.map((i) => `${i.path}: ${i.message}`);
    throw error;
  }
}

describe('scenarios/README.md, the format reference', () => {
  it('has a full example for every vehicle kind, and fragments', () => {
    expect(full.map((b) => (b.json.vehicle as { kind: string }).kind).sort()).toEqual(['projectile', 'release', 'rocket']);
    expect(parsed.length - full.length).toBeGreaterThanOrEqual(6);
  });

  for (const block of parsed) {
    const label = block.json.strewn !== undefined ? `full example '${String(block.json.name)}'` : `fragment ${block.index} (${Object.keys(block.json).join(', ')})`;
    it(`${label} validates`, () => {
      const scenario = block.json.strewn !== undefined ? block.json : { ...structuredClone(base), ...structuredClone(block.json) };
      expect(problems(scenario)).toEqual([]);
    });
  }

  it('the full examples pass strewn check (exit 0) as files beside the motors folder', () => {
    const dir = tempDir();
    cpSync(join(SCENARIOS, 'motors'), join(dir, 'motors'), { recursive: true });
    for (const [i, b] of full.entries()) {
      const file = join(dir, `example-${i}.json`);
      writeFileSync(file, b.body);
      const r = strewn(['check', file]);
      expect(r.status, r.stderr).toBe(0);
    }
  });

  it('names every top-level field and every spread the format has', () => {
    for (const field of ['strewn', 'name', 'notes', 'site', 'vehicle', 'launch', 'recovery', 'weather', 'uncertainty', 'failures', 'run']) expect(text).toContain(`| \`${field}\` |`);
    for (const name of ['wind.speed', 'wind.from', 'wind.gust', 'launch.tilt', 'launch.azimuth', 'launch.speed', 'launch.elevation', 'launch.height', 'motor.impulse', 'vehicle.mass', 'vehicle.drag', 'recovery.delay', 'recovery.rate']) expect(text).toContain(`| \`${name}\` |`);
    for (const file of ['landings.csv', 'summary.json', 'scenario.json', 'review.json', 'map.svg', 'sheet.pdf', 'envelope.json', 'envelope.csv', 'envelope.svg', 'envelope.pdf']) expect(text).toContain(`\`${file}\``);
  });
});
