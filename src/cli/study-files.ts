import type { RunResult } from '../dispersion/results.js';
import { allFailedMessage, type RunSummary } from '../report/run-summary.js';
import { studyOutcome } from '../report/study.js';
import type { Issue, Scenario } from '../scenario/types.js';
import type { OutputFolder } from './output-folder.js';
import { writeOutcomeFiles, type StudyWriting } from './outcome-files.js';
import { PhaseTimer } from './phase-timer.js';

/**
 * From every sample of a study to the files of its results folder, all in this thread (the sheet
 * aside). `strewn merge` ends here and `strewn run` in `writeStudyFilesInThreads`
 * (study-files-threads.ts), which computes the same parts with the same code in other threads;
 * that is what makes a merged study byte-identical to one run.
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

export { writeOutcomeFiles, type StudyWriting } from './outcome-files.js';
export { studyOutcome };
export { honourInterrupt } from './study-files-light.js';
