import { nodeWorkerCount, nodeWorkerFactory, prestartWorkers } from '../pool/node.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { UsageError } from './errors.js';
import { STUDY_OPTIONS } from './interrupt.js';
import { PhaseTimer } from './phase-timer.js';
import { DISPLAY_OPTIONS, displayChoices } from './display-options.js';
import type { EarlyWorkers } from './early-workers.js';

/*
 * Only what reads the options and starts the workers is loaded before the workers start; the rest
 * of the command (scenario, pool, report code: run-study.ts) loads while they load theirs.
 */

/** The help text (its figures come from the scenario and risk code, loaded for it). */
export async function runHelp(): Promise<string> {
  const { DEFAULT_MAX_SAMPLES } = await import('../scenario/schema.js');
  const { DEFAULT_STABLE_CAP } = await import('../risk/until-stable.js');
  return `Usage: strewn run <scenario.json> [options]

Flies every Monte-Carlo sample of the scenario and writes the results into a folder:
landings.csv, summary.json, contours.geojson, keepout.geojson, landings.fgb (every landing, FlatGeobuf),
landings.geojson (a stated, stratified subset above 100,000 landings), areas.csv,
result.kml, the review sheet (sheet.pdf, map.svg) and what redraws it (scenario.json, review.json;
see strewn sheet). The folder appears only when the run has finished; a failed or cancelled run
leaves nothing behind.

Options:
  --samples N       number of samples (default: the scenario's run.samples)
  --seed S          random seed (default: the scenario's run.seed)
  --workers W       worker threads (default: the number of CPU cores)
  --out DIR         results folder (default: results/<scenario file name>)
  --force           replace DIR if strewn wrote it (never a folder holding the scenario)
  --quiet           print nothing but errors
  --json            print the summary as JSON on stdout
  --units U         metric or imperial, for the printed summary and the sheet
                    (default: the scenario's run.units, else metric)
  --paper P         a4 or letter, for sheet.pdf (default: the scenario's run.paper, else a4)
  --max-samples N   lift the cap of ${DEFAULT_MAX_SAMPLES.toLocaleString('en')} samples
  --allow-outside-files  let the scenario name files outside its own folder
  --shard K/N       fly only shard K of N (K from 0; contiguous sample ranges) into the shard
                    folder DIR/shard-K-of-N for strewn merge; auto/N takes K from
                    JOB_COMPLETION_INDEX or SLURM_ARRAY_TASK_ID (default DIR: results/<name>-shards)
  --until-stable    fly again with twice the samples, round after round, until the farthest
                    reach of the individual-risk line at risk.criteria.individual (or the
                    smallest risk level) moves less than 2 % between rounds and the samples
                    resolve that line; the results are those of the last round
  --stable-cap N    most samples --until-stable flies in one round (default ${DEFAULT_STABLE_CAP.toLocaleString('en')});
                    it stops there and says so
  -h, --help        this help

Exit status: 0 done, 2 bad input (scenario or options), 1 anything else.
`;
}

/** `early`: engine threads started before this module was loaded (cli/early-workers.ts); taken first. */
export async function runCommand(args: string[], early?: EarlyWorkers): Promise<number> {
  const timer = new PhaseTimer();
  timer.lap('start and load');
  const { values, positionals } = parseCommandArgs('run', args, { ...STUDY_OPTIONS, ...DISPLAY_OPTIONS, 'max-samples': { type: 'string' }, shard: { type: 'string' }, 'until-stable': { type: 'boolean' }, 'stable-cap': { type: 'string' } });
  if (values.help) {
    process.stdout.write(await runHelp());
    return 0;
  }
  const path = onePositional('run', positionals, 'scenario file');
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  displayChoices(values);
  // The workers load their code while this thread loads its own, reads the scenario and flies the nominal flight.
  const prestarted = early ?? prestartWorkers(nodeWorkerFactory(), workers);
  try {
    const [{ runStudy }, { DEFAULT_MAX_SAMPLES }, { DEFAULT_STABLE_CAP }] = await Promise.all([
      import('./run-study.js'),
      import('../scenario/schema.js'),
      import('../risk/until-stable.js'),
    ]);
    timer.lap('load the study code (the workers start meanwhile)');
    const maxSamples = integerOption('max-samples', values['max-samples'] as string | undefined, 1, Number.MAX_SAFE_INTEGER) ?? DEFAULT_MAX_SAMPLES;
    const samplesOption = integerOption('samples', values.samples as string | undefined, 1, maxSamples, maxSamples === DEFAULT_MAX_SAMPLES ? ' (--max-samples lifts the cap)' : '');
    const seedOption = values.seed as string | undefined;
    if (seedOption !== undefined && seedOption.length === 0) throw new UsageError('--seed: expected a non-empty text');
    const stableCap = integerOption('stable-cap', values['stable-cap'] as string | undefined, 1, maxSamples) ?? Math.min(DEFAULT_STABLE_CAP, maxSamples);
    const untilStableWanted = values['until-stable'] === true;
    if (values['stable-cap'] !== undefined && !untilStableWanted) throw new UsageError('--stable-cap: only means something with --until-stable');
    const quiet = values.quiet === true;
    const json = values.json === true;
    return await runStudy(path, values, { maxSamples, samplesOption, workers, seedOption, quiet, json, timer, createWorker: prestarted.createWorker, untilStableWanted, stableCap });
  } finally {
    prestarted.dispose();
  }
}

