import { join } from 'node:path';
import type { RunResult } from '../dispersion/results.js';
import { landingSetFromRun } from '../analysis/from-run.js';
import { allFailedMessage, type RunSummary } from '../report/run-summary.js';
import { outcomeFromParts, type StudyOutcome } from '../report/study-parts.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { fileSystemError, type OutputFolder } from './output-folder.js';
import { writeOutcomeFiles, type StudyWriting } from './outcome-files.js';
import { PhaseTimer } from './phase-timer.js';
import type { SheetThread } from './sheet-thread.js';
import { StudyTaskError, type StudyThread } from './study-thread.js';

// Loads no analysis code itself (that is the analysis thread's), so this thread does not spend
// the workers' CPU loading it while the samples fly.

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
  // Its work is done: ending it now gives its memory back while the landings are still written.
  threads.analysis.dispose();
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
