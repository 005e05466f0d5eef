import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SCENARIOS, strewn, tempDir } from '../cli/helpers.js';

/**
 * A full disk, for real: ENOSPC (POSIX write(2): "no space left on device") must end a command
 * with exit 1 and one sentence naming the path, leave nothing half-written and keep the old
 * results as they were. A folder cannot live on /dev/full, so a results folder is written onto a
 * tiny tmpfs (mounting needs root or CAP_SYS_ADMIN; without it that test says so and is skipped),
 * and a single file onto /dev/full itself (Linux: every write to it fails with ENOSPC).
 */

const disk = tempDir('strewn-full-');
const mounted = (() => {
  if (process.platform !== 'linux') return false;
  // 1.5 MB: room for a 200-sample results folder (~0.6 MB), not for a second one of 3,000 (~2 MB).
  const r = spawnSync('mount', ['-t', 'tmpfs', '-o', 'size=1536k', 'strewn-test-full', disk], { encoding: 'utf8' });
  return r.status === 0;
})();

afterAll(() => {
  if (mounted) spawnSync('umount', [disk]);
});

function snapshot(folder: string): Record<string, string> {
  return Object.fromEntries(readdirSync(folder).sort().map((name) => [name, readFileSync(join(folder, name)).toString('base64')]));
}

describe('a full disk', () => {
  it.skipIf(!mounted)('run --force onto a full tmpfs: exit 1, one sentence, nothing half-written, the old results intact', () => {
    const out = join(disk, 'club');
    const first = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '200', '--workers', '1', '--out', out, '--quiet']);
    expect(first.status, first.stderr).toBe(0);
    const before = snapshot(out);

    const r = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '3000', '--out', out, '--force', '--quiet']);
    expect(r.status, r.stderr).toBe(1);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(new RegExp(`^strewn: the disk is full while writing '${out}/[a-z.]+'; free some space \\(or write elsewhere\\) and run again$`));
    expect(r.stderr).not.toMatch(/ENOSPC|at .*\.js:\d+/);
    // Only the old folder: no staging folder, no lock, no folder set aside.
    expect(readdirSync(disk)).toEqual(['club']);
    expect(snapshot(out)).toEqual(before);
  }, 180_000);

  it.skipIf(!mounted)('a parent folder made for --out on the full disk is removed again', () => {
    // Fill what is left, then ask for results in folders that do not exist yet.
    const filler = join(disk, 'filler');
    mkdirSync(filler, { recursive: true });
    try {
      for (let i = 0; ; i++) writeFileSync(join(filler, `f${i}`), Buffer.alloc(64 * 1024));
    } catch {
      // full
    }
    const r = strewn(['run', join(SCENARIOS, 'drone-power-loss.json'), '--samples', '50', '--workers', '1', '--out', join(disk, 'new', 'deeper', 'out'), '--quiet']);
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toMatch(/^strewn: the disk is full while /);
    expect(existsSync(join(disk, 'new'))).toBe(false);
  }, 120_000);

  it.skipIf(!existsSync('/dev/full'))('strewn new onto /dev/full: exit 1 and one sentence', () => {
    const r = strewn(['new', '/dev/full', '--kind', 'rocket', '--force']);
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toBe("strewn: the disk is full while writing '/dev/full'; free some space (or write elsewhere) and run again\n");
  });

  it.skipIf(!mounted)('strewn new --force over a file on a full disk keeps the old file whole', () => {
    const file = join(disk, 'filler', 'f0');
    const old = readFileSync(file);
    const r = strewn(['new', file, '--kind', 'rocket', '--force']);
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toMatch(/^strewn: the disk is full while writing '.*f0'; free some space/);
    expect(readFileSync(file).equals(old)).toBe(true);
    expect(readdirSync(join(disk, 'filler')).filter((n) => n.includes('partial'))).toEqual([]);
  });
});
