import type { Progress } from '../../../src/dispersion/execute.js';
import { combineEvent, type EventTotals, type ItemOutcome } from '../../../src/event/combine.js';
import type { EventPlan } from '../../../src/event/event-file.js';
import { runEventItems } from '../../../src/event/run-event.js';
import { browserWorkerCount, browserWorkerFactory } from '../../../src/pool/browser.js';
import { runInPool } from '../../../src/pool/pool.js';
import { reusableWorkers } from '../../../src/pool/reuse.js';

/**
 * Flies every item of an event on the page's workers, as `strewn event` does on its threads: one
 * set of workers serves every item one after the other (src/pool/reuse.ts), progress counts the
 * samples of the whole event, and the figures come from the same runEventItems and combineEvent.
 */
export interface EventRun {
  outcomes: ItemOutcome[];
  totals: EventTotals;
  /** Wall time of the flights and of the analysis with the combination, ms. */
  flightTime_ms: number;
  analysisTime_ms: number;
}

export async function runEventInPage(plan: EventPlan, options: { signal?: AbortSignal; onProgress?: (p: Progress) => void; onAnalysing?: () => void; workers?: number }): Promise<EventRun> {
  const keeper = reusableWorkers(browserWorkerFactory());
  const workers = options.workers ?? browserWorkerCount();
  const started = performance.now();
  let flown = started;
  try {
    // runEventItems analyses each item as soon as it has flown; the time is counted per phase below.
    const outcomes = await runEventItems(
      plan,
      (scenario, samples, seed, onProgress) => runInPool({ scenario, samples, seed }, { workers, createWorker: keeper.createWorker, signal: options.signal, onProgress }),
      (p) => {
        options.onProgress?.(p);
        if (p.done === p.total) {
          flown = performance.now();
          options.onAnalysing?.();
        }
      },
    );
    options.signal?.throwIfAborted();
    const totals = combineEvent(plan, outcomes);
    const end = performance.now();
    return { outcomes, totals, flightTime_ms: flown - started, analysisTime_ms: end - flown };
  } finally {
    keeper.close();
  }
}

/** The event sheet (map, items, totals, sign-off) in the page's units and paper; pdfkit loads on demand. */
export async function eventSheetPdf(plan: EventPlan, run: EventRun, computedAt: string, version: string, paper: 'a4' | 'letter', units: 'metric' | 'imperial'): Promise<Uint8Array> {
  await import('../exports/pdf-fonts.js');
  const { buildEventSheet } = await import('../../../src/event/event-sheet.js');
  return buildEventSheet(
    { totals: run.totals, site: plan.site, pads: plan.items.map((it) => it.scenario.site.pad), launches: plan.items.map((it) => it.scenario.launch), computedAt, version },
    { paper, units },
  ).pdf;
}

/** event.json as `strewn event` writes it (src/event/event-files.ts). */
export async function eventJson(plan: EventPlan, run: EventRun, computedAt: string, version: string): Promise<string> {
  const { eventSummary } = await import('../../../src/event/event-files.js');
  return JSON.stringify(eventSummary(plan, run.totals, version, computedAt), null, 2) + '\n';
}
