import { describe, expect, it } from 'vitest';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { launchDirection } from '../../src/flight/launch-direction.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { Scenario, Spread } from '../../src/scenario/types.js';
import { body, scenario } from '../helpers/build.js';

const normal = (sd: number): Spread => ({ kind: 'normal', sd, relative: false });

function stats(xs: Float64Array) {
  let s = 0, q = 0;
  for (const x of xs) { s += x; q += x * x; }
  const m = s / xs.length;
  return { mean: m, sd: Math.sqrt(q / xs.length - m * m) };
}

/**
 * Launch lean by two independent angles (in and across the plane of the nominal lean): a vertical
 * launch with a lean spread scatters round about the pad (isotropy of two i.i.d. normal
 * deviations, closed form: equal spread east and north, mean at the pad).
 */
describe('launch lean spreads in two dimensions', () => {
  it('the direction formula: in-plane angle unclamped, across angle to the right of the azimuth', () => {
    const d = new Float64Array(3);
    launchDirection(-3, 0, 0, true, d); // a negative tilt toward north leans south
    expect(d[1]).toBeCloseTo(-Math.sin((3 * Math.PI) / 180), 12);
    launchDirection(92, 0, 0, false, d); // an elevation past vertical leans back
    expect(d[1]).toBeLessThan(0);
    launchDirection(0, 0, 3, true, d);
    expect(d[0]).toBeCloseTo(Math.sin((3 * Math.PI) / 180), 12);
    expect(Math.hypot(d[0], d[1], d[2])).toBeCloseTo(1, 14);
  });

  it('a vertical mortar at 90° ± 2° in calm air scatters round, centred on the pad', () => {
    const sc: Scenario = {
      ...scenario({ vehicle: body('projectile', 0.5, 0.4, 0.0079), launch: { kind: 'projectile', speed: 60, elevation: 90, azimuth: 0, height: 0 } }),
      uncertainty: { 'launch.elevation': normal(2) },
    };
    const n = 2000;
    const r = new DispersionRunner(sc, { samples: n, seed: 'lean', flight: { earth: uniformEarth() } }).runChunk(0, n);
    const e = stats(r.east), no = stats(r.north);
    expect(Array.from(r.status).every((s) => s === 0)).toBe(true);
    // Equal spread east and north within sampling error (sd of an sd estimate ≈ sd/sqrt(2n) ≈ 1.6 %).
    expect(e.sd / no.sd).toBeGreaterThan(0.9);
    expect(e.sd / no.sd).toBeLessThan(1.1);
    // Mean at the pad within 4 standard errors (today's clamped elevation put it metres north).
    expect(Math.abs(e.mean)).toBeLessThan((4 * e.sd) / Math.sqrt(n));
    expect(Math.abs(no.mean)).toBeLessThan((4 * no.sd) / Math.sqrt(n));
  });

  it('a rocket on a vertical rail with tilt 0 ± 2° scatters round as well', () => {
    const sc: Scenario = {
      ...scenario({
        vehicle: {
          ...body('rocket', 0.4, 0.5, 0.0023),
          motor: { thrust: { time: [0, 0.1, 1.5, 1.6], thrust: [0, 60, 60, 0] }, propellantMass: 0.05 },
        },
        launch: { kind: 'rocket', rail: 1, tilt: 0, azimuth: 0 },
      }),
      uncertainty: { 'launch.tilt': normal(2) },
    };
    const n = 1000;
    const r = new DispersionRunner(sc, { samples: n, seed: 'lean', flight: { earth: uniformEarth() } }).runChunk(0, n);
    const e = stats(r.east), no = stats(r.north);
    expect(e.sd / no.sd).toBeGreaterThan(0.87);
    expect(e.sd / no.sd).toBeLessThan(1.15);
    expect(Math.abs(no.mean)).toBeLessThan((4 * no.sd) / Math.sqrt(n));
  });
});

describe('flights that start on the ground and move down land at once (scenario format: ground contact from the first step)', () => {
  it('a shell at height 0 with elevations drawn below 0 lands, none fails', () => {
    const sc: Scenario = {
      ...scenario({ vehicle: body('projectile', 0.5, 0.4, 0.0079), launch: { kind: 'projectile', speed: 40, elevation: 2, azimuth: 90, height: 0 } }),
      uncertainty: { 'launch.elevation': normal(3) },
    };
    const r = new DispersionRunner(sc, { samples: 40, seed: 'low' }).runChunk(0, 40);
    expect(Array.from(r.status)).toEqual(new Array(40).fill(0));
    // Those launched downward land at the pad at once.
    let atOnce = 0;
    for (let i = 0; i < 40; i++) if (r.flightTime[i] === 0) atOnce++;
    expect(atOnce).toBeGreaterThan(0);
  });

  it('a projectile at height 0 and elevation 0 lands at once at the pad', () => {
    const sc = scenario({ vehicle: body('projectile', 0.5, 0.4, 0.0079), launch: { kind: 'projectile', speed: 30, elevation: 0, azimuth: 0, height: 0 } });
    const r = new DispersionRunner(sc, { samples: 1, seed: '1' }).runChunk(0, 1);
    expect(r.status[0]).toBe(0);
    expect(r.flightTime[0]).toBeLessThan(1e-6);
    expect(Math.hypot(r.east[0], r.north[0])).toBeLessThan(1e-3);
  });

  it('a rocket with no rail whose curve starts at 0 N lands at once on the pad', () => {
    const sc = scenario({
      vehicle: { ...body('rocket', 0.4, 0.5, 0.0023), motor: { thrust: { time: [0, 0.2, 1.5, 1.6], thrust: [0, 60, 60, 0] }, propellantMass: 0.05 } },
      launch: { kind: 'rocket', rail: 0, tilt: 0, azimuth: 0 },
    });
    const r = new DispersionRunner(sc, { samples: 1, seed: '1' }).runChunk(0, 1);
    expect(r.status[0]).toBe(0);
    expect(r.flightTime[0]).toBeLessThan(1e-6);
  });
});

describe('a wind.speed spread scales a profile (scenario format: by drawn / nominal speed at the reference height)', () => {
  it('with wind.speed 0 and a profile, the spread still moves the drift', () => {
    const base = scenario({
      vehicle: body('release', 1, 1, 0.05),
      launch: { kind: 'release', height: 300, speed: 0, heading: 0, east: 0, north: 0 },
      wind: { speed: 0, from: 270, profile: [{ altitude: 10, speed: 4, from: 270 }, { altitude: 300, speed: 8, from: 270 }] },
    });
    const sc: Scenario = { ...base, uncertainty: { 'wind.speed': normal(2) } };
    const r = new DispersionRunner(sc, { samples: 200, seed: 'w', flight: { earth: uniformEarth() } }).runChunk(0, 200);
    const e = stats(r.east);
    const nominal = new DispersionRunner(base, { samples: 1, seed: 'w', flight: { earth: uniformEarth() } }).runChunk(0, 1).east[0];
    // Drift scales with the profile: sd of drift / drift ≈ sd of speed / speed at 10 m = 2 / 4.
    expect(e.sd / nominal).toBeGreaterThan(0.4);
    expect(e.sd / nominal).toBeLessThan(0.6);
  });
});
