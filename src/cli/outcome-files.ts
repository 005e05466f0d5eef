import { resultDataFiles } from '../report/result-data-files.js';
import type { Paper, UnitSystem } from '../report/sheet/index.js';
import type { RunSummary } from '../report/run-summary.js';
import type { StudyOutcome } from '../report/study-parts.js';
import type { Scenario } from '../scenario/types.js';
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
  /** The landings files are written elsewhere (writeStudyFilesInThreads). */
  withoutLandings?: boolean;
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
