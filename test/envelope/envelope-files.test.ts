import { beforeAll, describe, expect, it } from 'vitest';
import { cpSync, existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DOMParser, type Element } from '@xmldom/xmldom';
import { CAUTION } from '../../src/report/caution.js';
import { strewn, tempDir } from '../cli/helpers.js';
import { pdfPages, pdfText, runDemo } from '../report/sheet-helpers.js';

/**
 * `strewn envelope` writes envelope.pdf beside its other files, and `strewn sheet --envelope` adds
 * the same page to a run's review sheet, refusing an envelope of another scenario. Flown on a tiny
 * grid of the club demo (four directions, three speeds, few samples), so it stays quick.
 */

const DIRECTIONS = ['N 0°', 'E 90°', 'S 180°', 'W 270°'];

let envelopeDir: string;
let resultsDir: string;
let scenarioHash: string;

beforeAll(() => {
  envelopeDir = join(tempDir('strewn-envelope-'), 'envelope');
  const r = strewn(['envelope', 'scenarios/club-rocket.json', '--directions', '0:270:90', '--speeds', '0:6:3', '--samples', '60', '--workers', '1', '--quiet', '--out', envelopeDir], { env: { SOURCE_DATE_EPOCH: '1717243200' } });
  if (r.status !== 0) throw new Error(`strewn envelope failed (${r.status}): ${r.stderr}`);
  resultsDir = runDemo('club-rocket.json', 300);
  scenarioHash = JSON.parse(readFileSync(join(resultsDir, 'summary.json'), 'utf8')).scenarioHash;
}, 120_000);

/** A copy of the envelope folder with envelope.json changed by `edit`. */
function editedEnvelope(edit: (json: Record<string, unknown>) => void): string {
  const folder = join(tempDir(), 'envelope');
  cpSync(envelopeDir, folder, { recursive: true });
  const file = join(folder, 'envelope.json');
  const json = JSON.parse(readFileSync(file, 'utf8'));
  edit(json);
  writeFileSync(file, JSON.stringify(json));
  return folder;
}

/** The results folder's files with their sizes and times: what a refused command must leave alone. */
function snapshot(folder: string): string[] {
  return readdirSync(folder).sort().map((name) => `${name} ${statSync(join(folder, name)).size} ${statSync(join(folder, name)).mtimeMs}`);
}

function expectRefused(args: string[], named: RegExp[]): void {
  const before = snapshot(resultsDir);
  const r = strewn(['sheet', resultsDir, ...args]);
  expect(r.status, r.stderr).toBe(2);
  for (const n of named) expect(r.stderr).toMatch(n);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(snapshot(resultsDir)).toEqual(before);
}

describe('strewn envelope', () => {
  it('writes envelope.json, .csv, .svg and a one-page envelope.pdf with the caution, every direction and the scenario hash', () => {
    expect(readdirSync(envelopeDir).sort()).toEqual(['.strewn-results', 'envelope.csv', 'envelope.json', 'envelope.pdf', 'envelope.svg']);
    const json = JSON.parse(readFileSync(join(envelopeDir, 'envelope.json'), 'utf8'));
    expect(json.scenarioHash).toBe(scenarioHash);
    expect(json.computedAt).toBe('2024-06-01T12:00:00Z');
    const pdf = join(envelopeDir, 'envelope.pdf');
    expect(pdfPages(pdf)).toBe(1);
    const text = pdfText(pdf);
    expect(text).toContain(CAUTION.slice(0, 60));
    expect(text).toContain(scenarioHash);
    for (const d of DIRECTIONS) expect(text).toContain(d);
    expect(text).toContain('common random numbers; bisection over speeds');
    expect(text).toMatch(/Forecast .* (inside|OUTSIDE) the limits/);
  });

  it('draws the same limits in envelope.svg as envelope.json holds: one vertex per direction', () => {
    const doc = new DOMParser({ onError: (level, message) => { throw new Error(`envelope.svg: ${level}: ${message}`); } }).parseFromString(readFileSync(join(envelopeDir, 'envelope.svg'), 'utf8'), 'image/svg+xml');
    const elements = Array.from(doc.getElementsByTagName('*')) as Element[];
    const outline = elements.find((e) => e.getAttribute('id') === 'envelope')!;
    expect([...outline.getAttribute('d')!.matchAll(/[ML]/g)]).toHaveLength(DIRECTIONS.length);
    const json = JSON.parse(readFileSync(join(envelopeDir, 'envelope.json'), 'utf8'));
    const markers = elements.filter((e) => ['limit', 'above-grid'].includes(e.getAttribute('class') ?? ''));
    expect(markers.map((m) => m.getAttribute('data-speed'))).toEqual(json.limits.map((d: { limit: number | null }) => (d.limit === null ? 'none' : String(d.limit))));
  });

  it('refuses an unknown paper size before flying anything', () => {
    const out = join(tempDir(), 'never');
    const r = strewn(['envelope', 'scenarios/club-rocket.json', '--paper', 'a3', '--out', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("--paper: 'a3' is not one of a4, letter");
    expect(existsSync(out)).toBe(false);
  });
});

describe('strewn sheet --envelope', () => {
  it('adds the wind-limits page after the map and the record: three pages for the demo', () => {
    const r = strewn(['sheet', resultsDir, '--envelope', envelopeDir]);
    expect(r.status, r.stderr).toBe(0);
    const sheet = join(resultsDir, 'sheet.pdf');
    expect(pdfPages(sheet)).toBe(3);
    const last = pdfText(sheet, 3);
    expect(last).toContain('Page 3 of 3');
    expect(last).toContain('Limits by direction');
    for (const d of DIRECTIONS) expect(last).toContain(d);
    expect(last).toContain(CAUTION.slice(0, 60));
    expect(pdfText(sheet, 1)).toContain('of 3');
  });

  it('refuses an envelope of another scenario, naming both files, and writes nothing', () => {
    const other = editedEnvelope((json) => (json.scenarioHash = 'b'.repeat(64)));
    expectRefused(['--envelope', other], [/envelope\.json has scenarioHash bbbbbbbbbbbb/, new RegExp(`${resultsDir.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}/summary\\.json`)]);
  });

  it('refuses a missing or damaged envelope folder, naming the file and the field', () => {
    const missing = join(tempDir(), 'no-envelope');
    expectRefused(['--envelope', missing], [/--envelope: .*no-envelope: no such folder/]);
    const empty = tempDir();
    expectRefused(['--envelope', empty], [/envelope\.json: cannot read it: the file is missing/]);
    const broken = editedEnvelope(() => {});
    writeFileSync(join(broken, 'envelope.json'), '{ not json');
    expectRefused(['--envelope', broken], [/envelope\.json: not valid JSON/]);
    const wrongField = editedEnvelope((json) => ((json.limits as { limit: unknown }[])[1].limit = 'high'));
    expectRefused(['--envelope', wrongField], [/envelope\.json: limits\[1\]\.limit should be a number, found "high"/]);
  });
});
