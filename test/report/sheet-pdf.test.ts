import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, readdirSync, copyFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { CAUTION } from '../../src/report/caution.js';
import { strewn, tempDir } from '../cli/helpers.js';
import { pdfPages, pdfPageSize, pdfText, runDemo } from './sheet-helpers.js';

/**
 * The review sheet as a reader gets it: text pulled out of the PDF by poppler, an independent PDF
 * reader, must carry every figure the record promises. What the sheet must show is the project's
 * own contract (issue "Review sheet"); the page sizes are ISO 216 and ANSI letter.
 */

const normalise = (s: string) => s.replace(/\s+/g, ' ').trim();

describe('sheet.pdf written by strewn run', () => {
  let out: string;
  let summary: any;
  let text: string;
  beforeAll(() => {
    out = runDemo('club-rocket.json');
    summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    text = pdfText(join(out, 'sheet.pdf'));
  });

  it('has two pages: the map and the record', () => {
    expect(pdfPages(join(out, 'sheet.pdf'))).toBe(2);
  });

  it('names every area, every level, the seed and the scenario hash', () => {
    expect(summary.areas.length).toBeGreaterThan(0);
    for (const a of summary.areas) expect(text).toContain(a.name);
    for (const c of summary.contours) expect(text).toContain(`${Math.round(c.level * 1e4) / 100} %`);
    expect(text).toContain(summary.seed);
    expect(text).toContain(summary.scenarioHash);
  });

  it('carries the caution text on both pages', () => {
    for (const page of [1, 2]) expect(normalise(pdfText(join(out, 'sheet.pdf'), page))).toContain(normalise(CAUTION));
  });

  it('page 1 is the map with its legend, page 2 the record with blank sign-off lines', () => {
    const map = pdfText(join(out, 'sheet.pdf'), 1);
    expect(map).toContain('Keep-out zone');
    expect(map).toContain('Wind from');
    const record = pdfText(join(out, 'sheet.pdf'), 2);
    for (const words of ['Prepared by', 'Reviewed by', 'Decision', 'Scenario hash', 'Not a compliance figure', 'casualty area']) expect(record).toContain(words);
  });

  it('is A4 by default (ISO 216: 210 x 297 mm = 595.28 x 841.89 pt)', () => {
    const [w, h] = pdfPageSize(join(out, 'sheet.pdf'));
    expect(w).toBeCloseTo(595.28, 1);
    expect(h).toBeCloseTo(841.89, 1);
  });

  it('strewn sheet redraws the same bytes from the folder alone', () => {
    const copy = join(tempDir(), 'copy');
    mkdirSync(copy);
    for (const name of readdirSync(out)) if (name !== 'sheet.pdf' && name !== 'map.svg') copyFileSync(join(out, name), join(copy, name));
    const r = strewn(['sheet', copy]);
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(join(copy, 'sheet.pdf')).equals(readFileSync(join(out, 'sheet.pdf')))).toBe(true);
    expect(readFileSync(join(copy, 'map.svg'), 'utf8')).toBe(readFileSync(join(out, 'map.svg'), 'utf8'));
  });

  it('--paper letter --units imperial gives letter pages in feet, miles per hour and acres', () => {
    const copy = join(tempDir(), 'copy');
    mkdirSync(copy);
    for (const name of readdirSync(out)) copyFileSync(join(out, name), join(copy, name));
    const r = strewn(['sheet', copy, '--paper', 'letter', '--units', 'imperial']);
    expect(r.status, r.stderr).toBe(0);
    const [w, h] = pdfPageSize(join(copy, 'sheet.pdf'));
    expect([w, h]).toEqual([612, 792]); // ANSI letter, 8.5 x 11 in
    // The title and the notes are the user's own words and stay as written.
    const scenario = JSON.parse(readFileSync(join(copy, 'scenario.json'), 'utf8'));
    const imperial = normalise(pdfText(join(copy, 'sheet.pdf'))).split(normalise(scenario.name)).join('').split(normalise(scenario.notes ?? '')).join('')
      // Notes cut short to keep the record on its page are the user's own text, not a figure.
      .replace(/Invented demo\..*?\(full notes in scenario\.json\)/, '');
    expect(imperial).toMatch(/\d ft\b/);
    expect(imperial).toMatch(/\d mph\b/);
    expect(imperial).toMatch(/\d(\.\d+)? (acres|ft²)/);
    // No metric quantity left over (a number followed by a metric unit).
    expect(imperial).not.toMatch(/\d (m|km|m\/s|m²|hPa|kg|mm|cm²|°C)(?![\w/²])/);
  });
});

describe('sheet for a run too small to analyse', () => {
  it('still has both pages, without zones, when fewer than ten samples land', () => {
    const out = runDemo('display-shell.json', 5);
    expect(readdirSync(out)).not.toContain('contours.geojson');
    expect(pdfPages(join(out, 'sheet.pdf'))).toBe(2);
    const r = strewn(['sheet', out]);
    expect(r.status, r.stderr).toBe(0);
    expect(normalise(pdfText(join(out, 'sheet.pdf'), 1))).toContain(normalise(CAUTION));
  });
});
