import { describe, expect, it } from 'vitest';
import { Rodas, RODAS_TABLEAU } from '../../src/flight/rosenbrock.js';
import type { StiffSystem } from '../../src/flight/stepper.js';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { SampleStream } from '../../src/dispersion/random.js';
import { body, scenario } from '../helpers/build.js';

// The RODAS coefficients are checked against the order conditions of Rosenbrock methods in
// Hairer & Wanner, Solving Ordinary Differential Equations II (2nd ed., 1996), §IV.7, Table 7.1
// (with β_ij = α_ij + γ_ij, α_i = Σ_j α_ij, β'_i = Σ_{j<i} β_ij), after undoing the transformed
// variables of their (7.25): Γ⁻¹ = diag(1/γ) − C, α = A Γ, bᵀ = mᵀ Γ.

type Matrix = number[][];

function untransformed() {
  const { gamma, a, c, m, e } = RODAS_TABLEAU;
  const s = m.length;
  const gi: Matrix = a.map((_, i) => a.map((_, j) => (i === j ? 1 / gamma : 0) - c[i][j]));
  // Γ = (Γ⁻¹)⁻¹, lower triangular.
  const G: Matrix = a.map(() => new Array(s).fill(0));
  for (let j = 0; j < s; j++) {
    for (let i = 0; i < s; i++) {
      let v = i === j ? 1 : 0;
      for (let k = 0; k < i; k++) v -= gi[i][k] * G[k][j];
      G[i][j] = v / gi[i][i];
    }
  }
  const alpha: Matrix = a.map((row) => G[0].map((_, j) => row.reduce((acc, v, k) => acc + v * G[k][j], 0)));
  const b = G[0].map((_, j) => m.reduce((acc, mi, i) => acc + mi * G[i][j], 0));
  const bHat = G[0].map((_, j) => m.reduce((acc, mi, i) => acc + (mi - e[i]) * G[i][j], 0));
  const beta: Matrix = alpha.map((row, i) => row.map((v, j) => (j < i ? v + G[i][j] : 0)));
  return { gamma, alpha, beta, b, bHat, G };
}

/** Residuals of the eight conditions up to order 4 (Table 7.1) for weights w. */
function residuals(w: number[]): number[] {
  const { gamma: g, alpha, beta } = untransformed();
  const ai = alpha.map((r) => r.reduce((x, v) => x + v, 0));
  const bi = beta.map((r) => r.reduce((x, v) => x + v, 0));
  const sum = (f: (i: number) => number) => w.reduce((acc, wi, i) => acc + wi * f(i), 0);
  const bb = (i: number) => beta[i].reduce((acc, v, j) => acc + v * bi[j], 0);
  return [
    sum(() => 1) - 1,
    sum((i) => bi[i]) - (0.5 - g),
    sum((i) => ai[i] ** 2) - 1 / 3,
    sum(bb) - (1 / 6 - g + g * g),
    sum((i) => ai[i] ** 3) - 1 / 4,
    sum((i) => ai[i] * alpha[i].reduce((acc, v, j) => acc + v * bi[j], 0)) - (1 / 8 - g / 3),
    sum((i) => beta[i].reduce((acc, v, j) => acc + v * ai[j] ** 2, 0)) - (1 / 12 - g / 3),
    sum((i) => beta[i].reduce((acc, v, j) => acc + v * bb(j), 0)) - (1 / 24 - g / 2 + 1.5 * g * g - g ** 3),
  ];
}

describe('RODAS coefficients (Hairer & Wanner II, §IV.7)', () => {
  it('satisfy every order condition up to order 4; the embedded method those up to order 3 and not order 4', () => {
    for (const r of residuals(untransformed().b)) expect(Math.abs(r)).toBeLessThan(1e-12);
    const embedded = residuals(untransformed().bHat);
    for (const r of embedded.slice(0, 4)) expect(Math.abs(r)).toBeLessThan(1e-12);
    expect(Math.max(...embedded.slice(4).map(Math.abs))).toBeGreaterThan(1e-3);
  });

  it('stage times are the row sums of α (0, 0.386, 0.21, 0.63, 1, 1)', () => {
    const { alpha } = untransformed();
    const sums = alpha.map((r) => r.reduce((x, v) => x + v, 0));
    sums.forEach((v, i) => expect(v).toBeCloseTo(RODAS_TABLEAU.stageTimes[i], 12));
  });

  it('is L-stable: the stability function tends to 0 at −∞ and stays below 1 on the negative axis', () => {
    // R(z) = 1 + z bᵀ (I − z B)⁻¹ 1 with B = α + Γ (HW II, §IV.7, (7.12)).
    const { alpha, G, b } = untransformed();
    const R = (z: number) => {
      const x: number[] = [];
      for (let i = 0; i < b.length; i++) {
        let v = 1;
        for (let j = 0; j < i; j++) v += z * (alpha[i][j] + G[i][j]) * x[j];
        x.push(v / (1 - z * G[i][i]));
      }
      return 1 + z * b.reduce((acc, bi, i) => acc + bi * x[i], 0);
    };
    expect(Math.abs(R(-1e8))).toBeLessThan(1e-6);
    for (const z of [-0.1, -1, -3.3, -10, -100, -1e4]) expect(Math.abs(R(z))).toBeLessThan(1);
    expect(R(-0.1)).toBeCloseTo(Math.exp(-0.1), 7);
  });
});

/**
 * Vertical fall from rest with quadratic drag in still air of constant density: the closed form
 * v(t) = −v_t tanh(g t / v_t), z(t) = z0 − (v_t² / g) ln cosh(g t / v_t) (from memory; the
 * textbook result for quadratic air resistance). a = −g − (g / v_t²) |v| v.
 */
