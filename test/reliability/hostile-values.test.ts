import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { hashScenario } from '../../src/scenario/hash.js';
import { editedScenario, SCENARIOS, strewn } from '../cli/helpers.js';

/**
 * Values found to crash the program (exit 1 with an internal message) now give a clear exit 2 or a
 * correct result. IEEE 754 doubles reach about 1.8e308 and go down to about 5e-324 (IEEE 754-2008).
 */

const drone = () => JSON.parse(readFileSync(join(SCENARIOS, 'drone-power-loss.json'), 'utf8'));

function messages(json: unknown): string[] {
  try {
    parseScenario(json);
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues.map((i) => `${i.path}: ${i.message}`);
    throw error;
  }
  return [];
}

describe('huge and tiny values', () => {
  it.each([
    ['a keep-out margin of 1e308', (s: any) => (s.run.keepOut.margin = 1e308), 'run.keepOut.margin: 1e+308 m is outside 0–500000 m'],
    ['a minimum distance of 1e308', (s: any) => (s.site.minimumDistance = 1e308), 'site.minimumDistance: 1e+308 m is outside 0–500000 m'],
    ['a release offset of 1e308', (s: any) => (s.launch.east = 1e308), 'launch.east: 1e+308 m is outside -500000–500000 m'],
  ])('%s is an input error naming the field', (_name, edit, says) => {
    const s = drone();
    edit(s);
    expect(messages(s).join('\n')).toContain(says);
  });

  it('values at 1e-300 run to the end and the sheet writes them as people read them (a calm wind)', () => {
    const path = editedScenario('drone-power-loss.json', (s) => {
      s.weather.wind.speed = 1e-300;
      s.launch.speed = 1e-300;
    });
    const out = join(path, '..', 'out');
    const r = strewn(['run', path, '--samples', '40', '--workers', '1', '--out', out, '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toBe('');
    const text = execFileSync('pdftotext', [join(out, 'sheet.pdf'), '-'], { encoding: 'utf8' });
    // Speeds are written to a tenth of a metre per second for people (report/format-number.ts).
    expect(text).toContain('0.0 m/s at 10 m');
  });

  it("temperature -100 C (the lowest allowed, 173.15 K) is accepted; -100.5 C is refused in the user's unit", () => {
    const s = drone();
    s.weather.temperature = '-100 C';
    expect(messages(s)).toEqual([]);
    s.weather.temperature = '-148 F'; // -100 C exactly (F = C × 9/5 + 32)
    expect(messages(s)).toEqual([]);
    s.weather.temperature = '-100.5 C';
    expect(messages(s).join('\n')).toMatch(/weather\.temperature: -100\.5 C \(172\.65 K\) is outside 173\.15–343\.15 K/);
  });
});

describe('keys and shapes built to break readers', () => {
  it.each([
    ['top level', (s: any) => Object.defineProperty(s, '__proto__', { value: { x: 1 }, enumerable: true }), '__proto__'],
    ['an area', (s: any) => Object.defineProperty(s.site.areas[0], '__proto__', { value: [1], enumerable: true }), 'site.areas[0].__proto__'],
    ['uncertainty', (s: any) => Object.defineProperty(s.uncertainty, '__proto__', { value: { sd: 1 }, enumerable: true }), 'uncertainty.__proto__'],
    ['a stage', (s: any) => (s.recovery[0].constructor = 1), 'recovery[0].constructor'],
  ])('a __proto__ / constructor key in %s is reported as an unknown field', (_where, edit, path) => {
    const s = drone();
    edit(s);
    expect(messages(s)).toEqual([`${path}: '${path.split('.').pop()}' is not a field here (a name reserved by JavaScript); remove it`]);
  });

  it('JSON.parse keeps "__proto__" as a key, and the file reader reports it (exit 2)', () => {
    const path = editedScenario('drone-power-loss.json', () => {});
    const text = readFileSync(path, 'utf8').replace('"strewn": 1,', '"strewn": 1, "__proto__": {"name": 5},');
    writeFileSync(path, text);
    const r = strewn(['check', path]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("__proto__: '__proto__' is not a field here");
  });

  it('20,000 nested brackets are an input error, not a stack overflow', () => {
    const s = drone();
    let deep: unknown[] = [];
    for (let i = 0; i < 20_000; i++) deep = [deep];
    s.site.basemap = { type: 'FeatureCollection', features: [{ type: 'Feature', properties: { deep }, geometry: null }] };
    expect(messages(s)).toEqual(['site.basemap: lists or objects are nested more than 64 levels deep inside this field; no scenario needs that many']);
  });

  it('an ordinary scenario still hashes and parses', () => {
    expect(hashScenario(parseScenario(drone()).scenario)).toMatch(/^[0-9a-f]{64}$/);
  });
});
