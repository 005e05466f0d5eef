import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/analysis/index.js';
import { readLandingsCsv, LandingsInputError } from '../../src/analysis/landings-input.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import type { RunSettings, Site } from '../../src/scenario/types.js';
import { strewn, SCENARIOS } from '../cli/helpers.js';
import { join } from 'node:path';

/** Edge cases of `strewn analyze`'s reader and analysis (found by a fuzzing probe). */

const site: Site = { pad: { lat: 47, lon: 8, elevation: 0 }, areas: [] };
const run: RunSettings = { samples: 0, seed: '', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } };
const frame = createLocalFrame(site.pad);
const read = (lines: string[]) => readLandingsCsv(lines.join('\n'), frame);
const errorOf = (lines: string[]) => {
  try {
    read(lines);
  } catch (error) {
    if (error instanceof LandingsInputError) return error.message;
    throw error;
  }
  return '';
};
const spread = (n: number, extra = '') => Array.from({ length: n }, (_, i) => `${i * 2},${(i * 7) % 5}${extra}`);

describe('analyze edge cases', () => {
  it('two far groups of coinciding landings give regions that hold their probability, not 0 m²', () => {
    const set = read(['east_m,north_m', ...Array(5).fill('0,0'), ...Array(5).fill('100000,0')]);
    const result = analyze(set, site, run);
    const areas = result.contours.features.map((f) => f.properties.area_m2);
    // Each group carries half the weight: the 0.5 region must cover at least one group's kernel.
    for (const a of areas) expect(a).toBeGreaterThan(1e6);
    expect(areas[0]! < areas[1]! && areas[1]! < areas[2]!).toBe(true);
    expect(result.warnings.join(' ')).not.toContain('packed within a metre');
    expect(result.warnings.join(' ')).toContain('lie along a line');
  });

  it('a landing 1,000 km from the pad is refused (beyond the flat frame), naming the line', () => {
    expect(errorOf(['east_m,north_m', ...spread(10), '1000000,0'])).toBe('line 12: the landing is 1,000 km from the pad; the flat local frame holds only within 500 km (check the unit and the pad)');
  });

  it('weights of 1e308 give the same probabilities as weights of 1', () => {
    const big = read(['east_m,north_m,weight', ...spread(12, ',1e308')]);
    const one = read(['east_m,north_m,weight', ...spread(12, ',1')]);
    expect(Array.from(big.weight)).toEqual(Array.from(one.weight));
    expect(big.modeProbability).toEqual([1]);
    const a = analyze(big, site, run);
    for (const f of a.contours.features) expect(Number.isFinite(f.properties.area_m2)).toBe(true);
  });

  it("'0x10', '', 'Infinity' and '1e400' are not numbers", () => {
    for (const cell of ['0x10', 'Infinity', '1e400', '0b11']) {
      expect(errorOf(['east_m,north_m', ...spread(10), `${cell},5`])).toMatch(/^line 12: east_m is '.*'; expected a decimal number$/);
    }
    expect(errorOf(['east_m,north_m', ...spread(10), ',5'])).toMatch(/east_m is ''/);
  });

  it('a 20-digit sample index is refused, not mangled; 4294967295 is kept exactly', () => {
    expect(errorOf(['sample,east_m,north_m', ...spread(10).map((r, i) => `${i},${r}`), '12345678901234567890,1,1'])).toContain("sample is '12345678901234567890'; expected a whole number up to 4,294,967,295");
    const set = read(['sample,east_m,north_m', ...spread(10).map((r, i) => `${i},${r}`), '4294967295,1,1']);
    expect(set.sample[10]).toBe(4294967295);
  });

  it('--pad with --scenario is range-checked too', () => {
    const r = strewn(['analyze', 'x.csv', '--scenario', join(SCENARIOS, 'drone-power-loss.json'), '--pad', '95,200']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--pad: latitude 95 is outside');
  });
});
