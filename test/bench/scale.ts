/**
 * The figures of the scale issue, each with its target and conditions: start-up time of the
 * command line, `strewn run` end to end at 20,000 samples on 1 and 2 workers (with the longest
 * main-thread phase), and peak memory at 1,000,000 samples. 10,000,000 samples (several minutes)
 * runs only with BENCH_10M=1.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';

const USAGE_HOOK =
  'data:text/javascript,process.on("exit",()=>{const u=process.resourceUsage();process.stderr.write("\\nbench-usage "+u.maxRSS+" "+(u.userCPUTime+u.systemCPUTime)+"\\n")})';

interface Timed {
  seconds: number;
  /** CPU seconds of the whole process, every thread (a loaded host inflates them less than wall time). */
  cpuSeconds: number;
  peakMB: number;
  phases: [string, number][];
}

function strewn(root: string, args: string[]): Timed {
  const started = performance.now();
  const r = spawnSync(process.execPath, ['--import', USAGE_HOOK, join(root, 'dist/src/cli/main.js'), ...args], {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, STREWN_TIMING: '1', STREWN_TEST_FAULT: '' },
    maxBuffer: 1 << 26,
  });
  const seconds = (performance.now() - started) / 1000;
  if (r.status !== 0) throw new Error(`strewn ${args.join(' ')} failed (exit ${r.status}): ${r.stderr}`);
  const usage = [...r.stderr.matchAll(/bench-usage (\d+) (\d+)/g)].at(-1);
  const phases = [...r.stderr.matchAll(/strewn-phase (.+) ([\d.]+)$/gm)].map((m): [string, number] => [m[1], Number(m[2]) / 1000]);
  return { seconds, cpuSeconds: usage ? Number(usage[2]) / 1e6 : NaN, peakMB: usage ? Number(usage[1]) / 1024 : NaN, phases };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const verdict = (ok: boolean) => (ok ? 'meets target' : 'MISSES target');

export function scaleBench(root: string): void {
  const scenario = join(root, 'scenarios/club-rocket.json');
  const scratch = mkdtempSync(join(tmpdir(), 'strewn-scale-bench-'));
  try {
    console.log(`Scale (issue 13): ${cpus().length} cores, load average ${loadavg().map((l) => l.toFixed(1)).join(' ')} at the start`);
    for (const [label, args] of [
      ['strewn --version', ['--version']],
      ['strewn --help', ['--help']],
      ['strewn check (club rocket)', ['check', scenario]],
    ] as const) {
      const runs = Array.from({ length: 5 }, () => strewn(root, [...args]).seconds);
      const m = median(runs);
      console.log(`  ${label.padEnd(28)} median of 5: ${m.toFixed(3)} s  (target < 0.15 s: ${verdict(m < 0.15)})`);
    }

    const e2e = (workers: number) => strewn(root, ['run', scenario, '--samples', '20000', '--workers', String(workers), '--out', join(scratch, `e2e-${workers}`), '--force', '--quiet']);
    const pairs = Number(process.env.BENCH_SCALE_PAIRS ?? 2);
    const ratios: number[] = [];
    let last: Timed | null = null;
    for (let p = 0; p < pairs; p++) {
      // Back to back, the order alternating, so a change of load between minutes favours neither.
      const [one, two] = p % 2 === 0 ? [e2e(1), e2e(2)] : [e2e(2), e2e(1)].reverse();
      last = two;
      ratios.push(one.seconds / two.seconds);
      console.log(
        `  strewn run, 20,000 samples, end to end: 1 worker ${one.seconds.toFixed(2)} s (${one.cpuSeconds.toFixed(2)} cpu s), ` +
          `2 workers ${two.seconds.toFixed(2)} s (${two.cpuSeconds.toFixed(2)} cpu s) (speed-up ${(one.seconds / two.seconds).toFixed(2)}; load ${loadavg()[0].toFixed(1)})`,
      );
    }
    const speedUp = median(ratios);
    console.log(`  end-to-end speed-up, 2 workers over 1, median of ${pairs}: ${speedUp.toFixed(2)}  (target >= 1.8: ${verdict(speedUp >= 1.8)})`);
    if (last) {
      // Phases in which the main thread only waits for other threads (the flights, the sheet) are not its work.
      const mainThread = last.phases.filter(([name]) => !/waits\)$/.test(name));
      const longest = mainThread.reduce((a, b) => (b[1] > a[1] ? b : a));
      console.log(`  main-thread phases at 20,000 samples, 2 workers: ${mainThread.filter(([, s]) => s >= 0.01).map(([n, s]) => `${n} ${s.toFixed(2)} s`).join('; ')}`);
      console.log(`  longest main-thread phase: ${longest[0]} ${longest[1].toFixed(2)} s  (target <= 0.15 s: ${verdict(longest[1] <= 0.15)})`);
    }

    if (process.env.BENCH_SKIP_1M !== '1') {
      const big = strewn(root, ['run', scenario, '--samples', '1000000', '--out', join(scratch, 'big'), '--force', '--quiet']);
      console.log(`  strewn run, 1,000,000 samples, all cores: ${big.seconds.toFixed(1)} s, peak resident ${big.peakMB.toFixed(0)} MB  (target < 400 MB: ${verdict(big.peakMB < 400)})`);
    } else console.log('  1,000,000 samples: skipped (BENCH_SKIP_1M=1)');
    if (process.env.BENCH_10M === '1') {
      // The pipeline's memory does not depend on the vehicle (the same columns per sample); a
      // quicker vehicle (BENCH_10M_SCENARIO=display-shell) measures it in a fraction of the time.
      const name = process.env.BENCH_10M_SCENARIO ?? 'club-rocket';
      const huge = strewn(root, ['run', join(root, 'scenarios', `${name}.json`), '--samples', '10000000', '--out', join(scratch, 'huge'), '--force', '--quiet']);
      const longest = huge.phases.filter(([n]) => !/waits\)$/.test(n)).reduce((a, b) => (b[1] > a[1] ? b : a));
      console.log(`  strewn run, 10,000,000 samples of ${name}, all cores: ${huge.seconds.toFixed(0)} s, peak resident ${huge.peakMB.toFixed(0)} MB  (target < 1,536 MB: ${verdict(huge.peakMB < 1536)}); longest main-thread phase ${longest[0]} ${longest[1].toFixed(1)} s`);
    } else console.log('  10,000,000 samples: not run (several minutes; BENCH_10M=1 runs it)');
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}
