import { basename, extname, join } from 'node:path';
import { runInPool } from '../pool/pool.js';
import type { nodeWorkerFactory } from '../pool/node.js';
import { formatRunSummary } from '../report/run-text.js';
import { shardRange } from '../dispersion/shards.js';
import { OutputFolder } from './output-folder.js';
import { progressBar } from './progress.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { UsageError } from './errors.js';
import { STABLE_TOLERANCE, farthestReach, untilStable } from '../risk/until-stable.js';
import { interruptSignal } from './interrupt.js';
import { displayChoices } from './display-options.js';
import { parseShardOption, shardFolderName } from './shard-option.js';
import { writeShardFolder } from './shard-folder.js';
import { honourInterrupt } from './study-files-light.js';
import { SheetThread } from './sheet-thread.js';
import { StudyThread } from './study-thread.js';
import type { PhaseTimer } from './phase-timer.js';

/**
 * The body of `strewn run` once its options are read and its workers started (run.ts): loaded
 * after the workers have been started, so they load their code while this thread loads this.
 */

export interface RunSettings {
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

export async function runStudy(path: string, values: Record<string, unknown>, settings: RunSettings): Promise<number> {
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
  let studyThreads: StudyThread[] = [];
  try {
    const range = shard ? shardRange(samples, shard) : undefined;
    // The report code loads while the workers fly (the analysis code only where it runs: in
    // this thread for --until-stable, else in the analysis thread).
    const files = untilStableWanted ? import('./study-files.js') : null;
    const threadedFiles = shard || untilStableWanted ? null : import('./study-files-threads.js');
    for (const code of [files, threadedFiles]) code?.catch(() => {});
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
    // The threads that analyse and write the results load their code while the samples fly.
    sheetThread = shard ? undefined : SheetThread.start();
    const [analysisThread, sideThread] = (studyThreads = shard ? [] : [StudyThread.start(['analysis']), StudyThread.start(['sensitivity', 'landings'])]);
    const run = await runInPool(
      { scenario, samples, seed },
      // Shared columns: the study threads read the run without a copy.
      { workers, createWorker, signal: interrupt.signal, range, onProgress: (p) => bar.update(p), sharedColumns: !shard },
    );
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
    const { writeStudyFilesInThreads } = await threadedFiles!;
    const summary = await writeStudyFilesInThreads(
      out,
      scenario,
      loaded.hash,
      run,
      loaded.warnings,
      { analysis: analysisThread, side: sideThread, sheet: sheetThread! },
      { timer, display: { units, paper }, signal: interrupt.signal },
    );
    await honourInterrupt(interrupt.signal);
    out.commit();
    timer.lap('commit');
    if (json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (!quiet) process.stdout.write(formatRunSummary(summary, out.destination, units));
    return 0;
  } finally {
    sheetThread?.dispose();
    bar.end();
    // A study thread may be writing into the staging folder: it has stopped before the folder goes.
    await Promise.all(studyThreads.map((t) => t.stop()));
    out.discard();
    interrupt.dispose();
  }
}
