import type { RunResult } from '../dispersion/results.js';
import { resultDataFiles } from '../report/result-data-files.js';
import type { Paper, UnitSystem } from '../report/sheet/index.js';
import { allFailedMessage, type RunSummary } from '../report/run-summary.js';
import { studyOutcome, type StudyOutcome } from '../report/study.js';
import type { Issue, Scenario } from '../scenario/types.js';
import type { OutputFolder } from './output-folder.js';
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

/**
 * The files of an outcome already analysed. The sheet is drawn in a worker thread while this
 * thread writes the other files; the folder's bytes are those of drawing it here.
 */
export async function writeOutcomeFiles(out: OutputFolder, scenario: Scenario, outcome: StudyOutcome, writing: StudyWriting = {}): Promise<RunSummary> {
  const timer = writing.timer ?? new PhaseTimer();
  const { signal } = writing;
  if (signal) await honourInterrupt(signal);
  const { files, sheet: job } = resultDataFiles(scenario, outcome.set, outcome.analysis, outcome.summary, writing.display ?? {});
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
