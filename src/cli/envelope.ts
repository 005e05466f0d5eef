import { basename, extname, join } from 'node:path';
import { runInPool } from '../pool/pool.js';
import { nodeWorkerCount, nodeWorkerFactory } from '../pool/node.js';
import { reusableWorkers } from '../pool/reuse.js';
import { DEFAULT_MAX_SAMPLES } from '../scenario/schema.js';
import { rangeValues } from '../envelope/grid.js';
import { windEnvelope } from '../envelope/envelope.js';
import { writeEnvelopeCsv, writeEnvelopeJson, writeWindowCsv } from '../envelope/writers.js';
import { envelopeChart, forecastVerdict, judgeWindow } from '../envelope/chart.js';
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { hourlyWinds } from '../forecast/window.js';
import { resolveRelativePath } from '../scenario/thrust.js';
import { isoTime } from '../scenario/time.js';
import type { Scenario } from '../scenario/types.js';
import { envelopePdf } from '../envelope/envelope-pdf.js';
import { CAUTION } from '../report/caution.js';
import { isoSeconds, runDate } from '../report/sheet/review-facts.js';
import { VERSION } from '../version.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { OutputFolder } from './output-folder.js';
import { progressBar } from './progress.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { UsageError } from './errors.js';
import { interruptSignal, STUDY_OPTIONS } from './interrupt.js';

export const ENVELOPE_HELP = `Usage: strewn envelope <scenario.json> [options]

For every wind direction (from) and mean wind speed on a grid, flies the scenario's dispersion
(its spreads and failure modes, the same random numbers at every point), builds the keep-out zone
and tests it: inside site.boundary, and clear of every area of kind spectators, parking, road or
building. Reports, per direction, the highest speed at which every test holds and the test that
fails first above it. Writes envelope.json, envelope.csv, envelope.svg (the polar chart) and
envelope.pdf (a page in the review sheet's style; \`strewn sheet <results> --envelope <this folder>\`
adds the same page to a run's review sheet).

With weather.forecast, the forecast wind at the reference height for every hour of the chosen
day (UTC) within the file's steps is judged against the limits (the launch window): printed,
drawn on the chart and written to window.csv.

Options:
  --directions A:B:S  wind directions in degrees, start:stop:step (default 0:330:30)
  --speeds A:B:S      mean wind speeds in m/s at the reference height (default 0:14:1)
  --samples N         samples per grid point (default: the scenario's run.samples)
  --seed S            random seed (default: the scenario's run.seed)
  --workers W         worker threads (default: the number of CPU cores)
  --exhaustive        fly every grid point instead of bisecting each direction's speeds
  --units U           metric or imperial, for the chart and the page (default metric)
  --paper P           a4 or letter, for envelope.pdf (default a4)
  --out DIR           results folder (default: results/<scenario file name>-envelope)
  --force             replace DIR if it is not empty
  --quiet             print nothing but errors
  --json              print the limits as JSON on stdout
  -h, --help          this help
`;

function grid(option: string, text: string): number[] {
  const values = rangeValues(text);
  if (typeof values === 'string') throw new UsageError(`--${option}: ${values}`);
  return values;
}

