import { describe, expect, it } from 'vitest';
import { DispersionRunner } from '../../src/dispersion/runner.js';
import { assembleChunks } from '../../src/dispersion/results.js';
import { landingSetFromRun } from '../../src/analysis/from-run.js';
import { partFigures } from '../../src/analysis/parts.js';
import { G0 } from '../../src/physics/constants.js';
import { uniformEarth } from '../../src/physics/earth.js';
import type { Breakup, FailureMode, Scenario, Spread } from '../../src/scenario/types.js';
import { body, constantAir, scenario } from '../helpers/build.js';

/**
 * Fragments (scenario `breakup`): every piece is flown as a point mass from the break state.
 * Checks against closed forms; the scenarios are invented test inputs, not check values.
 */

const VACUUM = { air: constantAir(0), earth: uniformEarth(), rtol: 1e-10, atolPosition: 1e-9, atolVelocity: 1e-9 };

function piece(name: string, count: number, speed: number, mass = 0.01, cd = 1, area = 1e-3) {
  return { name, count, mass, dragArea: cd * area, drag: cd, referenceArea: area, speed, radius: Math.sqrt(area / Math.PI) };
}

function shell(breakup: Breakup | undefined, extra: Partial<Scenario> = {}, wind = 0, turbulence = false): Scenario {
  const sc = scenario({
    vehicle: body('projectile', 0.3, 0.5, 0.0044),
    launch: { kind: 'projectile', speed: 60, elevation: 80, azimuth: 70, height: 0 },
    wind: { speed: wind, from: 215, gust: wind > 0 ? wind * 1.8 : undefined },
    turbulence,
  });
  return { ...sc, ...(breakup ? { breakup } : {}), ...extra };
}

function fly(sc: Scenario, samples: number, flight?: object) {
  const runner = new DispersionRunner(sc, { samples, seed: 'fragments', flight });
  const chunk = runner.runChunk(0, samples);
  const run = assembleChunks(samples, [chunk], runner.plan, 'fragments');
  return { run, set: landingSetFromRun(run, sc) };
}

describe('fragments in a vacuum (closed-form ballistics: x = v cos θ t, z = v sin θ t − g t²/2)', () => {
  const v = 60;
  const th = (80 * Math.PI) / 180;
  const az = (70 * Math.PI) / 180;
  const range = (v * v * Math.sin(2 * th)) / G0;

  it('pieces with no added speed land where the unbroken point mass would, for a break at apogee or on the way up', () => {
    for (const breakup of [
      { name: 'burst', trigger: 'apogee', delay: 0, fragments: [piece('a', 3, 0), piece('b', 2, 0, 0.002)] },
      { name: 'burst', trigger: 'time', delay: 0, time: 1.7, fragments: [piece('a', 3, 0)] },
    ] as Breakup[]) {
      const { run, set } = fly(shell(breakup), 4, VACUUM);
      expect(Array.from(run.broken)).toEqual([1, 1, 1, 1]);
      expect(set.east.length).toBe(4 * breakup.fragments.reduce((s, f) => s + f.count, 0));
      for (let i = 0; i < set.east.length; i++) {
        expect(set.east[i]).toBeCloseTo(range * Math.sin(az), 4);
        expect(set.north[i]).toBeCloseTo(range * Math.cos(az), 4);
        expect(set.flightTime![i]).toBeCloseTo((2 * v * Math.sin(th)) / G0, 5);
        expect(set.impactSpeed![i]).toBeCloseTo(v, 4);
      }
    }
  });

  it('with an added speed s from apogee: a piece falling for t lands s·sin(θ)·t from where the object would be after t, and cos θ is uniform on [−1, 1] (Archimedes: uniform on the sphere)', () => {
    const s = 15;
    const H = (v * v * Math.sin(th) ** 2) / (2 * G0);
    const tUp = (v * Math.sin(th)) / G0;
    const n = 40;
    const { set } = fly(shell({ name: 'burst', trigger: 'apogee', delay: 0, fragments: [piece('shard', 10, s)] }), n, VACUUM);
    expect(set.east.length).toBe(n * 10);
    const cosines: number[] = [];
    for (let i = 0; i < set.east.length; i++) {
      const t = set.flightTime![i] - tUp;
      // Fall from H with vertical speed s·c: H + s c t − g t²/2 = 0.
      const c = ((G0 * t * t) / 2 - H) / (s * t);
      cosines.push(c);
      // The object itself would be (v cos θ)(t_up + t) downrange by then; the piece's own speed adds s sin θ t across.
      const along = v * Math.cos(th) * (tUp + t);
      const offset = Math.hypot(set.east[i] - along * Math.sin(az), set.north[i] - along * Math.cos(az));
      expect(offset).toBeCloseTo(s * Math.sqrt(Math.max(0, 1 - c * c)) * t, 3);
    }
    // Kolmogorov–Smirnov against U(−1, 1): D < 1.36/√n at the 5 % level (Kolmogorov's limit law).
    cosines.sort((a, b) => a - b);
    let d = 0;
    cosines.forEach((c, k) => {
      const F = (c + 1) / 2;
      d = Math.max(d, Math.abs(F - k / cosines.length), Math.abs(F - (k + 1) / cosines.length));
    });
    expect(d).toBeLessThan(1.36 / Math.sqrt(cosines.length));
  });
});

