import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { CLI, ROOT, SCENARIOS, strewn, tempDir } from '../cli/helpers.js';

/**
 * kill -9 (SIGKILL cannot be caught, POSIX) leaves the staging folder and the lock behind; the next
 * run on the same folder sweeps them (their process is gone) and says so.
 */

async function killWhen(args: string[], ready: () => boolean): Promise<void> {
  const child = spawn(process.execPath, [CLI, ...args], { cwd: ROOT, stdio: 'ignore' });
  const exited = new Promise((resolve) => child.on('exit', resolve));
  const deadline = Date.now() + 60_000;
  while (!ready()) {
    if (Date.now() > deadline) throw new Error('the moment to kill never came');
    if (child.exitCode !== null) throw new Error('the run ended before it could be killed');
    await new Promise((resolve) => setTimeout(resolve, 5));
  }
  child.kill('SIGKILL');
  await exited;
}

const staging = (dir: string) => readdirSync(dir).filter((n) => n.startsWith('.out.partial-'));

describe('kill -9, then a new run', () => {
  it.each([
    ['flying', (dir: string) => staging(dir).length > 0],
    // landings.csv is the first file written: the flights are over and the writing has begun.
    ['writing', (dir: string) => staging(dir).some((s) => existsSync(join(dir, s, 'landings.csv')))],
  ])('killed while %s: the leftovers are swept by the next run', async (_phase, ready) => {
    const dir = tempDir();
    const out = join(dir, 'out');
    await killWhen(['run', join(SCENARIOS, 'drone-power-loss.json'), '--samples', '60000', '--workers', '1', '--out', out, '--quiet'], () => ready(dir));
    expect(existsSync(out)).toBe(false);
    expect(staging(dir)).toHaveLength(1);
    expect(readdirSync(dir)).toContain('.out.lock');
    const r = strewn(['run', join(SCENARIOS, 'drone-power-loss.json'), '--samples', '40', '--workers', '1', '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/note: removed .*\.out\.partial-\w+ \(its process \d+ is gone\), left by an interrupted run/);
    expect(r.stderr).toMatch(/note: removed .*\.out\.lock \(its process \d+ is gone\)/);
    expect(readdirSync(dir)).toEqual(['out']);
  }, 90_000);
});

describe('SIGTERM', () => {
  it('while the results are being written stops the run (exit 130) and leaves nothing behind', async () => {
    const dir = tempDir();
    const out = join(dir, 'out');
    const child = spawn(process.execPath, [CLI, 'run', join(SCENARIOS, 'drone-power-loss.json'), '--samples', '60000', '--workers', '1', '--out', out, '--quiet'], { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    const deadline = Date.now() + 60_000;
    while (!staging(dir).some((s) => existsSync(join(dir, s, 'landings.csv')))) {
      if (Date.now() > deadline || child.exitCode !== null) throw new Error(`the writing was never seen: ${stderr}`);
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    child.kill('SIGTERM');
    expect(await exited).toBe(130);
    expect(stderr).toBe('strewn: cancelled; nothing was written\n');
    expect(readdirSync(dir)).toEqual([]);
  }, 90_000);
});
