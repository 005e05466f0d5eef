import { describe, expect, it } from 'vitest';
import { EarthModel, WGS84, addCoriolis, normalGravity, normalGravityAt } from '../../src/physics/earth.js';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import type { Earth } from '../../src/physics/earth.js';
import { body, constantAir, scenario } from '../helpers/build.js';

describe('WGS 84 normal gravity (NIMA TR8350.2, eq. 4-1 and 4-3)', () => {
  it('equals the published equatorial and polar normal gravity', () => {
    // TR8350.2 table 3.4: γe = 9.7803253359, γp = 9.8321849378 m/s².
    expect(normalGravity(0)).toBeCloseTo(9.7803253359, 9);
    expect(normalGravity(90)).toBeCloseTo(9.8321849378, 9);
    expect(normalGravity(-90)).toBeCloseTo(9.8321849378, 9);
  });

  it('falls with height by about 3.086e-6 s⁻² (the free-air gradient, eq. 4-3)', () => {
    // From memory: the free-air gradient is 0.3086 mGal/m = 3.086e-6 m/s² per metre at mid-latitudes.
    const gradient = (normalGravityAt(45, 0) - normalGravityAt(45, 1000)) / 1000;
    expect(gradient).toBeGreaterThan(3.07e-6);
    expect(gradient).toBeLessThan(3.1e-6);
  });

  it('the model at a pad gives eq. 4-3 at every height above the pad (the expansion is exact)', () => {
    const earth = new EarthModel(52.3, 420);
    for (const z of [0, 150, 2000, 17000, -300]) expect(earth.gravityAt(z)).toBeCloseTo(normalGravityAt(52.3, 420 + z), 12);
  });

  it('Coriolis −2Ω×v: a falling body is pushed east, a body moving north is pushed east in the north', () => {
    const earth = new EarthModel(45, 0);
    const acc = new Float64Array(3);
    addCoriolis(earth, 0, 0, -10, acc);
    expect(acc[0]).toBeCloseTo(2 * WGS84.omega * Math.cos(Math.PI / 4) * 10, 15);
    acc.fill(0);
    addCoriolis(earth, 0, 10, 0, acc);
    expect(acc[0]).toBeCloseTo(2 * WGS84.omega * Math.sin(Math.PI / 4) * 10, 15); // to the right in the north
    expect(acc[1]).toBe(0);
  });
});

describe('Coriolis deflection of vacuum flights (classical mechanics closed forms, first order in Ω)', () => {
  const lat = 40;
  const g = 9.81;
  const omega = WGS84.omega;
  // Uniform gravity (the closed forms assume it) with the Earth's rotation at the latitude.
  const earth: Earth = { gravityAt: () => g, gravitySlopeAt: () => 0, omegaNorth: omega * Math.cos((lat * Math.PI) / 180), omegaUp: omega * Math.sin((lat * Math.PI) / 180) };
  const tight = { rtol: 1e-11, atolPosition: 1e-10, atolVelocity: 1e-10, air: constantAir(0), earth };

  it('a drop from rest from height h lands east by (1/3) Ω g t³ cos φ', () => {
    const h = 1000;
    const sc = scenario({ vehicle: body('release', 1, 0, 0.01), launch: { kind: 'release', height: h, speed: 0, heading: 0, east: 0, north: 0 } });
    const inputs = emptyInputs(0);
    inputs.height = h;
    const r = new FlightModel(sc, tight).fly(inputs, () => 0, emptyResult());
    const t = Math.sqrt((2 * h) / g);
    const expected = (1 / 3) * omega * g * t ** 3 * Math.cos((lat * Math.PI) / 180);
    expect(expected).toBeGreaterThan(0.2); // ~0.24 m: big enough to see
    expect(r.east / expected).toBeCloseTo(1, 4);
    // Only a second-order (Ω²) drift north.
    expect(Math.abs(r.north)).toBeLessThan(2e-3 * expected);
  });

  it('a shot straight up to height h lands west by (4/3) Ω cos φ sqrt(8 h³ / g)', () => {
    const h = 1000;
    const v0 = Math.sqrt(2 * g * h);
    const sc = scenario({ vehicle: body('projectile', 1, 0, 0.01), launch: { kind: 'projectile', speed: v0, elevation: 90, azimuth: 0, height: 0 } });
    const inputs = emptyInputs(0);
    inputs.speed = v0;
    inputs.elevation = 90;
    const r = new FlightModel(sc, tight).fly(inputs, () => 0, emptyResult());
    const expected = (4 / 3) * omega * Math.cos((lat * Math.PI) / 180) * Math.sqrt((8 * h ** 3) / g);
    expect(-r.east / expected).toBeCloseTo(1, 3);
  });

  it('without rotation the same shot comes straight back down', () => {
    const sc = scenario({ vehicle: body('projectile', 1, 0, 0.01), launch: { kind: 'projectile', speed: 140, elevation: 90, azimuth: 0, height: 0 } });
    const inputs = emptyInputs(0);
    inputs.speed = 140;
    inputs.elevation = 90;
    const r = new FlightModel(sc, { ...tight, earth: { gravityAt: () => g, gravitySlopeAt: () => 0, omegaNorth: 0, omegaUp: 0 } }).fly(inputs, () => 0, emptyResult());
    expect(Math.abs(r.east)).toBeLessThan(1e-6);
  });
});
