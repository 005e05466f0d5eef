import type { FeatureCollection } from 'geojson';
import type { Store } from '../app/store.js';
import { CompareController } from '../compare/compare-controller.js';
import { compareCell, type CompareCell } from '../compare/saved-run.js';
import type { MapView } from '../map/view.js';
import { keyEntry, MapOverlay, OVERLAY_SOURCES, type OverlaySourceId } from '../map/overlay.js';
import { SYMBOLS, WORDS } from '../../../src/report/symbols.js';
import { compareFeatures, eventAreaLabels, eventPadFeatures, eventResultFeatures, eventSiteFeatures, routeFeatures } from '../map/overlay-features.js';
import { EMPTY_COLLECTION, basemapFeatures } from '../map/features.js';
import { comparePanel } from '../panels/compare-panel.js';
import { eventPanel } from '../panels/event-panel.js';
import type { Tab } from '../panels/tabs.js';
import { EventController } from './event-controller.js';
import { eventCell, type EventCell } from './event-state.js';

/**
 * Puts the event view and the saved-run comparison into the page: their tabs, their state, and
 * what they draw on the map (web/src/map/overlay.ts), plus the release route of the scenario.
 * main.ts only adds the tabs this returns.
 */
export interface EventTestHook {
  phase(): string;
  progress(): { done: number; total: number };
  totals(): unknown;
  onMap(): boolean;
  comparison(): unknown;
  sourceData(id: OverlaySourceId): FeatureCollection;
  /** Layout visibility of a map layer ('visible' or 'none'). */
  visibility(layer: string): string;
  /** How many features of a layer maplibre drew in view, or under one place (lon, lat). */
  rendered(layer: string, at?: [number, number]): number;
}

declare global {
  interface Window {
    __strewnEvent?: EventTestHook;
  }
}

type Kind = 'path' | 'area';
const routeKinds = (fc: FeatureCollection): Kind[] => fc.features.map((f) => (f.properties?.kind === 'release-path' ? 'path' : 'area'));

export interface EventView {
  tabs: Tab[];
  /** Files dropped on the page that hold an event plan (*.event.json) open here, not as a scenario. */
  opens(files: readonly File[]): boolean;
  openFiles(files: readonly File[]): Promise<void>;
}

