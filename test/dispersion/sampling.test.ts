import { describe, expect, it } from 'vitest';
import { spreadOffset } from '../../src/dispersion/spreads.js';
import { planModes, modeOfSample } from '../../src/dispersion/modes.js';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { SampleStream } from '../../src/dispersion/random.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { resolve } from 'node:path';

const scenarios = resolve(import.meta.dirname, '../../scenarios');

describe('spreads by inverse CDF', () => {
  it('a normal spread has the stated sd; a truncated one never leaves ±limit·sd', () => {
    const s = new SampleStream();
    s.select('spread', 0);
    const n = 200_000;
    let sum = 0, sq = 0, maxAbs = 0;
    for (let i = 0; i < n; i++) {
      const u = s.uniform();
      const x = spreadOffset({ kind: 'normal', sd: 2, relative: false }, 10, u);
      sum += x;
      sq += x * x;
      const t = spreadOffset({ kind: 'normal', sd: 2, relative: false, limit: 1.5 }, 10, u);
      maxAbs = Math.max(maxAbs, Math.abs(t));
    }
    expect(Math.abs(sum / n)).toBeLessThan(0.02);
    expect(Math.sqrt(sq / n)).toBeCloseTo(2, 1);
    expect(maxAbs).toBeLessThanOrEqual(3 + 1e-12);
    expect(maxAbs).toBeGreaterThan(2.9);
  });

  it('relative spreads scale with the nominal value; uniform spreads cover [lo, hi]', () => {
    expect(spreadOffset({ kind: 'normal', sd: 0.1, relative: true }, 50, 0.8413447460685429)).toBeCloseTo(5, 5);
    expect(spreadOffset({ kind: 'uniform', lo: -2, hi: 6, relative: false }, 1, 0.75)).toBeCloseTo(4, 12);
  });
});

describe('failure-mode plan', () => {
  it('rare modes get a minimum count; landed weights give each mode its probability', () => {
    const plan = planModes(
      [
        { name: 'main fails', probability: 0.03, effect: 'skip', stage: 'main' },
        { name: 'all fail', probability: 0.001, effect: 'skip', stage: 'all' },
      ],
      2000,
    );
    expect(Array.from(plan.counts)).toEqual([1800, 100, 100]);
    expect(plan.counts.reduce((a, b) => a + b, 0)).toBe(2000);
    for (let m = 0; m < 3; m++) expect(plan.weight[m] * plan.counts[m]).toBeCloseTo(plan.probability[m], 12);
    expect(modeOfSample(plan, 0)).toBe(0);
    expect(modeOfSample(plan, 1850)).toBe(1);
    expect(modeOfSample(plan, 1999)).toBe(2);
  });

  it('a mode with probability 0 gets no samples; probabilities summing to 1 leave no nominal', () => {
    const plan = planModes([{ name: 'a', probability: 1, effect: 'skip', stage: 'all' }], 50);
    expect(Array.from(plan.counts)).toEqual([0, 50]);
  });
});

describe('sample runner', () => {
  const club = loadScenarioFile(`${scenarios}/club-rocket.json`).scenario;

  it('a sample gives the same result whichever chunk it is flown in', () => {
    const a = new DispersionRunner(club, { samples: 120, seed: 's' }).runChunk(0, 120);
    const b = new DispersionRunner(club, { samples: 120, seed: 's' }).runChunk(70, 50);
    for (let j = 0; j < 50; j++) {
      expect(b.east[j]).toBe(a.east[70 + j]);
      expect(b.north[j]).toBe(a.north[70 + j]);
      expect(b.mode[j]).toBe(a.mode[70 + j]);
    }
  });

  it('without spreads, gusts or failures every sample is the nominal flight', () => {
    const calm = { ...club, uncertainty: {}, failures: [], weather: { ...club.weather, wind: { ...club.weather.wind, gust: undefined }, turbulence: false } };
    const c = new DispersionRunner(calm, { samples: 20, seed: 'x' }).runChunk(0, 20);
    for (let i = 1; i < 20; i++) {
      expect(c.east[i]).toBe(c.east[0]);
      expect(c.north[i]).toBe(c.north[0]);
    }
  });

  it('a sample whose state goes non-finite is counted as failed, never as a landing', () => {
    const broken = { ...club, vehicle: { ...club.vehicle, drag: { mach: [0], cd: [Number.NaN] } } };
    const r = new DispersionRunner(broken, { samples: 5, seed: 'x' }).runChunk(0, 5);
    for (let i = 0; i < 5; i++) {
      expect(r.status[i]).not.toBe(0);
      expect(Number.isNaN(r.east[i])).toBe(true);
    }
  });

  it('a flight past the time limit fails with its reason', () => {
    const r = new DispersionRunner(club, { samples: 3, seed: 'x', flight: { maxTime: 5 } }).runChunk(0, 3);
    expect(Array.from(r.status)).toEqual([2, 2, 2]);
  });
});
