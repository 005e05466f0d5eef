import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs, type FlightInputs } from '../../src/flight/inputs.js';
import { FlightStatus } from '../../src/flight/status.js';
import { G0 } from '../../src/physics/constants.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { Scenario } from '../../src/scenario/types.js';
import { body, constantAir, scenario } from '../helpers/build.js';

const noNoise = () => 0;
/** Tight tolerances: these tests check the equations, not the default accuracy/speed trade. */
// The textbook closed forms assume uniform gravity g0 and a frame that does not turn.
const TIGHT = { rtol: 1e-10, atolPosition: 1e-9, atolVelocity: 1e-9, earth: uniformEarth() };

function projectileInputs(speed: number, elevation: number, azimuth = 0, height = 0): FlightInputs {
  const inputs = emptyInputs(0);
  Object.assign(inputs, { speed, elevation, azimuth, height, mass: 1 });
  return inputs;
}

function flyProjectile(sc: Scenario, inputs: FlightInputs, density?: number) {
  const model = new FlightModel(sc, density === undefined ? TIGHT : { ...TIGHT, air: constantAir(density) });
  inputs.mass = sc.vehicle.mass;
  inputs.windSpeed = sc.weather.wind.speed;
  return { ...model.fly(inputs, noNoise, emptyResult()) };
}

describe('vacuum projectile (closed form, any mechanics textbook)', () => {
  const cases: [number, number][] = [[100, 45], [80, 30], [150, 70]];
  it.each(cases)('v = %d m/s at %d°: range v² sin2θ / g, apex v² sin²θ / 2g, time 2 v sinθ / g', (v, deg) => {
    const sc = scenario({ vehicle: body('projectile', 2, 0, 0.01), launch: { kind: 'projectile', speed: v, elevation: deg, azimuth: 90, height: 0 } });
    const r = flyProjectile(sc, projectileInputs(v, deg, 90));
    const th = (deg * Math.PI) / 180;
    expect(r.status).toBe(FlightStatus.LANDED);
    expect(r.east).toBeCloseTo((v * v * Math.sin(2 * th)) / G0, 6);
    expect(Math.abs(r.north)).toBeLessThan(1e-9);
    expect(r.apogee).toBeCloseTo((v * v * Math.sin(th) ** 2) / (2 * G0), 6);
    expect(r.flightTime).toBeCloseTo((2 * v * Math.sin(th)) / G0, 6);
    expect(r.impactSpeed).toBeCloseTo(v, 5);
  });
});

describe('quadratic drag, vertical motion (J. R. Taylor, Classical Mechanics (2005), ch. 2)', () => {
  const m = 0.5, cd = 0.8, area = 0.01, rho = 1.2;
  const vt = Math.sqrt((2 * m * G0) / (rho * cd * area));

  it('upward launch reaches (vt²/2g) ln(1 + v0²/vt²) at (vt/g) atan(v0/vt)', () => {
    const v0 = 60;
    const sc = scenario({ vehicle: body('projectile', m, cd, area), launch: { kind: 'projectile', speed: v0, elevation: 90, azimuth: 0, height: 0 } });
    const model = new FlightModel(sc, { ...TIGHT, air: constantAir(rho) });
    const inputs = projectileInputs(v0, 90);
    inputs.mass = m;
    const r = model.fly(inputs, noNoise, emptyResult());
    expect(r.apogee).toBeCloseTo(((vt * vt) / (2 * G0)) * Math.log(1 + (v0 * v0) / (vt * vt)), 4);
    expect(r.apogeeTime).toBeCloseTo((vt / G0) * Math.atan(v0 / vt), 5);
  });

  it('fall from rest: depth (vt²/g) ln cosh(g t / vt), speed vt tanh(g t / vt)', () => {
    const h = 200;
    const sc = scenario({ vehicle: body('release', m, cd, area), launch: { kind: 'release', height: h, speed: 0, heading: 0, east: 0, north: 0 } });
    const model = new FlightModel(sc, { ...TIGHT, air: constantAir(rho) });
    const inputs = emptyInputs(0);
    Object.assign(inputs, { height: h, speed: 0, mass: m });
    const r = model.fly(inputs, noNoise, emptyResult());
    // Time to fall h: invert h = (vt²/g) ln cosh(g t / vt).
    const t = (vt / G0) * Math.acosh(Math.exp((h * G0) / (vt * vt)));
    expect(r.flightTime).toBeCloseTo(t, 5);
    expect(r.impactSpeed).toBeCloseTo(vt * Math.tanh((G0 * t) / vt), 5);
  });
});

describe('steady parachute descent (closed form v = sqrt(2 m g / (ρ CdA)))', () => {
  it('a released load under an open canopy lands at the steady descent rate', () => {
    const m = 1.2, cda = 0.5, rho = 1.225;
    const sc = scenario({
      vehicle: body('release', m, 0.5, 0.02),
      launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
      recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: cda }],
    });
    const model = new FlightModel(sc, { ...TIGHT, air: constantAir(rho) });
    const inputs = emptyInputs(1);
    Object.assign(inputs, { height: 300, mass: m });
    const r = model.fly(inputs, noNoise, emptyResult());
    const v = Math.sqrt((2 * m * G0) / (rho * cda));
    expect(r.impactSpeed).toBeCloseTo(v, 4);
    // Nearly all of the 300 m is fallen at the steady rate (the opening transient is short).
    expect(r.flightTime).toBeGreaterThan(300 / v);
    expect(r.flightTime).toBeLessThan(300 / v + 1);
  });
});