export function installEventView(store: Store, mapView: MapView | null): EventView {
  const event: EventCell = eventCell();
  const compare: CompareCell = compareCell();
  const eventActions = new EventController(event);
  const compareActions = new CompareController(compare, store);
  const overlay = mapView ? new MapOverlay(mapView.map) : null;

  if (overlay) {
    const drawRoute = () => {
      const fc = routeFeatures([{ launch: store.get().accepted.scenario.launch }]);
      overlay.setData(OVERLAY_SOURCES.route, fc);
      overlay.setRouteKey(routeKinds(fc));
    };
    drawRoute();
    store.subscribe((s, p) => s.accepted !== p.accepted && drawRoute());

    event.subscribe((s, p) => {
      if (s.plan !== p.plan) {
        const routes = s.plan ? routeFeatures(s.plan.items.map((it) => ({ launch: it.scenario.launch, item: it.name }))) : EMPTY_COLLECTION;
        const site = s.plan ? eventSiteFeatures(s.plan.site) : EMPTY_COLLECTION;
        overlay.setData(OVERLAY_SOURCES.eventSite, { type: 'FeatureCollection', features: [...site.features, ...routes.features] });
        overlay.setData(OVERLAY_SOURCES.eventPads, s.plan ? eventPadFeatures(s.plan) : EMPTY_COLLECTION);
        const basemap = s.plan ? basemapFeatures(s.plan.site) : null;
        overlay.setData(OVERLAY_SOURCES.eventBasemap, basemap?.shapes ?? EMPTY_COLLECTION);
        overlay.setData(OVERLAY_SOURCES.eventBasemapLabels, basemap?.labels ?? EMPTY_COLLECTION);
      }
      if (s.plan !== p.plan || s.run !== p.run) {
        const results = s.run && s.plan ? eventResultFeatures(s.run.totals, s.plan.site) : null;
        overlay.setData(OVERLAY_SOURCES.eventZones, results?.zones ?? EMPTY_COLLECTION);
        overlay.setData(OVERLAY_SOURCES.eventRisk, results?.risk ?? EMPTY_COLLECTION);
        overlay.setData(OVERLAY_SOURCES.eventZoneLabels, results?.labels ?? EMPTY_COLLECTION);
        overlay.setData(OVERLAY_SOURCES.eventAreaLabels, s.plan ? eventAreaLabels(s.plan.site, s.run?.totals ?? null) : EMPTY_COLLECTION);
        const routes = s.plan ? routeKinds(routeFeatures(s.plan.items.map((it) => ({ launch: it.scenario.launch })))) : [];
        overlay.setEventKey(s.run?.totals.zones.map((z) => z.name) ?? [], s.run?.totals.individualRisk.lines.map((l) => l.level) ?? [], routes);
      }
      const show = s.onMap && s.plan !== null;
      if (show !== overlay.showingEvent || (show && (s.plan !== p.plan || s.run !== p.run))) {
        void overlay.showEvent(show).then(() => {
          if (show) overlay.fitTo([OVERLAY_SOURCES.eventSite, OVERLAY_SOURCES.eventZones]);
        });
      }
    });

    compare.subscribe((s) => {
      const shown = s.onMap && s.comparison !== null;
      const fc = shown ? compareFeatures(s.saved, s.current) : EMPTY_COLLECTION;
      overlay.setData(OVERLAY_SOURCES.compare, fc);
      const sides = new Set(fc.features.map((f) => f.properties?.side));
      overlay.setCompareKey([
        ...(sides.has('a') ? [keyEntry(SYMBOLS.compareA, `A, saved run: ${WORDS.keepOut.toLowerCase()}`)] : []),
        ...(sides.has('b') ? [keyEntry(SYMBOLS.compareB, `B, current run: ${WORDS.keepOut.toLowerCase()}`)] : []),
      ]);
    });
  }

  window.__strewnEvent = {
    phase: () => event.get().phase,
    progress: () => ({ done: event.get().done, total: event.get().total }),
    totals: () => {
      const t = event.get().run?.totals;
      // Plain figures only (no grids or geometry) for the tests to compare with `strewn event`.
      return t ? { flights: t.flights, items: t.items, areas: t.areas, total: t.total, unionArea_m2: t.unionArea_m2, unionReach_m: t.unionReach_m, riskMax: t.individualRisk.max, riskLines: t.individualRisk.lines.map((l) => ({ level: l.level, area_m2: l.area_m2 })) } : null;
    },
    onMap: () => overlay?.showingEvent ?? false,
    comparison: () => compare.get().comparison,
    sourceData: (id) => overlay?.sourceData(id) ?? EMPTY_COLLECTION,
    visibility: (layer) => String(mapView?.map.getLayoutProperty(layer, 'visibility') ?? 'visible'),
    rendered: (layer, at) => {
      if (!mapView) return 0;
      const options = { layers: [layer] };
      if (!at) return mapView.map.queryRenderedFeatures(options).length;
      const p = mapView.map.project(at);
      // A few pixels around the place: a line is drawn a few pixels wide.
      return mapView.map.queryRenderedFeatures([[p.x - 3, p.y - 3], [p.x + 3, p.y + 3]], options).length;
    },
  };

  return {
    tabs: [
      { id: 'event', title: 'Event', panel: eventPanel(store, event, eventActions) },
      { id: 'compare', title: 'Compare', panel: comparePanel(store, compare, compareActions) },
    ],
    opens: (files) => files.some((f) => /\.event\.json$/i.test(f.name)),
    openFiles: (files) => eventActions.openFiles(files),
  };
}
