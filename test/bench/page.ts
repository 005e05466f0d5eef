/**
 * The page against the command line at 20,000 samples (issue 13: "the page within 1.2× of the
 * command line"). Runs only when BENCH_PAGE=1 (bench.ts), or on its own:
 * `node dist/test/bench/page.js` after `npx tsc -p tsconfig.json`.
 *
 * Page: the built workspace (the same Vite build as `npm run build:web`) served on 127.0.0.1,
 * headless Debian chromium, the club rocket with run.samples 20,000 and the browser's own worker
 * count (navigator.hardwareConcurrency). Timed from pressing Run to the results shown: the run
 * phase "finished" (summary and findings drawn) and the map idle with the zone drawn.
 * Command line: `strewn run scenarios/club-rocket.json --samples 20000` with its default workers,
 * timed from start to exit (it starts Node, flies, analyses, writes its files and draws the sheet).
 * The two alternate, pair by pair, so both see the same load.
 *
 * CPU seconds: the command line's from /usr/bin/time (user + system of the process and its
 * threads); the page's from /proc, the user + system time the browser's processes (renderer with
 * its workers, GPU process, browser) spent between pressing Run and the results shown.
 *
 * Environment: BENCH_PAGE_PAIRS (default 3), BENCH_PAGE_SAMPLES (default 20,000).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { buildWebApp, launchChromium, serveStatic } from '../web/browser-kit.js';

const TARGET = 1.2;

interface PageTiming {
  wall_s: number;
  cpu_s: number;
  /** The page's own marks (performance.mark in web/src/app/controller.ts), seconds from Run. */
  marks: Record<string, number>;
}

interface CliTiming {
  wall_s: number;
  cpu_s: number;
  peakMB: number;
}

const TICKS_PER_SECOND = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;

/** User + system CPU seconds of every living descendant of this process (the browser's processes). */
function descendantCpuSeconds(): number {
  const parent = new Map<number, number>();
  const ticks = new Map<number, number>();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    let stat: string;
    try {
      stat = readFileSync(`/proc/${name}/stat`, 'utf8');
    } catch {
      continue; // gone meanwhile
    }
    // The command name may hold spaces and brackets: the fields start after its closing bracket.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    parent.set(Number(name), Number(fields[1]));
    ticks.set(Number(name), Number(fields[11]) + Number(fields[12]));
  }
  let total = 0;
  for (const [pid, t] of ticks) {
    for (let p = parent.get(pid); p !== undefined && p > 1; p = parent.get(p)) {
      if (p === process.pid) {
        total += t;
        break;
      }
    }
  }
  return total / TICKS_PER_SECOND;
}

async function openPage(browser: Browser, url: string, samples: number): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
  const page = await context.newPage();
  await page.goto(url);
  await page.waitForFunction(() => (window as any).__strewn !== undefined);
  await page.evaluate(() => (window as any).__strewn.idle());
  await page.locator('[data-tab="setup"]').click();
  const input = page.locator('input[data-path="run.samples"]');
  await input.fill(String(samples));
  await input.press('Enter');
  await page.waitForFunction((n) => (window as any).__strewn.scenario().draftIssues === 0 && document.querySelector('[data-test="run"]:not([disabled])') !== null, samples);
  // Back to the map, as a user would look at it while the run goes.
  await page.locator('[data-tab="findings"]').click();
  await page.evaluate(() => (window as any).__strewn.idle());
  return page;
}

async function timePage(browser: Browser, url: string, samples: number): Promise<PageTiming> {
  const page = await openPage(browser, url, samples);
  try {
    const cpuBefore = descendantCpuSeconds();
    const started = performance.now();
    await page.locator('[data-test="run"]').click();
    await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes((window as any).__strewn.run().phase), null, { timeout: 600_000, polling: 20 });
    const phase = await page.evaluate(() => (window as any).__strewn.run().phase as string);
    if (phase !== 'finished') throw new Error(`the page's run ended ${phase}: ${await page.evaluate(() => (window as any).__strewn.run().message)}`);
    await page.evaluate(() => (window as any).__strewn.idle());
    const wall_s = (performance.now() - started) / 1000;
    const cpu_s = descendantCpuSeconds() - cpuBefore;
    const zone = await page.evaluate(() => (window as any).__strewn.sourceData('keepout').features.length as number).catch(() => -1);
    if (zone === 0) throw new Error('the page finished without drawing the keep-out zone');
    const marks = await page.evaluate(() => {
      const entries = performance.getEntriesByType('mark').filter((m) => m.name.startsWith('strewn:'));
      const start = entries.filter((m) => m.name === 'strewn:run').at(-1)?.startTime ?? 0;
      return Object.fromEntries(entries.filter((m) => m.startTime >= start).map((m) => [m.name.slice(7), (m.startTime - start) / 1000]));
    });
    return { wall_s, cpu_s, marks };
  } finally {
    await page.context().close();
  }
}

