/**
 * Flies every item of an event, one after the other on the caller's executor (the command line
 * hands in one worker pool whose threads serve every item), and analyses each like `strewn run`.
 * Progress is reported over the samples of the whole event.
 */
import type { Progress } from '../dispersion/execute.js';
import type { RunResult } from '../dispersion/results.js';
import { studyOutcome } from '../report/study.js';
import type { Scenario } from '../scenario/types.js';
import { itemHarm } from './casualty.js';
import type { ItemOutcome } from './combine.js';
import type { EventPlan } from './event-file.js';

export type ItemExecutor = (scenario: Scenario, samples: number, seed: string, onProgress: (p: Progress) => void) => Promise<RunResult>;

export async function runEventItems(plan: EventPlan, execute: ItemExecutor, onProgress?: (p: Progress) => void): Promise<ItemOutcome[]> {
  const total = plan.items.reduce((s, it) => s + it.scenario.run.samples, 0);
  const started = Date.now();
  let before = 0;
  const outcomes: ItemOutcome[] = [];
  for (const item of plan.items) {
    const sc = item.scenario;
    const run = await execute(sc, sc.run.samples, sc.run.seed, (p) => {
      const done = before + p.done;
      onProgress?.({ done, total, rate: done / Math.max(1e-3, (Date.now() - started) / 1000) });
    });
    before += sc.run.samples;
    const { set, analysis, summary } = studyOutcome(sc, item.hash, run, item.warnings);
    outcomes.push({ item, set, analysis, summary, harm: analysis === null ? null : itemHarm(set, analysis) });
  }
  return outcomes;
}
