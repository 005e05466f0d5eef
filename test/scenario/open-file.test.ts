import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, symlinkSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import { readRegularFile, SIZE_LIMITS, excerpt } from '../../src/scenario/open-file.js';
import { SCENARIOS, strewn, tempDir } from '../cli/helpers.js';

/**
 * How files named by the user or by a scenario are opened. Facts of the trade (common practice,
 * no source): opening a FIFO for reading blocks until a writer appears unless O_NONBLOCK is given;
 * character devices such as /dev/zero never reach end of file; fstat on the open descriptor tells a
 * regular file from anything else without a check-then-open race.
 */

const CURVE = '0,0\n0.1,80\n1.0,60\n1.5,0\n';

/** A rocket scenario in a fresh folder whose thrust curve is the path `thrust`. */
function rocketWith(thrust: string, dir = tempDir()): string {
  const json = JSON.parse(readFileSync(join(SCENARIOS, 'club-rocket.json'), 'utf8'));
  json.vehicle.motor.thrust = thrust;
  const path = join(dir, 'rocket.json');
  writeFileSync(path, JSON.stringify(json));
  return path;
}

function issuesOf(fn: () => unknown): string {
  try {
    fn();
  } catch (error) {
    if (error instanceof ScenarioError) return error.message;
    throw error;
  }
  throw new Error('expected a ScenarioError');
}

describe('reading only regular files, with a size cap', () => {
  it('a thrust curve that is a FIFO is refused at once instead of hanging', () => {
    const dir = tempDir();
    execFileSync('mkfifo', [join(dir, 'pipe.csv')]);
    const started = Date.now();
    const message = issuesOf(() => loadScenarioFile(rocketWith('pipe.csv', dir)));
    expect(message).toContain('not a regular file');
    expect(Date.now() - started).toBeLessThan(2000);
  });

  it('/dev/zero is refused without reading it (allowed outside the folder, still not a regular file)', () => {
    const message = issuesOf(() => loadScenarioFile(rocketWith('/dev/zero'), { allowOutsideFiles: true }));
    expect(message).toContain('not a regular file');
  });

  it('a file over the cap implied by 100,000 rows is refused before it is read', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'huge.csv'), '');
    truncateSync(join(dir, 'huge.csv'), SIZE_LIMITS.thrustCsv + 1);
    expect(issuesOf(() => loadScenarioFile(rocketWith('huge.csv', dir)))).toMatch(/more than the 15\.3 MB such a file may have/);
    // The cap leaves room for 100,000 honest rows.
    expect(SIZE_LIMITS.thrustCsv).toBeGreaterThan(100_000 * '12.345678,1234.5678\r\n'.length);
  });

  it('a scenario that is a folder, or a FIFO, is refused with exit 2', () => {
    const dir = tempDir();
    execFileSync('mkfifo', [join(dir, 's.json')]);
    const r = strewn(['check', join(dir, 's.json')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('not a regular file');
    expect(strewn(['check', dir]).stderr).toContain('it is a folder');
  });

  it('readRegularFile reads an ordinary file whole', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'a.csv'), CURVE);
    expect(readRegularFile(join(dir, 'a.csv'), 1000)).toBe(CURVE);
    expect(() => readRegularFile(join(dir, 'a.csv'), 10)).toThrow(/more than/);
  });
});

describe('files named in a scenario stay in its folder unless allowed', () => {
  it('a curve in the folder or below it is read', () => {
    const dir = tempDir();
    mkdirSync(join(dir, 'motors'));
    writeFileSync(join(dir, 'motors', 'g.csv'), CURVE);
    expect(loadScenarioFile(rocketWith('motors/g.csv', dir)).scenario.vehicle.kind).toBe('rocket');
  });

  it('../ leaving the folder, an absolute path and a link pointing out are refused; the option allows them', () => {
    const outer = tempDir();
    writeFileSync(join(outer, 'secret.csv'), CURVE);
    const dir = join(outer, 'scenario');
    mkdirSync(dir);
    symlinkSync(join(outer, 'secret.csv'), join(dir, 'link.csv'));
    for (const path of ['../secret.csv', join(outer, 'secret.csv'), 'link.csv']) {
      const scenario = rocketWith(path, dir);
      expect(issuesOf(() => loadScenarioFile(scenario))).toContain("outside the scenario's folder");
      expect(loadScenarioFile(scenario, { allowOutsideFiles: true }).scenario.vehicle.kind).toBe('rocket');
    }
    const r = strewn(['check', rocketWith('../secret.csv', dir)]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('--allow-outside-files');
    expect(strewn(['check', rocketWith('../secret.csv', dir), '--allow-outside-files']).status).toBe(0);
  });

  it('an error quotes at most the first 60 characters of the offending line', () => {
    const dir = tempDir();
    const secret = 'S'.repeat(500);
    writeFileSync(join(dir, 'bad.csv'), `0,0\n${secret},1\n1,0\n`);
    const message = issuesOf(() => loadScenarioFile(rocketWith('bad.csv', dir)));
    expect(message).not.toContain('S'.repeat(61));
    expect(excerpt('x'.repeat(100))).toHaveLength(60);
  });
});
