import { basename, extname, join } from 'node:path';
import { DEFAULT_MAX_SAMPLES } from '../scenario/schema.js';
import { runInPool } from '../pool/pool.js';
import { nodeWorkerCount, nodeWorkerFactory } from '../pool/node.js';
import { buildResultFiles } from '../report/result-files.js';
import { formatRunSummary } from '../report/run-text.js';
import { studyOutcome } from '../report/study.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { OutputFolder } from './output-folder.js';
import { progressBar } from './progress.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { UsageError } from './errors.js';
import { interruptSignal, STUDY_OPTIONS } from './interrupt.js';

export const RUN_HELP = `Usage: strewn run <scenario.json> [options]

Flies every Monte-Carlo sample of the scenario and writes the results into a folder:
landings.csv, summary.json, contours.geojson, keepout.geojson, landings.geojson, areas.csv,
result.kml, the review sheet (sheet.pdf, map.svg) and what redraws it (scenario.json, review.json;
see strewn sheet). The folder appears only when the run has finished; a failed or cancelled run
leaves nothing behind.

Options:
  --samples N       number of samples (default: the scenario's run.samples)
  --seed S          random seed (default: the scenario's run.seed)
  --workers W       worker threads (default: the number of CPU cores)
  --out DIR         results folder (default: results/<scenario file name>)
  --force           replace DIR if it is not empty
  --quiet           print nothing but errors
  --json            print the summary as JSON on stdout
  --max-samples N   lift the cap of ${DEFAULT_MAX_SAMPLES.toLocaleString('en')} samples
  -h, --help        this help

Exit status: 0 done, 2 bad input (scenario or options), 1 anything else.
`;

export async function runCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('run', args, { ...STUDY_OPTIONS, 'max-samples': { type: 'string' } });
  if (values.help) {
    process.stdout.write(RUN_HELP);
    return 0;
  }
  const path = onePositional('run', positionals, 'scenario file');
  const maxSamples = integerOption('max-samples', values['max-samples'] as string | undefined, 1, Number.MAX_SAFE_INTEGER) ?? DEFAULT_MAX_SAMPLES;
  const samplesOption = integerOption('samples', values.samples as string | undefined, 1, maxSamples, maxSamples === DEFAULT_MAX_SAMPLES ? ' (--max-samples lifts the cap)' : '');
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  const seedOption = values.seed as string | undefined;
  if (seedOption !== undefined && seedOption.length === 0) throw new UsageError('--seed: expected a non-empty text');
  const quiet = values.quiet === true;
  const json = values.json === true;

  const loaded = await loadForCommand(path, maxSamples);
  const scenario = loaded.scenario;
  const samples = samplesOption ?? scenario.run.samples;
  const seed = seedOption ?? scenario.run.seed;
  const outDir = (values.out as string | undefined) ?? join('results', basename(path, extname(path)));
  const createWorker = nodeWorkerFactory();
  const out = OutputFolder.prepare(outDir, values.force === true);
  if (!quiet && !json) printWarnings(loaded.warnings);

  const interrupt = interruptSignal();
  const bar = progressBar(process.stderr, !quiet);
  try {
    const run = await runInPool({ scenario, samples, seed }, { workers, createWorker, signal: interrupt.signal, onProgress: (p) => bar.update(p) });
    bar.end();
    const { set, analysis, summary } = studyOutcome(scenario, loaded.hash, run, loaded.warnings);
    for (const [name, content] of buildResultFiles(scenario, set, analysis, summary)) out.write(name, content);
    // The analysis and the writing run in this thread, so a Ctrl-C pressed meanwhile waits in the
    // event loop: two turns (one is not enough) let it reach its handler; honour it before the
    // results appear.
    for (let turn = 0; turn < 2; turn++) await new Promise((resolve) => setImmediate(resolve));
    interrupt.signal.throwIfAborted();
    out.commit();
    if (json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (!quiet) process.stdout.write(formatRunSummary(summary, out.destination));
    return 0;
  } finally {
    bar.end();
    out.discard();
    interrupt.dispose();
  }
}