describe('fragments in air', () => {
  it('n pieces of 1/n the mass and 1/n the drag area, no added speed, land where the whole object lands (same ballistic coefficient: the same equations of motion; closed form), in wind and turbulence', () => {
    const whole = shell(undefined, {}, 5, true);
    const v = whole.vehicle;
    const quarter = { name: 'quarter', count: 4, mass: v.mass / 4, dragArea: (0.5 * v.referenceArea) / 4, drag: 0.5, referenceArea: v.referenceArea / 4, speed: 0, radius: 0.02 };
    const broken = shell({ name: 'burst', trigger: 'apogee', delay: 0, fragments: [quarter] }, {}, 5, true);
    // Tight tolerances: the check is of the equations and the break state, not of the default accuracy.
    const tight = { rtol: 1e-10, atolPosition: 1e-7, atolVelocity: 1e-7 };
    const a = fly(whole, 12, tight).run;
    const b = fly(broken, 12, tight).set;
    for (let i = 0; i < 12; i++) {
      for (let p = 0; p < 4; p++) {
        const k = 4 * i + p;
        expect(b.sample![k]).toBe(i);
        // Within the integrator's tolerance (the pieces start their stepper at apogee, the object
        // keeps its planned step past it): about 0.1 m at the default tolerances, 1 mm here.
        expect(Math.hypot(b.east[k] - a.east[i], b.north[k] - a.north[i])).toBeLessThan(1e-3);
      }
    }
  });

  it('a piece falling far reaches ½ m v_t² with v_t = √(2 m g / (ρ Cd A)) (closed-form terminal speed)', () => {
    const rho = 1.2;
    const f = piece('card', 3, 4, 0.004, 1.2, 1.5e-3);
    const vt = Math.sqrt((2 * f.mass * G0) / (rho * f.drag * f.referenceArea));
    const sc = shell({ name: 'burst', trigger: 'apogee', delay: 0, fragments: [f] });
    const { set } = fly(sc, 5, { air: constantAir(rho), earth: uniformEarth() });
    // Within 0.2 %: the default velocity tolerance (3 mm/s) of a 6 m/s fall.
    for (let i = 0; i < set.east.length; i++) {
      expect(Math.abs(set.impactSpeed![i] / vt - 1)).toBeLessThan(2e-3);
      expect(Math.abs(set.impactEnergy![i] / (0.5 * f.mass * vt * vt) - 1)).toBeLessThan(4e-3);
    }
  });

  it('the scatter grows with the added speed (sd of piece landings about their sample mean)', () => {
    const spread = (s: number) => {
      const { set } = fly(shell({ name: 'burst', trigger: 'apogee', delay: 0, fragments: [piece('shard', 8, s)] }, {}, 3), 30);
      let sum = 0;
      for (let i = 0; i < 30; i++) {
        let me = 0, mn = 0;
        for (let p = 0; p < 8; p++) { me += set.east[8 * i + p] / 8; mn += set.north[8 * i + p] / 8; }
        for (let p = 0; p < 8; p++) sum += (set.east[8 * i + p] - me) ** 2 + (set.north[8 * i + p] - mn) ** 2;
      }
      return Math.sqrt(sum / (30 * 8));
    };
    const s0 = spread(0), s5 = spread(5), s15 = spread(15);
    expect(s0).toBeLessThan(1e-6);
    expect(s5).toBeGreaterThan(1);
    expect(s15).toBeGreaterThan(2 * s5);
  });
});

