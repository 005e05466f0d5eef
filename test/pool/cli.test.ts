import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import type { ChildProcess } from 'node:child_process';
import { landings, leftBehind, removeScratch, scratch, startStrewn, strewnSync } from './cli-helpers.js';

/** The built `strewn run` with its worker pool (npm test builds first). */

const SAMPLES = 3000;
const runArgs = (out: string, workers: number) => ['run', 'scenarios/club-rocket.json', '--samples', String(SAMPLES), '--workers', String(workers), '--out', out, '--quiet'];

const undisturbed = new Map<number, string>();
/** landings.csv of an undisturbed run with this many workers (run once, then reused). */
function cleanLandings(workers: number): string {
  let csv = undisturbed.get(workers);
  if (csv === undefined) {
    const { out } = scratch();
    const r = strewnSync(runArgs(out, workers));
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    csv = landings(out);
    undisturbed.set(workers, csv);
  }
  return csv;
}

describe('strewn run on the worker pool', () => {
  afterAll(removeScratch);

  it('writes byte-identical landings.csv with 1, 2 and 4 workers', () => {
    const one = cleanLandings(1);
    const rows = one.trimEnd().split('\n');
    expect(rows.length).toBeGreaterThan(SAMPLES * 0.9); // header + landed samples; failures are few
    expect(rows.at(-1)!.split(',')[0]).toBe(String(SAMPLES - 1));
    expect(cleanLandings(2) === one).toBe(true);
    expect(cleanLandings(4) === one).toBe(true);
  });

  it.each(['exit@1234', 'throw@1234'])('a worker fault (%s) is retried and the results match the undisturbed run byte for byte', (fault) => {
    const { out } = scratch();
    const r = strewnSync(runArgs(out, 2), { STREWN_TEST_FAULT: fault });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(landings(out) === cleanLandings(2)).toBe(true);
  });

  it.each([
    ['exit@1234x2', 'worker thread stopped unexpectedly (exit code 70)'],
    ['throw@1234x2', 'test fault at sample 1234'],
  ])('a fault on both attempts (%s) exits 1 naming the sample range and the cause, writing nothing', (fault, cause) => {
    const { folder, out } = scratch();
    const r = strewnSync(runArgs(out, 2), { STREWN_TEST_FAULT: fault });
    expect(r.status).toBe(1);
    const m = /^strewn: samples (\d+) to (\d+) failed twice, on two workers \(both times: (.*)\)\n$/.exec(r.stderr);
    expect(m, r.stderr).not.toBeNull();
    expect(Number(m![1])).toBeLessThanOrEqual(1234);
    expect(Number(m![2])).toBeGreaterThanOrEqual(1234);
    expect(m![3]).toBe(cause);
    expect(leftBehind(folder)).toEqual([]);
  });

  it('Ctrl-C stops a big run within a second, exit 130, and leaves no folder behind', async () => {
    const { folder, out } = scratch();
    const child = startStrewn(['run', 'scenarios/club-rocket.json', '--samples', '1000000', '--workers', '2', '--out', out]);
    const exited = exitOf(child);
    let stderr = '';
    child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));

    // The staging folder appears right before the Ctrl-C handler is set and the workers start.
    const deadline = performance.now() + 20_000;
    while (!readdirSync(folder).some((name) => name.startsWith('.out.partial-'))) {
      if (performance.now() > deadline) throw new Error(`the run never started: ${stderr}`);
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    await new Promise((resolve) => setTimeout(resolve, 1000));
    const signalled = performance.now();
    child.kill('SIGINT');
    const { code, at, stderr: said } = await exited;

    expect(code).toBe(130);
    expect(said).toBe('strewn: cancelled; nothing was written\n');
    expect(at - signalled).toBeLessThan(1000);
    expect(existsSync(out)).toBe(false);
    expect(leftBehind(folder)).toEqual([]);
  });

  // Linux only: the worker threads are counted in /proc to see when the flights are over.
  it.skipIf(!existsSync('/proc/self/task'))('Ctrl-C during the analysis (after the workers are gone) still leaves nothing behind', async () => {
    const { folder, out } = scratch();
    const child = startStrewn(['run', 'scenarios/club-rocket.json', '--samples', '50000', '--workers', '2', '--out', out]);
    const ended = exitOf(child);
    const threads = () => {
      try {
        return readdirSync(`/proc/${child.pid}/task`).length;
      } catch {
        return 0;
      }
    };
    // The two worker threads are the last the process starts while the samples fly; once the
    // count is two below its peak, both are gone and the main thread is analysing and writing.
    let most = 0;
    for (;;) {
      const now = threads();
      if (now === 0 && most > 0) throw new Error('the run ended before its workers were seen to finish');
      most = Math.max(most, now);
      if (now > 0 && now <= most - 2) break;
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    child.kill('SIGINT');
    const { code, stderr } = await ended;
    expect(code).toBe(130);
    expect(stderr).toBe('strewn: cancelled; nothing was written\n');
    expect(existsSync(out)).toBe(false);
    expect(leftBehind(folder)).toEqual([]);
  });
});

function exitOf(child: ChildProcess): Promise<{ code: number | null; stderr: string; at: number }> {
  let stderr = '';
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  return new Promise((resolve) => child.on('exit', (code) => resolve({ code, stderr, at: performance.now() })));
}
