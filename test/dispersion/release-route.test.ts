import { describe, expect, it } from 'vitest';
import { jStat } from 'jstat';
import { parseScenario } from '../../src/scenario/load.js';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { issuesOf } from '../scenario/helpers.js';
import { planModes } from '../../src/dispersion/modes.js';

const PAD = { lat: 47.3, lon: 8.0 };
const frame = createLocalFrame(PAD);
const lonLat = (e: number, n: number) => frame.toLonLat(e, n);

/** A drone scenario flying a route; invented values. */
function droneOnRoute(launch: Record<string, unknown>, extra: Record<string, unknown> = {}) {
  return {
    strewn: 1,
    name: 'route test',
    site: { pad: { ...PAD } },
    vehicle: { kind: 'release', mass: 1, referenceArea: 0.05, drag: 1 },
    launch: { height: 40, speed: 5, ...launch },
    weather: { wind: { speed: 0, from: 0 } },
    run: { samples: 2000, seed: 'route' },
    ...extra,
  };
}

/** Kolmogorov–Smirnov distance of a sample from the uniform distribution on [lo, hi]. */
function ksUniform(values: number[], lo: number, hi: number): number {
  const v = [...values].sort((a, b) => a - b);
  let d = 0;
  v.forEach((x, i) => {
    const f = (x - lo) / (hi - lo);
    d = Math.max(d, Math.abs(f - i / v.length), Math.abs(f - (i + 1) / v.length));
  });
  return d;
}

describe('release along a path (drone operations)', () => {
  // A straight route 600 m long toward the north-east, with an extra vertex a sixth of the way
  // along, so a route drawn per segment instead of per metre would crowd the short first leg.
  const bearing = 45;
  const b = (bearing * Math.PI) / 180;
  const along = (s: number) => lonLat(s * Math.sin(b), s * Math.cos(b));
  const path = { type: 'LineString', coordinates: [along(-300), along(-200), along(300)] };

  it('calm air: the landings are uniform along the straight path, on the line, shifted forward by the fall', () => {
    const { scenario } = parseScenario(droneOnRoute({ path }));
    const runner = new DispersionRunner(scenario);
    const run = runner.runChunk(0, 2000);
    const s: number[] = [];
    let maxCross = 0;
    for (let i = 0; i < run.count; i++) {
      expect(run.status[i]).toBe(0);
      const e = run.east[i], n = run.north[i];
      s.push(e * Math.sin(b) + n * Math.cos(b));
      maxCross = Math.max(maxCross, Math.abs(e * Math.cos(b) - n * Math.sin(b)));
    }
    // Every flight is the same fall moved along the line: the forward carry is one constant.
    const carry = Math.min(...s) + 300;
    expect(carry).toBeGreaterThan(0);
    expect(maxCross).toBeLessThan(0.05);
    // Uniform in time at constant speed = uniform in distance (closed form); KS 1 % critical value
    // 1.63/sqrt(n) (Kolmogorov's distribution, e.g. Conover, Practical Nonparametric Statistics).
    expect(ksUniform(s, -300 + carry, 300 + carry)).toBeLessThan(1.63 / Math.sqrt(s.length));
    // The heading follows the path: the carry points along +bearing.
    expect(Math.abs(Math.max(...s) - (300 + carry))).toBeLessThan(3);
  });

  it('back and forth for a longer duration: both directions are flown, the carry goes both ways', () => {
    const { scenario } = parseScenario(droneOnRoute({ path, duration: 600 }));
    const runner = new DispersionRunner(scenario);
    const run = runner.runChunk(0, 400);
    const s = Array.from(run.east, (e, i) => e * Math.sin(b) + run.north[i] * Math.cos(b));
    expect(Math.min(...s)).toBeLessThan(-300);
    expect(Math.max(...s)).toBeGreaterThan(300);
  });

  it('a failure rate λ per flight hour over T hours is the chance 1 − e^(−λT) per operation (exponential failure law)', () => {
    // λT = 1: a linear λT would say 100 %, the closed form 63.2 %.
    const json = droneOnRoute(
      { path, speed: 5, duration: '2 h', rate: '0.5 /h' },
      {
        recovery: [{ name: 'chute', trigger: 'time', time: 1, dragArea: 0.3 }],
        failures: [{ name: 'chute fails', rate: '0.5 /h', stage: 'chute' }],
      },
    );
    const { scenario } = parseScenario(json);
    expect(scenario.failures[0].probability).toBeCloseTo(1 - Math.exp(-1), 12);
    const plan = planModes(scenario.failures, 2000);
    expect(plan.probability[1]).toBeCloseTo(0.6321205588, 9);
    expect(scenario.launch.kind === 'release' && scenario.launch.rate).toBeCloseTo(0.5 / 3600, 15);
    // Two competing rate modes share 1 − e^(−(λ1+λ2)T) in proportion to their rates.
    const two = parseScenario({ ...json, failures: [{ name: 'a', rate: '0.3 /h', stage: 'chute' }, { name: 'b', rate: '0.1 /h', stage: 'chute' }] }).scenario;
    const total = 1 - Math.exp(-0.4 * 2);
    expect(two.failures[0].probability).toBeCloseTo(0.75 * total, 12);
    expect(two.failures[1].probability).toBeCloseTo(0.25 * total, 12);
  });

  it('a path without a duration is flown once: T = length / speed', () => {
    const { scenario } = parseScenario(droneOnRoute({ path, speed: 4 }));
    expect(scenario.launch.kind === 'release' && scenario.launch.duration).toBeCloseTo(600 / 4, 1);
  });

  it('bad route inputs name the field', () => {
    expect(issuesOf(droneOnRoute({ path, east: 10 }))[0].path).toBe('launch.east');
    expect(issuesOf(droneOnRoute({ path, speed: 0 }))[0].path).toBe('launch.speed');
    expect(issuesOf(droneOnRoute({ path, heading: 10 }))[0].path).toBe('launch.heading');
    expect(issuesOf(droneOnRoute({}))[0].path).toBe('launch.heading');
    expect(issuesOf(droneOnRoute({ path: { type: 'LineString', coordinates: [[8, 47]] } }))[0].path).toBe('launch.path.coordinates');
    // A rate without a unit could be per second or per hour: refused, not guessed.
    const rateIssues = issuesOf(droneOnRoute({ path, duration: 60, rate: 0.5 }));
    expect(rateIssues[0].path).toBe('launch.rate');
    expect(rateIssues[0].message).toMatch(/\/h/);
    expect(issuesOf(droneOnRoute({ path, rate: '1 /h' }))[0].path).toBe('launch.duration');
    expect(
      issuesOf(droneOnRoute({ path }, { recovery: [{ name: 'c', trigger: 'time', time: 1, dragArea: 0.3 }], failures: [{ name: 'f', rate: '1 /h', stage: 'c' }] }))[0].path,
    ).toBe('failures[0].rate');
  });
});

