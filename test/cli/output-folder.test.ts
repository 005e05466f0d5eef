import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { chmodSync, cpSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CLI, ROOT, SCENARIOS, strewn, tempDir } from './helpers.js';
import { DiskFullError, fileSystemError, sweepLeftovers } from '../../src/cli/output-folder.js';
import { UsageError } from '../../src/cli/errors.js';

/**
 * What `--out` may and may not do to the user's files. Facts of the trade (common practice, no
 * source): a results folder replaced with --force must be one the program wrote; writing goes to a
 * staging folder renamed into place; a lock file created exclusively (O_EXCL) keeps two writers
 * apart; POSIX rename(2) replaces atomically.
 */

const SCENARIO = 'drone-power-loss.json';
const quick = (out: string, ...extra: string[]) => ['run', join(SCENARIOS, SCENARIO), '--samples', '40', '--workers', '1', '--out', out, '--quiet', ...extra];

/** A scenario folder of the user's own: the scenario, a notes file and the motors. */
function userFolder(): string {
  const dir = tempDir();
  cpSync(join(SCENARIOS, SCENARIO), join(dir, SCENARIO));
  cpSync(join(SCENARIOS, 'motors'), join(dir, 'motors'), { recursive: true });
  writeFileSync(join(dir, 'notes.txt'), 'my notes\n');
  return dir;
}

