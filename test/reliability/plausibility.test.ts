import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { apogeeWarnings, shareBelow } from '../../src/scenario/plausibility.js';
import { SCENARIOS } from '../cli/helpers.js';

/**
 * Values no real event has give warnings (thresholds: common practice, no source; see
 * src/scenario/plausibility.ts). Zero-size and self-crossing areas are errors.
 */

const drone = () => JSON.parse(readFileSync(join(SCENARIOS, 'drone-power-loss.json'), 'utf8'));
const warningsOf = (s: unknown) => parseScenario(s).warnings.map((w) => `${w.path}: ${w.message}`);
function errorsOf(s: unknown): string[] {
  try {
    parseScenario(s);
    return [];
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues.map((i) => `${i.path}: ${i.message}`);
    throw error;
  }
}

describe('plausibility warnings', () => {
  it('the demo drone scenario gives none of them', () => {
    expect(warningsOf(drone()).filter((w) => /elevation|release point|minimumDistance|people|vehicle\.mass/.test(w))).toEqual([]);
  });

  it.each([
    ['pad elevation 9,500 m', (s: any) => (s.site.pad.elevation = '9500 m'), 'site.pad.elevation: 9500 m above sea level is outside -500 to 9000 m'],
    ['pad elevation -600 m', (s: any) => (s.site.pad.elevation = -600), 'site.pad.elevation: -600 m above sea level'],
    ['pad elevation 1,370 ft is fine, 30,000 ft is not', (s: any) => (s.site.pad.elevation = '30000 ft'), 'site.pad.elevation: 9144 m'],
    ['a release 60 km from the pad', (s: any) => ((s.launch.east = '36 km'), (s.launch.north = '48 km')), 'launch.east: the release point is 60 km from the pad'],
    ['a minimum distance of 25 km', (s: any) => (s.site.minimumDistance = '25 km'), 'site.minimumDistance: 25 km is more than the 20 km'],
    ['1.5 million people in an area', (s: any) => (s.site.areas[0].people = 1_500_000), "site.areas[0].people: 1,500,000 people in 'Spectator line'"],
  ])('%s', (_name, edit, says) => {
    const s = drone();
    edit(s);
    expect(warningsOf(s).join('\n')).toContain(says);
  });

  it('values just inside the limits give no warning', () => {
    const s = drone();
    s.site.pad.elevation = 9000;
    s.launch.east = '30 km';
    s.launch.north = '40 km'; // exactly 50 km (3-4-5 triangle)
    s.site.minimumDistance = '20 km';
    s.site.areas[0].people = 1_000_000;
    expect(warningsOf(s).filter((w) => /elevation|release point|minimumDistance|people/.test(w))).toEqual([]);
  });

  it('a mass spread that draws near-zero or negative masses says it is clamped and how often', () => {
    const s = drone();
    s.uncertainty['vehicle.mass'] = { sd: '50 %' };
    // P(Z < -0.999 / 0.5) = Phi(-1.998) = 2.29 % (standard normal table, e.g. Abramowitz & Stegun 26.2)
    expect(warningsOf(s).join('\n')).toMatch(/uncertainty\.vehicle\.mass: the spread draws a mass of 0\.0009 kg or less .* in about 2\.3 % of samples; those draws are clamped/);
    s.uncertainty['vehicle.mass'] = { sd: '50 %', limit: 1.9 };
    expect(warningsOf(s).join('\n')).not.toContain('uncertainty.vehicle.mass');
    expect(shareBelow({ kind: 'uniform', lo: -2, hi: 2, relative: false }, 1, -1)).toBeCloseTo(0.25, 12);
  });

  it('an apogee over 150 km warns', () => {
    expect(apogeeWarnings(150_000)).toEqual([]);
    expect(apogeeWarnings(180_000)[0]!.message).toContain('reaches 180 km, above 150 km');
  });
});

describe('area shapes', () => {
  it('an area of zero size is an error naming its ring', () => {
    const s = drone();
    s.site.areas[0].geometry.coordinates = [[[8.0, 47.3], [8.001, 47.3], [8.002, 47.3], [8.0, 47.3]]];
    expect(errorsOf(s)).toEqual(['site.areas[0].geometry.coordinates[0]: the ring encloses no area (its points lie on one line or on one spot); draw the area with at least three corners apart']);
  });

  it('a bow-tie (self-crossing) area or boundary is an error giving the crossing point', () => {
    const s = drone();
    s.site.areas[1].geometry.coordinates = [[[8.0, 47.3], [8.002, 47.302], [8.002, 47.3], [8.0, 47.302], [8.0, 47.3]]];
    expect(errorsOf(s)).toEqual(['site.areas[1].geometry.coordinates[0]: the ring crosses itself near [8.001, 47.301]; redraw it so its edges meet only at corners']);
    const t = drone();
    t.site.boundary.coordinates = s.site.areas[1].geometry.coordinates;
    expect(errorsOf(t)[0]).toMatch(/^site\.boundary\.coordinates\[0\]: the ring crosses itself/);
  });
});
