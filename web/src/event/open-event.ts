import { parseEventText, type EventPlan } from '../../../src/event/event-file.js';
import { ScenarioError } from '../../../src/scenario/errors.js';
import type { Issue } from '../../../src/scenario/types.js';
import { attachedFileReader, type AttachedFiles } from '../scenario/document.js';
import { PAGE_MAX_SAMPLES } from '../scenario/validate.js';

/** An event plan that opened, or the problems of the one refused (with field paths, as `strewn event` says them). */
export type EventOpening = { ok: true; plan: EventPlan; fileName: string } | { ok: false; fileName: string; issues: Issue[] };

/**
 * Opens an event plan with the same parser as `strewn event` (src/event/event-file.ts): the
 * scenarios and motor curves it names are read from the files opened with it, by name.
 */
export function openEventText(text: string, fileName: string, files: AttachedFiles): EventOpening {
  try {
    return { ok: true, fileName, plan: parseEventText(text, fileName, { readText: attachedFileReader(files), maxSamples: PAGE_MAX_SAMPLES }) };
  } catch (error) {
    if (error instanceof ScenarioError) return { ok: false, fileName, issues: error.issues };
    throw error;
  }
}

/** The files the user picked: one `*.event.json` plan, and the scenarios and curves it names. */
export async function openEventFiles(files: readonly File[]): Promise<EventOpening> {
  const plans = files.filter((f) => /\.event\.json$/i.test(f.name));
  if (plans.length !== 1) {
    const names = files.map((f) => f.name).join(', ') || 'nothing';
    const message =
      plans.length === 0
        ? `no event plan (a file named *.event.json) among the opened files (${names})`
        : `${plans.length} event plans were opened at once (${plans.map((f) => f.name).join(', ')}); open one at a time, with the scenario files it names`;
    return { ok: false, fileName: names, issues: [{ path: '', message }] };
  }
  const plan = plans[0]!;
  const attached: Record<string, string> = {};
  for (const file of files) if (file !== plan) attached[file.name] = await file.text();
  return openEventText(await plan.text(), plan.name, attached);
}