describe('run --out: never destroys a folder strewn did not write', () => {
  it('--out the scenario\'s own folder with --force is refused (exit 2) and every file stays', () => {
    const dir = userFolder();
    const before = readdirSync(dir).sort();
    const r = strewn(['run', join(dir, SCENARIO), '--samples', '40', '--out', dir, '--force', '--quiet']);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('an input of this run');
    expect(readdirSync(dir).sort()).toEqual(before);
  });

  it('--out . --force in the scenario\'s folder is refused', () => {
    const dir = userFolder();
    const r = strewn(['run', SCENARIO, '--samples', '40', '--out', '.', '--force', '--quiet'], { cwd: dir });
    expect(r.status).toBe(2);
    expect(readFileSync(join(dir, 'notes.txt'), 'utf8')).toBe('my notes\n');
  });

  it('a folder of other files is refused even with --force, naming the marker', () => {
    const dir = tempDir();
    const out = join(dir, 'photos');
    mkdirSync(out);
    writeFileSync(join(out, 'holiday.jpg'), 'x');
    const r = strewn(quick(out, '--force'));
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('not written by strewn');
    expect(readdirSync(out)).toEqual(['holiday.jpg']);
  });

  it('a folder strewn wrote is replaced with --force, and the new folder carries the marker', () => {
    const out = join(tempDir(), 'out');
    expect(strewn(quick(out)).status).toBe(0);
    writeFileSync(join(out, 'stale.txt'), 'old');
    const r = strewn(quick(out, '--force'));
    expect(r.status, r.stderr).toBe(0);
    expect(existsSync(join(out, 'stale.txt'))).toBe(false);
    expect(existsSync(join(out, '.strewn-results'))).toBe(true);
    expect(readdirSync(join(out, '..')).sort()).toEqual(['out']);
  });

  it('a --force run that fails keeps the old results as they were', () => {
    const out = join(tempDir(), 'out');
    expect(strewn(quick(out)).status).toBe(0);
    const before = readFileSync(join(out, 'landings.csv'), 'utf8');
    const r = strewn(quick(out, '--force'), { env: { STREWN_TEST_FAULT: 'throw@3x2' } });
    expect(r.status).toBe(1);
    expect(readFileSync(join(out, 'landings.csv'), 'utf8')).toBe(before);
    expect(readdirSync(join(out, '..'))).toEqual(['out']);
  });

  it('a second run on the same --out while the first holds the lock exits 2', () => {
    const dir = tempDir();
    const out = join(dir, 'out');
    // The lock of a live process (this test's own) is held.
    writeFileSync(join(dir, '.out.lock'), `${process.pid} now\n`);
    const r = strewn(quick(out));
    expect(r.status).toBe(2);
    expect(r.stderr).toContain(`another strewn process (${process.pid}) is writing`);
    expect(existsSync(out)).toBe(false);
  });

  it('two runs started together: one writes, the other exits 2; never both succeed', async () => {
    const out = join(tempDir(), 'out');
    const start = () =>
      new Promise<number | null>((resolve) => {
        const child = spawn(process.execPath, [CLI, ...quick(out, '--samples', '2000')], { cwd: ROOT, stdio: 'ignore' });
        child.on('exit', (code) => resolve(code));
      });
    const codes = (await Promise.all([start(), start()])).sort();
    expect(codes).toEqual([0, 2]);
  });

  it('a stale staging folder and lock (process gone) are swept by the next run, which says so', () => {
    const dir = tempDir();
    const dead = 2 ** 22 + 12345; // above Linux's default pid_max of 2^22, so no live process has it
    mkdirSync(join(dir, '.out.partial-deadbeef'));
    writeFileSync(join(dir, '.out.partial-deadbeef', '.strewn-owner'), `${dead}\n`);
    writeFileSync(join(dir, '.out.lock'), `${dead} then\n`);
    const r = strewn(['run', join(SCENARIOS, SCENARIO), '--samples', '40', '--workers', '1', '--out', join(dir, 'out')]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toContain('.out.partial-deadbeef');
    expect(r.stderr).toContain('left by an interrupted run');
    expect(readdirSync(dir)).toEqual(['out']);
  });

  it('a staging folder older than an hour is swept even without an owner file; a fresh one is kept', () => {
    const dir = tempDir();
    mkdirSync(join(dir, '.x.partial-old1'));
    mkdirSync(join(dir, '.x.partial-new1'));
    const twoHoursAgo = Date.now() / 1000 - 7200;
    utimesSync(join(dir, '.x.partial-old1'), twoHoursAgo, twoHoursAgo);
    const removed = sweepLeftovers(dir);
    expect(removed.length).toBe(1);
    expect(readdirSync(dir)).toEqual(['.x.partial-new1']);
  });

  it('a fresh staging folder and lock whose owner file reads empty (being written this instant) are kept', () => {
    // Shards started at once into one folder: one sweeps while another has just created its owner
    // file but not yet written its process number (common practice, no source: a file being
    // written may be read empty).
    const dir = tempDir();
    mkdirSync(join(dir, '.shard-1-of-4.partial-abc123'));
    writeFileSync(join(dir, '.shard-1-of-4.partial-abc123', '.strewn-owner'), '');
    writeFileSync(join(dir, '.shard-2-of-4.lock'), '');
    expect(sweepLeftovers(dir)).toEqual([]);
    expect(readdirSync(dir).sort()).toEqual(['.shard-1-of-4.partial-abc123', '.shard-2-of-4.lock']);
  });

  it('parent folders created for --out are removed again when the run fails', () => {
    const dir = tempDir();
    const out = join(dir, 'a', 'b', 'out');
    // A worker fault on both attempts makes the run fail after --out was prepared.
    const r = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '40', '--out', out, '--quiet'], { env: { STREWN_TEST_FAULT: 'throw@3x2' } });
    expect(r.status).toBe(1);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a symbolic link as --out is followed: the link stays, the folder it points to gets the results', () => {
    const dir = tempDir();
    const real = join(dir, 'real');
    mkdirSync(real);
    symlinkSync(real, join(dir, 'link'));
    expect(strewn(quick(join(dir, 'link'))).status).toBe(0);
    expect(statSync(join(dir, 'link')).isDirectory()).toBe(true);
    expect(existsSync(join(real, 'summary.json'))).toBe(true);
    // Replaced again through the link: still a link.
    expect(strewn(quick(join(dir, 'link'), '--force')).status).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(['link', 'real']);
    symlinkSync(join(dir, 'nowhere'), join(dir, 'dangling'));
    const r = strewn(quick(join(dir, 'dangling')));
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('points to nothing');
  });

  it('the results folder gets the umask\'s permissions, not 0700', () => {
    const out = join(tempDir(), 'out');
    const r = strewn(['run', join(SCENARIOS, SCENARIO), '--samples', '40', '--workers', '1', '--out', out, '--quiet'], {});
    expect(r.status).toBe(0);
    const umask = process.umask();
    expect(statSync(out).mode & 0o777).toBe(0o777 & ~umask);
  });

  it('a path through a file (ENOTDIR) and an unwritable folder (EACCES) give one sentence naming the path, exit 2', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'file'), 'x');
    const r = strewn(quick(join(dir, 'file', 'out')));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^strewn: .*is a file, not a folder; .*\n$/);
    expect(r.stderr).toContain(join(dir, 'file'));
    if (process.getuid?.() !== 0) {
      const locked = join(dir, 'locked');
      mkdirSync(locked);
      chmodSync(locked, 0o500);
      const e = strewn(quick(join(locked, 'out')));
      expect(e.status).toBe(2);
      expect(e.stderr).toContain('no permission');
    }
  });

  it('a full disk (ENOSPC) is one sentence naming the path, exit 1 (not a usage error)', () => {
    const error = fileSystemError(Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' }), '/data/out/landings.csv', 'writing');
    expect(error).toBeInstanceOf(DiskFullError);
    expect(error).not.toBeInstanceOf(UsageError);
    expect(error.message).toBe("the disk is full while writing '/data/out/landings.csv'; free some space (or write elsewhere) and run again");
  });
});
