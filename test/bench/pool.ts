/**
 * Pool benchmark on the club-rocket demo exactly as the file states it (all its spreads, and Dryden
 * turbulence, which its gust switches on): flights per second on one worker and on every core, the
 * speed-up, and `strewn run` end to end (writing all result files) with wall time and peak memory.
 *
 * Environment: BENCH_POOL_SAMPLES samples per throughput run (default 40,000: long enough that
 * starting the workers and warming up their compiled code are a small part of it);
 * BENCH_POOL_PAIRS pairs of runs, one worker and all cores back to back (default 3);
 * BENCH_E2E_SAMPLES (default 100,000).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { nodeWorkerCount, nodeWorkerFactory } from '../../src/pool/node.js';
import { runInPool } from '../../src/pool/pool.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import type { Scenario } from '../../src/scenario/types.js';

export interface ThroughputFigures {
  workers: number;
  samples: number;
  seconds: number;
  flightsPerSecond: number;
  /** CPU seconds of this process (all threads): equal work should cost the same on any worker count. */
  cpuSeconds: number;
  /** CPU seconds other processes used meanwhile (Linux only): a shared machine skews the figures. */
  othersCpuSeconds: number | null;
}

/** CPU seconds the whole machine has spent busy since boot, from /proc/stat (null elsewhere). */
function machineBusySeconds(): number | null {
  if (!existsSync('/proc/stat')) return null;
  // The first line adds up every CPU, in ticks of 1/100 s: user nice system idle iowait irq softirq steal.
  const [user, nice, system, , , irq, softirq, steal] = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/).slice(1, 9).map(Number);
  return (user + nice + system + irq + softirq + steal) / 100;
}

/** One whole pooled run, worker start-up included, as `strewn run` pays it. */
export async function measureThroughput(scenario: Scenario, samples: number, workers: number): Promise<ThroughputFigures> {
  const busyBefore = machineBusySeconds();
  const cpuBefore = process.cpuUsage();
  const started = performance.now();
  await runInPool({ scenario, samples, seed: 'bench-pool' }, { workers, createWorker: nodeWorkerFactory() });
  const seconds = (performance.now() - started) / 1000;
  const cpu = process.cpuUsage(cpuBefore);
  const busyAfter = machineBusySeconds();
  const cpuSeconds = (cpu.user + cpu.system) / 1e6;
  const othersCpuSeconds = busyBefore === null || busyAfter === null ? null : Math.max(0, busyAfter - busyBefore - cpuSeconds);
  return { workers, samples, seconds, flightsPerSecond: samples / seconds, cpuSeconds, othersCpuSeconds };
}

export interface CliFigures {
  samples: number;
  seconds: number;
  /** Largest resident set of the whole process (main thread and every worker), MB. */
  peakRssMB: number;
  cpuSeconds: number;
  othersCpuSeconds: number | null;
}

// Reports the process's peak resident set and CPU time on exit, from inside the measured process.
const USAGE_HOOK =
  'data:text/javascript,process.on("exit",()=>{const u=process.resourceUsage();process.stderr.write("\\nbench-usage "+u.maxRSS+" "+(u.userCPUTime+u.systemCPUTime)+"\\n")})';

