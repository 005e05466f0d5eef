import { beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';
import { readResultsFolder } from '../../src/report/sheet/read-results.js';
import { buildSheet } from '../../src/report/sheet/index.js';
import type { Page, Shape, TextShape } from '../../src/report/sheet/display-list.js';
import { CAUTION } from '../../src/report/caution.js';
import { pdfPages, pdfText, runDemo } from './sheet-helpers.js';

/** Every text shape of a page, through groups and clips. */
function texts(shapes: Shape[]): TextShape[] {
  return shapes.flatMap((s) => (s.kind === 'text' ? [s] : s.kind === 'group' || s.kind === 'clip' ? texts(s.shapes) : []));
}

function cautionTop(page: Page): number {
  const box = page.shapes.find((s) => s.kind === 'group' && s.id === 'caution');
  const rect = box && box.kind === 'group' ? box.shapes.find((s) => s.kind === 'rect') : undefined;
  if (!rect || rect.kind !== 'rect') throw new Error('no caution box on the page');
  return rect.y;
}

function checkPages(pages: Page[]): void {
  for (const page of pages) {
    const all = texts(page.shapes);
    // Readable at arm's length: nothing smaller than 8 pt (common practice, no source).
    for (const t of all) expect(t.size, t.text).toBeGreaterThanOrEqual(8);
    // Nothing runs off the paper or under the caution box.
    const top = cautionTop(page);
    const caution = texts(page.shapes.filter((s) => s.kind === 'group' && s.id === 'caution'));
    for (const t of all) {
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x, t.text).toBeLessThanOrEqual(page.width);
      if (!caution.includes(t)) expect(t.y, t.text).toBeLessThan(top);
    }
  }
}

describe('sheet pages', () => {
  it('keep the demo sheets to two pages with text of 8 pt or more, clear of the caution box', () => {
    const out = runDemo('club-rocket.json', 300);
    for (const [paper, units] of [['letter', 'imperial'], ['a4', 'metric']] as const) {
      const sheet = buildSheet(readResultsFolder(out), { paper, units });
      expect(sheet.pages.length).toBe(2);
      checkPages(sheet.pages);
    }
  });

  describe('a crowded scenario (many areas, long notes)', () => {
    let out: string;
    beforeAll(() => {
      const path = editedScenario('club-rocket.json', (json) => {
        json.notes = 'These notes run on. '.repeat(80);
        for (let k = 0; k < 16; k++) {
          const lon = 8.0172 + (k % 8) * 0.0011;
          const lat = 47.3141 + Math.floor(k / 8) * 0.0009;
          json.site.areas.push({ name: `Viewing spot ${k + 1}`, kind: k % 2 ? 'spectators' : 'parking', people: 5 + k, geometry: { type: 'Polygon', coordinates: [[[lon, lat], [lon + 0.0005, lat], [lon + 0.0005, lat + 0.0003], [lon, lat + 0.0003], [lon, lat]]] } });
        }
      });
      out = join(tempDir(), 'out');
      const r = strewn(['run', path, '--out', out, '--samples', '300', '--quiet', '--workers', '1']);
      if (r.status !== 0) throw new Error(r.stderr);
    });

    it('continues the record on another page instead of running under the caution box', () => {
      const sheet = buildSheet(readResultsFolder(out));
      expect(sheet.pages.length).toBeGreaterThan(2);
      checkPages(sheet.pages);
      expect(pdfPages(join(out, 'sheet.pdf'))).toBe(sheet.pages.length);
    });

    it('still lists every area, and puts the caution on every page', () => {
      const file = join(out, 'sheet.pdf');
      const text = pdfText(file);
      for (let k = 1; k <= 16; k++) expect(text).toContain(`Viewing spot ${k}`);
      for (let page = 1; page <= pdfPages(file); page++) expect(pdfText(file, page)).toContain(CAUTION.slice(0, 60));
    });

    it('keeps map labels apart by tagging areas with their table row where names would crowd', () => {
      const map = buildSheet(readResultsFolder(out)).pages[0];
      const labels = (function collect(shapes: Shape[]): Shape[] {
        return shapes.flatMap((s) => (s.kind === 'group' && (s.className ?? '').startsWith('label') ? [s] : s.kind === 'group' || s.kind === 'clip' ? collect(s.shapes) : []));
      })(map.shapes);
      expect(labels.some((l) => l.kind === 'group' && l.className === 'label label-area-tag')).toBe(true);
      const boxes = labels.flatMap((l) => (l.kind === 'group' ? l.shapes.filter((s) => s.kind === 'rect') : [])).map((r) => r as { x: number; y: number; width: number; height: number });
      let clashes = 0;
      boxes.forEach((a, i) => boxes.slice(i + 1).forEach((b) => {
        if (a.x < b.x + b.width - 0.01 && b.x < a.x + a.width - 0.01 && a.y < b.y + b.height - 0.01 && b.y < a.y + a.height - 0.01) clashes++;
      }));
      expect(clashes).toBe(0);
    });
  });
});
