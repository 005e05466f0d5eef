import { readFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { runInPool } from '../pool/pool.js';
import { nodeWorkerCount, nodeWorkerFactory } from '../pool/node.js';
import { reusableWorkers } from '../pool/reuse.js';
import { CAUTION } from '../report/caution.js';
import { runDate } from '../report/sheet/review-facts.js';
import { ScenarioError } from '../scenario/errors.js';
import { VERSION } from '../version.js';
import { combineEvent, type EventTotals } from '../event/combine.js';
import { parseEventText } from '../event/event-file.js';
import { buildEventFiles } from '../event/event-files.js';
import { runEventItems } from '../event/run-event.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { interruptSignal, STUDY_OPTIONS } from './interrupt.js';
import { OutputFolder } from './output-folder.js';
import { progressBar } from './progress.js';
import { printWarnings } from './scenario-input.js';

export const EVENT_HELP = `Usage: strewn event <plan.event.json> [options]

Flies every item of an event plan (the site once; each item a scenario with how many times it
flies) on one set of worker threads and writes one results folder: per item the usual results in
items/NN-name/, and for the whole event event.json, event-zones.geojson (each item's keep-out zone
and their union), event-risk.geojson (individual-risk lines over the event), event-areas.csv
(expected landings, chance of any landing and expected casualties per area) and the event sheet
event-sheet.pdf (map, items, totals, sign-off) with its map as event-map.svg.

Options:
  --workers W       worker threads (default: the number of CPU cores)
  --out DIR         results folder (default: results/<plan name>)
  --force           replace DIR if it is not empty
  --quiet           print nothing but errors
  --json            print event.json on stdout
  -h, --help        this help

Exit status: 0 done, 2 bad input (plan, scenarios or options), 1 anything else.
`;

function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : error instanceof Error ? error.message : String(error);
    throw new ScenarioError([{ path, message: `cannot read the file: ${reason}` }], 'A file of the event cannot be read');
  }
}

export async function eventCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('event', args, { workers: STUDY_OPTIONS.workers, out: STUDY_OPTIONS.out, force: STUDY_OPTIONS.force, quiet: STUDY_OPTIONS.quiet, json: STUDY_OPTIONS.json });
  if (values.help) {
    process.stdout.write(EVENT_HELP);
    return 0;
  }
  const path = onePositional('event', positionals, 'event plan file');
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  const quiet = values.quiet === true;
  const json = values.json === true;
  const plan = parseEventText(readText(path), path, { baseDir: dirname(path), readText, joinPath: join });
  const outDir = (values.out as string | undefined) ?? join('results', basename(path).replace(/(\.event)?\.json$/i, ''));
  const out = OutputFolder.prepare(outDir, values.force === true);
  if (!quiet && !json) for (const item of plan.items) printWarnings(item.warnings.map((w) => ({ path: `${item.name}: ${w.path}`, message: w.message })));

  const interrupt = interruptSignal();
  const bar = progressBar(process.stderr, !quiet);
  // One set of threads serves every item, one after the other.
  const keeper = reusableWorkers(nodeWorkerFactory());
  const started = Date.now();
  try {
    const outcomes = await runEventItems(
      plan,
      (scenario, samples, seed, onProgress) => runInPool({ scenario, samples, seed }, { workers, createWorker: keeper.createWorker, signal: interrupt.signal, onProgress }),
      (p) => bar.update(p),
    );
    bar.end();
    const flown_s = (Date.now() - started) / 1000;
    const totals = combineEvent(plan, outcomes);
    for (const [name, content] of buildEventFiles(plan, outcomes, totals, VERSION, runDate())) out.write(name, content);
    for (let turn = 0; turn < 2; turn++) await new Promise((resolve) => setImmediate(resolve));
    interrupt.signal.throwIfAborted();
    out.commit();
    if (json) process.stdout.write(readFileSync(join(out.destination, 'event.json'), 'utf8'));
    else if (!quiet) process.stdout.write(formatEvent(totals, out.destination, flown_s, (Date.now() - started) / 1000));
    return 0;
  } finally {
    keeper.close();
    bar.end();
    out.discard();
    interrupt.dispose();
  }
}

function small(x: number): string {
  return x === 0 ? '0' : x >= 0.001 ? x.toPrecision(2) : x.toExponential(1);
}

function formatEvent(t: EventTotals, folder: string, flown_s: number, total_s: number): string {
  const lines = [`${t.name}: ${t.items.length} items, ${t.flights.toLocaleString('en')} flights (flown in ${flown_s.toFixed(1)} s, ${total_s.toFixed(1)} s with analysis and files)`];
  for (const r of t.items) {
    lines.push(`  item         ${r.name}: ${r.flights} flights, zone ${r.keepOut_m2 === null ? 'n/a' : `${Math.round(r.keepOut_m2).toLocaleString('en')} m²`}, expected casualties ${r.expectedCasualties === null ? 'n/a' : small(r.expectedCasualties)}`);
  }
  for (const a of t.areas) {
    lines.push(`  area         ${a.name} (${a.kind}): expected landings ${small(a.expectedLandings)}, chance of any ${(a.chanceOfAnyLanding * 100).toPrecision(2)} %${a.expectedCasualties === undefined ? '' : `, expected casualties ${small(a.expectedCasualties)}`}`);
  }
  lines.push(`  event zone   ${t.unionArea_m2 === null ? 'n/a' : `${Math.round(t.unionArea_m2).toLocaleString('en')} m², reaches ${Math.round(t.unionReach_m!)} m`}`);
  lines.push(`  total        expected casualties ${small(t.total.expectedCasualties)} for the whole event (indicative); highest individual risk ${small(t.individualRisk.max)}`);
  lines.push(`  results      ${folder}`, '', `CAUTION: ${CAUTION}`, '');
  return lines.join('\n');
}
