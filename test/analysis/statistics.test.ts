import { describe, expect, it } from 'vitest';
import { chiSquare2, levelEllipses, modeEllipses } from '../../src/analysis/ellipse.js';
import { effectiveSampleSize, weightedQuantile } from '../../src/analysis/weightedStats.js';
import { scottBandwidth } from '../../src/analysis/bandwidth.js';
import { mixtureSet } from './fixtures.js';
import { makeRandom } from './sampling.js';

describe('chi-square with 2 degrees of freedom (closed form −2 ln(1 − p))', () => {
  it('0.5 → 1.3863, 0.9 → 4.6052, 0.99 → 9.2103', () => {
    expect(chiSquare2(0.5)).toBeCloseTo(1.3863, 4);
    expect(chiSquare2(0.9)).toBeCloseTo(4.6052, 4);
    expect(chiSquare2(0.99)).toBeCloseTo(9.2103, 4);
  });
});

describe('dispersion ellipses', () => {
  it('recover σ 90 × 40 m at azimuth 30° from 40,000 samples: semi-axes sqrt(χ²₂(p)) σ (closed form)', () => {
    const set = mixtureSet('ellipse', [
      { name: 'nominal', probability: 0.97, samples: 40_000, shape: { sigmaMajor: 90, sigmaMinor: 40, azimuthDeg: 30, meanEast: 15, meanNorth: -40 } },
      { name: 'other', probability: 0.03, samples: 500, shape: { sigmaMajor: 10, sigmaMinor: 10, azimuthDeg: 0, meanEast: 900 } },
    ]);
    const [nominal, other] = modeEllipses(set, [0.5, 0.9]);
    expect(nominal.samples).toBe(40_000);
    expect(nominal.meanEast_m).toBeCloseTo(15, 0);
    expect(nominal.meanNorth_m).toBeCloseTo(-40, 0);
    const e90 = nominal.ellipses[1];
    expect(Math.abs(e90.semiMajor_m / (Math.sqrt(chiSquare2(0.9)) * 90) - 1)).toBeLessThan(0.02);
    expect(Math.abs(e90.semiMinor_m / (Math.sqrt(chiSquare2(0.9)) * 40) - 1)).toBeLessThan(0.02);
    expect(Math.abs(e90.azimuth_deg - 30)).toBeLessThan(1);
    expect(other.meanEast_m).toBeCloseTo(900, -1);
  });

  it('axis-aligned covariances give azimuth 0° (north-south) or 90° (east-west)', () => {
    expect(levelEllipses(1, 4, 0, [0.5])[0].azimuth_deg).toBeCloseTo(0, 12);
    expect(levelEllipses(4, 1, 0, [0.5])[0].azimuth_deg).toBeCloseTo(90, 12);
    // Equal variances with positive covariance: major axis along north-east (45°).
    expect(levelEllipses(2, 2, 1, [0.5])[0].azimuth_deg).toBeCloseTo(45, 12);
  });
});

