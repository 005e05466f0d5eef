import { describe, expect, it } from 'vitest';
import jstatModule from 'jstat';
import { clopperPearsonUpper, weightedUpperBound } from '../../src/analysis/clopperPearson.js';
import { inverseRegularizedBeta, lnGamma, regularizedBeta } from '../../src/analysis/betaFunction.js';

// Reference implementation: jstat's regularised incomplete beta and its inverse (npm jstat).
const jStat = (jstatModule as unknown as { jStat?: typeof jstatModule }).jStat ?? jstatModule;
const jbeta = (jStat as unknown as { beta: { inv(p: number, a: number, b: number): number } }).beta;
const jibeta = (jStat as unknown as { ibeta(x: number, a: number, b: number): number }).ibeta;
const jgammaln = (jStat as unknown as { gammaln(x: number): number }).gammaln;

describe('Clopper–Pearson one-sided 95 % upper bound (Clopper & Pearson 1934, Biometrika 26:404)', () => {
  it('rule of three: n = 1000, 0 hits → 1 − 0.05^(1/1000) = 0.002991 (Hanley & Lippman-Hand 1983, JAMA 249:1743)', () => {
    expect(clopperPearsonUpper(0, 1000)).toBeCloseTo(0.002991, 6);
    expect(clopperPearsonUpper(0, 1000)).toBeCloseTo(1 - Math.pow(0.05, 1 / 1000), 14);
    // ≈ 3/n, the rule of three.
    expect(clopperPearsonUpper(0, 1000) * 1000).toBeCloseTo(3, 0);
  });

  const table: [number, number][] = [
    [1, 10], [3, 10], [9, 10], [1, 100], [5, 200], [17, 300], [50, 100], [2, 2000],
    [10, 1000], [99, 10000], [250, 100000], [1, 1_000_000], [500, 1_000_000],
  ];
  for (const [k, n] of table) {
    it(`k = ${k}, n = ${n} matches the Beta(k + 1, n − k) 0.95 quantile from jstat's beta.inv`, () => {
      const reference = jbeta.inv(0.95, k + 1, n - k);
      expect(Math.abs(clopperPearsonUpper(k, n) / reference - 1)).toBeLessThan(1e-7);
    });
  }

  it('every hit gives bound 1; bounds grow with hits and shrink with trials (definition of the bound)', () => {
    expect(clopperPearsonUpper(20, 20)).toBe(1);
    expect(clopperPearsonUpper(3, 100)).toBeGreaterThan(clopperPearsonUpper(2, 100));
    expect(clopperPearsonUpper(3, 1000)).toBeLessThan(clopperPearsonUpper(3, 100));
  });

  it('weighted samples use the effective sample size: equal weights reproduce the plain bound', () => {
    expect(weightedUpperBound(5 / 200, 200)).toBeCloseTo(jbeta.inv(0.95, 6, 195), 9);
    expect(weightedUpperBound(0, 1000)).toBeCloseTo(0.002991, 6);
  });
});

describe('regularised incomplete beta', () => {
  // jstat's ibeta agrees to about 1e-7 (its own error, seen at symmetric points where the exact
  // value is 0.5), so it is compared at that tolerance; the closed forms below are checked tightly.
  const cases: [number, number, number][] = [
    [0.3, 2, 5], [0.5, 0.5, 0.5], [0.01, 1, 1000], [0.9, 30, 3], [0.002, 3, 998], [0.5, 5000, 5000],
  ];
  for (const [x, a, b] of cases) {
    it(`I_${x}(${a}, ${b}) against jstat's ibeta, and the inverse returns x`, () => {
      expect(Math.abs(regularizedBeta(x, a, b) - jibeta(x, a, b))).toBeLessThan(1e-7);
      expect(inverseRegularizedBeta(regularizedBeta(x, a, b), a, b)).toBeCloseTo(x, 9);
    });
  }

  it('integer a, b: I_x(a, b) = P(Binomial(a + b − 1, x) ≥ a) (A&S 26.5.24, closed form)', () => {
    const binomialTail = (n: number, k: number, x: number) => {
      let total = 0;
      for (let j = k; j <= n; j++) total += Math.exp(lnChoose(n, j) + j * Math.log(x) + (n - j) * Math.log1p(-x));
      return total;
    };
    const lnChoose = (n: number, k: number) => lnFactorial(n) - lnFactorial(k) - lnFactorial(n - k);
    const lnFactorial = (n: number) => {
      let s = 0;
      for (let i = 2; i <= n; i++) s += Math.log(i);
      return s;
    };
    for (const [x, a, b] of [[0.9, 30, 3], [0.002, 3, 998], [0.3, 2, 5], [0.05, 7, 200]]) {
      expect(regularizedBeta(x, a, b)).toBeCloseTo(binomialTail(a + b - 1, a, x), 12);
    }
  });

  it('symmetry and one-parameter closed forms: I_0.5(a, a) = 1/2, I_x(1, b) = 1 − (1 − x)^b, I_x(a, 1) = x^a', () => {
    for (const a of [0.5, 3, 5000]) expect(regularizedBeta(0.5, a, a)).toBeCloseTo(0.5, 11);
    expect(regularizedBeta(0.01, 1, 1000)).toBeCloseTo(1 - Math.pow(0.99, 1000), 13);
    expect(regularizedBeta(0.7, 4.5, 1)).toBeCloseTo(Math.pow(0.7, 4.5), 13);
  });

  it('ln Γ against jstat gammaln and Γ(5) = 4! = 24', () => {
    for (const x of [0.1, 0.5, 1, 2.5, 7, 14.9, 15, 100, 1e6]) {
      expect(Math.abs(lnGamma(x) - jgammaln(x))).toBeLessThan(1e-9 * Math.max(1, Math.abs(jgammaln(x))));
    }
    expect(Math.exp(lnGamma(5))).toBeCloseTo(24, 10);
    // Γ(1/2) = √π (closed form).
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
  });
});
