import type { ScenarioDocument } from './document.js';

/**
 * The working scenario survives a reload: the draft the fields show (possibly with mistakes in
 * it) and the last document that passed validation, which is what runs. Storage can be full or
 * switched off; the page then simply starts from the demo.
 */

const KEY = 'strewn.workspace.v1';

export interface KeptWorkspace {
  draft: ScenarioDocument;
  accepted: ScenarioDocument;
}

export function keepWorkspace(kept: KeptWorkspace, storage: Storage | null = safeStorage()): void {
  try {
    // Forecast and terrain bytes are not kept (they may be large): after a reload they are loaded again.
    storage?.setItem(KEY, JSON.stringify(kept, (key, value: unknown) => (key === 'binaries' ? undefined : value)));
  } catch {
    // Quota exceeded or storage disabled: the page still works, it only forgets on reload.
  }
}

export function recallWorkspace(storage: Storage | null = safeStorage()): KeptWorkspace | null {
  try {
    const text = storage?.getItem(KEY);
    if (!text) return null;
    const kept = JSON.parse(text) as Partial<KeptWorkspace>;
    return isDocument(kept.draft) && isDocument(kept.accepted) ? { draft: kept.draft, accepted: kept.accepted } : null;
  } catch {
    return null;
  }
}

function isDocument(value: unknown): value is ScenarioDocument {
  if (value === null || typeof value !== 'object') return false;
  const doc = value as Record<string, unknown>;
  return typeof doc.fileName === 'string' && doc.files !== null && typeof doc.files === 'object' && 'json' in doc;
}

/** localStorage, or null where reading it throws (some privacy settings do). */
export function safeStorage(): Storage | null {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
}
