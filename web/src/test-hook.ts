import type { FeatureCollection } from 'geojson';
import type { RunSummary } from '../../src/report/run-summary.js';
import type { Store } from './app/store.js';
import type { SourceId } from './map/style.js';
import type { MapView } from './map/view.js';

/**
 * Read-only views of the page for the browser tests: what the map's sources were given, the run
 * summary, the run's state. Nothing in the page reads this.
 */
export interface StrewnTestHook {
  /** The map exists (WebGL works). */
  readonly mapAvailable: boolean;
  /** Resolves once the map has drawn everything it was given. */
  idle(): Promise<void>;
  sourceData(id: SourceId): FeatureCollection;
  /** Names of the map's sources (those the style declares plus any added). */
  sourceIds(): string[];
  summary(): RunSummary | null;
  run(): { phase: string; done: number; total: number; rate: number; message: string; flightTime_ms: number | null };
  scenario(): { name: string; pad: { lat: number; lon: number }; hash: string; draftIssues: number };
  /** The wind-limits computation: its phase and, when done, the limit per direction (m/s). */
  envelope(): { phase: string; progress: number; limits: { from: number; limit: number | null }[] | null; hash: string | null };
  /** The mean wind of the accepted scenario (m/s, degrees from). */
  wind(): { speed: number; from: number; gust: number | null };
  /** Where a place is drawn, in page pixels (null without a map). */
  screenPoint(lon: number, lat: number): { x: number; y: number } | null;
  /** Labels of a symbol layer that maplibre actually placed, with their text and screen point. */
  placedLabels(layer: string): { label: string; x: number; y: number }[];
  /** Zoom the map to `zoom` around its centre (no animation). */
  zoomTo(zoom: number): void;
}

export function installTestHook(store: Store, mapView: MapView | null): void {
  window.__strewn = {
    mapAvailable: mapView !== null,
    idle: () =>
      new Promise<void>((resolve) => {
        if (!mapView) return resolve();
        mapView.ready().then(() => {
          mapView.map.once('idle', () => resolve());
          mapView.map.triggerRepaint();
        });
      }),
    sourceData: (id) => mapView?.sourceData(id) ?? { type: 'FeatureCollection', features: [] },
    sourceIds: () => Object.keys(mapView?.map.getStyle().sources ?? {}),
    summary: () => store.get().study?.summary ?? null,
    run: () => ({ ...store.get().run, flightTime_ms: store.get().study?.flightTime_ms ?? null }),
    scenario: () => {
      const s = store.get();
      return { name: s.accepted.scenario.name, pad: { lat: s.accepted.scenario.site.pad.lat, lon: s.accepted.scenario.site.pad.lon }, hash: s.accepted.hash, draftIssues: s.draftIssues.length };
    },
    envelope: () => {
      const e = store.get().envelope;
      return { phase: e.phase, progress: e.progress, limits: e.outcome?.envelope.limits.map((d) => ({ from: d.from, limit: d.limit })) ?? null, hash: e.outcome?.hash ?? null };
    },
    wind: () => {
      const w = store.get().accepted.scenario.weather.wind;
      return { speed: w.speed, from: w.from, gust: w.gust ?? null };
    },
    placedLabels: (layer) => {
      if (!mapView) return [];
      const box = mapView.map.getContainer().getBoundingClientRect();
      return mapView.map.queryRenderedFeatures({ layers: [layer] }).flatMap((f) => {
        if (f.geometry.type !== 'Point') return [];
        const p = mapView.map.project(f.geometry.coordinates as [number, number]);
        return [{ label: String(f.properties?.label ?? ''), x: box.left + p.x, y: box.top + p.y }];
      });
    },
    zoomTo: (zoom) => mapView?.map.jumpTo({ zoom }),
    screenPoint: (lon, lat) => {
      if (!mapView) return null;
      const p = mapView.map.project([lon, lat]);
      const box = mapView.map.getContainer().getBoundingClientRect();
      return { x: box.left + p.x, y: box.top + p.y };
    },
  };
}
