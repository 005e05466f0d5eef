import { describe, expect, it } from 'vitest';
import { analyze } from '../../src/analysis/index.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { createPolygonIndex, countInside } from '../../src/analysis/pointInPolygon.js';
import { polygonsToEastNorth } from '../../src/analysis/projectGeometry.js';
import { makeRun, makeSite, mixtureSet, PAD } from './fixtures.js';
import { drawNormal2, makeRandom, normal2Density, type Normal2 } from './sampling.js';

// Reference: the p-region of a bivariate normal is the ellipse with Mahalanobis radius² χ²₂(p) =
// −2 ln(1 − p) (chi-square with 2 degrees of freedom, closed form); its area is π σ1 σ2 χ²₂(p).
const chi2 = (p: number) => -2 * Math.log(1 - p);

describe('highest-density regions of a rotated bivariate normal (50,000 samples, 40 m × 90 m, 30°)', () => {
  const shape: Normal2 = { sigmaMajor: 90, sigmaMinor: 40, azimuthDeg: 30 };
  const set = mixtureSet('bivariate-normal', [{ name: 'nominal', probability: 1, samples: 50_000, shape }]);
  const result = analyze(set, makeSite(), makeRun());
  const frame = createLocalFrame(PAD);
  const freshEast = new Float64Array(200_000);
  const freshNorth = new Float64Array(200_000);
  drawNormal2(makeRandom('independent fresh sample'), shape, freshEast, freshNorth);

  for (const feature of result.contours.features) {
    const p = feature.properties.level;
    it(`level ${p}: area within 3 % of π σx σy χ²₂(p) (chi-square 2 dof, closed form)`, () => {
      const expected = Math.PI * 40 * 90 * chi2(p);
      expect(Math.abs(feature.properties.area_m2 / expected - 1)).toBeLessThan(0.03);
    });
    it(`level ${p}: an independent sample falls inside with frequency within 1 % of p (chi-square 2 dof)`, () => {
      const index = createPolygonIndex(polygonsToEastNorth(frame, feature.geometry));
      const coverage = countInside(index, freshEast, freshNorth).hits / freshEast.length;
      expect(Math.abs(coverage - p)).toBeLessThan(0.01);
    });
    it(`level ${p}: farthest point near the ellipse's major semi-axis sqrt(χ²₂(p)) σ_major (closed form)`, () => {
      // Ellipse centred on the pad: the farthest point is the end of the major axis.
      const expected = Math.sqrt(chi2(p)) * 90;
      expect(Math.abs(feature.properties.maxDistance_m / expected - 1)).toBeLessThan(0.05);
    });
  }

  it('reports the bandwidth rule, the grid used and the stage timings', () => {
    expect(result.bandwidth.rule).toMatch(/Scott \(1992\)/);
    // Scott (1992): h = σ n^(−1/6); per-axis σ of the rotated normal: σ_e² = 90² sin²30° + 40² cos²30°.
    const sigmaEast = Math.sqrt(90 ** 2 * 0.25 + 40 ** 2 * 0.75);
    expect(result.bandwidth.east / (sigmaEast * Math.pow(50_000, -1 / 6))).toBeCloseTo(1, 1);
    expect(result.grid.nx).toBeGreaterThan(16);
    expect(result.grid.nx).toBeLessThanOrEqual(512);
    expect(result.timing_ms.total).toBeGreaterThan(0);
  });
});

describe('two-mode mixture with over-sampled rare mode weighted back', () => {
  // 98 % mode (nominal) and 2 % mode (a failure landing farther out and wider), drawn 40,000 and
  // 10,000 times: the rare mode is over-sampled tenfold and weighted back.
  const main: Normal2 = { sigmaMajor: 90, sigmaMinor: 40, azimuthDeg: 30, meanEast: 50, meanNorth: 120 };
  const rare: Normal2 = { sigmaMajor: 160, sigmaMinor: 120, azimuthDeg: 80, meanEast: 520, meanNorth: 650 };
  const set = mixtureSet('two-mode mixture', [
    { name: 'nominal', probability: 0.98, samples: 40_000, shape: main, parachute: true },
    { name: 'no parachute', probability: 0.02, samples: 10_000, shape: rare },
  ]);
  const result = analyze(set, makeSite(), makeRun({ levels: [0.5, 0.9, 0.99] }));
  const frame = createLocalFrame(PAD);
  const mixtureDensity = (e: number, n: number) => 0.98 * normal2Density(main, e, n) + 0.02 * normal2Density(rare, e, n);

  for (const feature of result.contours.features) {
    const p = feature.properties.level;
    it(`level ${p}: the known mixture density integrates to p ± 1 % over the region`, () => {
      // Midpoint rule on a 1 m lattice over the region's bounding box (the density is known in
      // closed form; the mixture weights are the stated mode probabilities).
      const polygons = polygonsToEastNorth(frame, feature.geometry);
      const index = createPolygonIndex(polygons);
      let minE = Infinity, maxE = -Infinity, minN = Infinity, maxN = -Infinity;
      for (const rings of polygons) for (const [e, n] of rings[0]) {
        minE = Math.min(minE, e); maxE = Math.max(maxE, e); minN = Math.min(minN, n); maxN = Math.max(maxN, n);
      }
      const step = Math.max(1, Math.sqrt(((maxE - minE) * (maxN - minN)) / 2e6));
      let mass = 0;
      for (let e = minE + step / 2; e < maxE; e += step) {
        for (let n = minN + step / 2; n < maxN; n += step) {
          if (index.contains(e, n)) mass += mixtureDensity(e, n) * step * step;
        }
      }
      expect(Math.abs(mass - p)).toBeLessThan(0.01);
    });
  }

  it('the rare mode shows up in the 0.99 region but not in the 0.5 region', () => {
    const index50 = createPolygonIndex(polygonsToEastNorth(frame, result.contours.features[0].geometry));
    const index99 = createPolygonIndex(polygonsToEastNorth(frame, result.contours.features[2].geometry));
    expect(index50.contains(520, 650)).toBe(false);
    expect(index99.contains(520, 650)).toBe(true);
  });

  it('uses the effective sample size (Σw)²/Σw² (Kish 1965) for the bandwidth', () => {
    const expected = 1 / (0.98 ** 2 / 40_000 + 0.02 ** 2 / 10_000);
    expect(result.effectiveSamples).toBeCloseTo(expected, 6);
    expect(result.bandwidth.effectiveN).toBeCloseTo(expected, 6);
  });
});
