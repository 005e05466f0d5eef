import { describe, expect, it } from 'vitest';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';

/**
 * The `breakup` block read into SI with the format's own rules, worked by hand: reference area
 * π d²/4, drag area Cd·A, a piece given by its drag area alone has Cd 1 and A = Cd·A, casualty
 * radius d/2 or √(A/π) (cm² = 1e-4 m², g = 1e-3 kg: SI Brochure, 9th ed.).
 */
const base = {
  strewn: 1,
  name: 'Test shell',
  site: { pad: { lat: 47.3, lon: 8.0 } },
  vehicle: { kind: 'projectile', mass: '0.26 kg', diameter: '75 mm', drag: 0.47 },
  launch: { speed: '58 m/s', elevation: '85 deg', azimuth: '80 deg' },
  weather: { wind: { speed: '4 m/s', from: '215 deg' } },
};

const breakup = {
  name: 'burst',
  trigger: 'apogee',
  fragments: [
    { name: 'half', count: 2, mass: '28 g', diameter: '75 mm', drag: 1.4, speed: '12 m/s' },
    { name: 'shard', count: 10, mass: '3 g', dragArea: '12 cm2', speed: '25 m/s' },
    { name: 'plug', count: 1, mass: '6 g', referenceArea: '1 cm2', drag: 0.9, radius: '8 mm' },
  ],
};

function issues(json: unknown): string[] {
  try {
    parseScenario(json);
    return [];
  } catch (error) {
    if (error instanceof ScenarioError) return error.issues.map((i) => `${i.path}: ${i.message}`);
    throw error;
  }
}

describe('scenario breakup (fragments)', () => {
  it('reads each class into SI with its drag area, reference area and casualty radius', () => {
    const sc = parseScenario({ ...base, breakup, failures: [{ name: 'low', probability: 0.01, effect: 'early', stage: 'burst', time: '800 ms' }] }).scenario;
    const [half, shard, plug] = sc.breakup!.fragments;
    const a = (Math.PI * 0.075 * 0.075) / 4;
    expect(half).toEqual({ name: 'half', count: 2, mass: expect.closeTo(0.028, 12), referenceArea: expect.closeTo(a, 12), drag: 1.4, dragArea: expect.closeTo(1.4 * a, 12), speed: 12, radius: expect.closeTo(0.0375, 12) });
    expect(shard.drag).toBe(1);
    expect(shard.dragArea).toBeCloseTo(0.0012, 12);
    expect(shard.referenceArea).toBeCloseTo(0.0012, 12);
    expect(shard.radius).toBeCloseTo(Math.sqrt(0.0012 / Math.PI), 12);
    expect(plug.dragArea).toBeCloseTo(0.9e-4, 12);
    expect(plug.radius).toBeCloseTo(0.008, 12);
    expect(plug.speed).toBe(0);
    expect(sc.breakup!.delay).toBe(0);
    expect(sc.failures[0]).toEqual({ name: 'low', probability: 0.01, effect: 'early', stage: 'burst', time: expect.closeTo(0.8, 12) });
  });

  it('a scenario without a breakup keeps no breakup member (its hash is unchanged)', () => {
    expect('breakup' in parseScenario(base).scenario).toBe(false);
  });

  it.each([
    ['both a diameter and a drag area', { fragments: [{ name: 'x', count: 1, mass: '1 g', diameter: '1 cm', drag: 1, dragArea: '1 cm2' }] }, 'breakup.fragments[0].dragArea'],
    ['a drag coefficient beside a drag area', { fragments: [{ name: 'x', count: 1, mass: '1 g', dragArea: '1 cm2', drag: 1 }] }, 'breakup.fragments[0].drag'],
    ['a diameter without drag', { fragments: [{ name: 'x', count: 1, mass: '1 g', diameter: '1 cm' }] }, 'breakup.fragments[0].drag'],
    ['no size at all', { fragments: [{ name: 'x', count: 1, mass: '1 g' }] }, 'breakup.fragments[0].diameter'],
    ['a count that is not a whole number', { fragments: [{ name: 'x', count: 2.5, mass: '1 g', dragArea: '1 cm2' }] }, 'breakup.fragments[0].count'],
    ['the reserved part name whole', { fragments: [{ name: 'whole', count: 1, mass: '1 g', dragArea: '1 cm2' }] }, 'breakup.fragments[0].name'],
    ['trigger time without a time', { trigger: 'time' }, 'breakup.time'],
    ['a time with trigger apogee', { time: '3 s' }, 'breakup.time'],
  ])('refuses %s, naming the field', (_what, change, path) => {
    const found = issues({ ...base, breakup: { ...breakup, ...change } });
    expect(found.some((m) => m.startsWith(`${path}:`)), found.join('\n')).toBe(true);
  });

  it("effect 'early' names the breakup and gives a time; 'skip' may name the breakup of a projectile", () => {
    expect(issues({ ...base, breakup, failures: [{ name: 'dud', probability: 0.03, stage: 'burst' }] })).toEqual([]);
    expect(issues({ ...base, breakup, failures: [{ name: 'low', probability: 0.01, effect: 'early', stage: 'burst' }] })).toEqual([expect.stringMatching(/^failures\[0\]\.time: missing/)]);
    expect(issues({ ...base, failures: [{ name: 'low', probability: 0.01, effect: 'early', stage: 'burst', time: '1 s' }] }).join('\n')).toMatch(/failures\[0\]\.stage/);
    expect(issues({ ...base, breakup, failures: [{ name: 'dud', probability: 0.03, stage: 'burst', time: '1 s' }] })).toEqual([expect.stringMatching(/^failures\[0\]\.time: is used only with effect 'early'/)]);
  });
});
