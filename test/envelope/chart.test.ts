import { describe, expect, it } from 'vitest';
import { DOMParser, type Document, type Element } from '@xmldom/xmldom';
import { envelopeChart, envelopeChartPage, forecastVerdict } from '../../src/envelope/chart.js';
import { hatchLines } from '../../src/envelope/hatch.js';
import { polarFrame } from '../../src/envelope/polar-frame.js';
import { envelopeSheetPages } from '../../src/envelope/sheet-page.js';
import type { Page, Shape, TextShape } from '../../src/report/sheet/display-list.js';
import { defaultMeasure } from '../../src/report/sheet/fonts.js';
import { PAPER_SIZES } from '../../src/report/sheet/page-parts.js';
import { madeUpEnvelope } from './fixtures.js';

/** Strict XML parsing: any error or warning fails the test. */
function parseSvg(text: string): Document {
  return new DOMParser({
    onError: (level, message) => {
      throw new Error(`envelope.svg is not well-formed XML (${level}): ${message}`);
    },
  }).parseFromString(text, 'image/svg+xml');
}

function all(doc: Document, tag: string): Element[] {
  return Array.from(doc.getElementsByTagName(tag)) as Element[];
}

function byId(doc: Document, id: string): Element | undefined {
  return all(doc, '*').find((e) => e.getAttribute('id') === id);
}

function byClass(doc: Document, name: string): Element[] {
  return all(doc, '*').filter((e) => (e.getAttribute('class') ?? '').split(' ').includes(name));
}

/** Vertices of a path of M/L/Z commands, as the renderer writes them. */
function vertices(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

function texts(shapes: Shape[]): TextShape[] {
  return shapes.flatMap((s) => (s.kind === 'text' ? [s] : s.kind === 'group' || s.kind === 'clip' ? texts(s.shapes) : []));
}

describe('envelope.svg', () => {
  it('parses as XML and has one envelope vertex per direction, each at its limit on the speed scale', () => {
    const e = madeUpEnvelope({});
    const doc = parseSvg(envelopeChart(e, { units: 'metric' }));
    const outline = byId(doc, 'envelope')!;
    expect(outline.getAttribute('d')).toMatch(/Z$/);
    const corners = vertices(outline.getAttribute('d')!);
    expect(corners).toHaveLength(e.directions.length);
    // The centre is where every spoke starts; the outermost ring is the top of the scale.
    const [cx, cy] = vertices(byClass(doc, 'spoke')[0].getAttribute('d')!)[0];
    const rings = byClass(doc, 'ring').map((r) => Number(r.getAttribute('r')));
    const outer = Math.max(...rings);
    const topLabel = byClass(doc, 'ring-label').map((t) => t.textContent ?? '').find((t) => t.includes('m/s'))!;
    const topSpeed = Number(topLabel.replace(' m/s', ''));
    e.limits.forEach((d, i) => {
      const [x, y] = corners[i];
      expect(Math.hypot(x - cx, y - cy) / outer).toBeCloseTo((d.limit ?? 0) / topSpeed, 2);
      // North up, clockwise: a wind from the east is drawn right of the centre.
      if (d.from === 90) expect(x).toBeGreaterThan(cx);
      if (d.from === 0) expect(y).toBeLessThan(cy);
    });
  });

  it('marks limits at the top of the grid with triangles and the rest with dots', () => {
    const e = madeUpEnvelope({ speeds: '0:8:1' });
    const top = e.limits.filter((d) => d.aboveGrid).length;
    expect(top).toBeGreaterThan(0);
    const doc = parseSvg(envelopeChart(e, { units: 'metric' }));
    expect(byClass(doc, 'above-grid')).toHaveLength(top);
    expect(byClass(doc, 'limit')).toHaveLength(e.limits.length - top);
  });

  it('states the forecast verdict: OUTSIDE above the limit, inside below it', () => {
    const outside = madeUpEnvelope({ forecast: { from: 0, speed: 9 } });
    const inside = madeUpEnvelope({ forecast: { from: 0, speed: 3 } });
    expect(byId(parseSvg(envelopeChart(outside, { units: 'metric' })), 'verdict')!.textContent).toContain('OUTSIDE the limits');
    expect(byId(parseSvg(envelopeChart(inside, { units: 'metric' })), 'verdict')!.textContent).toContain('is inside the limits');
    expect(forecastVerdict(outside).inside).toBe(false);
    expect(byId(parseSvg(envelopeChart(outside, { units: 'metric' })), 'forecast')).toBeDefined();
  });

  it('writes speeds in mph for imperial units', () => {
    const doc = parseSvg(envelopeChart(madeUpEnvelope({ forecast: { from: 0, speed: 4.4704 } }), { units: 'imperial' }));
    expect(byId(doc, 'verdict')!.textContent).toContain('Forecast 10 mph');
    expect(byClass(doc, 'ring-label').some((t) => (t.textContent ?? '').endsWith('mph'))).toBe(true);
  });

  it('shows a scenario name with markup as text, never as markup', () => {
    const name = '<b onmouseover="x()">Field & "test"</b>';
    const doc = parseSvg(envelopeChart(madeUpEnvelope({ name }), { units: 'metric' }));
    expect(all(doc, 'b')).toHaveLength(0);
    expect(all(doc, 'title')[0].textContent).toBe(`Wind limits: ${name}`);
    expect(all(doc, 'text').map((t) => t.textContent).join(' ')).toContain('Field &');
  });

  it('draws a fan from the centre when the directions do not go all the way round', () => {
    const e = madeUpEnvelope({ directions: '0:90:30' });
    const doc = parseSvg(envelopeChart(e, { units: 'metric' }));
    expect(vertices(byId(doc, 'envelope')!.getAttribute('d')!)).toHaveLength(e.directions.length + 1);
  });

  it('keeps every text at 8 pt or more, on the page', () => {
    const page = envelopeChartPage(madeUpEnvelope({}), { units: 'metric' });
    for (const t of texts(page.shapes)) {
      expect(t.size, t.text).toBeGreaterThanOrEqual(8);
      expect(t.y, t.text).toBeLessThan(page.height);
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x, t.text).toBeLessThanOrEqual(page.width);
    }
  });
});

