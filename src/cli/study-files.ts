import type { RunResult } from '../dispersion/results.js';
import { buildResultFiles } from '../report/result-files.js';
import type { RunSummary } from '../report/run-summary.js';
import { studyOutcome } from '../report/study.js';
import type { Issue, Scenario } from '../scenario/types.js';
import type { OutputFolder } from './output-folder.js';

/**
 * From every sample of a study to the files of its results folder. `strewn run` and
 * `strewn merge` both end here, which is what makes a merged study byte-identical to one run.
 */
export function writeStudyFiles(out: OutputFolder, scenario: Scenario, hash: string, run: RunResult, warnings: Issue[]): RunSummary {
  const { set, analysis, summary } = studyOutcome(scenario, hash, run, warnings);
  for (const [name, content] of buildResultFiles(scenario, set, analysis, summary)) out.write(name, content);
  return summary;
}

/**
 * The analysis and the writing run in this thread, so a Ctrl-C pressed meanwhile waits in the
 * event loop: two turns (one is not enough) let it reach its handler; honour it before the
 * results appear.
 */
export async function honourInterrupt(signal: AbortSignal): Promise<void> {
  for (let turn = 0; turn < 2; turn++) await new Promise((resolve) => setImmediate(resolve));
  signal.throwIfAborted();
}