/** `strewn run` from the built CLI in a child process, writing its files into a scratch folder. */
export function measureCli(root: string, scenarioFile: string, samples: number): CliFigures {
  const scratch = mkdtempSync(join(tmpdir(), 'strewn-bench-'));
  try {
    const args = ['--import', USAGE_HOOK, join(root, 'dist/src/cli/main.js'), 'run', scenarioFile, '--samples', String(samples), '--out', join(scratch, 'out'), '--quiet'];
    const busyBefore = machineBusySeconds();
    const started = performance.now();
    const r = spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8', env: { ...process.env, STREWN_TEST_FAULT: '' } });
    const seconds = (performance.now() - started) / 1000;
    const busyAfter = machineBusySeconds();
    // The last report is the main thread's, written as the whole process ends.
    const usage = [...(r.stderr ?? '').matchAll(/bench-usage (\d+) (\d+)/g)].at(-1);
    if (r.status !== 0 || !usage) throw new Error(`strewn run --samples ${samples} failed (exit ${r.status}): ${r.stderr}`);
    const cpuSeconds = Number(usage[2]) / 1e6;
    const othersCpuSeconds = busyBefore === null || busyAfter === null ? null : Math.max(0, busyAfter - busyBefore - cpuSeconds);
    return { samples, seconds, peakRssMB: Number(usage[1]) / 1024, cpuSeconds, othersCpuSeconds };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

const TARGET_SPEED_UP = 1.8;
const TARGET_E2E_SECONDS = 20;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 === 1 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

const verdict = (ok: boolean) => (ok ? 'meets target' : 'MISSES target');
const contention = (f: CliFigures) => `\n  its CPU ${f.cpuSeconds.toFixed(1)} s` + (f.othersCpuSeconds === null ? '' : `; other processes meanwhile: ${f.othersCpuSeconds.toFixed(1)} CPU s`);

export async function poolBench(root: string): Promise<void> {
  const file = join(root, 'scenarios/club-rocket.json');
  const { scenario } = loadScenarioFile(file);
  const samples = Number(process.env.BENCH_POOL_SAMPLES ?? 40_000);
  const pairs = Number(process.env.BENCH_POOL_PAIRS ?? 3);
  const cores = nodeWorkerCount();

  console.log(`Worker pool: club-rocket.json with its spreads and turbulence, ${samples.toLocaleString('en')} samples per run`);
  // A shared or virtual machine speeds up and slows down by tens of per cent from one minute to
  // the next, so each speed-up compares two runs made back to back (in alternating order), and
  // the median pair is reported.
  const best = new Map<number, ThroughputFigures>();
  const ratios: number[] = [];
  for (let p = 0; p < pairs; p++) {
    const pair = new Map<number, ThroughputFigures>();
    for (const workers of p % 2 === 0 ? [1, cores] : [cores, 1]) {
      const f = await measureThroughput(scenario, samples, workers);
      const others = f.othersCpuSeconds === null ? '' : `; other processes meanwhile ${f.othersCpuSeconds.toFixed(1)} CPU s`;
      console.log(`  pair ${p + 1}: ${String(workers).padStart(2)} worker(s)  ${f.seconds.toFixed(2).padStart(6)} s  ${f.flightsPerSecond.toFixed(0).padStart(6)} flights/s  (its CPU ${f.cpuSeconds.toFixed(1)} s${others})`);
      pair.set(workers, f);
      if (f.flightsPerSecond > (best.get(workers)?.flightsPerSecond ?? 0)) best.set(workers, f);
    }
    ratios.push(pair.get(cores)!.flightsPerSecond / pair.get(1)!.flightsPerSecond);
  }
  const speedUp = median(ratios);
  console.log(`  best: 1 worker ${best.get(1)!.flightsPerSecond.toFixed(0)} flights/s; ${cores} workers (all cores) ${best.get(cores)!.flightsPerSecond.toFixed(0)} flights/s`);
  console.log(
    `  speed-up per pair ${ratios.map((r) => r.toFixed(2)).join(', ')}; median ${speedUp.toFixed(2)} (target >= ${TARGET_SPEED_UP} with 2 workers${cores === 2 ? '' : `; this machine has ${cores} cores`}): ${verdict(speedUp >= TARGET_SPEED_UP)}`,
  );

  const e2eSamples = Number(process.env.BENCH_E2E_SAMPLES ?? 100_000);
  const e2e = measureCli(root, file, e2eSamples);
  console.log(`strewn run, ${e2eSamples.toLocaleString('en')} samples end to end on ${cores} workers: ${e2e.seconds.toFixed(1)} s, peak ${e2e.peakRssMB.toFixed(0)} MB  (target < ${TARGET_E2E_SECONDS} s: ${verdict(e2e.seconds < TARGET_E2E_SECONDS)})${contention(e2e)}`);

  // The 1,000,000-sample run, with its memory target, is in scale.ts.
}
