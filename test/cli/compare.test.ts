import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { SCENARIOS, strewn, tempDir } from './helpers.js';

describe('strewn compare', () => {
  it('differences are B − A of the two summaries, a folder against itself changes nothing, both zones on one map', () => {
    const dir = tempDir('strewn-compare-');
    const a = join(dir, 'a');
    const b = join(dir, 'b');
    expect(strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '300', '--out', a, '--quiet']).status).toBe(0);
    expect(strewn(['run', join(SCENARIOS, 'display-shell.json'), '--samples', '300', '--out', b, '--quiet']).status).toBe(0);
    const r = strewn(['compare', a, b, '--json', '--out', join(dir, 'cmp')]);
    expect(r.status).toBe(0);
    const c = JSON.parse(r.stdout);
    const sa = JSON.parse(readFileSync(join(a, 'summary.json'), 'utf8'));
    const sb = JSON.parse(readFileSync(join(b, 'summary.json'), 'utf8'));
    expect(c.zone.area_m2.change).toBeCloseTo(sb.keepOut.area_m2 - sa.keepOut.area_m2, 9);
    expect(c.zone.maxDistance_m.change).toBeCloseTo(sb.keepOut.maxDistance_m - sa.keepOut.maxDistance_m, 9);
    const crowd = c.areas.find((x: any) => x.name === 'Spectator line');
    expect(crowd.probability.change).toBeCloseTo(sb.areas[0].probability - sa.areas[0].probability, 12);
    const svg = readFileSync(join(dir, 'cmp', 'compare.svg'), 'utf8');
    expect(svg).toContain('id="zone-a"');
    expect(svg).toContain('id="zone-b"');
    expect(existsSync(join(dir, 'cmp', 'compare.pdf'))).toBe(true);
    const same = JSON.parse(strewn(['compare', a, a, '--json']).stdout);
    expect(same.zone.area_m2.change).toBe(0);
    expect(same.areas.every((x: any) => x.probability.change === 0)).toBe(true);
  }, 60_000);

  it('a folder that is not a results folder exits 2 naming the file', () => {
    const dir = tempDir('strewn-compare-');
    const r = strewn(['compare', dir, dir]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/summary\.json/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
