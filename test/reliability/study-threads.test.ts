import { describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CLI, ROOT, SCENARIOS, strewn, tempDir } from '../cli/helpers.js';
import { loadForCommand } from '../../src/cli/scenario-input.js';
import { runInPool } from '../../src/pool/pool.js';
import { nodeWorkerFactory } from '../../src/pool/node.js';
import { StudyThread, StudyTaskError } from '../../src/cli/study-thread.js';
import { landingFiles } from '../../src/report/result-data-files.js';
import { landingSetFromRun } from '../../src/analysis/from-run.js';
import { studyAnalysis, studySpreadSensitivity } from '../../src/report/study.js';

/**
 * `strewn run` analyses and writes its results in threads of its own after the flights
 * (src/cli/study-thread.ts, workers/study-entry.ts). A failure there must end the run like one in
 * the main thread: exit 1, one sentence, nothing left behind; a signal while a thread writes must
 * stop the run at once (exit 130, 128 + SIGINT, the shell's convention; common practice, no
 * source) and leave nothing, not even a file the thread was writing. And a thread's work must be
 * the main thread's, number for number and byte for byte.
 */

const run = (dir: string, env: Record<string, string>) =>
  strewn(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '300', '--workers', '1', '--out', join(dir, 'made', 'out')], { env });

describe('a failure in a study thread', () => {
  it.each([
    ['landings', 'strewn: writing the landings files failed: test fault in the landings task\n'],
    ['analysis', 'strewn: the analysis failed: test fault in the analysis task\n'],
    ['sensitivity', 'strewn: the sensitivity study failed: test fault in the sensitivity task\n'],
  ])('in the %s task: exit 1, one sentence, nothing left behind', (task, message) => {
    const dir = tempDir();
    const r = run(dir, { STREWN_TEST_THREAD_FAULT: `throw:${task}` });
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toBe(message);
    // Not even the parent folder made for --out.
    expect(readdirSync(dir)).toEqual([]);
  }, 120_000);
});

describe('a signal while the landings thread writes', () => {
  it('SIGTERM stops the run within a second (exit 130) and leaves nothing behind', async () => {
    const dir = tempDir();
    const out = join(dir, 'out');
    // slow: the thread waits 0.5 s after each piece it writes, so the writing lasts seconds.
    const child = spawn(process.execPath, [CLI, 'run', join(SCENARIOS, 'club-rocket.json'), '--samples', '2000', '--workers', '1', '--out', out, '--quiet'], {
      cwd: ROOT,
      stdio: ['ignore', 'ignore', 'pipe'],
      env: { ...process.env, STREWN_TEST_THREAD_FAULT: 'slow:landings' },
    });
    let stderr = '';
    child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
    const exited = new Promise<{ code: number | null; at: number }>((resolve) => child.on('exit', (code) => resolve({ code, at: performance.now() })));
    const writing = () => readdirSync(dir).some((s) => s.startsWith('.out.partial-') && existsSync(join(dir, s, 'landings.csv')));
    const deadline = Date.now() + 90_000;
    while (!writing()) {
      if (Date.now() > deadline || child.exitCode !== null) throw new Error(`the writing was never seen: ${stderr}`);
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    const signalled = performance.now();
    child.kill('SIGTERM');
    const ended = await exited;
    expect(ended.code, stderr).toBe(130);
    expect(stderr).toBe('strewn: cancelled; nothing was written\n');
    expect(ended.at - signalled).toBeLessThan(1000);
    expect(readdirSync(dir)).toEqual([]);
  }, 120_000);
});

describe('a study thread does what the main thread does', () => {
  it('same analysis, sensitivity and landings bytes from shared columns; a bad folder is an error naming the file', async () => {
    const loaded = await loadForCommand(join(SCENARIOS, 'club-rocket.json'), 1e6, false);
    const scenario = loaded.scenario;
    const result = await runInPool({ scenario, samples: 400, seed: 'threads' }, { workers: 1, createWorker: nodeWorkerFactory(), sharedColumns: true });
    expect(result.east.buffer).toBeInstanceOf(SharedArrayBuffer);
    const dir = tempDir();
    const analysis = StudyThread.start(['analysis']);
    const side = StudyThread.start(['sensitivity', 'landings']);
    try {
      const [a, s, w] = await Promise.all([
        analysis.run<{ analysis: unknown }>({ task: 'analysis', scenario, run: result }),
        side.run<{ sensitivity: unknown }>({ task: 'sensitivity', scenario, run: result }),
        side.run({ task: 'landings', scenario, run: result, folder: dir }),
      ]);
      const set = landingSetFromRun(result, scenario);
      // The analysis carries its own stage times, which differ from run to run.
      const { timing_ms: _t1, ...fromThread } = a.analysis as Record<string, unknown>;
      const { timing_ms: _t2, ...here } = studyAnalysis(scenario, result, set) as unknown as Record<string, unknown>;
      expect(fromThread).toEqual(here);
      expect(s.sensitivity).toEqual(studySpreadSensitivity(scenario, result));
      expect(w).toEqual({ written: true });
      const mine = join(dir, 'mine');
      mkdirSync(mine);
      for (const [name, content] of landingFiles(scenario, set)) {
        const pieces = typeof content === 'string' || content instanceof Uint8Array ? [content] : [...content];
        writeFileSync(join(mine, name), Buffer.concat(pieces.map((p) => (typeof p === 'string' ? Buffer.from(p) : p))));
        expect(readFileSync(join(dir, name)).equals(readFileSync(join(mine, name))), name).toBe(true);
      }
      // A folder that does not exist: the system error's code and the file come back.
      const failed = await side.run({ task: 'landings', scenario, run: result, folder: join(dir, 'missing') }).catch((e: unknown) => e);
      expect(failed).toBeInstanceOf(StudyTaskError);
      expect(failed).toMatchObject({ code: 'ENOENT', file: 'landings.csv' });
    } finally {
      await Promise.all([analysis.stop(), side.stop()]);
    }
  }, 120_000);
});
