import { describe, expect, it } from 'vitest';
import { LabelPlacer, aroundPoint } from '../../src/report/sheet/labels.js';
import { createTextMeasure, wrapText } from '../../src/report/sheet/fonts.js';
import { chooseExtent, fitView } from '../../src/report/sheet/map-view.js';
import { renderSvg } from '../../src/report/sheet/render-svg.js';
import { renderPdf } from '../../src/report/sheet/render-pdf.js';
import type { Page } from '../../src/report/sheet/display-list.js';

const measure = createTextMeasure();

describe('text metrics', () => {
  // Adobe Helvetica metrics (AFM): 'H' is 722/1000 em wide, space 278/1000 (from memory of the AFM file).
  it('measures with the standard font metrics', () => {
    expect(measure('H', 10, 'regular')).toBeCloseTo(7.22, 6);
    expect(measure('H H', 10, 'regular')).toBeCloseTo(7.22 * 2 + 2.78, 6);
  });

  it('wraps within the width without losing words', () => {
    const text = 'Results support, and never replace, the range-safety code that governs the site.';
    const lines = wrapText(measure, text, 9, 'regular', 120);
    expect(lines.length).toBeGreaterThan(1);
    for (const l of lines) expect(measure(l, 9, 'regular')).toBeLessThanOrEqual(120);
    expect(lines.join(' ')).toBe(text);
  });
});

// Labels that do not overlap and stay inside the frame: common practice in map making, no source.
describe('greedy label placement', () => {
  it('places optional labels only where they clear every other label and reserved box', () => {
    const placer = new LabelPlacer({ minX: 0, minY: 0, maxX: 200, maxY: 200 }, measure);
    placer.reserve({ minX: 90, minY: 90, maxX: 110, maxY: 110 });
    const boxes = [];
    for (let k = 0; k < 40; k++) {
      const box = placer.place([{ text: `label ${k}`, size: 8, font: 'regular' }], aroundPoint(100, 100, 12));
      if (box) boxes.push(box);
    }
    expect(boxes.length).toBeGreaterThan(2);
    expect(boxes.length).toBeLessThan(9); // eight positions round one point, some blocked
    const all = [...boxes, { minX: 90, minY: 90, maxX: 110, maxY: 110 }];
    all.forEach((a, i) => all.slice(i + 1).forEach((b) => {
      expect(a.minX < b.maxX && b.minX < a.maxX && a.minY < b.maxY && b.minY < a.maxY).toBe(false);
    }));
  });

  it('places a required label where it overlaps least when nothing is clear, and counts it', () => {
    const placer = new LabelPlacer({ minX: 0, minY: 0, maxX: 100, maxY: 30 }, measure);
    placer.reserve({ minX: 0, minY: 0, maxX: 100, maxY: 23 });
    const box = placer.place([{ text: 'must show', size: 8, font: 'bold' }], [{ x: 50, y: 15, alignX: 0.5, alignY: 0.5 }, { x: 50, y: 25, alignX: 0.5, alignY: 0.5 }], { required: true });
    expect(box).not.toBeNull();
    expect(placer.forced).toBe(1);
    expect(box!.minY).toBeGreaterThan(15); // the lower candidate overlaps the reserved box less
  });
});

// North up, one scale on both axes (a conformal, undistorted plot of the local frame): common practice, no source.
describe('map extent and projection', () => {
  it('keeps a far-away area from shrinking the zone, but shows a near one', () => {
    const zone = { minX: -100, minY: -80, maxX: 120, maxY: 90 };
    const near = { minX: -260, minY: -200, maxX: -120, maxY: -170 };
    const far = { minX: 3000, minY: 3000, maxX: 3100, maxY: 3100 };
    const e = chooseExtent({ core: zone, areas: [near, far], reach: 150 });
    expect(e.minX).toBeLessThan(-260);
    expect(e.maxX).toBeLessThan(1000);
  });

  it('fits with one scale on both axes, north up, centred', () => {
    const view = fitView({ minX: -100, minY: -50, maxX: 100, maxY: 50 }, { x: 10, y: 20, width: 400, height: 400 });
    expect(view.scale).toBe(2);
    expect(view.toPage(0, 0)).toEqual([210, 220]);
    const [, yNorth] = view.toPage(0, 10);
    expect(yNorth).toBeLessThan(220);
    expect(view.toPage(10, 0)[0] - 210).toBeCloseTo(view.toPage(0, 0)[1] - view.toPage(0, 10)[1], 12);
  });
});

// XML escaping as XML 1.0 (W3C, 5th ed., section 2.4) requires for character data and attributes.
describe('rendering one display list two ways', () => {
  const page: Page = {
    width: 200,
    height: 100,
    shapes: [
      { kind: 'path', id: 'p', d: [['M', 10, 10], ['L', 50, 10], ['L', 50, 50], ['Z']], stroke: { color: '#000000', width: 1, dash: [3, 2] }, fill: { color: '#ff0000', opacity: 0.5 } },
      { kind: 'text', x: 100, y: 50, text: 'Tom & "Jerry" <3 °', size: 9, font: 'bold', anchor: 'middle', color: '#111111' },
      { kind: 'markers', symbol: 'triangle', size: 2, points: [10, 80, 20, 80], color: '#0000ff' },
      { kind: 'clip', x: 0, y: 0, width: 100, height: 100, shapes: [{ kind: 'circle', cx: 90, cy: 50, r: 30, stroke: { color: '#00ff00', width: 2 } }] },
    ],
  };

  it('escapes text for SVG', () => {
    const svg = renderSvg(page, 'a < b');
    expect(svg).toContain('Tom &amp; &quot;Jerry&quot; &lt;3 °');
    expect(svg).toContain('<title>a &lt; b</title>');
    expect(svg).toContain('clip-path="url(#clip1)"');
  });

  it('gives the same PDF bytes for the same pages and date', () => {
    const date = new Date('2024-06-01T12:00:00Z');
    const a = renderPdf([page, page], { title: 't', creator: 'c', date });
    const b = renderPdf([page, page], { title: 't', creator: 'c', date });
    expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true);
    expect(Buffer.from(a).subarray(0, 5).toString()).toBe('%PDF-');
    const c = renderPdf([page, page], { title: 't', creator: 'c', date: new Date('2024-06-02T12:00:00Z') });
    expect(Buffer.from(a).equals(Buffer.from(c))).toBe(false);
  });
});
