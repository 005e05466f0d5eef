import { describe, expect, it } from 'vitest';
import { assessRisk } from '../../src/risk/index.js';
import { riskAt } from '../../src/risk/individual.js';
import { riskSettings } from '../../src/risk/settings.js';
import { casualtyArea } from '../../src/risk/casualty-area.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import type { LandingSet } from '../../src/analysis/types.js';
import type { Area, PolygonGeometry, Site } from '../../src/scenario/types.js';
import { drawNormal2, makeRandom } from '../analysis/sampling.js';

const PAD = { lat: 46.2, lon: 6.1, elevation: 400 };
const frame = createLocalFrame(PAD);

function box(e0: number, n0: number, e1: number, n1: number): PolygonGeometry {
  const ring = [[e0, n0], [e1, n0], [e1, n1], [e0, n1], [e0, n0]].map(([e, n]) => frame.toLonLat(e, n));
  return { type: 'Polygon', coordinates: [ring] };
}

/** Landings of one mode, every one vertical at 100 J (over the 15 J threshold: P = 1). */
function landings(east: Float64Array, north: Float64Array): LandingSet {
  const n = east.length;
  return {
    east,
    north,
    weight: new Float64Array(n).fill(1 / n),
    mode: new Uint8Array(n),
    modeNames: ['nominal'],
    modeProbability: [1],
    impactEnergy: new Float64Array(n).fill(100),
    impactAngle: new Float64Array(n).fill(90),
  };
}

// A rocket of 0.1 m diameter: R_o = 0.05 m; vertical casualty area π(0.35)².
const settings = riskSettings({ vehicle: { kind: 'rocket', mass: 1, referenceArea: (Math.PI * 0.1 * 0.1) / 4, drag: { mach: [0], cd: [0.5] } } });
const AC = casualtyArea(0.3, 0.05, 1.8, 90);

describe('impacts spread uniformly over a disc of area S (closed form: IR = A_c P / S inside, E = N A_c P / S)', () => {
  const R = 500;
  const n = 40_000;
  const random = makeRandom('disc');
  const east = new Float64Array(n);
  const north = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    // Uniform in the disc: radius √u R (area-uniform), angle uniform.
    const r = Math.sqrt(random()) * R;
    const a = 2 * Math.PI * random();
    east[i] = r * Math.sin(a);
    north[i] = r * Math.cos(a);
  }
  const S = Math.PI * R * R;
  const people = 300;
  const areas: Area[] = [{ name: 'crowd', kind: 'spectators', people, geometry: box(-100, -100, 100, 100) }];
  const site: Site = { pad: PAD, areas };
  const risk = assessRisk(landings(east, north), site, settings);

  it('object radius defaults to half the reference diameter', () => {
    expect(settings.objectRadius).toBeCloseTo(0.05, 12);
  });

  it('individual risk well inside the disc is A_c P / S within 5 %', () => {
    const pts = [[0, 0], [150, -80], [-200, 120], [60, 250]];
    const ir = riskAt(risk.surface, Float64Array.from(pts.map((p) => p[0])), Float64Array.from(pts.map((p) => p[1])));
    for (const v of ir) expect(v / (AC / S)).toBeCloseTo(1, 1);
  });

  it('expected casualties of a fully covered area: N A_c P / S within 3 binomial sd', () => {
    const a = risk.areas[0];
    const expected = (people * AC) / S;
    // Hits in a 200 m square: binomial with p = 40 000 m² / S.
    const p = 40_000 / S;
    const sd = expected * Math.sqrt((1 - p) / (n * p));
    expect(Math.abs(a.expectedCasualties! - expected)).toBeLessThan(3 * sd);
    expect(a.upper95!).toBeGreaterThan(a.expectedCasualties!);
    expect(risk.total.expectedCasualties).toBeCloseTo(a.expectedCasualties!, 15);
  });

  it('an area no sample hit keeps an upper bound above zero (rule of three × most harmful landing)', () => {
    const far: Area[] = [{ name: 'far', kind: 'road', people: 10, geometry: box(5000, 5000, 5100, 5100) }];
    const r = assessRisk(landings(east, north), { pad: PAD, areas: far }, settings);
    expect(r.areas[0].expectedCasualties).toBe(0);
    const rho = 10 / 10_000;
    expect(r.areas[0].upper95!).toBeCloseTo((1 - Math.pow(0.05, 1 / n)) * rho * AC, 12);
  });
});

describe('bivariate-normal impacts (closed form: peak A_c P / (2π σx σy), area inside r-line 2π σx σy ln(A_c P / (2π σx σy r)))', () => {
  const n = 100_000;
  const sx = 60;
  const sy = 30;
  const east = new Float64Array(n);
  const north = new Float64Array(n);
  drawNormal2(makeRandom('normal'), { sigmaMajor: sx, sigmaMinor: sy, azimuthDeg: 90 }, east, north);
  const peak = AC / (2 * Math.PI * sx * sy);
  const levels = [peak / 3, peak / 30, peak / 300];
  const risk = assessRisk(landings(east, north), { pad: PAD, areas: [] }, { ...settings, levels });
  const h = risk.surface!.bandwidth;

  it('peak individual risk within 5 % (the kernel widens σ² by h², about 2 % at this n)', () => {
    let max = 0;
    for (const v of risk.surface!.grid.values) max = Math.max(max, v);
    expect(max / peak).toBeGreaterThan(0.95);
    expect(max / peak).toBeLessThan(1.03);
    // With the widened σ the closed form holds to sampling error.
    const widened = AC / (2 * Math.PI * Math.hypot(sx, h.east) * Math.hypot(sy, h.north));
    expect(max / widened).toBeCloseTo(1, 1);
  });

  it('area inside each r-line within 6 % of 2π σx σy ln(peak / r)', () => {
    risk.lines.forEach((line) => {
      const closed = 2 * Math.PI * sx * sy * Math.log(peak / line.level);
      expect(line.area_m2 / closed).toBeGreaterThan(0.94);
      expect(line.area_m2 / closed).toBeLessThan(1.06);
    });
  });
});
