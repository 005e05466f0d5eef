import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { convertQuantity, type Dimension } from '../../src/scenario/units.js';
import { starterScenario } from '../../src/scenario/starter.js';
import { SCENARIOS, strewn, tempDir } from './helpers.js';
import { pdfText } from '../report/sheet-helpers.js';

/**
 * Inputs people get wrong, end to end through the built command line. Unit factors are the exact
 * definitions (1959 international yard and pound; pound-force = 0.45359237 kg × 9.80665 m/s²,
 * NIST SP 811 appendix B).
 */
const LBF = 4.4482216152605;

function apogeeOf(stderr: string): string {
  return /apogee ([\d,]+ (?:m|ft))/.exec(stderr)?.[1] ?? `no apogee in: ${stderr}`;
}

describe('thrust-curve units end to end', () => {
  it('a curve headed time_s,thrust_lbf flies like the same curve in newtons', () => {
    const dir = tempDir();
    const csv = readFileSync(join(SCENARIOS, 'motors/harrow-g150.csv'), 'utf8').trim().split('\n');
    const inLbf = ['time_s,thrust_lbf', ...csv.slice(1).map((line) => {
      const [t, f] = line.split(',');
      return `${t},${Number(f) / LBF}`;
    })];
    writeFileSync(join(dir, 'lbf.csv'), inLbf.join('\n'));
    const scenario = JSON.parse(readFileSync(join(SCENARIOS, 'club-rocket.json'), 'utf8'));
    scenario.vehicle.motor.thrust = 'lbf.csv';
    writeFileSync(join(dir, 's.json'), JSON.stringify(scenario));
    const original = strewn(['check', join(SCENARIOS, 'club-rocket.json')]);
    const converted = strewn(['check', join(dir, 's.json')]);
    expect(converted.status).toBe(0);
    expect(apogeeOf(converted.stderr)).toBe(apogeeOf(original.stderr));
    // Both flights really fly (read as newtons, the lbf figures would give a far lower apogee).
    expect(Number(apogeeOf(original.stderr).replace(/[^\d]/g, ''))).toBeGreaterThan(300);
  });

  it('an unknown header unit is exit 2 naming the file and line, nothing else', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'm.csv'), 'time_s,thrust_kgf\n0,0\n1,10\n2,0\n');
    const scenario = JSON.parse(readFileSync(join(SCENARIOS, 'club-rocket.json'), 'utf8'));
    scenario.vehicle.motor.thrust = 'm.csv';
    writeFileSync(join(dir, 's.json'), JSON.stringify(scenario));
    const r = strewn(['check', join(dir, 's.json')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("vehicle.motor.thrust: 'm.csv' line 1: header 'time_s,thrust_kgf': the thrust unit 'kgf' is not understood");
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});

/** Replaces every "<number> <unit>" text by the plain SI number the parser makes of it (same operation, same double). */
const DIMENSION_OF: Record<string, Dimension> = { ft: 'length', in: 'length', m: 'length', cm: 'length', mm: 'length', lb: 'mass', oz: 'mass', g: 'mass', kg: 'mass', mph: 'speed', 'ft/s': 'speed', 'm/s': 'speed', lbf: 'force', N: 'force', s: 'time', deg: 'angle' };
function toPlainSI(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(toPlainSI);
  if (value !== null && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, k === 'run' ? { ...(v as object), units: 'metric' } : toPlainSI(v)]));
  if (typeof value !== 'string') return value;
  const unit = /^[-+\d.]+\s*(\S+)$/.exec(value)?.[1];
  const dimension = unit === undefined ? undefined : DIMENSION_OF[unit];
  if (dimension === undefined) return value;
  const q = convertQuantity(value, dimension);
  if (!q.ok) throw new Error(q.message);
  return q.value;
}

