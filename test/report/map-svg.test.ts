import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, readdirSync, mkdirSync, copyFileSync } from 'node:fs';
import { join } from 'node:path';
import { DOMParser, type Document, type Element } from '@xmldom/xmldom';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { strewn, tempDir } from '../cli/helpers.js';
import { pdfText, runDemo } from './sheet-helpers.js';

/** Strict XML parsing: any error or warning fails the test. */
function parseSvg(text: string): Document {
  return new DOMParser({
    onError: (level, message) => {
      throw new Error(`map.svg is not well-formed XML (${level}): ${message}`);
    },
  }).parseFromString(text, 'image/svg+xml');
}

function all(doc: Document, tag: string): Element[] {
  return Array.from(doc.getElementsByTagName(tag)) as Element[];
}

function byId(doc: Document, id: string): Element | undefined {
  return all(doc, '*').find((e) => e.getAttribute('id') === id);
}

/** Vertices of an SVG path made of M/L/Z commands (as map.svg writes them). */
function pathPoints(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

function extent(points: number[][]): { w: number; h: number; top: number[]; } {
  const xs = points.map((p) => p[0]);
  const ys = points.map((p) => p[1]);
  return { w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys), top: points[ys.indexOf(Math.min(...ys))] };
}

/** A scale-bar label in metres: exact unit definitions (international foot 0.3048 m, mile 5280 ft; 1959 agreement). */
function labelMetres(label: string): number {
  const m = /^([\d.,]+) (m|km|ft|mi)$/.exec(label.trim());
  if (!m) throw new Error(`scale-bar label '${label}' is not a length`);
  const value = Number(m[1].replace(/,/g, ''));
  return value * { m: 1, km: 1000, ft: 0.3048, mi: 1609.344 }[m[2] as 'm' | 'km' | 'ft' | 'mi'];
}

/**
 * Points per metre on the page, computed back from the keep-out zone (createLocalFrame itself is
 * checked against GeographicLib in test/analysis): its outline in map.svg
 * against the same outline in keepout.geojson projected with the pad's local frame.
 */
function scaleFromKeepOut(doc: Document, folder: string): { sx: number; sy: number } {
  const keepOut = JSON.parse(readFileSync(join(folder, 'keepout.geojson'), 'utf8'));
  const scenario = JSON.parse(readFileSync(join(folder, 'scenario.json'), 'utf8'));
  const frame = createLocalFrame(scenario.site.pad);
  const geometry = keepOut.features[0].geometry;
  const rings: number[][][] = geometry.type === 'Polygon' ? geometry.coordinates : geometry.coordinates.flat();
  const metres = rings.flat().map(([lon, lat]) => frame.toEastNorth(lon, lat));
  const page = pathPoints(byId(doc, 'keep-out')!.getAttribute('d')!);
  const m = extent(metres);
  const p = extent(page);
  return { sx: p.w / m.w, sy: p.h / m.h };
}

describe.each([
  ['club-rocket.json', []],
  ['drone-power-loss.json', ['--units', 'imperial']],
] as [string, string[]][])('map.svg of %s %s', (scenario, options) => {
  let folder: string;
  let doc: Document;
  let summary: any;
  beforeAll(() => {
    const run = runDemo(scenario);
    folder = join(tempDir(), 'copy');
    mkdirSync(folder);
    for (const name of readdirSync(run)) copyFileSync(join(run, name), join(folder, name));
    if (options.length > 0) {
      const r = strewn(['sheet', folder, ...options]);
      if (r.status !== 0) throw new Error(r.stderr);
    }
    doc = parseSvg(readFileSync(join(folder, 'map.svg'), 'utf8'));
    summary = JSON.parse(readFileSync(join(folder, 'summary.json'), 'utf8'));
  });

  it('is an SVG document the size of the page', () => {
    const root = doc.documentElement!;
    expect(root.nodeName).toBe('svg');
    expect(root.getAttribute('viewBox')).toMatch(/^0 0 [\d.]+ [\d.]+$/);
  });

  it('draws every contour and the keep-out zone as a named path', () => {
    const contours = all(doc, 'path').filter((p) => p.getAttribute('class') === 'contour');
    expect(contours.map((p) => Number(p.getAttribute('data-level')))).toEqual(summary.contours.map((c: any) => c.level));
    for (const c of contours) expect(pathPoints(c.getAttribute('d')!).length).toBeGreaterThan(3);
    const keepOut = byId(doc, 'keep-out');
    expect(keepOut?.nodeName).toBe('path');
    expect(pathPoints(keepOut!.getAttribute('d')!).length).toBeGreaterThan(3);
  });

  it('uses one scale on both axes and puts north up', () => {
    const { sx, sy } = scaleFromKeepOut(doc, folder);
    expect(sy / sx).toBeCloseTo(1, 2);
    // The northernmost vertex of the zone is the topmost on the page (north up; common practice, no source).
    const keepOut = JSON.parse(readFileSync(join(folder, 'keepout.geojson'), 'utf8'));
    const ring: number[][] = keepOut.features[0].geometry.type === 'Polygon' ? keepOut.features[0].geometry.coordinates[0] : keepOut.features[0].geometry.coordinates[0][0];
    const north = ring.reduce((a, b) => (b[1] > a[1] ? b : a));
    const west = ring.reduce((a, b) => (b[0] < a[0] ? b : a));
    const page = pathPoints(byId(doc, 'keep-out')!.getAttribute('d')!);
    const index = (p: number[]) => ring.findIndex((q) => q[0] === p[0] && q[1] === p[1]);
    expect(page[index(north)][1]).toBeCloseTo(Math.min(...page.map((p) => p[1])), 1);
    expect(page[index(west)][0]).toBeCloseTo(Math.min(...page.map((p) => p[0])), 1);
  });

  it('has a scale bar whose length matches its label within 1 %', () => {
    const { sx } = scaleFromKeepOut(doc, folder);
    const bar = byId(doc, 'scale-bar-outline')!;
    const label = byId(doc, 'scale-bar-label')!.textContent!;
    const barMetres = Number(bar.getAttribute('width')) / sx;
    expect(Math.abs(barMetres / labelMetres(label) - 1)).toBeLessThan(0.01);
  });

  it('shows the same words as page 1 of sheet.pdf', () => {
    const page1 = pdfText(join(folder, 'sheet.pdf'), 1);
    const words = all(doc, 'text').map((t) => t.textContent!.trim()).filter((t) => t.length > 0);
    expect(words.length).toBeGreaterThan(20);
    for (const w of words) expect(page1.replace(/\s+/g, '')).toContain(w.replace(/\s+/g, ''));
  });

  it('keeps map labels clear of each other', () => {
    const labels = all(doc, 'g').filter((g) => (g.getAttribute('class') ?? '').split(' ').includes('label'));
    expect(labels.length).toBeGreaterThan(5);
    const boxes = labels
      .map((g) => all(g as unknown as Document, 'rect')[0])
      .filter((r): r is Element => r !== undefined)
      .map((r) => ({ x: Number(r.getAttribute('x')), y: Number(r.getAttribute('y')), w: Number(r.getAttribute('width')), h: Number(r.getAttribute('height')) }));
    const clashes: string[] = [];
    boxes.forEach((a, i) => boxes.slice(i + 1).forEach((b) => {
      if (a.x < b.x + b.w - 0.01 && b.x < a.x + a.w - 0.01 && a.y < b.y + b.h - 0.01 && b.y < a.y + a.h - 0.01) clashes.push(`${JSON.stringify(a)} / ${JSON.stringify(b)}`);
    }));
    expect(clashes).toEqual([]);
  });
});
