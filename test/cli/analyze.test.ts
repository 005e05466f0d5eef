import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { strewn, tempDir } from './helpers.js';

const PAD = '47.31204,8.02117,418';

/** A small landings file: 60 points on a spiral around (100, 50) m, written in local metres. */
function spiralCsv(): string {
  const lines = ['east_m,north_m,mode'];
  for (let i = 0; i < 60; i++) {
    const r = 5 + i * 1.5;
    const a = i * 0.7;
    lines.push(`${(100 + r * Math.cos(a)).toFixed(3)},${(50 + r * Math.sin(a)).toFixed(3)},${i % 10 === 0 ? 'no parachute' : 'nominal'}`);
  }
  return lines.join('\n') + '\n';
}

function write(name: string, text: string): { path: string; out: string } {
  const dir = tempDir();
  const path = join(dir, name);
  writeFileSync(path, text);
  return { path, out: join(dir, 'out') };
}

describe('strewn analyze: landing points recorded elsewhere', () => {
  it('draws contours and a keep-out zone from east/north metres, with modes', () => {
    const { path, out } = write('tracked.csv', spiralCsv());
    const r = strewn(['analyze', path, '--pad', PAD, '--out', out, '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.landings).toBe(60);
    expect(s.contours.map((c: { level: number }) => c.level)).toEqual([0.5, 0.9, 0.99]);
    expect(s.modes.find((m: { name: string }) => m.name === 'no parachute').probability).toBeCloseTo(0.1, 12);
    expect(s.caution).toContain('never replace');
    for (const f of ['contours.geojson', 'keepout.geojson', 'landings.geojson', 'result.kml', 'summary.json']) expect(existsSync(join(out, f))).toBe(true);
  });

  it('lat/lon columns give the same zone as east/north metres', () => {
    const a = write('metres.csv', spiralCsv());
    const ra = strewn(['analyze', a.path, '--pad', PAD, '--out', a.out, '--quiet']);
    expect(ra.status).toBe(0);
    // Convert through the first run's landings.geojson, which carries both.
    const points = JSON.parse(readFileSync(join(a.out, 'landings.geojson'), 'utf8')).features as { geometry: { coordinates: number[] }; properties: { mode: string } }[];
    const csv = ['lat,lon,mode', ...points.map((p) => `${p.geometry.coordinates[1]},${p.geometry.coordinates[0]},${p.properties.mode}`)].join('\n');
    const b = write('degrees.csv', csv);
    const rb = strewn(['analyze', b.path, '--pad', PAD, '--out', b.out, '--quiet']);
    expect(rb.status).toBe(0);
    const sa = JSON.parse(readFileSync(join(a.out, 'summary.json'), 'utf8'));
    const sb = JSON.parse(readFileSync(join(b.out, 'summary.json'), 'utf8'));
    expect(Math.abs(sb.keepOut.area_m2 / sa.keepOut.area_m2 - 1)).toBeLessThan(1e-3);
  });

  it.each([
    ['an empty file', '', 'empty'],
    ['a file without position columns', 'x,y\n' + '1,2\n'.repeat(20), 'neither east_m and north_m nor lat and lon'],
    ['a non-numeric row', 'east_m,north_m\n' + '1,2\n'.repeat(5) + '3,abc\n' + '1,2\n'.repeat(10), 'line 7'],
    ['fewer than 10 points', 'east_m,north_m\n' + '1,2\n'.repeat(9), 'at least 10'],
    ['a negative weight', 'east_m,north_m,weight\n' + '1,2,1\n'.repeat(10) + '1,2,-3\n', 'line 12'],
  ])('%s → exit 2 naming the problem, nothing written', (_name, text, message) => {
    const { path, out } = write('bad.csv', text);
    const r = strewn(['analyze', path, '--pad', PAD, '--out', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(out)).toBe(false);
  });

  it.each([
    [['--pad', '95,8'], '--pad'],
    [['--pad', 'north'], '--pad'],
    [[], '--pad LAT,LON'],
    [['--pad', PAD, '--levels', '0.9,0.5'], '--levels'],
  ])('bad options %j exit 2', (extra, message) => {
    const { path, out } = write('ok.csv', spiralCsv());
    const r = strewn(['analyze', path, ...(extra as string[]), '--out', out]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(message);
  });
});
