import type { RunResult } from '../dispersion/results.js';
import { buildResultFiles } from '../report/result-files.js';
import type { Paper, UnitSystem } from '../report/sheet/index.js';
import { allFailedMessage, type RunSummary } from '../report/run-summary.js';
import { studyOutcome, type StudyOutcome } from '../report/study.js';
import type { Issue, Scenario } from '../scenario/types.js';
import type { OutputFolder } from './output-folder.js';
import { PhaseTimer } from './phase-timer.js';

/**
 * From every sample of a study to the files of its results folder. `strewn run` and
 * `strewn merge` both end here, which is what makes a merged study byte-identical to one run.
 */
export function writeStudyFiles(out: OutputFolder, scenario: Scenario, hash: string, run: RunResult, warnings: Issue[], timer = new PhaseTimer(), display: { units?: UnitSystem; paper?: Paper } = {}): RunSummary {
  const { set, analysis, summary } = studyOutcome(scenario, hash, run, warnings);
  // Nothing landed: no figures to write (exit 1, the reasons counted).
  if (summary.samples > 0 && summary.failedSamples === summary.samples) throw new Error(allFailedMessage(summary));
  timer.lap('analysis, sensitivity and summary');
  const files = buildResultFiles(scenario, set, analysis, summary, display);
  timer.lap('small result files and the sheet');
  for (const [name, content] of files) {
    out.write(name, content);
    timer.lap(`write ${name}`);
  }
  return summary;
}

/** The files of an outcome already analysed (the last round of `run --until-stable`). */
export function writeOutcomeFiles(out: OutputFolder, scenario: Scenario, outcome: StudyOutcome, timer = new PhaseTimer()): RunSummary {
  const files = buildResultFiles(scenario, outcome.set, outcome.analysis, outcome.summary);
  timer.lap('small result files and the sheet');
  for (const [name, content] of files) out.write(name, content);
  return outcome.summary;
}

export { studyOutcome };
export { honourInterrupt } from './study-files-light.js';
