import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { requestedWorkers } from '../../src/cli/early-workers.js';
import { CLI, ROOT, SCENARIOS, tempDir } from './helpers.js';

/**
 * What the command line loads, checked by structure rather than by timing (timings on a shared
 * machine prove nothing): the built command runs with a preload that records, in order, every
 * module file the main thread loads and every worker thread it starts
 * (fixtures/trace-loads.mjs, Node's public module hooks). Each loaded file is turned back into
 * the sources it was built from through its source map, so the checks hold for the bundled
 * build (`npm run build`) and for plain tsc output alike.
 * The rules are the project's own (common practice, no source): start-up loads only what the
 * command needs, and `strewn run` starts its engine threads before loading anything else.
 */

const PRELOAD = join(ROOT, 'test/cli/fixtures/trace-loads.mjs');

type TraceEvent = { kind: 'worker'; script: string } | { kind: 'load'; sources: string[] };

/** Project-relative sources of one loaded file; packages as `node_modules/NAME/…`. */
function sourcesOf(url: string): string[] {
  if (!url.startsWith('file:')) return [];
  const file = fileURLToPath(url);
  const map = `${file}.map`;
  const paths = existsSync(map) ? (JSON.parse(readFileSync(map, 'utf8')) as { sources: string[] }).sources.map((s) => resolve(dirname(map), s)) : [file];
  return paths.map((p) => {
    const at = p.lastIndexOf('/node_modules/');
    return at >= 0 ? p.slice(at + 1) : relative(ROOT, p);
  });
}

function packageOf(source: string): string | null {
  const m = /^node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(source);
  return m ? m[1] : null;
}

function traced(args: string[]): { status: number | null; stderr: string; events: TraceEvent[] } {
  const trace = join(tempDir('strewn-trace-'), 'trace.txt');
  const r = spawnSync(process.execPath, ['--import', PRELOAD, CLI, ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, STREWN_LOAD_TRACE: trace },
    timeout: 60_000,
  });
  const lines = existsSync(trace) ? readFileSync(trace, 'utf8').trim().split('\n') : [];
  const events = lines.map((line): TraceEvent => {
    const [kind, value] = [line.slice(0, line.indexOf(' ')), line.slice(line.indexOf(' ') + 1)];
    return kind === 'worker' ? { kind, script: value } : { kind: 'load', sources: sourcesOf(value) };
  });
  return { status: r.status, stderr: r.stderr, events };
}

const loadedSources = (events: TraceEvent[]) => events.flatMap((e) => (e.kind === 'load' ? e.sources : []));

describe('start-up loads only what the command needs', () => {
  it('--version and --help load the command table and nothing else: no package, no scenario validation, no engine', () => {
    // The files main.ts imports statically; every command's own code is a dynamic import.
    const allowed = new Set(['src/cli/main.ts', 'src/cli/commands.ts', 'src/cli/errors.ts', 'src/version.ts', 'src/scenario/errors.ts']);
    for (const args of [['--version'], ['--help']]) {
      const { status, events } = traced(args);
      expect(status).toBe(0);
      const sources = loadedSources(events);
      // The trace saw the entry itself (else the checks below would pass on an empty trace).
      expect(sources).toContain('src/cli/main.ts');
      expect(sources.filter((s) => !allowed.has(s))).toEqual([]);
      expect(events.filter((e) => e.kind === 'worker')).toEqual([]);
    }
  });

  it('check loads the scenario and flight code but no worker pool, analysis, risk or sheet drawing', () => {
    const { status, stderr, events } = traced(['check', join(SCENARIOS, 'club-rocket.json')]);
    expect(status, stderr).toBe(0);
    const sources = loadedSources(events);
    expect(sources).toContain('src/scenario/schema.ts');
    expect(sources).toContain('src/flight/flight.ts');
    const needless = sources.filter(
      (s) =>
        /^src\/(pool|risk|sensitivity|envelope|event)\//.test(s) ||
        (s.startsWith('src/analysis/') && s !== 'src/analysis/geodesy.ts') ||
        // check names the spreads in the sheet's words, and nothing more of the sheet.
        (s.startsWith('src/report/sheet/') && s !== 'src/report/sheet/input-names.ts'),
    );
    expect(needless).toEqual([]);
    const packages = new Set(sources.map(packageOf).filter((p) => p !== null));
    for (const heavy of ['pdfkit', '@turf/turf', 'd3-contour', 'flatgeobuf', 'geotiff', 'comlink']) expect(packages.has(heavy), heavy).toBe(false);
    expect(events.filter((e) => e.kind === 'worker')).toEqual([]);
  });

  it('run starts its engine threads before it loads its own code, the scenario validation or any package', () => {
    const out = join(tempDir(), 'out');
    const { status, stderr, events } = traced(['run', join(SCENARIOS, 'club-rocket.json'), '--samples', '40', '--workers', '2', '--out', out, '--quiet']);
    expect(status, stderr).toBe(0);
    const firstOf = (test: (s: string) => boolean) => events.findIndex((e) => e.kind === 'load' && e.sources.some(test));
    const engineThreads = events.flatMap((e, i) => (e.kind === 'worker' && e.script.endsWith('node-entry.js') ? [i] : []));
    expect(engineThreads.length).toBe(2);
    const runCode = firstOf((s) => s === 'src/cli/run.ts');
    const validation = firstOf((s) => s === 'src/scenario/schema.ts');
    const firstPackage = firstOf((s) => packageOf(s) !== null && packageOf(s) !== 'comlink');
    expect(runCode).toBeGreaterThan(0);
    expect(validation).toBeGreaterThan(0);
    expect(firstPackage).toBeGreaterThan(0);
    for (const later of [runCode, validation, firstPackage]) expect(Math.max(...engineThreads)).toBeLessThan(later);
  });

  it('a run that stops on bad input still ends its early threads and exits 2', () => {
    const r = traced(['run', join(tempDir(), 'missing.json'), '--workers', '2']);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/missing\.json/);
    expect(r.events.filter((e) => e.kind === 'worker').length).toBe(2);
  });
});

describe('the early worker count follows --workers', () => {
  it('reads --workers N and --workers=N, defaults to every core, and starts none for help or a count run rejects', () => {
    expect(requestedWorkers(['s.json', '--workers', '3'])).toBe(3);
    expect(requestedWorkers(['s.json', '--workers=1_0'])).toBe(10);
    expect(requestedWorkers(['s.json'])).toBe(availableParallelism());
    expect(requestedWorkers(['s.json', '--help'])).toBeUndefined();
    expect(requestedWorkers(['-h'])).toBeUndefined();
    expect(requestedWorkers(['s.json', '--workers', '0'])).toBeUndefined();
    expect(requestedWorkers(['s.json', '--workers', 'two'])).toBeUndefined();
    expect(requestedWorkers(['s.json', '--workers', '257'])).toBeUndefined();
  });
});
