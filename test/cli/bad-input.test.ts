import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync, writeFileSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { editedScenario, strewn, tempDir } from './helpers.js';

type Edit = (s: Record<string, any>) => void;

// Each broken scenario must exit 2, name the field in its message, print no stack trace, and leave
// no output folder behind.
const BROKEN: [string, Edit, string][] = [
  ['missing name', (s) => delete s.name, 'name'],
  ['missing vehicle', (s) => delete s.vehicle, 'vehicle'],
  ['mass of the wrong type', (s) => (s.vehicle.mass = true), 'vehicle.mass'],
  ['mass given as NaN', (s) => (s.vehicle.mass = 'NaN kg'), 'vehicle.mass'],
  ['negative mass', (s) => (s.vehicle.mass = -1.2), 'vehicle.mass'],
  ['unknown unit', (s) => (s.weather.wind.speed = '12 furlongs'), 'weather.wind.speed'],
  ['unit of the wrong dimension', (s) => (s.launch.rail = '2 kg'), 'launch.rail'],
  ['rail tilt beyond vertical', (s) => (s.launch.tilt = '95 deg'), 'launch.tilt'],
  ['unsorted thrust curve', (s) => (s.vehicle.motor.thrust = [[0, 0], [0.5, 100], [0.3, 80], [1, 0]]), 'vehicle.motor.thrust'],
  ['failure probabilities over 1', (s) => (s.failures = [{ name: 'a', probability: 0.7, stage: 'main' }, { name: 'b', probability: 0.6, stage: 'all' }]), 'failures'],
  ['samples over the cap', (s) => (s.run.samples = 20_000_000), 'run.samples'],
  ['failure naming a missing stage', (s) => (s.failures[0].stage = 'mainn'), 'failures[0].stage'],
];

describe('strewn run: broken scenarios exit 2 naming the field, write nothing', () => {
  it.each(BROKEN)('%s', (_name, edit, field) => {
    const path = editedScenario('club-rocket.json', edit);
    const out = join(dirname(path), 'out');
    const r = strewn(['run', path, '--out', out, '--samples', '50', '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(field);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(out)).toBe(false);
    expect(readdirSync(dirname(path)).filter((f) => f.includes('partial'))).toEqual([]);
  });

  it('reports several problems of one file together', () => {
    const path = editedScenario('club-rocket.json', (s) => {
      s.vehicle.mass = -1;
      s.launch.tilt = '95 deg';
      s.weather.wind.speed = '3 parsecs';
    });
    const r = strewn(['check', path]);
    expect(r.status).toBe(2);
    for (const f of ['vehicle.mass', 'launch.tilt', 'weather.wind.speed']) expect(r.stderr).toContain(f);
  });

  it('a JSON syntax error names the line', () => {
    const dir = tempDir();
    const path = join(dir, 'broken.json');
    writeFileSync(path, '{\n  "strewn": 1,\n  "name": "x",\n  oops\n}');
    const r = strewn(['check', path]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/line 4/);
  });

  it('a missing file exits 2', () => {
    const r = strewn(['run', '/nonexistent/scenario.json', '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('no such file');
  });

  it('--max-samples lifts the samples cap', () => {
    const path = editedScenario('drone-power-loss.json', (s) => (s.run.samples = 20_000_000));
    expect(strewn(['check', path]).status).toBe(2);
    expect(strewn(['check', path, '--max-samples', '30000000']).status).toBe(0);
  });

  it.each([
    [['run', 'scenarios/club-rocket.json', '--samples', 'many'], '--samples'],
    [['run', 'scenarios/club-rocket.json', '--samples', '0'], '--samples'],
    [['run', 'scenarios/club-rocket.json', '--workers', '-2'], '--workers'],
    [['run', 'scenarios/club-rocket.json', '--colour'], 'colour'],
    [['fly', 'scenarios/club-rocket.json'], "unknown command 'fly'"],
    [['run'], 'scenario file'],
  ])('bad options %j exit 2', (args, text) => {
    const r = strewn(args as string[]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(text);
  });

  it('refuses a non-empty output folder without --force', () => {
    const out = tempDir();
    writeFileSync(join(out, 'keep.txt'), 'mine');
    const r = strewn(['run', 'scenarios/drone-power-loss.json', '--samples', '20', '--out', out, '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--force');
    expect(readdirSync(out)).toEqual(['keep.txt']);
  });
});