describe('polar chart geometry', () => {
  it('reads a point of the chart back into the grid point drawn there', () => {
    const e = madeUpEnvelope({});
    for (const units of ['metric', 'imperial'] as const) {
      const frame = polarFrame(e, units, 200, 200, 150);
      for (const from of e.directions) {
        // At zero speed every direction meets in the centre; elsewhere the point is unambiguous.
        for (const speed of e.speeds.filter((v) => v > 0)) {
          const [x, y] = frame.point(from, speed);
          expect(frame.pick(x, y, e.directions, e.speeds)).toEqual({ from, speed });
        }
      }
      expect(frame.pick(200 + 400, 200, e.directions, e.speeds)).toBeNull();
    }
  });

  it('hatches a shape with lines whose total length is its area over the spacing', () => {
    const square: [number, number][] = [[0, 0], [100, 0], [100, 100], [0, 100]];
    const d = hatchLines(square, 5, 45);
    let length = 0;
    for (let i = 0; i < d.length; i += 2) {
      const a = d[i];
      const b = d[i + 1];
      if (a[0] !== 'M' || b[0] !== 'L') throw new Error('hatching is not pairs of M and L');
      length += Math.hypot(b[1] - a[1], b[2] - a[2]);
      // Every end lies on or inside the square.
      for (const [x, y] of [[a[1], a[2]], [b[1], b[2]]]) {
        expect(x).toBeGreaterThanOrEqual(-1e-9);
        expect(x).toBeLessThanOrEqual(100 + 1e-9);
        expect(y).toBeGreaterThanOrEqual(-1e-9);
        expect(y).toBeLessThanOrEqual(100 + 1e-9);
      }
    }
    expect(length / (10_000 / 5)).toBeGreaterThan(0.97);
    expect(length / (10_000 / 5)).toBeLessThan(1.03);
  });
});

describe('the wind-limits page of the review sheet', () => {
  const record = (directions: string) => ({ envelope: madeUpEnvelope({ directions }), scenarioHash: 'a'.repeat(64), version: '0.1.0', computedAt: '2024-06-01T12:00:00Z' });

  function checkPage(page: Page): void {
    const box = page.shapes.find((s) => s.kind === 'group' && s.id === 'caution');
    const rect = box && box.kind === 'group' ? box.shapes.find((s) => s.kind === 'rect') : undefined;
    if (!rect || rect.kind !== 'rect') throw new Error('no caution box on the page');
    const caution = new Set(texts(box!.kind === 'group' ? box!.shapes : []));
    for (const t of texts(page.shapes)) {
      expect(t.size, t.text).toBeGreaterThanOrEqual(8);
      expect(t.x, t.text).toBeGreaterThanOrEqual(0);
      expect(t.x, t.text).toBeLessThanOrEqual(page.width);
      if (!caution.has(t)) expect(t.y, t.text).toBeLessThan(rect.y);
    }
  }

  it('fits twelve directions on one page, A4 and Letter, with a row per direction', () => {
    for (const paper of ['a4', 'letter'] as const) {
      const pages = envelopeSheetPages(record('0:330:30'), { paper, units: 'metric', measure: defaultMeasure() });
      expect(pages).toHaveLength(1);
      expect(pages[0].width).toBeCloseTo(PAPER_SIZES[paper].width, 6);
      checkPage(pages[0]);
      const all = texts(pages[0].shapes).map((t) => t.text);
      for (const label of ['N 0°', 'E 90°', 'S 180°', 'W 270°', '30°']) expect(all.filter((t) => t === label).length, label).toBeGreaterThanOrEqual(2);
    }
  });

  it('runs many directions in two columns and onto further pages, never under the caution box', () => {
    const five = envelopeSheetPages(record('0:355:5'), { paper: 'letter', units: 'imperial', measure: defaultMeasure() });
    const one = envelopeSheetPages(record('0:359:1'), { paper: 'a4', units: 'metric', measure: defaultMeasure() });
    expect(one.length).toBeGreaterThan(1);
    for (const page of [...five, ...one]) checkPage(page);
    // Every direction is in the table exactly once (the chart labels at most sixteen).
    const rows = one.flatMap((p) => texts(p.shapes.filter((s) => s.kind === 'group' && (s.id ?? '').startsWith('table-limits'))));
    expect(rows.filter((t) => /^(\w+ )?\d+(\.\d)?°$/.test(t.text))).toHaveLength(360);
  });
});