describe('release over an area', () => {
  it('the release points are uniform over the polygon, its hole left empty', () => {
    // An L-shaped area with a square hole; invented. Cell counts against the cell areas.
    const ring = [[0, 0], [400, 0], [400, 200], [200, 200], [200, 400], [0, 400], [0, 0]].map(([e, n]) => lonLat(e, n));
    const hole = [[50, 50], [150, 50], [150, 150], [50, 150], [50, 50]].map(([e, n]) => lonLat(e, n));
    const { scenario } = parseScenario(droneOnRoute({ area: { type: 'Polygon', coordinates: [ring, hole] }, speed: 0, height: 1 }));
    const runner = new DispersionRunner(scenario);
    const run = runner.runChunk(0, 4000);
    // 100 m cells of the L (12 cells; the four round the hole lose 50 m × 50 m each) against
    // their areas.
    const counts = new Map<string, number>();
    for (let i = 0; i < run.count; i++) {
      const e = run.east[i], n = run.north[i];
      expect(e > 50 && e < 150 && n > 50 && n < 150).toBe(false);
      const key = `${Math.floor(e / 100)},${Math.floor(n / 100)}`;
      counts.set(key, (counts.get(key) ?? 0) + 1);
    }
    let chi2 = 0;
    let cells = 0;
    for (let ci = 0; ci < 4; ci++) {
      for (let cj = 0; cj < 4; cj++) {
        if (ci >= 2 && cj >= 2) {
          expect(counts.get(`${ci},${cj}`) ?? 0).toBe(0);
          continue;
        }
        const area = ci < 2 && cj < 2 ? 7500 : 10000;
        const expected = (area / 110000) * run.count;
        chi2 += ((counts.get(`${ci},${cj}`) ?? 0) - expected) ** 2 / expected;
        cells++;
      }
    }
    // Pearson's χ² test, 1 % point with cells − 1 degrees of freedom.
    expect(chi2).toBeLessThan(jStat.chisquare.inv(0.99, cells - 1));
  });
});