function timeCli(root: string, samples: number, out: string): CliTiming {
  const r = spawnSync('/usr/bin/time', ['-f', 'bench-time %e %U %S %M', process.execPath, join(root, 'dist/src/cli/main.js'), 'run', join(root, 'scenarios/club-rocket.json'), '--samples', String(samples), '--out', out, '--force', '--quiet'], {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, STREWN_TEST_FAULT: '' },
  });
  if (r.status !== 0) throw new Error(`strewn run failed (exit ${r.status}): ${r.stderr}`);
  const m = /bench-time ([\d.]+) ([\d.]+) ([\d.]+) (\d+)/.exec(r.stderr);
  if (!m) throw new Error(`no timing from /usr/bin/time: ${r.stderr}`);
  return { wall_s: Number(m[1]), cpu_s: Number(m[2]) + Number(m[3]), peakMB: Number(m[4]) / 1024 };
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
const load = () => loadavg().map((l) => l.toFixed(1)).join(' ');

export async function pageBench(root: string): Promise<void> {
  const samples = Number(process.env.BENCH_PAGE_SAMPLES ?? 20_000);
  const pairs = Number(process.env.BENCH_PAGE_PAIRS ?? 3);
  const scratch = mkdtempSync(join(tmpdir(), 'strewn-page-bench-'));
  console.log(`Page against the command line (issue 13), club rocket, ${samples.toLocaleString('en')} samples, ${cpus().length} cores, load average ${load()} at the start`);
  console.log('  page: built workspace in headless chromium, every core as web workers, Run pressed to results shown (summary, findings, map zone drawn)');
  console.log('  command line: strewn run --samples N, start to exit (Node start-up, flights, analysis, result files and sheet written)');
  const server = await (async () => {
    await buildWebApp(join(scratch, 'web'));
    return serveStatic(join(scratch, 'web'));
  })();
  const browser = await launchChromium();
  try {
    // One run each first, unmeasured: the first page run compiles the engine in the workers' V8,
    // the first CLI run warms the file cache.
    await timePage(browser, server.url, samples);
    timeCli(root, samples, join(scratch, 'cli'));
    const rows: { page: PageTiming; cli: CliTiming }[] = [];
    for (let i = 0; i < pairs; i++) {
      const page = await timePage(browser, server.url, samples);
      const cli = timeCli(root, samples, join(scratch, 'cli'));
      rows.push({ page, cli });
      const marks = Object.entries(page.marks).map(([k, v]) => `${k} ${v.toFixed(2)}`).join(', ');
      console.log(`  pair ${i + 1}: page ${page.wall_s.toFixed(2)} s (${page.cpu_s.toFixed(2)} CPU s; marks from Run: ${marks}), command line ${cli.wall_s.toFixed(2)} s (${cli.cpu_s.toFixed(2)} CPU s, peak ${cli.peakMB.toFixed(0)} MB), ratio ${(page.wall_s / cli.wall_s).toFixed(2)}`);
    }
    const ratio = median(rows.map((r) => r.page.wall_s / r.cli.wall_s));
    const cpuRatio = median(rows.map((r) => r.page.cpu_s / r.cli.cpu_s));
    const verdict = ratio <= TARGET ? 'meets target' : 'MISSES target';
    console.log(`  median of ${pairs} pairs: page ${median(rows.map((r) => r.page.wall_s)).toFixed(2)} s, command line ${median(rows.map((r) => r.cli.wall_s)).toFixed(2)} s, ratio ${ratio.toFixed(2)} (CPU ratio ${cpuRatio.toFixed(2)})  (target <= ${TARGET}: ${verdict}; load average ${load()} at the end)`);
  } finally {
    await browser.close();
    await server.close();
    rmSync(scratch, { recursive: true, force: true });
  }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) await pageBench(fileURLToPath(new URL('../../..', import.meta.url)));