describe('weighted statistics', () => {
  it("Kish's effective sample size (Σw)²/Σw² (Kish 1965, Survey Sampling)", () => {
    expect(effectiveSampleSize(new Float64Array([1, 1, 1, 1]))).toBe(4);
    expect(effectiveSampleSize(new Float64Array([3, 1]))).toBeCloseTo(16 / 10, 14);
  });

  it('weighted quantile: smallest value whose cumulative weight reaches q (definition), at scale', () => {
    // 1..n with equal weights: the q-quantile is ceil(q n).
    const n = 100_003;
    const values = Float64Array.from({ length: n }, (_, i) => n - i); // descending, to defeat order luck
    const weights = new Float64Array(n).fill(1);
    for (const q of [0.001, 0.25, 0.5, 0.75, 0.999]) {
      expect(weightedQuantile(values, weights, q)).toBe(Math.ceil(q * n));
    }
    // Weighted: value 10 carries 90 % of the weight.
    expect(weightedQuantile(new Float64Array([1, 10, 20]), new Float64Array([0.05, 0.9, 0.05]), 0.5)).toBe(10);
    expect(weightedQuantile(new Float64Array([1, 10, 20]), new Float64Array([0.05, 0.9, 0.05]), 0.97)).toBe(20);
    // Ties and clustered values.
    const tied = new Float64Array(10_000).fill(7);
    tied[0] = -1e9;
    expect(weightedQuantile(tied, new Float64Array(10_000).fill(1), 0.5)).toBe(7);
  });

  it('of a subset of indices: the quantile of those entries alone (definition: smallest v whose weight at or below reaches q; common practice, no source)', () => {
    // Every third entry of 1..30 000 (values 3, 6, …, 30 000, equal weights) sits among entries of
    // huge weight that must not count: the median of the subset is 15 000.
    const n = 30_000;
    const values = Float64Array.from({ length: n }, (_, i) => i + 1);
    const weights = Float64Array.from({ length: n }, (_, i) => ((i + 1) % 3 === 0 ? 1 : 1e6));
    const subset = Uint32Array.from({ length: n / 3 }, (_, k) => 3 * k + 2);
    expect(weightedQuantile(values, weights, 0.5, subset)).toBe(15_000);
    expect(weightedQuantile(values, weights, 0.1, subset)).toBe(3_000);
    // The same number as gathering the subset's values and weights first, ties and weights included.
    const random = makeRandom('quantile-subset');
    const v = Float64Array.from({ length: 50_000 }, () => Math.round(random() * 400) / 4);
    const w = Float64Array.from({ length: 50_000 }, () => random());
    const pick = Uint32Array.from({ length: 50_000 }, (_, i) => i).filter((i) => v[i] > 20 && i % 7 !== 0);
    const gathered = [Float64Array.from(pick, (i) => v[i]), Float64Array.from(pick, (i) => w[i])] as const;
    for (const q of [0.01, 0.5, 0.95, 1]) expect(weightedQuantile(v, w, q, pick)).toBe(weightedQuantile(gathered[0], gathered[1], q));
    expect(weightedQuantile(v, w, 0.5, new Uint32Array(0))).toBeNaN();
  });
});

describe('bandwidth', () => {
  it('equal-weight normal sample: h = σ n^(−1/6) per axis (Scott 1992)', () => {
    const random = makeRandom('bandwidth');
    const n = 20_000;
    const e = new Float64Array(n);
    const nn = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const u = Math.sqrt(-2 * Math.log(1 - random()));
      const v = 2 * Math.PI * random();
      e[i] = 30 * u * Math.cos(v);
      nn[i] = 70 * u * Math.sin(v);
    }
    const h = scottBandwidth(e, nn, new Float64Array(n).fill(1));
    expect(h.east / (30 * Math.pow(n, -1 / 6))).toBeCloseTo(1, 1);
    expect(h.north / (70 * Math.pow(n, -1 / 6))).toBeCloseTo(1, 1);
  });

  it('a far rare cloud does not widen the kernel: robust scale IQR/1.34 (Silverman 1986)', () => {
    const set = mixtureSet('robust', [
      { name: 'a', probability: 0.9, samples: 9000, shape: { sigmaMajor: 20, sigmaMinor: 20, azimuthDeg: 0 } },
      { name: 'b', probability: 0.1, samples: 1000, shape: { sigmaMajor: 20, sigmaMinor: 20, azimuthDeg: 0, meanEast: 5000 } },
    ]);
    const h = scottBandwidth(set.east, set.north, set.weight);
    // σ_east is about 1500 m here; the IQR of the main cloud keeps h near 20 m × n^(−1/6).
    expect(h.east).toBeLessThan(2 * 20 * Math.pow(h.effectiveN, -1 / 6) * 1.5);
  });

  it('identical landings use the floor bandwidth and say so; an override is used as given', () => {
    const same = new Float64Array(100).fill(3);
    const h = scottBandwidth(same, same, new Float64Array(100).fill(1));
    expect(h.floored).toBe(true);
    expect(h.east).toBe(0.5);
    const fixed = scottBandwidth(same, same, new Float64Array(100).fill(1), 12);
    expect([fixed.east, fixed.north, fixed.overridden]).toEqual([12, 12, true]);
  });
});
