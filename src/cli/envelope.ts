import { basename, extname, join } from 'node:path';
import { runInPool } from '../pool/pool.js';
import { nodeWorkerCount, nodeWorkerFactory } from '../pool/node.js';
import { reusableWorkers } from '../pool/reuse.js';
import { DEFAULT_MAX_SAMPLES } from '../scenario/schema.js';
import { rangeFrom, rangeValues } from '../envelope/grid.js';
import { convertQuantity } from '../scenario/units.js';
import { unitFormatter, type UnitFormatter } from '../report/format-number.js';
import { DISPLAY_OPTIONS, displayChoices } from './display-options.js';
import { windEnvelope } from '../envelope/envelope.js';
import type { Aim } from '../envelope/aim.js';
import { writeEnvelopeCsv, writeEnvelopeJson, writeWindowCsv } from '../envelope/writers.js';
import { envelopeChart, forecastVerdict } from '../envelope/chart.js';
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { launchWindow } from '../envelope/launch-window.js';
import { resolveRelativePath } from '../scenario/thrust.js';
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
  --speeds A:B:S      mean wind speeds at the reference height (default 0:14:1 m/s); each
                      part may carry a unit ("0 mph:30 mph:2 mph"), or one unit at the end
                      applies to all ("0:30:2 mph"); bare numbers are m/s
  --samples N         samples per grid point (default: the scenario's run.samples)
  --seed S            random seed (default: the scenario's run.seed)
  --workers W         worker threads (default: the number of CPU cores)
  --aim A             how the launcher is aimed as the wind goes round: fixed (the scenario's
                      azimuth), into-wind (toward each wind's from-direction) or
                      away-from=AREA (away from the named area's centre); default: fixed, uncapped
  --max-tilt DEG      largest lean from vertical with --aim (default 20, common practice)
  --exhaustive        fly every grid point instead of bisecting each direction's speeds
  --units U           metric or imperial, for the text, the chart and the page (default: the
                      scenario's run.units, else metric)
  --paper P           a4 or letter, for envelope.pdf (default: the scenario's run.paper, else a4)
  --out DIR           results folder (default: results/<scenario file name>-envelope)
  --force             replace DIR if strewn wrote it (never a folder holding the scenario)
  --allow-outside-files  let the scenario name files outside its own folder
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
    aim: { type: 'string' },
    'max-tilt': { type: 'string' },
    ...DISPLAY_OPTIONS,
  });
  if (values.help) {
    process.stdout.write(ENVELOPE_HELP);
    return 0;
  }
  const path = onePositional('envelope', positionals, 'scenario file');
  const directions = grid('directions', (values.directions as string | undefined) ?? '0:330:30');
  if (directions.some((d) => d >= 360)) throw new UsageError(`--directions: ${directions[directions.length - 1]} is 360° or more; expected directions below 360`);
  const speedGrid = parseSpeedGrid((values.speeds as string | undefined) ?? '0:14:1');
  const speeds = speedGrid.speeds;
  if (speeds[0] < 0) throw new UsageError(`--speeds: ${speeds[0]} m/s is negative`);
  const samplesOption = integerOption('samples', values.samples as string | undefined, 10, DEFAULT_MAX_SAMPLES);
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  displayChoices(values);
  const quiet = values.quiet === true;
  const json = values.json === true;

  const loaded = await loadForCommand(path, undefined, values['allow-outside-files'] === true);
  const scenario = loaded.scenario;
  const aim = aimOption(values.aim as string | undefined, values['max-tilt'] as string | undefined, scenario);
  const { units, paper } = displayChoices(values, scenario.run);
  const samples = samplesOption ?? scenario.run.samples;
  const seed = (values.seed as string | undefined) ?? scenario.run.seed;
  const out = OutputFolder.prepare((values.out as string | undefined) ?? join('results', `${basename(path, extname(path))}-envelope`), { force: values.force === true, inputs: loaded.inputFiles, say: quiet ? () => {} : undefined });
  if (!quiet && !json) {
    printWarnings(loaded.warnings);
    if (speedGrid.note !== undefined && values.speeds !== undefined) process.stderr.write(`note: ${speedGrid.note}\n`);
  }

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
      ...(aim ? { aim } : {}),
      signal: interrupt.signal,
      execute: (sc, n, s, signal) => runInPool({ scenario: sc, samples: n, seed: s }, { workers, createWorker, signal }),
      onCase: (done, planned) => bar.update({ done, total: planned, rate: (done * samples) / Math.max(1e-3, (Date.now() - started) / 1000) }),
    });
    bar.end();
    const forecast = scenario.weather.forecast;
    if (forecast) result.window = launchWindowOf(result, path, scenario);
    const computedAt = isoSeconds(runDate());
    const extra = { version: VERSION, scenarioHash: loaded.hash, computedAt, caution: CAUTION };
    out.write('envelope.json', writeEnvelopeJson(result, extra));
    out.write('envelope.csv', writeEnvelopeCsv(result));
    if (result.window) out.write('window.csv', writeWindowCsv(result.window));
    out.write('envelope.svg', envelopeChart(result, { units }));
    out.write('envelope.pdf', envelopePdf({ envelope: result, scenarioHash: loaded.hash, version: VERSION, computedAt }, { paper, units }));
    out.commit();
    if (json) process.stdout.write(JSON.stringify({ ...extra, limits: result.limits.map(({ cases: _c, ...d }) => d) }, null, 2) + '\n');
    else if (!quiet) process.stdout.write(formatEnvelope(result, out.destination, unitFormatter(units)));
    return 0;
  } finally {
    keeper.close();
    bar.end();
    out.discard();
    interrupt.dispose();
  }
}

