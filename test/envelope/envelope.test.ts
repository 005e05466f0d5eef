import { describe, expect, it } from 'vitest';
import { windEnvelope, type Execute } from '../../src/envelope/envelope.js';
import { executeInThread } from '../../src/dispersion/execute.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { G0 } from '../../src/physics/constants.js';
import type { PolygonGeometry, Scenario } from '../../src/scenario/types.js';
import { body, scenario } from '../helpers/build.js';
import { rangeValues } from '../../src/envelope/grid.js';
import { limitAt } from '../../src/envelope/chart.js';

const execute: Execute = (sc, samples, seed, signal) => executeInThread(sc, { samples, seed, signal });

// An invented field: the boundary lies 300 m east, 200 m north, 150 m west and 400 m south of the pad.
const SIDES = { east: 300, north: 200, west: 150, south: 400 };
const PAD = { lat: 45, lon: 7, elevation: 0 };

function boundary(): PolygonGeometry {
  const frame = createLocalFrame(PAD);
  const corners: [number, number][] = [
    [-SIDES.west, -SIDES.south], [SIDES.east, -SIDES.south], [SIDES.east, SIDES.north], [-SIDES.west, SIDES.north], [-SIDES.west, -SIDES.south],
  ];
  return { type: 'Polygon', coordinates: [corners.map(([e, n]) => frame.toLonLat(e, n))] };
}

/** A load released at 200 m under a canopy of 5 m/s, in a wind that is the same at every height. */
function parachuteDrop(): Scenario {
  const mass = 2;
  const rate = 5;
  const base = scenario({
    vehicle: body('release', mass, 0.8, 0.02),
    launch: { kind: 'release', height: 200, speed: 0, heading: 0, east: 0, north: 0 },
    recovery: [{ name: 'canopy', trigger: 'apogee', delay: 0, dragArea: (2 * mass * G0) / (1.225 * rate * rate) }],
    wind: { speed: 3, from: 270, shear: 0 },
  });
  return { ...base, site: { ...base.site, pad: PAD, boundary: boundary() } };
}

describe('wind envelope', () => {
  it('constant wind, no spreads, a parachute: limit per direction = drift (wind × descent time) against the boundary, within one speed step (common practice, no source)', async () => {
    const sc = parachuteDrop();
    const speeds = rangeValues('0:10:1') as number[];
    const e = await windEnvelope(sc, { directions: [0, 90, 180, 270], speeds, samples: 20, seed: 'env', execute });
    const descentTime = 200 / 5;
    const margin = sc.run.keepOut.margin;
    // Wind from 0° carries the load south, from 90° west, from 180° north, from 270° east.
    const room = { 0: SIDES.south, 90: SIDES.west, 180: SIDES.north, 270: SIDES.east } as Record<number, number>;
    for (const d of e.limits) {
      const expected = (room[d.from] - margin) / descentTime;
      expect(d.limit).not.toBeNull();
      expect(Math.abs(d.limit! - expected)).toBeLessThanOrEqual(1 + 1e-9);
      expect(d.firstFailure).toEqual(['site boundary']);
    }
  });

  it('bisection finds the same limits as flying every grid point', async () => {
    const sc = parachuteDrop();
    const speeds = rangeValues('0:8:1') as number[];
    const opts = { directions: [90, 270], speeds, samples: 20, seed: 'env', execute };
    const fast = await windEnvelope(sc, opts);
    const full = await windEnvelope(sc, { ...opts, exhaustive: true });
    expect(fast.limits.map((d) => d.limit)).toEqual(full.limits.map((d) => d.limit));
    expect(fast.casesFlown).toBeLessThan(full.casesFlown);
  });

  it('a larger wind-direction spread never gets a higher limit (common random numbers keep this monotone)', async () => {
    const narrow = { ...parachuteDrop(), uncertainty: { 'wind.from': { kind: 'normal' as const, sd: 5, relative: false } } };
    const wide = { ...parachuteDrop(), uncertainty: { 'wind.from': { kind: 'normal' as const, sd: 30, relative: false } } };
    const opts = { directions: [0, 90, 180, 270], speeds: rangeValues('0:9:1') as number[], samples: 150, seed: 'mono', execute };
    const a = await windEnvelope(narrow, opts);
    const b = await windEnvelope(wide, opts);
    a.limits.forEach((d, i) => expect(b.limits[i].limit ?? -1).toBeLessThanOrEqual(d.limit ?? -1));
  });

  it('reads the limit between grid directions', () => {
    const e = { limits: [{ from: 0, limit: 4 }, { from: 90, limit: 8 }, { from: 180, limit: 2 }, { from: 270, limit: 6 }] } as never;
    expect(limitAt(e, 45)).toBeCloseTo(6, 12);
    expect(limitAt(e, 315)).toBeCloseTo(5, 12);
  });

  it('parses grid ranges and rejects bad ones', () => {
    expect(rangeValues('0:330:30')).toHaveLength(12);
    expect(rangeValues('0:14:1')).toHaveLength(15);
    expect(typeof rangeValues('0:10')).toBe('string');
    expect(typeof rangeValues('0:10:0')).toBe('string');
    expect(typeof rangeValues('10:0:1')).toBe('string');
  });
});