class QuadraticFall implements StiffSystem {
  constructor(readonly g: number, readonly vt: number) {}
  derivative(_t: Float64Array, y: Float64Array, dy: Float64Array): void {
    dy[0] = y[3];
    dy[1] = y[4];
    dy[2] = y[5];
    dy[3] = 0;
    dy[4] = 0;
    dy[5] = -this.g - (this.g / (this.vt * this.vt)) * Math.abs(y[5]) * y[5];
  }
  accelerationJacobian(_t: Float64Array, y: Float64Array, dadx: Float64Array, dadv: Float64Array): void {
    dadx.fill(0);
    dadv.fill(0);
    dadv[8] = -2 * (this.g / (this.vt * this.vt)) * Math.abs(y[5]);
  }
}

function exactFall(g: number, vt: number, z0: number, t: number) {
  return { z: z0 - ((vt * vt) / g) * Math.log(Math.cosh((g * t) / vt)), v: -vt * Math.tanh((g * t) / vt) };
}

/** Fixed steps of size h from the closed form's state at t0 to time T; returns the height and speed errors. */
function fixedSteps(sys: QuadraticFall, h: number, T: number, t0 = 0) {
  const r = new Rodas(6);
  const start = exactFall(sys.g, sys.vt, 1000, t0);
  r.reset([0, 0, start.z, 0, 0, start.v]);
  let t = t0;
  const steps = Math.round((T - t0) / h);
  for (let k = 0; k < steps; k++) {
    r.attempt(sys, t, h);
    r.accept();
    t += h;
  }
  const e = exactFall(sys.g, sys.vt, 1000, T);
  return { z: Math.abs(r.y[2] - e.z), v: Math.abs(r.y[5] - e.v), stepper: r, t };
}

describe('Rosenbrock stepper against the closed form of a fall with quadratic drag', () => {
  it('converges at fourth order', () => {
    const sys = new QuadraticFall(9.81, 20);
    const coarse = fixedSteps(sys, 0.4, 8);
    const fine = fixedSteps(sys, 0.2, 8);
    // Global error ~ h⁴: halving h divides it by about 16.
    const order = Math.log2(coarse.z / fine.z);
    expect(order).toBeGreaterThan(3.5);
    expect(order).toBeLessThan(5);
  });

  it('stays stable and accurate with steps far past the explicit limit (h·λ ≈ 10 under a 2 m/s canopy)', () => {
    // λ = 2g/v_t = 9.8 /s; Dormand–Prince is unstable beyond h·λ ≈ 3.3. From 0.5 s after
    // release (already 92 % of v_t), where the drag term's Jacobian carries the stiffness.
    const sys = new QuadraticFall(9.81, 2);
    const r = fixedSteps(sys, 1, 60.5, 0.5);
    expect(r.v).toBeLessThan(1e-9);
    expect(r.z).toBeLessThan(1e-3);
  });

  it('dense output (cubic Hermite) follows the closed form inside a step', () => {
    const sys = new QuadraticFall(9.81, 20);
    const r = fixedSteps(sys, 0.1, 3).stepper;
    const t0 = r.stepStart;
    for (const s of [0.25, 0.5, 0.75]) {
      const t = t0 + s * r.stepLength;
      expect(Math.abs(r.denseComponent(2, t) - exactFall(9.81, 20, 1000, t).z)).toBeLessThan(1e-5);
      expect(Math.abs(r.denseComponent(5, t) - exactFall(9.81, 20, 1000, t).v)).toBeLessThan(1e-4);
    }
  });
});

describe('the flight model’s acceleration Jacobian under a canopy', () => {
  it('equals central differences of its own equations (wind shear, turbulence, density, gravity, Coriolis)', () => {
    // Finite differences as a check on an analytic derivative: common practice, no source.
    const sc = scenario({
      vehicle: body('release', 1.2, 0.5, 0.0023),
      launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
      recovery: [{ name: 'main', trigger: 'time', time: 0, delay: 0, dragArea: 0.6 }],
      wind: { speed: 7, from: 250, height: 10, shear: 0.16 },
    });
    const model = new FlightModel(sc);
    const inputs = emptyInputs(1);
    Object.assign(inputs, { mass: 1.2, windSpeed: 7, sigmaW: 1.2, height: 300 });
    const stream = new SampleStream();
    stream.select('jacobian', 3);
    // A short flight deploys the stage and draws the gust field; then probe its equations.
    model.fly(inputs, () => stream.normal(), emptyResult());
    const time = Float64Array.of(100);
    const dadx = new Float64Array(9);
    const dadv = new Float64Array(9);
    const plus = new Float64Array(6);
    const minus = new Float64Array(6);
    for (const [z, ve, vn, vu] of [[85.3, 2.1, -0.7, -5.4], [12.7, 4.4, 1.9, -6.1], [260.2, -1.3, 3.3, -3.9]]) {
      const y = Float64Array.of(30, -12, z, ve, vn, vu);
      model.accelerationJacobian(time, y, dadx, dadv);
      for (let j = 0; j < 6; j++) {
        const d = j < 3 ? 1e-4 : 1e-6;
        const yp = Float64Array.from(y);
        const ym = Float64Array.from(y);
        yp[j] += d;
        ym[j] -= d;
        model.derivative(time, yp, plus);
        model.derivative(time, ym, minus);
        for (let i = 0; i < 3; i++) {
          const fd = (plus[3 + i] - minus[3 + i]) / (2 * d);
          const analytic = j < 3 ? dadx[3 * i + j] : dadv[3 * i + j - 3];
          expect(Math.abs(analytic - fd)).toBeLessThan(1e-5 * (1 + Math.abs(fd)));
        }
      }
    }
  });
});
