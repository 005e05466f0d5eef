import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, strewn, tempDir } from './helpers.js';

const HEADER = 'sample,mode,east_m,north_m,lat,lon,apogee_m,flight_time_s,impact_speed_m_s,impact_energy_J,impact_angle_deg,part,weight';

function run(scenario: string, extra: string[]) {
  const out = join(tempDir(), 'out');
  const r = strewn(['run', `scenarios/${scenario}`, '--out', out, ...extra]);
  return { ...r, out };
}

describe('strewn run on the demo scenarios', () => {
  it.each(['club-rocket.json', 'display-shell.json', 'drone-power-loss.json'])('%s writes every result file and the caution', (name) => {
    const r = run(name, ['--samples', '400']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('never replace');
    const files = readdirSync(r.out).sort();
    expect(files).toEqual(['.strewn-results', 'areas.csv', 'contours.geojson', 'keepout.geojson', 'landings.csv', 'landings.fgb', 'landings.geojson', 'map.svg', 'result.kml', 'review.json', 'risk.geojson', 'scenario.json', 'sheet.pdf', 'summary.json']);
    const csv = readFileSync(join(r.out, 'landings.csv'), 'utf8').trimEnd().split('\n');
    expect(csv[0]).toBe(HEADER);
    const summary = JSON.parse(readFileSync(join(r.out, 'summary.json'), 'utf8'));
    expect(csv.length - 1 + summary.failedSamples).toBe(400);
    for (const key of ['samples', 'failedSamples', 'seed', 'scenarioHash', 'version', 'apogee_m', 'contours', 'keepOut', 'areas', 'modes']) {
      expect(summary).toHaveProperty(key);
    }
    expect(summary.version).toBe(JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')).version);
    const samples = csv.slice(1).map((l) => Number(l.split(',')[0]));
    expect(samples).toEqual([...samples].sort((a, b) => a - b));
  });

  it('--json prints the summary as JSON on stdout', () => {
    const r = run('display-shell.json', ['--samples', '100', '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.samples).toBe(100);
    expect(s.caution).toContain('never replace');
  });

  it('the same scenario and seed give identical landings; another seed gives different ones', () => {
    const a = run('club-rocket.json', ['--samples', '300', '--seed', 'alpha', '--quiet']);
    const b = run('club-rocket.json', ['--samples', '300', '--seed', 'alpha', '--quiet']);
    const c = run('club-rocket.json', ['--samples', '300', '--seed', 'beta', '--quiet']);
    const read = (o: string) => readFileSync(join(o, 'landings.csv'), 'utf8');
    expect(read(a.out)).toBe(read(b.out));
    expect(read(a.out)).not.toBe(read(c.out));
  });

  it('check prints the scenario in SI units', () => {
    const r = strewn(['check', 'scenarios/club-rocket.json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout);
    expect(s.weather.wind.speed).toBeCloseTo(11 * 0.44704, 9); // 11 mph, exact definition of the mile and hour
    expect(s.weather.temperature).toBeCloseTo(287.15, 9); // 14 C
    expect(s.vehicle.referenceArea).toBeCloseTo(Math.PI * 0.054 ** 2 / 4, 12);
  });

  it('--help and --version answer', () => {
    expect(strewn(['--version']).stdout).toMatch(/^strewn \d+\.\d+\.\d+/);
    for (const c of ['run', 'check']) {
      const r = strewn([c, '--help']);
      expect(r.status).toBe(0);
      expect(r.stdout).toContain(`strewn ${c}`);
    }
  });
});
