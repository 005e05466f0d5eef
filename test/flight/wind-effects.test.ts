import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { G0 } from '../../src/physics/constants.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { Wind } from '../../src/scenario/types.js';
import { body, constantAir, scenario } from '../helpers/build.js';

function carry(wind: Partial<Wind>) {
  // A dense ball fired north at 45°, 60 m/s, in a uniform wind (shear 0).
  const sc = scenario({
    vehicle: body('projectile', 0.5, 0.47, 0.005),
    launch: { kind: 'projectile', speed: 60, elevation: 45, azimuth: 0, height: 0 },
    wind: { shear: 0, ...wind },
  });
  // Uniform gravity, no Earth rotation: the wind's effect alone (Coriolis would break the mirror symmetry).
  const model = new FlightModel(sc, { earth: uniformEarth() });
  const inputs = emptyInputs(0);
  Object.assign(inputs, { mass: 0.5, speed: 60, elevation: 45, azimuth: 0, windSpeed: sc.weather.wind.speed });
  return { ...model.fly(inputs, () => 0, emptyResult()) };
}

describe('wind and a dragged projectile (common practice, no source)', () => {
  const calm = carry({ speed: 0 });

  it('a steady crosswind shortens the carry down the line of fire', () => {
    const cross = carry({ speed: 8, from: 270 });
    expect(cross.north).toBeLessThan(calm.north - 0.5);
    expect(cross.east).toBeGreaterThan(1); // and drifts downwind
  });

  it('a tailwind lengthens the carry and a headwind shortens it', () => {
    const tail = carry({ speed: 8, from: 180 });
    const head = carry({ speed: 8, from: 0 });
    expect(tail.north).toBeGreaterThan(calm.north + 1);
    expect(head.north).toBeLessThan(calm.north - 1);
  });

  it('the crosswind effect is symmetric: wind from the east mirrors wind from the west', () => {
    const west = carry({ speed: 8, from: 270 });
    const east = carry({ speed: 8, from: 90 });
    expect(east.north).toBeCloseTo(west.north, 6);
    expect(east.east).toBeCloseTo(-west.east, 6);
  });
});

describe('drift under a parachute ≈ wind speed × descent time (common practice, no source)', () => {
  it('a load released at 300 m drifts downwind by about wind × time aloft', () => {
    const m = 1.5, cda = 0.6;
    const sc = scenario({
      vehicle: body('release', m, 0.8, 0.03),
      launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
      recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: cda }],
      wind: { speed: 6, from: 45, shear: 0 },
    });
    const model = new FlightModel(sc, { air: constantAir(1.2), earth: uniformEarth() });
    const inputs = emptyInputs(1);
    Object.assign(inputs, { height: 300, mass: m, windSpeed: 6 });
    const r = model.fly(inputs, () => 0, emptyResult());
    const v = Math.sqrt((2 * m * G0) / (1.2 * cda));
    const drift = Math.hypot(r.east, r.north);
    // Wind from 45° blows toward 225° (south-west).
    expect(r.east).toBeLessThan(0);
    expect(r.north).toBeLessThan(0);
    expect(Math.abs(drift / (6 * (300 / v)) - 1)).toBeLessThan(0.02);
  });
});
