import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { editedScenario, strewn } from '../cli/helpers.js';
import { failureWarnings } from '../../src/report/run-summary.js';

/**
 * Runs whose samples fail. The rocket's G motor peaks near 138 N (its curve file), so a rocket of
 * about 10 kg sits on the edge of lifting off (weight m g0 against the peak thrust; g0 = 9.80665
 * m/s², CGPM 1901): with its 2 % mass and 3 % impulse spreads a good share of samples never leave
 * the pad, and at 500 kg none does.
 */

describe('failed samples are never silently dropped', () => {
  it('a run in which every sample failed exits 1, counts the reasons, and writes nothing', () => {
    const path = editedScenario('club-rocket.json', (s) => (s.vehicle.mass = '500 kg'));
    const out = join(path, '..', 'out');
    const r = strewn(['run', path, '--samples', '60', '--workers', '1', '--out', out, '--quiet']);
    expect(r.status).toBe(1);
    expect(r.stderr).toBe('strewn: every one of the 60 samples failed (60 did not leave the pad); nothing was written. Check the scenario (strewn check) for the cause\n');
    expect(existsSync(out)).toBe(false);
  });

  it('more than 1 % failed: the terminal, the sheet and summary.json (which the page shows) warn', () => {
    const path = editedScenario('club-rocket.json', (s) => (s.vehicle.mass = '10 kg'));
    const out = join(path, '..', 'out');
    const r = strewn(['run', path, '--samples', '200', '--workers', '1', '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    expect(summary.failedSamples).toBeGreaterThan(2);
    const warning = summary.warnings[0] as string;
    expect(warning).toMatch(new RegExp(`^${summary.failedSamples} of 200 samples \\(\\d+ %\\) failed to fly to the ground \\(${summary.failedSamples} did not leave the pad\\)`));
    expect(r.stdout).toContain(warning);
    const text = execFileSync('pdftotext', [join(out, 'sheet.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain(`${summary.failedSamples} of 200 samples`);
  });

  it('the threshold is more than 1 %: 1 of 100 gives no warning, 2 of 100 does', () => {
    const f = [{ reason: 'did not leave the pad', samples: 1 }];
    expect(failureWarnings(100, 1, f)).toEqual([]);
    expect(failureWarnings(100, 2, [{ ...f[0], samples: 2 }])).toHaveLength(1);
  });
});
