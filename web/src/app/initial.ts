import type { Issue } from '../../../src/scenario/types.js';
import type { ScenarioDocument } from '../scenario/document.js';
import { FIRST_DEMO } from '../scenario/demos.js';
import { recallWorkspace } from '../scenario/persist.js';
import { openScenarioText } from '../scenario/read-files.js';
import { validateDocument, type AcceptedScenario } from '../scenario/validate.js';

export interface InitialWorkspace {
  draft: ScenarioDocument;
  accepted: AcceptedScenario;
  draftIssues: Issue[];
  /** The kept scenario could not be reopened (its forecast or terrain file is not kept over a reload). */
  refused?: { fileName: string; issues: Issue[] };
}

/**
 * What the page opens with: the working copy kept from the last visit (edits with mistakes
 * included, beside the last valid version), or else the first demo.
 */
export function initialWorkspace(): InitialWorkspace {
  const kept = recallWorkspace();
  let refused: InitialWorkspace['refused'];
  if (kept) {
    const accepted = validateDocument(kept.accepted);
    if (accepted.ok) {
      const draft = validateDocument(kept.draft);
      if (draft.ok) return { draft: kept.draft, accepted: draft.accepted, draftIssues: [] };
      return { draft: kept.draft, accepted: accepted.accepted, draftIssues: draft.issues };
    }
    // Forecast and terrain bytes are not kept (persist.ts): say so rather than lose the scenario silently.
    if (accepted.issues.some((i) => /is not loaded in the page/.test(i.message))) {
      refused = { fileName: kept.accepted.fileName, issues: [{ path: '', message: 'the page keeps no forecast or terrain file over a reload; open the scenario again together with those files' }, ...accepted.issues] };
    }
  }
  const demo = openScenarioText(FIRST_DEMO.text, FIRST_DEMO.fileName, { ...FIRST_DEMO.files });
  if (!demo.ok) throw new Error(`the bundled demo does not validate: ${demo.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  return refused ? { draft: demo.accepted.document, accepted: demo.accepted, draftIssues: [], refused } : { draft: demo.accepted.document, accepted: demo.accepted, draftIssues: [] };
}
