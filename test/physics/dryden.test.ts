import { describe, expect, it } from 'vitest';
import { drydenAt, gaussMarkovSeries, sigmaWFromGust } from '../../src/physics/dryden.js';
import { GustField } from '../../src/physics/gust-field.js';
import { SampleStream } from '../../src/dispersion/random.js';

const FT = 0.3048;

function stats(x: Float64Array, lag: number) {
  let mean = 0;
  for (const v of x) mean += v;
  mean /= x.length;
  let c0 = 0, c1 = 0;
  for (let i = 0; i < x.length; i++) c0 += (x[i] - mean) ** 2;
  for (let i = 0; i + lag < x.length; i++) c1 += (x[i] - mean) * (x[i + lag] - mean);
  return { sd: Math.sqrt(c0 / x.length), rho: c1 / c0 };
}

describe('Dryden turbulence (MIL-F-8785C, 1980; MIL-HDBK-1797)', () => {
  it('low-altitude scale lengths and intensity ratio at 100 ft', () => {
    const p = drydenAt(100 * FT);
    const base = 0.177 + 0.000823 * 100;
    expect(p.lengthU / FT).toBeCloseTo(100 / base ** 1.2, 6);
    expect(p.lengthW / FT).toBeCloseTo(100, 6);
    expect(p.sigmaRatioU).toBeCloseTo(1 / base ** 0.4, 9);
  });

  it('at 1000 ft the low-altitude forms meet: L_u = L_w = 1000 ft and σ_u = σ_w', () => {
    const p = drydenAt(1000 * FT);
    expect(p.lengthU / FT).toBeCloseTo(1000, 6);
    expect(p.lengthW / FT).toBeCloseTo(1000, 6);
    expect(p.sigmaRatioU).toBeCloseTo(1, 9);
  });

  it('a long generated series has the specified σ and correlation time L/V within 5 %', () => {
    const stream = new SampleStream();
    stream.select('dryden-series', 0);
    const sigma = 1.5, L = 200, V = 50, dt = 0.1; // correlation time 4 s
    const x = gaussMarkovSeries(() => stream.normal(), sigma, L / V, dt, new Float64Array(2_000_000));
    const lag = Math.round(L / V / dt);
    const s = stats(x, lag);
    expect(Math.abs(s.sd / sigma - 1)).toBeLessThan(0.05);
    // Autocorrelation of a first-order process at one correlation time is 1/e.
    const tauEstimate = (-lag * dt) / Math.log(s.rho);
    expect(Math.abs(tauEstimate / (L / V) - 1)).toBeLessThan(0.05);
  });

  it('the gust field in altitude has the Dryden σ_u and scale length above 2000 ft', () => {
    const field = new GustField(20_000);
    const stream = new SampleStream();
    const sigmaW = 1.2;
    const L = 1750 * FT; // isotropic scale length above 2000 ft (from memory, MIL-F-8785C)
    const base = Math.ceil(700 / GustField.STEP) * GustField.STEP;
    const n = Math.floor((20_000 - base) / GustField.STEP) - 2;
    const lag = Math.round(L / GustField.STEP);
    let sumSq = 0, sumLag = 0, count = 0;
    const out = new Float64Array(3);
    const series = new Float64Array(n);
    for (let sample = 0; sample < 40; sample++) {
      stream.select('gust-field', sample);
      field.reset(sigmaW, () => stream.normal());
      for (let i = 0; i < n; i++) {
        out.fill(0);
        field.addAt(base + i * GustField.STEP, out);
        series[i] = out[0];
      }
      for (let i = 0; i < n; i++) sumSq += series[i] ** 2;
      for (let i = 0; i + lag < n; i++) sumLag += series[i] * series[i + lag];
      count += n;
    }
    const sd = Math.sqrt(sumSq / count);
    expect(Math.abs(sd / sigmaW - 1)).toBeLessThan(0.05);
    const rho = sumLag / sumSq;
    expect(Math.abs(-lag * GustField.STEP / Math.log(rho) / L - 1)).toBeLessThan(0.1);
  });

  it('near the ground the gust field has σ_u = σ_w / (0.177 + 0.000823 h)^0.4', () => {
    const field = new GustField(1000);
    const stream = new SampleStream();
    const h = 100 * FT;
    const out = new Float64Array(3);
    let su = 0, sw = 0;
    const n = 6000;
    for (let s = 0; s < n; s++) {
      stream.select('gust-near-ground', s);
      field.reset(1, () => stream.normal());
      out.fill(0);
      field.addAt(Math.round(h / GustField.STEP) * GustField.STEP, out);
      su += out[0] ** 2;
      sw += out[2] ** 2;
    }
    const expected = 1 / (0.177 + 0.000823 * (Math.round(h / GustField.STEP) * GustField.STEP) / FT) ** 0.4;
    expect(Math.abs(Math.sqrt(su / n) / expected - 1)).toBeLessThan(0.05);
    expect(Math.abs(Math.sqrt(sw / n) - 1)).toBeLessThan(0.05);
  });

  it('a peak gust of mean + 3σ sets σ_u at the reference height (common practice, no source)', () => {
    const sigmaW = sigmaWFromGust(9, 6, 10);
    expect(sigmaW * drydenAt(10).sigmaRatioU).toBeCloseTo(1, 12);
  });
});