describe('the same scenario in SI and in imperial units', () => {
  it('gives byte-identical landings', () => {
    const dir = tempDir();
    const imperial = starterScenario('rocket', 'imperial');
    const si = toPlainSI(imperial) as Record<string, unknown>;
    expect(JSON.stringify(si)).not.toMatch(/ (ft|lb|lbf|mph|in|oz)"/);
    writeFileSync(join(dir, 'imperial.json'), JSON.stringify(imperial));
    writeFileSync(join(dir, 'si.json'), JSON.stringify(si));
    for (const name of ['imperial', 'si']) {
      const r = strewn(['run', join(dir, `${name}.json`), '--samples', '300', '--workers', '2', '--out', join(dir, name), '--quiet']);
      expect(r.status, r.stderr).toBe(0);
    }
    const a = readFileSync(join(dir, 'imperial', 'landings.csv'));
    const b = readFileSync(join(dir, 'si', 'landings.csv'));
    expect(a.length).toBeGreaterThan(1000);
    expect(a.equals(b)).toBe(true);
  });
});

describe('strewn new', () => {
  for (const kind of ['rocket', 'projectile', 'release']) {
    for (const units of ['metric', 'imperial']) {
      it(`writes a ${kind} scenario in ${units} units that validates without warnings`, () => {
        const file = join(tempDir(), `${kind}.json`);
        const made = strewn(['new', file, '--kind', kind, '--units', units]);
        expect(made.status, made.stderr).toBe(0);
        const text = readFileSync(file, 'utf8');
        expect(text).toMatch(units === 'imperial' ? /"\d[\d.]* (ft|lb|mph|in)"/ : /"\d[\d.]* (m|kg|m\/s|mm|cm|g)"/);
        if (units === 'metric') expect(text).not.toMatch(/ (ft|lb|mph|lbf)"/);
        const checked = strewn(['check', file]);
        expect(checked.status, checked.stderr).toBe(0);
        // The point-mass rocket warning (no vehicle.shape) is the rigid-body model's advice, not a slip.
        expect(checked.stderr.split('\n').filter((l) => l.startsWith('warning') && !l.startsWith('warning: vehicle.shape'))).toEqual([]);
      });
    }
  }

  it('refuses to replace a file without --force, and an unknown kind', () => {
    const file = join(tempDir(), 'x.json');
    writeFileSync(file, '{}');
    expect(strewn(['new', file, '--kind', 'rocket']).stderr).toContain('already exists');
    expect(readFileSync(file, 'utf8')).toBe('{}');
    const bad = strewn(['new', join(tempDir(), 'y.json'), '--kind', 'balloon']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain("--kind: 'balloon' is not one of rocket, projectile, release");
  });
});

describe('spreads printed as flown', () => {
  // A launch height of 130 ft with offsets -30 ft to +30 ft flies from 100 ft to 160 ft.
  function shell(dir: string): string {
    const s = starterScenario('projectile', 'imperial') as Record<string, any>;
    s.launch.height = '130 ft';
    s.uncertainty['launch.height'] = { range: ['-30 ft', '30 ft'] };
    const file = join(dir, 'shell.json');
    writeFileSync(file, JSON.stringify(s));
    return file;
  }

  it('in check', () => {
    const r = strewn(['check', shell(tempDir())]);
    expect(r.status).toBe(0);
    expect(r.stderr).toContain('launch height: 130 ft, \u221230 to +30 ft \u2192 100\u2013160 ft');
  });

  it('on the review sheet, in the units of run.units', () => {
    const dir = tempDir();
    const r = strewn(['run', shell(dir), '--samples', '100', '--workers', '1', '--out', join(dir, 'out'), '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    const text = pdfText(join(dir, 'out', 'sheet.pdf'));
    expect(text).toContain('launch height: 130 ft, -30 to +30 ft -> 100');
    expect(text).not.toContain('uniform -30');
  });
});

describe('check prints descent rates at the pad', () => {
  it('for a canopy given by diameter and drag coefficient, with the canopy note', () => {
    const dir = tempDir();
    const file = join(dir, 'r.json');
    writeFileSync(file, JSON.stringify(starterScenario('rocket', 'metric')));
    const r = strewn(['check', file, '--units', 'imperial']);
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/main: \d+ ft\/s \([\d.]+ m\/s\) at the pad, \d+ ft\/s at sea level; canopy 35\.4 in across, Cd 0\.8 \(flat circular\)/);
    expect(r.stderr).toContain("note: a canopy's drag coefficient depends on its shape");
  });
});


describe('sheet on a folder written by analyze', () => {
  it('analyze with --scenario writes the sheet, prints area chances like run, and strewn sheet redraws it', () => {
    const dir = tempDir();
    const scenario = join(dir, 'r.json');
    writeFileSync(scenario, JSON.stringify(starterScenario('rocket', 'metric')));
    expect(strewn(['run', scenario, '--samples', '200', '--workers', '1', '--out', join(dir, 'run'), '--quiet']).status).toBe(0);
    const a = strewn(['analyze', join(dir, 'run', 'landings.csv'), '--scenario', scenario, '--out', join(dir, 'an'), '--units', 'imperial']);
    expect(a.status, a.stderr).toBe(0);
    expect(a.stdout).toMatch(/area {11}Spectators \(spectators\): \d+ hits?, chance per flight [\d.]+ %, 95 % upper bound [\d.]+ %/);
    expect(a.stdout).toMatch(/reaches [\d,]+ ft from the pad/);
    const s = strewn(['sheet', join(dir, 'an')]);
    expect(s.status, s.stderr).toBe(0);
    expect(pdfText(join(dir, 'an', 'sheet.pdf'))).toContain('landings recorded in landings.csv');
  });

  it('without --scenario, strewn sheet says why it cannot draw one', () => {
    const dir = tempDir();
    const csv = join(dir, 'l.csv');
    writeFileSync(csv, 'east_m,north_m\n' + Array.from({ length: 60 }, (_, i) => `${(i % 7) * 3},${Math.floor(i / 7) * 4}`).join('\n'));
    expect(strewn(['analyze', csv, '--pad', '47.3,8.0', '--out', join(dir, 'an'), '--quiet']).status).toBe(0);
    const s = strewn(['sheet', join(dir, 'an')]);
    expect(s.status).toBe(2);
    expect(s.stderr).toContain('written by strewn analyze without --scenario');
  });
});
