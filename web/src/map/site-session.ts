import type { LonLat, SiteTarget } from '../scenario/site-edits.js';

/**
 * What the site editor is doing, shared by the map (web/src/map/site-editor.ts) and the Site tab
 * (web/src/panels/site-panel.ts). The scenario document stays the one record of the site: the
 * corners here are only the polygon under the pointer while it is being drawn or edited.
 */
export type SiteMode =
  | { kind: 'idle' }
  /** The next click on the map places the pad. */
  | { kind: 'pad' }
  /** Corners clicked so far of a new area or of a new boundary. */
  | { kind: 'draw'; target: 'boundary' | 'new-area'; corners: LonLat[] }
  /** An existing polygon with handles; `selected` is the corner last touched (Delete removes it). */
  | { kind: 'edit'; target: SiteTarget; corners: LonLat[]; selected: number | null };

export class SiteSession {
  private current: SiteMode = { kind: 'idle' };
  private readonly listeners = new Set<(mode: SiteMode) => void>();
  /** A short line for the Site tab about the last thing refused ("an area needs three corners"). */
  note = '';

  get mode(): SiteMode {
    return this.current;
  }

  set(mode: SiteMode, note = ''): void {
    this.current = mode;
    this.note = note;
    for (const listener of this.listeners) listener(mode);
  }

  subscribe(listener: (mode: SiteMode) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }
}