describe('counts and weights (expected landings per flight = Σ count × P(mode), linearity of expectation, common practice, no source)', () => {
  const failures: FailureMode[] = [
    { name: 'no burst', probability: 0.2, effect: 'skip', stage: 'burst' },
    { name: 'low break', probability: 0.1, effect: 'early', stage: 'burst', time: 1 },
  ];
  const breakup: Breakup = { name: 'burst', trigger: 'apogee', delay: 0, fragments: [piece('half', 2, 10, 0.03), piece('shard', 7, 20, 0.003), piece('fuse', 1, 5, 0.006)] };
  const uncertainty: Partial<Record<'wind.speed', Spread>> = { 'wind.speed': { kind: 'normal', sd: 1, relative: false } };
  const sc = shell(breakup, { failures, uncertainty }, 4, true);
  const n = 400;
  const { run, set } = fly(sc, n);

  it('each breaking sample yields count pieces of each class; a dud lands whole', () => {
    const plan = run.plan;
    const broke = plan.counts[0] + plan.counts[2];
    expect(Array.from(run.broken).filter((b) => b === 1).length).toBe(broke);
    const parts = set.partNames!;
    expect(parts).toEqual(['whole', 'half', 'shard', 'fuse']);
    const rows = (k: number) => Array.from(set.part!).filter((p) => p === k).length;
    expect(rows(0)).toBe(plan.counts[1]);
    expect(rows(1)).toBe(2 * broke);
    expect(rows(2)).toBe(7 * broke);
    expect(rows(3)).toBe(broke);
  });

  it('the weights of each part add up to count × P(modes that break up), the whole object to P(no burst)', () => {
    const figures = partFigures(set)!;
    const pBreak = 0.7 + 0.1;
    expect(figures[0].expectedLandings).toBeCloseTo(0.2, 10);
    expect(figures[1].expectedLandings).toBeCloseTo(2 * pBreak, 10);
    expect(figures[2].expectedLandings).toBeCloseTo(7 * pBreak, 10);
    expect(figures[3].expectedLandings).toBeCloseTo(pBreak, 10);
    expect(figures[2].byMode.map((m) => m.expectedLandings)).toEqual([expect.closeTo(7 * 0.7, 10), 0, expect.closeTo(7 * 0.1, 10)]);
  });

  it('the early break happens at its time, low on the way up (the pieces rise from where the object was at t = 1 s)', () => {
    const first = run.plan.first[2];
    // Every low-break piece's flight ends later than 1 s and the object's apogee there is below the nominal one.
    const lowApogee = run.apogee[first];
    const nominalApogee = run.apogee[0];
    expect(lowApogee).toBeLessThan(nominalApogee);
    for (let k = 0; k < set.east.length; k++) if (set.mode[k] === 2) expect(set.flightTime![k]).toBeGreaterThan(1);
  });

  it('a breakup timed after landing changes nothing: the object flies exactly as without one (no draw inserted)', () => {
    const late: Breakup = { ...breakup, trigger: 'time', time: 1e4 };
    const onlyDuds = { ...sc, failures: [failures[0]] };
    const a = fly({ ...onlyDuds, breakup: late }, 60).run;
    const { breakup: _none, ...plain } = onlyDuds;
    const b = fly(plain as Scenario, 60).run;
    expect(Array.from(a.broken).every((x) => x === 0)).toBe(true);
    expect(Buffer.from(a.east.buffer)).toEqual(Buffer.from(b.east.buffer));
    expect(Buffer.from(a.north.buffer)).toEqual(Buffer.from(b.north.buffer));
    expect(Buffer.from(a.impactSpeed.buffer)).toEqual(Buffer.from(b.impactSpeed.buffer));
  });

  it('a sample gives the same pieces in any chunk (results depend on the sample index only)', () => {
    const runner = new DispersionRunner(sc, { samples: n, seed: 'fragments' });
    // Samples 270–289 span the end of the nominal block and the start of the duds.
    const c1 = runner.runChunk(270, 20);
    const fresh = new DispersionRunner(sc, { samples: n, seed: 'fragments' });
    fresh.runChunk(0, 7);
    const c2 = fresh.runChunk(270, 20);
    for (const name of ['pieceEast', 'pieceNorth', 'pieceFlightTime', 'pieceStatus', 'east', 'apogee'] as const) {
      expect(Buffer.from(c1[name].buffer)).toEqual(Buffer.from(c2[name].buffer));
    }
    expect(Buffer.from(c1.pieceEast.buffer)).toEqual(Buffer.from(run.pieceEast.buffer, 270 * 10 * 8, 20 * 10 * 8));
  });
});

describe('pieces that fail to fly to the ground', () => {
  it('are counted with their reason and never written as landings (a feather-light class past the time limit)', async () => {
    const { failedPieces } = await import('../../src/dispersion/breakup.js');
    const { FlightStatus } = await import('../../src/flight/status.js');
    // Terminal speed √(2 m g / (ρ Cd A)) ≈ 0.4 m/s: from ~170 m it needs minutes; the limit is 60 s.
    const feather = piece('tissue', 3, 1, 0.0005, 1.3, 0.05);
    const stone = piece('stone', 1, 1, 0.05, 0.5, 1e-3);
    const sc = shell({ name: 'burst', trigger: 'apogee', delay: 0, fragments: [feather, stone] });
    const { run, set } = fly(sc, 5, { maxTime: 60 });
    const { flown, failed } = failedPieces(run);
    expect(flown).toBe(5 * 4);
    expect(failed.get(FlightStatus.MAX_TIME)).toBe(5 * 3);
    expect(Array.from(set.part!)).toEqual(new Array(5).fill(2));
  });
});
