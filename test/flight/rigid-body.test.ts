import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult, type FlightOptions } from '../../src/flight/flight.js';
import { Dopri5, type OdeSystem } from '../../src/flight/dopri5.js';
import { emptyInputs, type FlightInputs } from '../../src/flight/inputs.js';
import { FlightStatus } from '../../src/flight/status.js';
import { aeroTable, finMachFactor, massLayout } from '../../src/physics/aero.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { Scenario } from '../../src/scenario/types.js';
import { constantAir } from '../helpers/build.js';
import { shapedRocket } from './shaped-rocket.js';

// Checks of the rigid-body rocket (scenario format, "vehicle.shape") against closed forms.

function inputsFor(sc: Scenario, edit: Partial<FlightInputs> = {}): FlightInputs {
  const l = sc.launch;
  const inputs = emptyInputs(sc.recovery.length);
  Object.assign(inputs, { mass: sc.vehicle.mass, windSpeed: sc.weather.wind.speed });
  if (l.kind === 'rocket') Object.assign(inputs, { tilt: l.tilt, azimuth: l.azimuth });
  return Object.assign(inputs, edit);
}

const rho = 1.2;
const sound = 340;

/**
 * Pitch motion in a steady stream: the model's own derivative, with position and velocity held
 * fixed (flying east at V, long after burnout), so only the attitude moves. θ is the axis's angle
 * from the velocity in the horizontal plane.
 */
function pitchInSteadyStream(options: Partial<FlightOptions>, V: number, theta0: number, until: number) {
  const sc = shapedRocket(0, 0, 0, false);
  const model = new FlightModel(sc, { air: constantAir(rho, sound), earth: uniformEarth(), ...options });
  model.fly(inputsFor(sc), () => 0, emptyResult()); // configures the sample (dry balance point, inertia)
  const late = Float64Array.of(100); // well after burnout: no thrust, no propellant
  const system: OdeSystem = {
    derivative(_time, y, dy) {
      model.derivative(late, y, dy);
      for (let i = 0; i < 6; i++) dy[i] = 0;
    },
  };
  const solver = new Dopri5(15);
  solver.rtol = 1e-10;
  solver.atol.fill(1e-12);
  const y0 = new Float64Array(15);
  y0[2] = 100;
  y0[3] = V;
  y0[6] = Math.cos(theta0);
  y0[7] = Math.sin(theta0);
  y0[13] = 1; // misalignment direction: any unit vector across the axis
  solver.reset(y0);
  const times: number[] = [];
  const thetas: number[] = [];
  let t = 0;
  let h = 1e-3;
  while (t < until) {
    const step = Math.min(h, until - t);
    const err = solver.attempt(system, t, step);
    if (err > 1) {
      h = step * Dopri5.factor(err);
      continue;
    }
    solver.accept();
    t += step;
    h = step * Dopri5.factor(err);
    times.push(t);
    thetas.push(Math.atan2(solver.y[7], solver.y[6]));
  }
  return { sc, times, thetas };
}

/** Stiffness K = q A CNα (Xcp − Xcg) and damping C = ½ρVA Σ CNα_i (X_i − Xcg)², worked from the parts. */
function linearCoefficients(sc: Scenario, V: number) {
  const v = sc.vehicle;
  const shape = v.shape!;
  const layout = massLayout(v.mass, v.motor!.propellantMass, shape.cg, shape.inertia, shape.motorEnd - v.motor!.length! / 2);
  const k = finMachFactor(V / sound);
  const parts = aeroTable(shape, v.diameter!).parts.map((p) => ({ cn: p.cnAlpha * (p.fins ? k : 1), x: p.cp }));
  const cn = parts.reduce((s, p) => s + p.cn, 0);
  const xcp = parts.reduce((s, p) => s + p.cn * p.x, 0) / cn;
  const A = v.referenceArea;
  const K = 0.5 * rho * V * V * A * cn * (xcp - layout.dryCg);
  const C = 0.5 * rho * V * A * parts.reduce((s, p) => s + p.cn * (p.x - layout.dryCg) ** 2, 0);
  return { K, C, I: layout.dryInertia };
}

