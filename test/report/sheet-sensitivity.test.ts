import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { readFileSync } from 'node:fs';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';
import { readResultsFolder } from '../../src/report/sheet/read-results.js';
import { buildSheet } from '../../src/report/sheet/index.js';
import { inputWords } from '../../src/report/sheet/input-names.js';
import type { Shape } from '../../src/report/sheet/display-list.js';
import { pdfText, runDemo } from './sheet-helpers.js';

/** Groups of a page (through groups and clips) whose class names include `name`. */
function groups(shapes: Shape[], name: string): Extract<Shape, { kind: 'group' }>[] {
  return shapes.flatMap((s) => {
    if (s.kind === 'group') return [...((s.className ?? '').split(' ').includes(name) ? [s] : []), ...groups(s.shapes, name)];
    return s.kind === 'clip' ? groups(s.shapes, name) : [];
  });
}

describe('what drives the landing spread, on the record page', () => {
  it('names the section and the top input in plain words, with bars to one scale', () => {
    const out = runDemo('drone-power-loss.json', 300);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const inputs = summary.sensitivity.inputs as { input: string; scatter: number; distance: number }[];
    const record = pdfText(join(out, 'sheet.pdf'), 2);
    expect(record).toContain('What drives the landing spread');
    expect(record).toContain(inputWords(inputs[0].input));
    expect(record).toContain('first-order indices from given data');

    // Each bar's length is its share on the chart's one scale: lengths in proportion to the shares.
    const page = buildSheet(readResultsFolder(out)).pages[1];
    const rows = groups(page.shapes, 'bar-row');
    expect(rows.length).toBeGreaterThanOrEqual(Math.min(2, inputs.length));
    const bar = (row: (typeof rows)[number], name: string) => {
      const rect = row.shapes.find((s) => s.kind === 'rect' && s.className === name);
      if (!rect || rect.kind !== 'rect') throw new Error(`no ${name} in the row`);
      return rect.width;
    };
    const first = inputs.find((x) => x.input === rows[0].data!.input)!;
    const second = inputs.find((x) => x.input === rows[1].data!.input)!;
    expect(bar(rows[0], 'bar-scatter') / bar(rows[1], 'bar-scatter')).toBeCloseTo(first.scatter / second.scatter, 6);
    expect(bar(rows[0], 'bar-distance') / bar(rows[0], 'bar-scatter')).toBeCloseTo(Math.max(0, first.distance) / first.scatter, 6);
  });

  it('is left out when the run has no spreads and no failure modes to rank', () => {
    const path = editedScenario('display-shell.json', (json) => {
      json.uncertainty = {};
      json.failures = [];
    });
    const out = join(tempDir(), 'out');
    const r = strewn(['run', path, '--out', out, '--samples', '100', '--quiet', '--workers', '1']);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')).sensitivity).toBeUndefined();
    expect(pdfText(join(out, 'sheet.pdf'), 2)).not.toContain('What drives the landing spread');
  });
});
