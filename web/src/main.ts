import '@fontsource/noto-sans/latin-400.css';
import '@fontsource/noto-sans/latin-700.css';
import './styles/app.css';
import { CAUTION } from '../../src/report/caution.js';
import { Controller } from './app/controller.js';
import { initialWorkspace } from './app/initial.js';
import { recallUnits } from './app/preferences.js';
import { Store, studyIsCurrent, type AppState } from './app/store.js';
import { createMap, webglAvailable } from './map/create-map.js';
import { MapView } from './map/view.js';
import { installPrintSnapshot } from './map/print.js';
import { el } from './panels/dom.js';
import { exportPanel } from './panels/export-panel.js';
import { findingsPanel } from './panels/findings-panel.js';
import { envelopePanel } from './panels/envelope-panel.js';
import { IDLE_ENVELOPE } from './study/envelope.js';
import { runPanel } from './panels/run-panel.js';
import { scenarioPanel } from './panels/scenario-panel.js';
import { settingsPanel } from './panels/settings-panel.js';
import { tabs } from './panels/tabs.js';
import { unitSwitch } from './panels/unit-switch.js';
import { installDropTarget } from './panels/drop-target.js';
import { installTestHook } from './test-hook.js';
import { installEventView } from './event/install.js';
import { SiteSession } from './map/site-session.js';
import { SiteEditor } from './map/site-editor.js';
import { TerrainLayer } from './map/terrain-layer.js';
import { installSiteTestHook } from './map/site-test-hook.js';
import { sitePanel } from './panels/site-panel.js';

/**
 * The map workspace: composes the scenario, the engine (through the worker pool), the analysis
 * and the result writers from src/ into one page. Nothing here computes physics.
 */

function byId(id: string): HTMLElement {
  const node = document.getElementById(id);
  if (!node) throw new Error(`index.html lacks #${id}`);
  return node;
}

function boot(): void {
  byId('caution-text').textContent = CAUTION;

  const initial = initialWorkspace();
  const store = new Store({
    ...initial,
    refused: initial.refused ?? null,
    documentVersion: 0,
    units: recallUnits(initial.accepted.scenario.run.units),
    run: { phase: 'idle', done: 0, total: 0, rate: 0, message: '' },
    study: null,
    envelope: IDLE_ENVELOPE,
  });
  const controller = new Controller(store);

  const nameInBar = byId('scenario-name');
  const showName = (state: AppState) => {
    nameInBar.textContent = state.accepted.scenario.name;
    document.title = `${state.accepted.scenario.name} · Strewn`;
  };
  showName(store.get());
  store.subscribe((state, previous) => state.accepted !== previous.accepted && showName(state));
  byId('unit-switch-slot').replaceWith(unitSwitch(store, controller));

  const mapContainer = byId('map');
  let mapView: MapView | null = null;
  let mapProblem = '';
  if (webglAvailable()) {
    try {
      const { pad } = store.get().accepted.scenario.site;
      const created = createMap(mapContainer, [pad.lon, pad.lat]);
      mapView = new MapView(created.map, created.scale, (lon, lat) => controller.movePad(lon, lat));
      installPrintSnapshot(created.map, mapContainer.parentElement ?? mapContainer);
    } catch (error) {
      mapProblem = error instanceof Error ? error.message : String(error);
    }
  } else {
    mapProblem = 'this browser cannot draw WebGL 2 graphics';
  }
  if (!mapView) {
    mapContainer.appendChild(el('div', { class: 'map-missing', attrs: { role: 'alert' } }, el('strong', { text: 'The map cannot be shown: ' }), mapProblem, '. Everything else works: run the scenario and read the Findings and Files tabs.'));
  }
  controller.mapView = mapView;
  // The site drawn on the map and the terrain's contours (Site tab).
  const siteSession = new SiteSession();
  const siteEditor = mapView ? new SiteEditor(mapView.map, siteSession, store, controller, mapView.ready()) : null;
  const terrainLayer = mapView ? new TerrainLayer(mapView.map, mapView.ready()) : null;

  const side = byId('side');
  const eventView = installEventView(store, mapView);
  const workspaceTabs = tabs(
    [
      { id: 'setup', title: 'Setup', panel: scenarioPanel(store, controller) },
      { id: 'site', title: 'Site', panel: sitePanel(store, controller, { session: siteSession, editor: siteEditor, terrain: terrainLayer }) },
      { id: 'findings', title: 'Findings', panel: findingsPanel(store) },
      { id: 'limits', title: 'Wind limits', panel: envelopePanel(store, controller) },
      { id: 'files', title: 'Files', panel: exportPanel(store, controller) },
      { id: 'map', title: 'Map', panel: settingsPanel(controller, mapView !== null, (listener) => mapView && (mapView.onBasemapError = listener)) },
      // The event view and the saved-run comparison (web/src/event/install.ts).
      ...eventView.tabs,
    ],
    'Workspace',
  );
  side.append(runPanel(store, controller), workspaceTabs.element);

  // A finished run opens the findings.
  store.subscribe((state, previous) => {
    if (state.study !== previous.study && state.study !== null) workspaceTabs.select('findings');
  });

  installDropTarget(document.body, (files) => {
    if (!eventView.opens(files)) return controller.openFiles(files);
    workspaceTabs.select('event');
    return eventView.openFiles(files);
  });

  if (mapView) {
    const view = mapView;
    const scene = (s: AppState) => ({ accepted: s.accepted, study: s.study, current: studyIsCurrent(s), units: s.units });
    void view.show(scene(store.get()), { fit: 'site' });
    store.subscribe((state, previous) => {
      if (state.accepted === previous.accepted && state.study === previous.study && state.units === previous.units) return;
      // A new scenario shows its site; a new result is framed so the zone and its neighbours fill the view.
      const fit = state.documentVersion !== previous.documentVersion ? 'site' : state.study !== previous.study && state.study !== null ? 'results' : 'none';
      void view.show(scene(state), { fit });
    });
  }
  const staleBanner = byId('stale-banner');
  const showStale = (s: AppState) => (staleBanner.hidden = s.study === null || studyIsCurrent(s));
  showStale(store.get());
  store.subscribe(showStale);

  installTestHook(store, mapView);
  installSiteTestHook(store, siteSession, mapView?.map ?? null, siteEditor, terrainLayer);
}

boot();
