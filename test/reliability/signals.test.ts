import { beforeAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { CLI, ROOT, SCENARIOS, editedScenario, strewn, tempDir } from '../cli/helpers.js';

/**
 * SIGTERM and SIGINT (Ctrl-C) in the phases where the main thread used to be busy or had no
 * handler: drawing the sheet, `strewn analyze`, `strewn merge`. Each must stop promptly with exit
 * 130 (128 + SIGINT, the shell's convention; common practice, no source), say so in one line and
 * leave nothing behind: no results folder, no staging folder, no lock, no parent folder it made.
 */

interface Ended {
  code: number | null;
  signal: NodeJS.Signals | null;
  stderr: string;
  at: number;
}

function start(args: string[], env: Record<string, string> = {}) {
  const child = spawn(process.execPath, [CLI, ...args], { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'], env: { ...process.env, ...env } });
  let stderr = '';
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  const ended = new Promise<Ended>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal, stderr, at: performance.now() })));
  return { child, ended, stderr: () => stderr };
}

async function until(what: string, ready: () => boolean, child: { exitCode: number | null }, log: () => string): Promise<void> {
  const deadline = Date.now() + 90_000;
  while (!ready()) {
    if (Date.now() > deadline) throw new Error(`${what} was never seen: ${log()}`);
    if (child.exitCode !== null) throw new Error(`the command ended before ${what}: ${log()}`);
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
}

const locked = (dir: string) => () => existsSync(dir) && readdirSync(dir).some((n) => n.endsWith('.lock'));

describe('a signal while the sheet is drawn', () => {
  it('SIGTERM ends the run within a second although the drawing would take seconds more', async () => {
    // One unbroken 6,000-character name makes the drawing try many line breaks: seconds of work.
    const scenario = editedScenario('club-rocket.json', (s) => (s.name = 'x'.repeat(6000)));
    const dir = tempDir();
    const out = join(dir, 'out');
    const run = start(['run', scenario, '--samples', '200', '--workers', '1', '--out', out], { STREWN_TIMING: '1' });
    // The analysis is over once its phase is reported; the sheet is drawn next.
    await until('the end of the analysis', () => /strewn-phase summary /.test(run.stderr()), run.child, run.stderr);
    await new Promise((resolve) => setTimeout(resolve, 150));
    const signalled = performance.now();
    run.child.kill('SIGTERM');
    const ended = await run.ended;
    expect(ended.code, ended.stderr).toBe(130);
    expect(ended.stderr).toMatch(/strewn: cancelled; nothing was written\n$/);
    expect(ended.at - signalled).toBeLessThan(1000);
    expect(readdirSync(dir)).toEqual([]);
  }, 120_000);
});

describe('strewn analyze and strewn merge answer signals like strewn run', () => {
  let landings: string;
  let shards: string;
  beforeAll(() => {
    const dir = tempDir();
    const r = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '4000', '--out', join(dir, 'run'), '--quiet']);
    expect(r.status, r.stderr).toBe(0);
    landings = join(dir, 'run', 'landings.csv');
    shards = join(dir, 'shards');
    for (const k of [0, 1]) {
      const s = strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '4000', '--shard', `${k}/2`, '--out', shards, '--quiet']);
      expect(s.status, s.stderr).toBe(0);
    }
  }, 240_000);

  it.each(['SIGTERM', 'SIGINT'] as const)('analyze: %s once its folder is taken stops it, removes the folders it made', async (signal) => {
    const dir = tempDir();
    // Two parent folders that do not exist yet: made for --out, removed again on the signal.
    const parent = join(dir, 'made', 'for-it');
    const cmd = start(['analyze', landings, '--scenario', join(SCENARIOS, 'club-rocket.json'), '--out', join(parent, 'out')]);
    await until('the lock', locked(parent), cmd.child, cmd.stderr);
    cmd.child.kill(signal);
    const ended = await cmd.ended;
    expect(ended.signal, 'ended by the signal without cleaning up').toBe(null);
    expect(ended.code, ended.stderr).toBe(130);
    expect(ended.stderr).toBe('strewn: cancelled; nothing was written\n');
    expect(readdirSync(dir)).toEqual([]);
  }, 120_000);

  it('merge: SIGTERM once its folder is taken stops it, removes the folders it made', async () => {
    const dir = tempDir();
    const parent = join(dir, 'made');
    const cmd = start(['merge', shards, '--out', join(parent, 'merged')]);
    await until('the lock', locked(parent), cmd.child, cmd.stderr);
    cmd.child.kill('SIGTERM');
    const ended = await cmd.ended;
    expect(ended.signal, 'ended by the signal without cleaning up').toBe(null);
    expect(ended.code, ended.stderr).toBe(130);
    expect(ended.stderr).toBe('strewn: cancelled; nothing was written\n');
    expect(readdirSync(dir)).toEqual([]);
  }, 120_000);
});
