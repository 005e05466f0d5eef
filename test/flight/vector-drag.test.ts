import { describe, expect, it } from 'vitest';
import { FlightModel, emptyResult } from '../../src/flight/flight.js';
import { emptyInputs } from '../../src/flight/inputs.js';
import { G0 } from '../../src/physics/constants.js';
import { uniformEarth } from '../../src/physics/earth.js';
import { body, constantAir, scenario } from '../helpers/build.js';

// Drag acts against the air-relative velocity with magnitude ½ρCdA|v_rel|²; for v_rel = (3, 4) the
// drag is k·(15, 20) (magnitude 25k at 53.1°), not the per-component k·(9, 16) (18.4k at 60.6°).
// Common practice, no source (the worked numbers are in the project's reference notes).
describe('drag acts on the whole air-relative velocity vector (common practice, no source)', () => {
  const m = 2, cd = 0.5, area = 0.02, rho = 1.2;
  const k = (rho * cd * area) / (2 * m);

  function acceleration(v: [number, number, number], windFromWestSpeed: number) {
    const sc = scenario({
      vehicle: body('projectile', m, cd, area),
      launch: { kind: 'projectile', speed: 0, elevation: 0, azimuth: 0, height: 100 },
      wind: { speed: windFromWestSpeed, from: 270, shear: 0 },
    });
    const model = new FlightModel(sc, { air: constantAir(rho), earth: uniformEarth() });
    // Configure the model for this sample by flying it once, then probe the equations of motion.
    const inputs = emptyInputs(0);
    Object.assign(inputs, { mass: m, height: 100, windSpeed: windFromWestSpeed });
    model.fly(inputs, () => 0, emptyResult());
    const dy = new Float64Array(6);
    model.derivative(0, Float64Array.from([0, 0, 100, ...v]), dy);
    return [dy[3], dy[4], dy[5] + G0];
  }

  it('v_rel = (3, 4): drag k·(15, 20), magnitude 25k along −v_rel', () => {
    const [ax, ay, az] = acceleration([3, 4, 0], 0);
    expect(ax).toBeCloseTo(-15 * k, 12);
    expect(ay).toBeCloseTo(-20 * k, 12);
    expect(az).toBeCloseTo(0, 12);
    expect(Math.atan2(-ay, -ax) * (180 / Math.PI)).toBeCloseTo(53.13, 2);
    // The per-component error would give these; make sure we are nowhere near them.
    expect(Math.abs(ax + 9 * k)).toBeGreaterThan(5 * k);
    expect(Math.abs(ay + 16 * k)).toBeGreaterThan(3 * k);
  });

  it('uses the velocity relative to the air, not to the ground', () => {
    // Ground velocity (8, 4) in a 5 m/s wind blowing toward the east: v_rel = (3, 4).
    const [ax, ay] = acceleration([8, 4, 0], 5);
    expect(ax).toBeCloseTo(-15 * k, 12);
    expect(ay).toBeCloseTo(-20 * k, 12);
  });

  it('a pure crosswind on a body moving north produces drag with an along-track part', () => {
    // Moving north at 20 m/s, wind 10 m/s from the west: v_rel = (-10, 20), |v_rel| = 22.36.
    const [ax, ay] = acceleration([0, 20, 0], 10);
    const speed = Math.hypot(10, 20);
    expect(ay).toBeCloseTo(-k * speed * 20, 10);
    expect(ax).toBeCloseTo(k * speed * 10, 10);
    // Per-component drag would leave the along-track part at k·20² — smaller than the truth.
    expect(-ay).toBeGreaterThan(k * 400 * 1.1);
  });
});