/** Reads --aim and --max-tilt; a name after away-from must be one of the scenario's areas. */
function aimOption(text: string | undefined, maxTiltText: string | undefined, scenario: Scenario): Aim | undefined {
  if (text === undefined) {
    if (maxTiltText !== undefined) throw new UsageError('--max-tilt: goes with --aim; add --aim fixed, into-wind or away-from=AREA');
    return undefined;
  }
  if (scenario.launch.kind === 'release') throw new UsageError('--aim: a released object has no launcher to aim; leave --aim out');
  const maxTilt = maxTiltText === undefined ? 20 : Number(maxTiltText);
  if (maxTiltText !== undefined && !(/^\s*[0-9.]+\s*$/.test(maxTiltText) && maxTilt >= 0 && maxTilt <= 90)) {
    throw new UsageError(`--max-tilt: '${maxTiltText}'; expected degrees from vertical, 0 to 90`);
  }
  const match = /^\s*(fixed|into-wind|away-from)(?:\s*[= :]\s*(.+?))?\s*$/.exec(text);
  if (match === null) throw new UsageError(`--aim: '${text}'; expected fixed, into-wind or away-from=AREA`);
  const mode = match[1] as Aim['mode'];
  const area = match[2];
  if (mode !== 'away-from') {
    if (area !== undefined) throw new UsageError(`--aim: '${text}'; only away-from takes an area name`);
    return { mode, maxTilt };
  }
  const names = scenario.site.areas.map((a) => a.name);
  if (area === undefined) throw new UsageError(`--aim: away-from needs an area, e.g. --aim "away-from=${names[0] ?? 'Spectators'}"`);
  if (!names.includes(area)) throw new UsageError(`--aim: '${area}' is not an area of the scenario; expected one of ${names.map((n) => `'${n}'`).join(', ') || '(none)'}`);
  return { mode, area, maxTilt };
}

/**
 * --speeds: "start:stop:step" with a speed unit on each part, on the last part only (then for
 * all), or on none (m/s, and a note says so). Values are converted with the scenario's unit table.
 */
export function parseSpeedGrid(text: string): { speeds: number[]; note?: string } {
  const parts = text.split(':').map((p) => p.trim());
  if (parts.length !== 3) throw new UsageError(`--speeds: '${text}' is not start:stop:step`);
  const hasUnit = parts.map((p) => /[a-z/]/i.test(p.replace(/e[+-]?\d+$/i, '')));
  let written = parts;
  if (!hasUnit[0] && !hasUnit[1] && hasUnit[2]) {
    const unit = /^[+-]?[\d.]+(?:e[+-]?\d+)?\s*(.*)$/i.exec(parts[2]!)?.[1] ?? '';
    written = [`${parts[0]} ${unit}`, `${parts[1]} ${unit}`, parts[2]!];
  } else if (hasUnit.some((h) => h) && !hasUnit.every((h) => h)) {
    throw new UsageError(`--speeds: '${text}' has a unit on some parts only; write it on every part ("0 mph:30 mph:2 mph"), once at the end ("0:30:2 mph"), or on none (m/s)`);
  }
  const anyUnit = hasUnit.some((h) => h);
  const si = written.map((p) => {
    const q = convertQuantity(anyUnit ? p : Number(p), 'speed');
    if (!q.ok) throw new UsageError(`--speeds: '${p}': ${q.message}`);
    return q.value;
  });
  const speeds = rangeFrom(si[0]!, si[1]!, si[2]!, text);
  if (typeof speeds === 'string') throw new UsageError(`--speeds: ${speeds}`);
  return anyUnit ? { speeds } : { speeds, note: `--speeds '${text}' has no unit, so it was read in m/s (write e.g. '0:30:2 mph' for another unit)` };
}

/** The forecast's hours of the chosen day judged against the limits. */
function launchWindowOf(result: Awaited<ReturnType<typeof windEnvelope>>, scenarioPath: string, scenario: Scenario): NonNullable<typeof result.window> {
  return launchWindow(result, readFileSync(resolveRelativePath(dirname(scenarioPath), scenario.weather.forecast!.file)), scenario);
}

function formatEnvelope(e: Awaited<ReturnType<typeof windEnvelope>>, folder: string, u: UnitFormatter): string {
  const lines = [`${e.name}: wind limits (${e.samples.toLocaleString('en')} samples per point, ${e.casesFlown} points flown in ${e.elapsed_s.toFixed(1)} s)`];
  for (const d of e.limits) {
    const limit = d.limit === null ? `fails already at ${u.speed(e.speeds[0])}` : `${d.aboveGrid ? 'at least ' : 'up to '}${u.speed(d.limit)}`;
    const rail = d.rail ? `rail ${String(Math.round(d.rail.azimuth)).padStart(3)}°  ` : '';
    lines.push(`  from ${String(d.from).padStart(3)}°  ${rail}${limit.padEnd(24)}${d.firstFailure.length ? `above it: ${d.firstFailure.join('; ')}` : ''}`);
  }
  lines.push(`  forecast     ${forecastVerdict(e, (v) => u.speed(v)).text}`);
  if (e.window && e.window.length > 0) {
    lines.push(`  launch window ${e.window[0].time.slice(0, 10)} (UTC, forecast wind at the reference height against the limits):`);
    for (const h of e.window) {
      lines.push(`    ${h.time.slice(11, 16)}  ${u.speed(h.speed).padStart(9)} from ${String(Math.round(h.from)).padStart(3)}°  ${h.inside ? 'inside' : 'OUTSIDE'}${h.limit === null ? '' : ` (limit about ${u.speed(h.limit)})`}`);
    }
  }
  lines.push(`  results      ${folder}`, '', `CAUTION: ${CAUTION}`, '');
  return lines.join('\n');
}