export async function envelopeCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('envelope', args, {
    ...STUDY_OPTIONS,
    directions: { type: 'string' },
    speeds: { type: 'string' },
    exhaustive: { type: 'boolean' },
    units: { type: 'string' },
    paper: { type: 'string' },
  });
  if (values.help) {
    process.stdout.write(ENVELOPE_HELP);
    return 0;
  }
  const path = onePositional('envelope', positionals, 'scenario file');
  const directions = grid('directions', (values.directions as string | undefined) ?? '0:330:30');
  if (directions.some((d) => d >= 360)) throw new UsageError(`--directions: ${directions[directions.length - 1]} is 360° or more; expected directions below 360`);
  const speeds = grid('speeds', (values.speeds as string | undefined) ?? '0:14:1');
  if (speeds[0] < 0) throw new UsageError(`--speeds: ${speeds[0]} m/s is negative`);
  const samplesOption = integerOption('samples', values.samples as string | undefined, 10, DEFAULT_MAX_SAMPLES);
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  const units = (values.units as string | undefined) ?? 'metric';
  if (units !== 'metric' && units !== 'imperial') throw new UsageError(`--units: '${units}'; expected metric or imperial`);
  const paper = (values.paper as string | undefined) ?? 'a4';
  if (paper !== 'a4' && paper !== 'letter') throw new UsageError(`--paper: '${paper}'; expected a4 or letter`);
  const quiet = values.quiet === true;
  const json = values.json === true;

  const loaded = await loadForCommand(path);
  const scenario = loaded.scenario;
  const samples = samplesOption ?? scenario.run.samples;
  const seed = (values.seed as string | undefined) ?? scenario.run.seed;
  const out = OutputFolder.prepare((values.out as string | undefined) ?? join('results', `${basename(path, extname(path))}-envelope`), values.force === true);
  if (!quiet && !json) printWarnings(loaded.warnings);

  const interrupt = interruptSignal();
  const bar = progressBar(process.stderr, !quiet);
  // One set of threads for the whole grid: starting them per grid point would cost more than flying.
  const keeper = reusableWorkers(nodeWorkerFactory());
  const createWorker = keeper.createWorker;
  const started = Date.now();
  try {
    const result = await windEnvelope(scenario, {
      directions,
      speeds,
      samples,
      seed,
      exhaustive: values.exhaustive === true,
      signal: interrupt.signal,
      execute: (sc, n, s, signal) => runInPool({ scenario: sc, samples: n, seed: s }, { workers, createWorker, signal }),
      onCase: (done, planned) => bar.update({ done, total: planned, rate: (done * samples) / Math.max(1e-3, (Date.now() - started) / 1000) }),
    });
    bar.end();
    const forecast = scenario.weather.forecast;
    if (forecast) result.window = launchWindow(result, path, scenario);
    const computedAt = isoSeconds(runDate());
    const extra = { version: VERSION, scenarioHash: loaded.hash, computedAt, caution: CAUTION };
    out.write('envelope.json', writeEnvelopeJson(result, extra));
    out.write('envelope.csv', writeEnvelopeCsv(result));
    if (result.window) out.write('window.csv', writeWindowCsv(result.window));
    out.write('envelope.svg', envelopeChart(result, { units }));
    out.write('envelope.pdf', envelopePdf({ envelope: result, scenarioHash: loaded.hash, version: VERSION, computedAt }, { paper, units }));
    out.commit();
    if (json) process.stdout.write(JSON.stringify({ ...extra, limits: result.limits.map(({ cases: _c, ...d }) => d) }, null, 2) + '\n');
    else if (!quiet) process.stdout.write(formatEnvelope(result, out.destination));
    return 0;
  } finally {
    keeper.close();
    bar.end();
    out.discard();
    interrupt.dispose();
  }
}

/** The forecast's hours of the chosen day judged against the limits. */
function launchWindow(result: Awaited<ReturnType<typeof windEnvelope>>, scenarioPath: string, scenario: Scenario): NonNullable<typeof result.window> {
  const f = scenario.weather.forecast!;
  const bytes = readFileSync(resolveRelativePath(dirname(scenarioPath), f.file));
  const hours = hourlyWinds(bytes, scenario.site.pad, Date.parse(f.time), scenario.weather.wind.height, scenario.weather.wind.shear);
  return judgeWindow(result, hours.map((h) => ({ time: isoTime(h.time), speed: h.speed, from: h.from })));
}

function formatEnvelope(e: Awaited<ReturnType<typeof windEnvelope>>, folder: string): string {
  const lines = [`${e.name}: wind limits (${e.samples.toLocaleString('en')} samples per point, ${e.casesFlown} points flown in ${e.elapsed_s.toFixed(1)} s)`];
  for (const d of e.limits) {
    const limit = d.limit === null ? `fails already at ${e.speeds[0]} m/s` : `${d.aboveGrid ? 'at least ' : 'up to '}${d.limit} m/s`;
    lines.push(`  from ${String(d.from).padStart(3)}°  ${limit.padEnd(24)}${d.firstFailure.length ? `above it: ${d.firstFailure.join('; ')}` : ''}`);
  }
  lines.push(`  forecast     ${forecastVerdict(e).text}`);
  if (e.window && e.window.length > 0) {
    lines.push(`  launch window ${e.window[0].time.slice(0, 10)} (UTC, forecast wind at the reference height against the limits):`);
    for (const h of e.window) {
      lines.push(`    ${h.time.slice(11, 16)}  ${h.speed.toFixed(1).padStart(5)} m/s from ${String(Math.round(h.from)).padStart(3)}°  ${h.inside ? 'inside' : 'OUTSIDE'}${h.limit === null ? '' : ` (limit about ${h.limit.toFixed(1)} m/s)`}`);
    }
  }
  lines.push(`  results      ${folder}`, '', `CAUTION: ${CAUTION}`, '');
  return lines.join('\n');
}
