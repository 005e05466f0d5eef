import { join } from 'node:path';
import type { RunResult } from '../dispersion/results.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import { resultDataFiles } from '../report/result-data-files.js';
import type { Paper, UnitSystem } from '../report/sheet/index.js';
import { allFailedMessage, type RunSummary } from '../report/run-summary.js';
import { outcomeFromParts, studyOutcome, type StudyOutcome } from '../report/study.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { fileSystemError, type OutputFolder } from './output-folder.js';
import { StudyTaskError, type StudyThread } from './study-thread.js';
import { PhaseTimer } from './phase-timer.js';
import { SheetThread } from './sheet-thread.js';
import { honourInterrupt } from './study-files-light.js';

export interface StudyWriting {
  timer?: PhaseTimer;
  display?: { units?: UnitSystem; paper?: Paper };
  /** Ctrl-C / SIGTERM: stops between steps and while writing; the sheet thread is ended at once. */
  signal?: AbortSignal;
  /** A sheet thread started earlier (it loads its code meanwhile); one is started here if absent. */
  sheet?: SheetThread;
  /** The landings files are written elsewhere (writeStudyFilesInThreads). */
  withoutLandings?: boolean;
}

/**
 * From every sample of a study to the files of its results folder. `strewn run` and
 * `strewn merge` both end here, which is what makes a merged study byte-identical to one run.
 */
export async function writeStudyFiles(out: OutputFolder, scenario: Scenario, hash: string, run: RunResult, warnings: Issue[], writing: StudyWriting = {}): Promise<RunSummary> {
  const timer = writing.timer ?? new PhaseTimer();
  const outcome = studyOutcome(scenario, hash, run, warnings);
  const { summary } = outcome;
  // Nothing landed: no figures to write (exit 1, the reasons counted).
  if (summary.samples > 0 && summary.failedSamples === summary.samples) throw new Error(allFailedMessage(summary));
  timer.lap('analysis, sensitivity and summary');
  return writeOutcomeFiles(out, scenario, outcome, { ...writing, timer });
}

/** Threads started while the samples fly, for `writeStudyFilesInThreads`. */
export interface StudyThreads {
  /** Does the analysis. */
  analysis: StudyThread;
  /** Does the sensitivity, then writes the landings files. */
  side: StudyThread;
  sheet: SheetThread;
}

/**
 * Like `writeStudyFiles`, with the work spread over the threads: the analysis in one, the
 * sensitivity and then the landings files in another, both at once, and the sheet in a third, so
 * that after the flights both cores work and this thread only composes. The run's columns must be
 * in shared memory (runInPool's `sharedColumns`), so no thread copies them. Same code, same
 * inputs, so the same bytes as `writeStudyFiles`.
 */
export async function writeStudyFilesInThreads(
  out: OutputFolder,
  scenario: Scenario,
  hash: string,
  run: RunResult,
  warnings: Issue[],
  threads: StudyThreads,
  writing: StudyWriting = {},
): Promise<RunSummary> {
  const timer = writing.timer ?? new PhaseTimer();
  const { signal } = writing;
  const analysed = threads.analysis.run<{ analysis: StudyOutcome['analysis'] }>({ task: 'analysis', scenario, run }, signal);
  const ranked = threads.side.run<{ sensitivity: Parameters<typeof outcomeFromParts>[6] }>({ task: 'sensitivity', scenario, run }, signal);
  const landings = threads.side.run({ task: 'landings', scenario, run, folder: out.staging }, signal);
  for (const p of [analysed, ranked, landings]) p.catch(() => {});
  const set = landingSetFromRun(run, scenario);
  timer.lap('landing set');
  const [{ analysis }, { sensitivity }] = await Promise.all([analysed.catch(taskFailed(out, 'the analysis')), ranked.catch(taskFailed(out, 'the sensitivity study'))]);
  timer.lap('analysis and sensitivity (their threads; main thread waits)');
  const outcome = outcomeFromParts(scenario, hash, run, warnings, set, analysis, sensitivity);
  const { summary } = outcome;
  // Nothing landed: no figures to write (exit 1, the reasons counted).
  if (summary.samples > 0 && summary.failedSamples === summary.samples) throw new Error(allFailedMessage(summary));
  timer.lap('summary');
  await writeOutcomeFiles(out, scenario, outcome, { ...writing, timer, withoutLandings: true, sheet: threads.sheet });
  await landings.catch(taskFailed(out, 'writing the landings files'));
  timer.lap('landings files (their thread; main thread waits)');
  return summary;
}

/** A task's failure as this thread would have reported it; a file's system error names the file. */
function taskFailed(out: OutputFolder, doing: string): (error: unknown) => never {
  return (error) => {
    if (!(error instanceof StudyTaskError)) throw error;
    if (error.file === undefined) throw new Error(`${doing} failed: ${error.message}`);
    if (error.code !== undefined) throw fileSystemError(Object.assign(new Error(error.message), { code: error.code }), join(out.destination, error.file), 'writing');
    throw new Error(`writing ${error.file} failed: ${error.message}`);
  };
}

/**
 * The files of an outcome already analysed. The sheet is drawn in a worker thread while this
 * thread writes the other files; the folder's bytes are those of drawing it here.
 */
export async function writeOutcomeFiles(out: OutputFolder, scenario: Scenario, outcome: StudyOutcome, writing: StudyWriting = {}): Promise<RunSummary> {
  const timer = writing.timer ?? new PhaseTimer();
  const { signal } = writing;
  if (signal) await honourInterrupt(signal);
  const { files, sheet: job } = resultDataFiles(scenario, outcome.set, outcome.analysis, outcome.summary, { ...writing.display, withoutLandings: writing.withoutLandings });
  const thread = writing.sheet ?? SheetThread.start();
  try {
    const drawn = thread.draw(job, signal);
    drawn.catch(() => {});
    timer.lap('small result files');
    for (const [name, content] of files) {
      await out.writeAsync(name, content, signal);
      timer.lap(`write ${name}`);
    }
    const sheet = await drawn;
    timer.lap('sheet (its thread; main thread waits)');
    out.write('map.svg', sheet.svg);
    out.write('sheet.pdf', sheet.pdf);
    timer.lap('write map.svg and sheet.pdf');
  } finally {
    thread.dispose();
  }
  return outcome.summary;
}

export { studyOutcome };
export { honourInterrupt } from './study-files-light.js';