describe('rigid-body pitch motion in a steady stream', () => {
  it('with damping off, small oscillations have ω² = q A CNα (Xcp − Xcg) / I (linear oscillator, small angles)', () => {
    const V = 80;
    const { sc, times, thetas } = pitchInSteadyStream({ damping: false }, V, 0.005, 3);
    const { K, I } = linearCoefficients(sc, V);
    const omega = Math.sqrt(K / I);
    // Period from the downward zero crossings of θ (linear interpolation between steps).
    const crossings: number[] = [];
    for (let i = 1; i < thetas.length; i++) {
      if (thetas[i - 1] > 0 && thetas[i] <= 0) crossings.push(times[i - 1] + ((times[i] - times[i - 1]) * thetas[i - 1]) / (thetas[i - 1] - thetas[i]));
    }
    expect(crossings.length).toBeGreaterThan(3);
    const period = (crossings[crossings.length - 1] - crossings[0]) / (crossings.length - 1);
    expect((2 * Math.PI) / period).toBeCloseTo(omega, 3);
    // and the amplitude stays: no damping
    expect(Math.max(...thetas.slice(-200))).toBeGreaterThan(0.00499);
  });

  it('with damping on, the decay follows the linear second-order closed form θ0 e^(−ζωt)(cos ω_d t + ζ/√(1−ζ²) sin ω_d t)', () => {
    // Closed form of I θ'' + C θ' + K θ = 0 from rest (any text on linear ODEs, e.g. Boyce & DiPrima,
    // Elementary Differential Equations, §3.7 — from memory).
    const V = 60;
    const theta0 = 0.004;
    const { sc, times, thetas } = pitchInSteadyStream({}, V, theta0, 2);
    const { K, C, I } = linearCoefficients(sc, V);
    const wn = Math.sqrt(K / I);
    const zeta = C / (2 * Math.sqrt(K * I));
    expect(zeta).toBeGreaterThan(0.02); // the damping is large enough to show
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    let worst = 0;
    for (let i = 0; i < times.length; i++) {
      const t = times[i];
      const closed = theta0 * Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
      worst = Math.max(worst, Math.abs(thetas[i] - closed));
    }
    expect(worst / theta0).toBeLessThan(2e-3);
  });
});

describe('rigid-body flights against the point mass', () => {
  it('turning ever faster into the air-relative velocity, the flight tends to the point-mass flight', () => {
    // CNα × k and inertia × k⁻³, damping ratio kept (damping moment × k⁻²). The inertia must fall
    // faster than 1/k: the velocity turns toward the body at λ = k N/(m V) while the body turns at
    // ω ∝ sqrt(k / I); only with λ/ω → 0 does the body do all the turning, as the point mass assumes
    // (with I/k the two meet part way and the limit is a different flight).
    const sc = shapedRocket(45, 6, 5, false);
    const inputs = inputsFor(sc);
    const point = new FlightModel({ ...sc, vehicle: { ...sc.vehicle, shape: undefined } }).fly(inputs, () => 0, emptyResult());
    const gaps = [3, 10, 30].map((k) => {
      const r = new FlightModel(sc, { normalForceScale: k, inertiaScale: k ** -3, dampingScale: k ** -2, maxSteps: 1_000_000 }).fly(inputs, () => 0, emptyResult());
      expect(r.status).toBe(FlightStatus.LANDED);
      return { landing: Math.hypot(r.east - point.east, r.north - point.north), apogee: Math.abs(r.apogee - point.apogee) };
    });
    const base = new FlightModel(sc).fly(inputs, () => 0, emptyResult());
    expect(Math.hypot(base.east - point.east, base.north - point.north)).toBeGreaterThan(100); // the real rocket is far from it
    expect(gaps[1].landing).toBeLessThan(gaps[0].landing / 4);
    expect(gaps[2].landing).toBeLessThan(gaps[1].landing / 4);
    expect(gaps[2].landing).toBeLessThan(1);
    expect(gaps[2].apogee).toBeLessThan(0.5);
  });

  it('in calm air from a vertical rail, without misalignment or Earth rotation, it goes straight up to the point mass apogee', () => {
    const sc = shapedRocket(0, 0, 0, false);
    const opts = { earth: uniformEarth() };
    const rigid = new FlightModel(sc, opts).fly(inputsFor(sc), () => 0, emptyResult());
    const point = new FlightModel({ ...sc, vehicle: { ...sc.vehicle, shape: undefined } }, opts).fly(inputsFor(sc), () => 0, emptyResult());
    expect(rigid.status).toBe(FlightStatus.LANDED);
    expect(Math.hypot(rigid.east, rigid.north)).toBeLessThan(1e-6);
    expect(Math.abs(rigid.apogee - point.apogee)).toBeLessThan(0.05);
    expect(rigid.apogee).toBeGreaterThan(300);
  });

  it('a thrust misalignment turns the rocket away from the side its thrust leans to, more for a larger angle (moment of a force about the balance point; common practice, no source)', () => {
    const sc = shapedRocket(0, 0, 0, false);
    const opts = { earth: uniformEarth() };
    // Direction 90°: for a vertical rail the thrust leans east of the axis; the tail is pushed east,
    // the nose turns west, and the rocket flies and lands west of the pad.
    const fly = (misalignment: number, misalignmentDirection: number) =>
      new FlightModel(sc, opts).fly(inputsFor(sc, { misalignment, misalignmentDirection }), () => 0, emptyResult());
    const small = { ...fly(0.25, 90) };
    const large = { ...fly(1, 90) };
    expect(small.east).toBeLessThan(-5);
    expect(Math.abs(small.north)).toBeLessThan(1e-3 * Math.abs(small.east));
    expect(large.east).toBeLessThan(2 * small.east);
    const south = { ...fly(1, 0) }; // thrust leans north: lands south
    expect(south.north).toBeLessThan(-5);
    expect(Math.abs(south.north - large.east)).toBeLessThan(1e-6 * Math.abs(large.east) + 1e-3);
  });
});
