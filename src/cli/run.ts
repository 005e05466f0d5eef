import { basename, extname, join } from 'node:path';
import { DEFAULT_MAX_SAMPLES } from '../scenario/schema.js';
import { runInPool } from '../pool/pool.js';
import { nodeWorkerCount, nodeWorkerFactory, prestartWorkers } from '../pool/node.js';
import { formatRunSummary } from '../report/run-text.js';
import { shardRange } from '../dispersion/shards.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { OutputFolder } from './output-folder.js';
import { progressBar } from './progress.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { UsageError } from './errors.js';
import { DEFAULT_STABLE_CAP, STABLE_TOLERANCE, farthestReach, untilStable } from '../risk/until-stable.js';
import { interruptSignal, STUDY_OPTIONS } from './interrupt.js';
import { parseShardOption, shardFolderName } from './shard-option.js';
import { writeShardFolder } from './shard-folder.js';
import { honourInterrupt } from './study-files-light.js';
import { SheetThread } from './sheet-thread.js';
import { PhaseTimer } from './phase-timer.js';
import { DISPLAY_OPTIONS, displayChoices } from './display-options.js';
import type { EarlyWorkers } from './early-workers.js';

// A function, not a constant: the first number formatted loads the locale data (about 20 ms),
// which a run should not spend before its flights start.
export const runHelp = (): string => `Usage: strewn run <scenario.json> [options]

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

/** `early`: engine threads started before this module was loaded (cli/early-workers.ts); taken first. */
export async function runCommand(args: string[], early?: EarlyWorkers): Promise<number> {
  const timer = new PhaseTimer();
  timer.lap('start and load');
  const { values, positionals } = parseCommandArgs('run', args, { ...STUDY_OPTIONS, ...DISPLAY_OPTIONS, 'max-samples': { type: 'string' }, shard: { type: 'string' }, 'until-stable': { type: 'boolean' }, 'stable-cap': { type: 'string' } });
  if (values.help) {
    process.stdout.write(runHelp());
    return 0;
  }
  const path = onePositional('run', positionals, 'scenario file');
  const maxSamples = integerOption('max-samples', values['max-samples'] as string | undefined, 1, Number.MAX_SAFE_INTEGER) ?? DEFAULT_MAX_SAMPLES;
  const samplesOption = integerOption('samples', values.samples as string | undefined, 1, maxSamples, maxSamples === DEFAULT_MAX_SAMPLES ? ' (--max-samples lifts the cap)' : '');
  const workers = integerOption('workers', values.workers as string | undefined, 1, 256) ?? nodeWorkerCount();
  const seedOption = values.seed as string | undefined;
  if (seedOption !== undefined && seedOption.length === 0) throw new UsageError('--seed: expected a non-empty text');
  const stableCap = integerOption('stable-cap', values['stable-cap'] as string | undefined, 1, maxSamples) ?? Math.min(DEFAULT_STABLE_CAP, maxSamples);
  const untilStableWanted = values['until-stable'] === true;
  if (values['stable-cap'] !== undefined && !untilStableWanted) throw new UsageError('--stable-cap: only means something with --until-stable');
  const quiet = values.quiet === true;
  const json = values.json === true;
  displayChoices(values);

  // The workers load their code while this thread reads the scenario and flies the nominal flight.
  const prestarted = early ?? prestartWorkers(nodeWorkerFactory(), workers);
  try {
    return await runStudy(path, values, { maxSamples, samplesOption, workers, seedOption, quiet, json, timer, createWorker: prestarted.createWorker, untilStableWanted, stableCap });
  } finally {
    prestarted.dispose();
  }
}

interface RunSettings {
  maxSamples: number;
  samplesOption: number | undefined;
  workers: number;
  seedOption: string | undefined;
  quiet: boolean;
  json: boolean;
  timer: PhaseTimer;
  createWorker: ReturnType<typeof nodeWorkerFactory>;
  untilStableWanted: boolean;
  stableCap: number;
}

async function runStudy(path: string, values: Record<string, unknown>, settings: RunSettings): Promise<number> {
  const { maxSamples, samplesOption, workers, seedOption, quiet, json, timer, createWorker, untilStableWanted, stableCap } = settings;
  const loaded = await loadForCommand(path, maxSamples, values['allow-outside-files'] === true);
  const scenario = loaded.scenario;
  const { units, paper } = displayChoices(values, scenario.run);
  const samples = samplesOption ?? scenario.run.samples;
  const seed = seedOption ?? scenario.run.seed;
  const shard = parseShardOption(values.shard as string | undefined, process.env, samples);
  if (shard && untilStableWanted) throw new UsageError('--until-stable: cannot be combined with --shard (each round flies the whole study)');
  const outDir = shard
    ? join((values.out as string | undefined) ?? join('results', `${basename(path, extname(path))}-shards`), shardFolderName(shard))
    : ((values.out as string | undefined) ?? join('results', basename(path, extname(path))));
  // Taken before the folder is prepared, so a signal from now on is answered by cleaning up.
  const interrupt = interruptSignal();
  let out: OutputFolder;
  try {
    out = OutputFolder.prepare(outDir, { force: values.force === true, inputs: loaded.inputFiles, say: quiet ? () => {} : undefined });
  } catch (error) {
    interrupt.dispose();
    throw error;
  }
  if (!quiet && !json) printWarnings(loaded.warnings);

  const bar = progressBar(process.stderr, !quiet);
  timer.lap('scenario and nominal flight');
  let sheetThread: SheetThread | undefined;
  try {
    const range = shard ? shardRange(samples, shard) : undefined;
    // The analysis, report and sheet code loads while the workers fly.
    const files = shard ? null : import('./study-files.js');
    files?.catch(() => {});
    if (untilStableWanted) {
      const { studyOutcome, writeOutcomeFiles } = await files!;
      const study = async (n: number) => {
        const run = await runInPool({ scenario, samples: n, seed }, { workers, createWorker, signal: interrupt.signal, onProgress: (p) => bar.update(p) });
        bar.end();
        return studyOutcome(scenario, loaded.hash, run, loaded.warnings);
      };
      const stable = await untilStable(samples, stableCap, async (n) => {
        const o = await study(n);
        return { outcome: o, reach: farthestReach(o.analysis?.risk), resolved: o.analysis?.risk?.standingLine.resolved ?? true };
      }, (round) => {
        if (!quiet && !json) {
          const moved = round.moved === null ? '' : `, moved ${(round.moved * 100).toFixed(1)} %`;
          process.stderr.write(`round: ${round.samples.toLocaleString('en')} samples, line reaches ${round.reach_m.toFixed(1)} m${moved}${round.resolved ? '' : ', not resolved yet'}\n`);
        }
      });
      const outcome = stable.outcome;
      if (outcome.summary.risk) outcome.summary.risk.untilStable = { rounds: stable.rounds, stopped: stable.stopped, tolerance: STABLE_TOLERANCE, cap: stableCap };
      if (!quiet && !json) {
        const last = stable.rounds[stable.rounds.length - 1];
        process.stderr.write(
          stable.stopped === 'stable'
            ? `stable: the line is resolved and its farthest reach moved less than ${STABLE_TOLERANCE * 100} % at ${last.samples.toLocaleString('en')} samples\n`
            : `stopped at the cap of ${stableCap.toLocaleString('en')} samples per round before the line settled (--stable-cap raises it)\n`,
        );
      }
      const summary = await writeOutcomeFiles(out, scenario, outcome, { timer, display: { units, paper }, signal: interrupt.signal });
      await honourInterrupt(interrupt.signal);
      out.commit();
      if (json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
      else if (!quiet) process.stdout.write(formatRunSummary(summary, out.destination));
      return 0;
    }
    // The sheet's thread loads the sheet code while the samples fly.
    sheetThread = shard ? undefined : SheetThread.start();
    const run = await runInPool({ scenario, samples, seed }, { workers, createWorker, signal: interrupt.signal, range, onProgress: (p) => bar.update(p) });
    bar.end();
    timer.lap('flights (workers; main thread waits)');
    if (shard) {
      const manifest = writeShardFolder(out, run, { scenario, scenarioHash: loaded.hash, seed, samples, warnings: loaded.warnings, shard });
      await honourInterrupt(interrupt.signal);
      out.commit();
      if (json) process.stdout.write(JSON.stringify({ shard: manifest.shard, first: manifest.first, count: manifest.count, folder: out.destination }, null, 2) + '\n');
      else if (!quiet) {
        process.stdout.write(
          `shard ${shard.index} of ${shard.count} (0-based): samples ${manifest.first}–${manifest.first + manifest.count - 1} of ${samples} flown into ${out.destination}\n` +
            'merge every shard with: strewn merge <shard folders…> --out <results folder>\n',
        );
      }
      return 0;
    }
    const { writeStudyFiles } = await files!;
    const summary = await writeStudyFiles(out, scenario, loaded.hash, run, loaded.warnings, { timer, display: { units, paper }, signal: interrupt.signal, sheet: sheetThread });
    await honourInterrupt(interrupt.signal);
    out.commit();
    timer.lap('commit');
    if (json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (!quiet) process.stdout.write(formatRunSummary(summary, out.destination, units));
    return 0;
  } finally {
    sheetThread?.dispose();
    bar.end();
    out.discard();
    interrupt.dispose();
  }
}
