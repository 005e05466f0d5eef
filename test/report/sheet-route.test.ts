import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { bearing, distance, point } from '@turf/turf';
import { DOMParser, type Document, type Element } from '@xmldom/xmldom';
import { describe, expect, it } from 'vitest';
import { SYMBOLS } from '../../src/report/symbols.js';
import { SCENARIOS, strewn, tempDir } from '../cli/helpers.js';

/**
 * A drone operation's route (`launch.path`) and area (`launch.area`) on the review sheet's map
 * (map.svg is page 1 of sheet.pdf) and on the event sheet's map (event-map.svg): drawn where the
 * coordinates say, in the shared symbol set, named in the legend.
 */

function parseSvg(text: string): Document {
  return new DOMParser({ onError: (level, message) => { throw new Error(`not well-formed SVG (${level}): ${message}`); } }).parseFromString(text, 'image/svg+xml');
}

function all(doc: Document): Element[] {
  return Array.from(doc.getElementsByTagName('*')) as Element[];
}

function withClass(doc: Document, name: string): Element[] {
  return all(doc).filter((e) => (e.getAttribute('class') ?? '').split(' ').includes(name));
}

function pathPoints(d: string): [number, number][] {
  return [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
}

/** The pad's centre on the page: the circles of the 'pad' group. */
function padAt(doc: Document): [number, number] {
  const pad = all(doc).find((e) => e.getAttribute('id') === 'pad')!;
  const c = Array.from(pad.getElementsByTagName('circle'))[0] as Element;
  return [Number(c.getAttribute('cx')), Number(c.getAttribute('cy'))];
}

function run(scenarioFile: string): string {
  const out = join(tempDir('strewn-route-'), 'out');
  const r = strewn(['run', scenarioFile, '--out', out, '--samples', '300', '--quiet', '--workers', '1'], { env: { SOURCE_DATE_EPOCH: '1717243200' } });
  if (r.status !== 0) throw new Error(`strewn run failed (${r.status}): ${r.stderr}`);
  return out;
}

/**
 * Every vertex drawn at the bearing and, at one scale, the distance from the pad that the
 * coordinates give on the sphere (@turf/bearing and @turf/distance, great-circle formulas; over a
 * few hundred metres they agree with a flat local frame to far below the tolerances).
 */
function expectDrawnAt(doc: Document, drawn: [number, number][], coordinates: number[][], pad: { lon: number; lat: number }): void {
  const [px, py] = padAt(doc);
  expect(drawn.length).toBe(coordinates.length);
  const scales: number[] = [];
  drawn.forEach(([x, y], i) => {
    const at = point(coordinates[i]!);
    const from = point([pad.lon, pad.lat]);
    const metres = distance(from, at, { units: 'meters' });
    const pageBearing = ((Math.atan2(x - px, py - y) * 180) / Math.PI + 360) % 360;
    const sphereBearing = (bearing(from, at) + 360) % 360;
    const gap = Math.abs(((pageBearing - sphereBearing + 540) % 360) - 180);
    expect(gap, `bearing of vertex ${i}`).toBeLessThan(0.5);
    scales.push(Math.hypot(x - px, y - py) / metres);
  });
  const mean = scales.reduce((s, v) => s + v, 0) / scales.length;
  for (const s of scales) expect(Math.abs(s / mean - 1)).toBeLessThan(0.005);
}

describe('sheet map: a drone operation where it may fail', () => {
  const scenario = JSON.parse(readFileSync(join(SCENARIOS, 'drone-route.json'), 'utf8'));
  const pad = scenario.site.pad as { lon: number; lat: number };

  it('draws the route flown where its coordinates lie, in the shared route symbol, and names it in the legend', () => {
    const folder = run(join(SCENARIOS, 'drone-route.json'));
    const svg = readFileSync(join(folder, 'map.svg'), 'utf8');
    const doc = parseSvg(svg);
    const paths = withClass(doc, 'release-path');
    expect(paths).toHaveLength(1);
    expect(paths[0]!.getAttribute('stroke')).toBe(SYMBOLS.releasePath.color);
    expect(paths[0]!.getAttribute('fill') ?? 'none').toBe('none');
    expectDrawnAt(doc, pathPoints(paths[0]!.getAttribute('d')!), scenario.launch.path.coordinates, pad);
    expect(svg).toContain('Route flown (failure anywhere along it)');
    // The route replaces the single release point: no diamond, no "Release point" label.
    expect(all(doc).some((e) => e.getAttribute('id') === 'release-point')).toBe(false);
  }, 60_000);

  it('draws an area flown over as a filled outline with its own legend entry', () => {
    const dir = tempDir('strewn-area-');
    const json = structuredClone(scenario);
    const [[w, s], , [e, n]] = [[8.0155, 47.3105], [8.0235, 47.3105], [8.0235, 47.3125]];
    json.launch.area = { type: 'Polygon', coordinates: [[[w, s], [e, s], [e, n], [w, n], [w, s]]] };
    delete json.launch.path;
    json.launch.duration = '20 min';
    const file = join(dir, 'drone-area.json');
    writeFileSync(file, JSON.stringify(json));
    const folder = run(file);
    const svg = readFileSync(join(folder, 'map.svg'), 'utf8');
    const doc = parseSvg(svg);
    const areas = withClass(doc, 'release-area');
    expect(areas).toHaveLength(1);
    expect(areas[0]!.getAttribute('fill')).toBe(SYMBOLS.releaseArea.fill.color);
    expect(areas[0]!.getAttribute('stroke')).toBe(SYMBOLS.releaseArea.line.color);
    const ring = json.launch.area.coordinates[0] as number[][];
    expectDrawnAt(doc, pathPoints(areas[0]!.getAttribute('d')!), ring, pad);
    expect(svg).toContain('Area flown over (failure anywhere inside)');
    expect(withClass(doc, 'release-path')).toHaveLength(0);
  }, 60_000);

  it('draws the drone item\u2019s route on the event sheet, beside the rockets\u2019 zones', () => {
    const out = join(tempDir('strewn-event-route-'), 'out');
    const dir = tempDir('strewn-event-plan-');
    const plan = JSON.parse(readFileSync(join(SCENARIOS, 'club-day.event.json'), 'utf8'));
    for (const item of plan.items) {
      item.samples = 300;
      item.scenario = join(SCENARIOS, item.scenario);
    }
    const file = join(dir, 'small.event.json');
    writeFileSync(file, JSON.stringify(plan));
    const r = strewn(['event', file, '--out', out, '--quiet', '--workers', '1'], { env: { SOURCE_DATE_EPOCH: '1717243200' } });
    expect(r.status, r.stderr).toBe(0);
    const svg = readFileSync(join(out, 'event-map.svg'), 'utf8');
    const doc = parseSvg(svg);
    const paths = withClass(doc, 'release-path');
    expect(paths.map((p) => p.getAttribute('data-item'))).toEqual(['Drone filming runs']);
    const drone = JSON.parse(readFileSync(join(SCENARIOS, 'drone-route.json'), 'utf8'));
    expectDrawnAt(doc, pathPoints(paths[0]!.getAttribute('d')!), drone.launch.path.coordinates, plan.site.pad);
    expect(svg).toContain('Route flown (failure anywhere along it)');
  }, 120_000);
});
