import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { execFileSync } from 'node:child_process';
import { csvParseRows } from 'd3-dsv';
import { DOMParser } from '@xmldom/xmldom';
import { csvField } from '../../src/analysis/areasCsv.js';
import { escapeXml as kmlEscape } from '../../src/analysis/kml.js';
import { escapeXml as svgEscape } from '../../src/report/sheet/render-svg.js';
import { neutraliseFormula, restoreFormulaText } from '../../src/scenario/safe-text.js';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';

/**
 * Names on their way into written files. CSV injection: cells starting with = + - @ tab or CR are
 * formulas to spreadsheet programs (OWASP, "CSV Injection"); the common practice is a leading
 * apostrophe. XML 1.0 (W3C, section 2.2) forbids control characters other than tab, LF and CR.
 */

// Hostile names of the kind spreadsheet attacks use (invented).
const HOSTILE = ['=1+2', '+SUM(A1:A9)', '-2+3', '@cmd', '\tTAB', '=HYPERLINK("http://example.invalid")'];

/** What a spreadsheet would treat as a formula. */
const live = (cell: string) => /^[=+\-@\t\r]/.test(cell) && !/^[+-]?\d+(\.\d*)?([eE][+-]?\d+)?$/.test(cell);

describe('CSV formula injection', () => {
  it('every hostile cell is neutralised, plain numbers are not', () => {
    for (const name of HOSTILE) {
      const cell = csvParseRows(csvField(name))[0]![0]!;
      expect(live(cell), name).toBe(false);
      expect(cell).toBe(`'${name}`);
      expect(restoreFormulaText(cell)).toBe(name);
    }
    expect(neutraliseFormula('-12.5')).toBe('-12.5');
    expect(neutraliseFormula('Car park')).toBe('Car park');
    expect(restoreFormulaText("'quoted")).toBe("'quoted");
  });

  it('areas.csv and landings.csv of a run hold no live formula, and analyze reads the mode names back', () => {
    const path = editedScenario('drone-power-loss.json', (s) => {
      s.site.areas.forEach((a: { name: string }, i: number) => (a.name = HOSTILE[i % HOSTILE.length]!));
      s.failures[0].name = '@SUM(1+1)';
    });
    const out = join(path, '..', 'out');
    const r = strewn(['run', path, '--samples', '200', '--workers', '1', '--out', out, '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    for (const file of ['areas.csv', 'landings.csv']) {
      const rows = csvParseRows(readFileSync(join(out, file), 'utf8'));
      const nameColumn = file === 'areas.csv' ? 0 : 1;
      for (const row of rows.slice(1)) expect(live(row[nameColumn]!), `${file}: ${row[nameColumn]}`).toBe(false);
    }
    expect(readFileSync(join(out, 'landings.csv'), 'utf8')).toContain(",'@SUM(1+1),");
    const a = strewn(['analyze', join(out, 'landings.csv'), '--pad', '47.31204,8.02117', '--out', join(path, '..', 'an'), '--json']);
    expect(a.status, a.stderr).toBe(0);
    expect(JSON.parse(a.stdout).modes.map((m: { name: string }) => m.name)).toContain('@SUM(1+1)');
  });
});

describe('control characters', () => {
  it('are refused in names at validation (exit 2, the character named)', () => {
    const path = editedScenario('drone-power-loss.json', (s) => (s.site.areas[0].name = 'Field\u0001A'));
    const r = strewn(['check', path]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("site.areas[0].name: 'Field?A' holds the control character U+0001");
  });

  it('are dropped by the KML and SVG writers, so the files stay well-formed XML', () => {
    const nasty = 'a\u0001b\u001fc\u000bd\ud800e & <f>';
    for (const escape of [kmlEscape, svgEscape]) {
      const text = escape(nasty);
      expect(text).toBe('abcde &amp; &lt;f&gt;');
      const errors: string[] = [];
      const doc = new DOMParser({ onError: (level, msg) => void (level !== 'warning' && errors.push(msg)) }).parseFromString(`<r>${text}</r>`, 'text/xml');
      expect(errors).toEqual([]);
      expect(doc.documentElement!.textContent).toBe('abcde & <f>');
    }
  });

  it('a mode name with a control character in recorded landings gives a well-formed result.kml', () => {
    const dir = tempDir();
    const rows = ['east_m,north_m,mode'];
    for (let i = 0; i < 20; i++) rows.push(`${i * 3},${(i % 5) * 4},${i % 2 ? 'drift\u0002' : 'nominal'}`);
    writeFileSync(join(dir, 'l.csv'), rows.join('\n'));
    const r = strewn(['analyze', join(dir, 'l.csv'), '--pad', '47,8', '--out', join(dir, 'out'), '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    const kml = readFileSync(join(dir, 'out', 'result.kml'), 'utf8');
    expect(kml).not.toMatch(/[\u0000-\u0008\u000b\u000c\u000e-\u001f]/);
  });
});

describe('characters the sheet font lacks', () => {
  it('the sheet says how many were printed as ?', () => {
    const path = editedScenario('drone-power-loss.json', (s) => (s.site.areas[0].name = 'Zuschauer \u{1F680} \u05E9\u05DC\u05D5\u05DD'));
    const out = join(path, '..', 'out');
    expect(strewn(['run', path, '--samples', '60', '--workers', '1', '--out', out, '--quiet']).status).toBe(0);
    const text = execFileSync('pdftotext', [join(out, 'sheet.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    // One emoji and four Hebrew letters: five characters outside Windows-1252.
    expect(text).toContain("5 characters of the names and notes (such as emoji or right-to-left scripts) cannot be shown in this sheet's font and are printed as '?'");
  });
});
