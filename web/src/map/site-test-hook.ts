import type { FeatureCollection } from 'geojson';
import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Store } from '../app/store.js';
import type { SiteEditor } from './site-editor.js';
import type { SiteSession } from './site-session.js';
import type { TerrainLayer } from './terrain-layer.js';

/**
 * Read-only views of the site editor for the browser tests (beside window.__strewn): the draft
 * scenario's JSON, the editing mode, and what the editor and the terrain layer gave the map.
 * Nothing in the page reads this.
 */
export interface StrewnSiteHook {
  draft(): unknown;
  issues(): { path: string; message: string }[];
  mode(): string;
  editFeatures(): FeatureCollection;
  terrainFeatures(): FeatureCollection;
  /** Features maplibre actually drew on screen from these layers. */
  rendered(layers: string[]): number;
}

declare global {
  interface Window {
    __strewnSite?: StrewnSiteHook;
  }
}

export function installSiteTestHook(store: Store, session: SiteSession, map: MapLibreMap | null, editor: SiteEditor | null, terrain: TerrainLayer | null): void {
  window.__strewnSite = {
    draft: () => structuredClone(store.get().draft.json),
    issues: () => store.get().draftIssues.map((i) => ({ path: i.path, message: i.message })),
    mode: () => session.mode.kind,
    editFeatures: () => editor?.features ?? { type: 'FeatureCollection', features: [] },
    terrainFeatures: () => terrain?.features ?? { type: 'FeatureCollection', features: [] },
    rendered: (layers) => (map ? map.queryRenderedFeatures({ layers: layers.filter((l) => map.getLayer(l)) }).length : 0),
  };
}
