import '../styles/site.css';
import type { AppState, Store } from '../app/store.js';
import { valueAt, withValue, type ScenarioDocument } from '../scenario/document.js';
import { forecastTimes, isForecastFile, isTerrainFile } from '../scenario/ground-files.js';
import { importSiteText, SiteImportError } from '../scenario/kml-import.js';
import { rawAreas, targetPath, targetRing, withAreaField, withAreas, withoutArea, withoutBoundary, type SiteTarget } from '../scenario/site-edits.js';
import { AREA_KINDS } from '../../../src/scenario/schema.js';
import { isoTime } from '../../../src/scenario/time.js';
import type { Issue } from '../../../src/scenario/types.js';
import type { SiteEditor } from '../map/site-editor.js';
import type { SiteSession } from '../map/site-session.js';
import { terrainFeatures, type TerrainLayer } from '../map/terrain-layer.js';
import { inUnit } from '../units/format.js';
import { figureUnits } from '../units/systems.js';
import type { Actions } from './actions.js';
import { el, replaceChildren, uniqueId } from './dom.js';
import { forecastProfileView } from './forecast-view.js';
import { issueConcerns, issueList } from './issues.js';

/**
 * The "Site" tab: the pad, the boundary and the marked areas drawn and edited on the map (name,
 * kind and head count per area, as the scenario format defines them), areas imported from KML or
 * GeoJSON, and the two files of the real day and the real ground: a GRIB2 forecast for the wind
 * (its profile shown) and a GeoTIFF elevation model (its contours drawn on the map). Every change
 * is written into the scenario document, so Run and Save use it; the validator's messages (the
 * command line's) are shown under the part they concern.
 */

export interface SiteParts {
  session: SiteSession;
  /** Null where the map cannot be shown: the list and the imports still work. */
  editor: SiteEditor | null;
  terrain: TerrainLayer | null;
}

const KIND_WORDS: Record<string, string> = { spectators: 'spectators', parking: 'parking', road: 'road', building: 'building', water: 'water', other: 'other' };

export function sitePanel(store: Store, actions: Actions, parts: SiteParts): HTMLElement {
  const { session, editor } = parts;
  const mapNeeded = editor === null ? el('p', { class: 'alert', text: 'The map cannot be shown in this browser, so nothing can be drawn; areas can still be imported and edited below.' }) : null;

  // --- Pad
  const padText = el('p', { class: 'note', data: { test: 'site-pad' } });
  const padButton = el('button', { text: 'Place the pad by clicking the map', attrs: { type: 'button' }, data: { test: 'place-pad' } });
  padButton.addEventListener('click', () => session.set(session.mode.kind === 'pad' ? { kind: 'idle' } : { kind: 'pad' }));
  const padIssues = el('div', { class: 'site-issues' });

  // --- Drawing status (what the map expects now) and its buttons
  const status = el('p', { class: 'site-status', attrs: { role: 'status' }, data: { test: 'site-status' } });
  const finishButton = el('button', { text: 'Close the polygon', attrs: { type: 'button' }, data: { test: 'site-finish' } });
  finishButton.addEventListener('click', () => editor?.finish());
  const deleteCornerButton = el('button', { text: 'Delete the selected corner', attrs: { type: 'button' }, data: { test: 'site-delete-corner' } });
  deleteCornerButton.addEventListener('click', () => {
    const mode = session.mode;
    if (mode.kind === 'edit' && mode.selected !== null) editor?.removeCorner(mode.selected);
  });
  const stopButton = el('button', { text: 'Stop', attrs: { type: 'button' }, data: { test: 'site-stop' } });
  stopButton.addEventListener('click', () => session.set({ kind: 'idle' }));
  const statusRow = el('div', { class: 'row site-status-row' }, finishButton, deleteCornerButton, stopButton);

  // --- Boundary
  const boundaryText = el('p', { class: 'note', data: { test: 'site-boundary' } });
  const boundaryDraw = el('button', { text: 'Draw', attrs: { type: 'button' }, data: { test: 'draw-boundary' } });
  boundaryDraw.addEventListener('click', () => session.set({ kind: 'draw', target: 'boundary', corners: [] }));
  const boundaryEdit = el('button', { text: 'Edit corners', attrs: { type: 'button' }, data: { test: 'edit-boundary' } });
  boundaryEdit.addEventListener('click', () => startEdit('boundary'));
  const boundaryRemove = el('button', { text: 'Remove', attrs: { type: 'button' } });
  boundaryRemove.addEventListener('click', () => {
    session.set({ kind: 'idle' });
    actions.editDraft(withoutBoundary);
  });
  const boundaryIssues = el('div', { class: 'site-issues', data: { test: 'boundary-issues' } });

  // --- Areas
  const kindId = uniqueId('next-kind');
  const nextKind = el('select', { attrs: { id: kindId }, data: { test: 'next-area-kind' } }, ...AREA_KINDS.map((k) => el('option', { text: KIND_WORDS[k] ?? k, attrs: { value: k } })));
  nextKind.value = 'spectators';
  const syncKind = () => editor && (editor.nextKind = nextKind.value);
  syncKind();
  nextKind.addEventListener('change', syncKind);
  const drawArea = el('button', { text: 'Draw an area', attrs: { type: 'button' }, data: { test: 'draw-area' } });
  drawArea.addEventListener('click', () => session.set({ kind: 'draw', target: 'new-area', corners: [] }));
  const areaList = el('ol', { class: 'area-list', data: { test: 'area-list' } });

  // --- Import
  const importInput = el('input', { class: 'visually-hidden', attrs: { type: 'file', accept: '.kml,.geojson,.json,application/vnd.google-earth.kml+xml,application/geo+json', tabindex: '-1', 'aria-label': 'KML or GeoJSON file with areas' }, data: { test: 'import-areas-input' } });
  const importButton = el('button', { text: 'Import areas (KML or GeoJSON)…', attrs: { type: 'button' } });
  importButton.addEventListener('click', () => importInput.click());
  const importStatus = el('p', { class: 'note', attrs: { role: 'status' }, data: { test: 'import-status' } });
  importInput.addEventListener('change', () => {
    const file = importInput.files?.[0];
    importInput.value = '';
    if (file) void importFile(file);
  });
  const importFile = async (file: File) => {
    try {
      const found = importSiteText(file.name, await file.text());
      if (found.areas.length === 0 && !found.boundary) {
        importStatus.textContent = `${file.name}: no polygons found${found.skipped.length ? ` (skipped ${found.skipped.join(', ')})` : ''}; nothing was changed.`;
        return;
      }
      session.set({ kind: 'idle' });
      actions.editDraft((doc) => {
        let next = withAreas(doc, [...rawAreas(doc.json), ...found.areas]);
        if (found.boundary) next = withValue(next, ['site', 'boundary'], found.boundary);
        return next;
      });
      const parts = [`${found.areas.length} ${found.areas.length === 1 ? 'area' : 'areas'} added`];
      if (found.boundary) parts.push('the boundary replaced');
      if (found.skipped.length) parts.push(`skipped ${found.skipped.join(', ')} (not polygons)`);
      importStatus.textContent = `${file.name}: ${parts.join('; ')}. Check each area's kind and head count below.`;
    } catch (error) {
      if (!(error instanceof SiteImportError)) throw error;
      importStatus.textContent = `${file.name} was not imported: ${error.message}. Nothing was changed.`;
    }
  };

  // --- Terrain and forecast files
  const groundInput = el('input', { class: 'visually-hidden', attrs: { type: 'file', accept: '.grib2,.grib,.grb2,.grb,.tif,.tiff', multiple: '', tabindex: '-1', 'aria-label': 'GRIB2 forecast or GeoTIFF terrain file' }, data: { test: 'ground-files-input' } });
  groundInput.addEventListener('change', () => {
    const files = Array.from(groundInput.files ?? []);
    groundInput.value = '';
    if (files.length > 0) void actions.attachFiles(files);
  });
  const groundButton = el('button', { text: 'Load forecast or terrain file…', attrs: { type: 'button' } });
  groundButton.addEventListener('click', () => groundInput.click());
  const terrainBox = el('div', { class: 'site-ground', data: { test: 'terrain-box' } });
  const forecastBox = el('div', { class: 'site-ground', data: { test: 'forecast-box' } });

  const startEdit = (target: SiteTarget) => {
    const corners = targetRing(store.get().draft.json, target);
    if (!corners || corners.length < 3) {
      session.set({ kind: 'idle' }, `${target === 'boundary' ? 'The boundary' : 'This area'} is not a polygon the map can edit; draw it anew or fix it in the file.`);
      return;
    }
    session.set({ kind: 'edit', target, corners, selected: null });
  };

  // ---------------------------------------------------------------------------------------
  const renderStatus = () => {
    const mode = session.mode;
    const words =
      mode.kind === 'pad'
        ? 'Click the map where the pad is (Escape to stop).'
        : mode.kind === 'draw'
          ? `${mode.target === 'boundary' ? 'Drawing the boundary' : 'Drawing an area'}: click each corner on the map (${mode.corners.length} so far); click the first corner, double-click or press Enter to close; Backspace takes the last corner back.`
          : mode.kind === 'edit'
            ? `Editing ${mode.target === 'boundary' ? 'the boundary' : `area ${mode.target + 1}`}: drag a corner to move it, drag a small mid-edge handle to add one, right-click a corner (or select it and press Delete) to remove it.`
            : '';
    status.textContent = [words, session.note].filter((t) => t !== '').join(' ');
    status.hidden = status.textContent === '';
    finishButton.hidden = mode.kind !== 'draw';
    deleteCornerButton.hidden = mode.kind !== 'edit';
    deleteCornerButton.disabled = mode.kind !== 'edit' || mode.selected === null;
    stopButton.hidden = mode.kind === 'idle';
    stopButton.textContent = mode.kind === 'edit' ? 'Done' : 'Stop';
    statusRow.hidden = mode.kind === 'idle';
    padButton.setAttribute('aria-pressed', String(mode.kind === 'pad'));
  };

  const issuesBox = (box: HTMLElement, issues: readonly Issue[]) => {
    if (issues.length === 0) replaceChildren(box);
    else replaceChildren(box, issueList(issues));
  };

  let areasBuiltFor = '';
  const renderAreas = (state: AppState) => {
    const areas = rawAreas(state.draft.json);
    const signature = JSON.stringify([state.documentVersion, areas.map((a) => [a.name, a.kind, a.people])]);
    const focusInside = areaList.contains(document.activeElement);
    if (signature !== areasBuiltFor && !focusInside) {
      areasBuiltFor = signature;
      replaceChildren(areaList, ...areas.map((area, i) => areaRow(area, i)));
    }
    areas.forEach((_, i) => {
      const box = areaList.querySelector<HTMLElement>(`[data-area-issues="${i}"]`);
      if (box) issuesBox(box, state.draftIssues.filter((issue) => issueConcerns(issue, targetPath(i))));
    });
    if (areas.length === 0) replaceChildren(areaList, el('li', { class: 'note', text: 'No marked areas yet: draw one or import a file.' }));
  };

  const areaRow = (area: Record<string, unknown>, index: number): HTMLElement => {
    const nameId = uniqueId('area-name');
    const name = el('input', { attrs: { id: nameId, type: 'text', autocomplete: 'off', value: typeof area.name === 'string' ? area.name : '' }, data: { test: 'area-name' } });
    name.addEventListener('change', () => actions.editDraft((doc) => withAreaField(doc, index, 'name', name.value)));
    const kind = el('select', { attrs: { 'aria-label': 'Kind' }, data: { test: 'area-kind' } }, ...AREA_KINDS.map((k) => el('option', { text: KIND_WORDS[k] ?? k, attrs: { value: k } })));
    kind.value = typeof area.kind === 'string' && (AREA_KINDS as readonly string[]).includes(area.kind) ? area.kind : 'other';
    kind.addEventListener('change', () => actions.editDraft((doc) => withAreaField(doc, index, 'kind', kind.value)));
    const peopleId = uniqueId('area-people');
    const people = el('input', { attrs: { id: peopleId, type: 'text', inputmode: 'numeric', autocomplete: 'off', value: area.people === undefined ? '' : String(area.people), placeholder: area.density !== undefined ? 'by density' : '' }, data: { test: 'area-people' } });
    people.addEventListener('change', () => {
      const text = people.value.trim();
      const value = text === '' ? undefined : Number.isFinite(Number(text)) ? Number(text) : text;
      actions.editDraft((doc) => withAreaField(doc, index, 'people', value));
    });
    const edit = el('button', { text: 'Edit corners', attrs: { type: 'button' }, data: { test: 'edit-area' } });
    edit.addEventListener('click', () => startEdit(index));
    const remove = el('button', { text: 'Delete', attrs: { type: 'button' }, data: { test: 'delete-area' } });
    remove.addEventListener('click', () => {
      session.set({ kind: 'idle' });
      actions.editDraft((doc) => withoutArea(doc, index));
    });
    const corners = targetRing(store.get().draft.json, index);
    // What the format holds but this list does not edit is said, not silently kept.
    const holes = Array.isArray((area.geometry as { coordinates?: unknown } | undefined)?.coordinates) ? (area.geometry as { coordinates: unknown[] }).coordinates.length - 1 : 0;
    const elsewhere = [area.density !== undefined ? `density ${String(area.density)}` : '', area.sheltered !== undefined ? `sheltered ${String(area.sheltered)}` : '', holes > 0 ? `${holes} ${holes === 1 ? 'hole' : 'holes'} in the outline` : ''].filter((t) => t !== '');
    return el(
      'li',
      { class: 'area-row', data: { areaIndex: String(index) } },
      el('div', { class: 'area-fields' }, el('label', { text: 'Name', attrs: { for: nameId } }), name, kind, el('label', { text: 'People', attrs: { for: peopleId } }), people),
      el('div', { class: 'row' }, el('span', { class: 'note', text: corners ? `${corners.length} corners` : 'not a polygon' }), editor ? edit : null, remove),
      elsewhere.length > 0 ? el('p', { class: 'note', text: `Kept as the file gives them, edited in the file: ${elsewhere.join(', ')}.` }) : null,
      el('div', { class: 'site-issues', data: { areaIssues: String(index) } }),
    );
  };

  const renderGround = (state: AppState) => {
    const loaded = Object.keys(state.draft.binaries?.bytes ?? {});
    const units = figureUnits(state.units);

    // Terrain
    const named = valueAt(state.draft.json, ['site', 'terrain']);
    const tifs = loaded.filter(isTerrainFile);
    const terrainParts: (Node | string)[] = [el('h3', { text: 'Terrain (site.terrain)' })];
    const ground = terrainFeatures(state.accepted.scenario.site, units.length).summary;
    if (ground) terrainParts.push(el('p', { class: 'note', data: { test: 'terrain-summary' }, text: `Ground from ${ground.file}: ${inUnit(ground.lowest, units.length)} to ${inUnit(ground.highest, units.length)} above sea level around the pad; contour lines every ${inUnit(ground.interval, units.length)} on the map (every fifth heavier, labelled). Flights end where they meet it.` }));
    else if (typeof named !== 'string') terrainParts.push(el('p', { class: 'note', text: 'Level ground at the pad\u2019s elevation. Load a GeoTIFF elevation model (latitude/longitude, EPSG:4326) to fly over the real ground.' }));
    if (typeof named === 'string' && !tifs.some((t) => t === named.split(/[/\\]/).pop())) terrainParts.push(el('p', { class: 'alert', text: `The scenario's ground is '${named}': load that file here (or open it with the scenario) to run.` }));
    const demError = typeof named === 'string' ? state.draft.binaries?.dems[named.split(/[/\\]/).pop() ?? named] : undefined;
    if (demError instanceof Error) terrainParts.push(el('p', { class: 'alert', text: `'${named as string}' cannot be used: ${demError.message}` }));
    for (const file of tifs) {
      if (file === (typeof named === 'string' ? named.split(/[/\\]/).pop() : '')) continue;
      const use = el('button', { text: `Use ${file} as the ground`, attrs: { type: 'button' }, data: { test: 'use-terrain' } });
      use.addEventListener('click', () => actions.editField(['site', 'terrain'], file));
      terrainParts.push(el('div', { class: 'row' }, use));
    }
    if (typeof named === 'string') {
      const level = el('button', { text: 'Level ground instead', attrs: { type: 'button' } });
      level.addEventListener('click', () => actions.editField(['site', 'terrain'], undefined));
      terrainParts.push(el('div', { class: 'row' }, level));
    }
    terrainParts.push(issuesNode(state.draftIssues, 'site.terrain'));
    replaceChildren(terrainBox, ...terrainParts);

    // Forecast
    const forecast = valueAt(state.draft.json, ['weather', 'forecast']) as { file?: unknown; time?: unknown } | undefined;
    const forecastFile = typeof forecast?.file === 'string' ? forecast.file.split(/[/\\]/).pop()! : null;
    const gribs = loaded.filter(isForecastFile);
    const forecastParts: (Node | string)[] = [el('h3', { text: 'Forecast wind (weather.forecast)' })];
    if (!forecast) forecastParts.push(el('p', { class: 'note', text: 'The wind is typed in (Setup tab). Load a GRIB2 forecast (isobaric heights, temperature and u/v wind) to fly the forecast profile instead.' }));
    if (forecastFile && !gribs.includes(forecastFile)) forecastParts.push(el('p', { class: 'alert', text: `The scenario reads its wind from '${String(forecast!.file)}': load that file here (or open it with the scenario) to run.` }));
    if (forecastFile && gribs.includes(forecastFile)) forecastParts.push(timeChooser(state, forecastFile, typeof forecast?.time === 'string' ? forecast.time : ''));
    for (const file of gribs) {
      if (file === forecastFile) continue;
      forecastParts.push(useForecast(state, file));
    }
    const profile = state.accepted.scenario.weather.forecast ? forecastProfileView(state.accepted.scenario, state.units) : null;
    if (profile) forecastParts.push(profile);
    if (forecast) {
      const stop = el('button', { text: 'Keep this wind typed in, without the file', attrs: { type: 'button' } });
      stop.title = 'Writes the forecast\u2019s speed, direction and profile into weather.wind and removes weather.forecast';
      stop.addEventListener('click', () => actions.editDraft((doc) => withoutForecast(doc, state)));
      forecastParts.push(el('div', { class: 'row' }, stop));
    }
    forecastParts.push(issuesNode(state.draftIssues, 'weather.forecast'));
    replaceChildren(forecastBox, ...forecastParts);
  };

  const timeChooser = (state: AppState, file: string, current: string): HTMLElement => {
    const times = timesOf(state, file);
    if ('error' in times) return el('p', { class: 'alert', text: `'${file}' cannot be read: ${times.error}` });
    const id = uniqueId('forecast-time');
    const select = el('select', { attrs: { id }, data: { test: 'forecast-time-select' } }, ...times.times.map((t) => el('option', { text: isoTime(t), attrs: { value: isoTime(t) } })));
    const known = times.times.map(isoTime);
    if (current !== '' && !known.includes(current)) select.prepend(el('option', { text: `${current} (between steps)`, attrs: { value: current } }));
    select.value = current;
    select.addEventListener('change', () => actions.editField(['weather', 'forecast', 'time'], select.value));
    return el('div', { class: 'row' }, el('label', { text: `Valid time in ${file}`, attrs: { for: id } }), select);
  };

  const useForecast = (state: AppState, file: string): HTMLElement => {
    const times = timesOf(state, file);
    if ('error' in times) return el('p', { class: 'alert', text: `'${file}' cannot be read: ${times.error}` });
    if (times.times.length === 0) return el('p', { class: 'alert', text: `'${file}' holds no wind on pressure levels; a profile cannot be made from it.` });
    const id = uniqueId('use-forecast-time');
    const select = el('select', { attrs: { id } }, ...times.times.map((t) => el('option', { text: isoTime(t), attrs: { value: isoTime(t) } })));
    const use = el('button', { text: `Use ${file} for the wind`, attrs: { type: 'button' }, data: { test: 'use-forecast' } });
    use.addEventListener('click', () => actions.editDraft((doc) => withForecast(doc, file, select.value)));
    return el('div', { class: 'row' }, el('label', { text: 'at', attrs: { for: id } }), select, use);
  };

  const timesCache = new Map<Uint8Array, ReturnType<typeof forecastTimes>>();
  const timesOf = (state: AppState, file: string) => {
    const bytes = state.draft.binaries!.bytes[file]!;
    let times = timesCache.get(bytes);
    if (!times) timesCache.set(bytes, (times = forecastTimes(bytes)));
    return times;
  };

  const render = (state: AppState) => {
    const pad = state.accepted.scenario.site.pad;
    padText.textContent = `Pad at ${pad.lat.toFixed(6)}° N, ${pad.lon.toFixed(6)}° E, ${inUnit(pad.elevation, figureUnits(state.units).length)} above sea level. You can also drag its marker.`;
    issuesBox(padIssues, state.draftIssues.filter((i) => issueConcerns(i, 'site.pad')));
    const boundary = targetRing(state.draft.json, 'boundary');
    boundaryText.textContent = valueAt(state.draft.json, ['site', 'boundary']) === undefined ? 'No boundary: draw the land the event may use.' : boundary ? `Boundary with ${boundary.length} corners.` : 'The boundary is not a polygon the map can edit.';
    boundaryEdit.disabled = !boundary || boundary.length < 3;
    boundaryRemove.disabled = valueAt(state.draft.json, ['site', 'boundary']) === undefined;
    issuesBox(boundaryIssues, state.draftIssues.filter((i) => issueConcerns(i, 'site.boundary')));
    renderAreas(state);
    renderGround(state);
  };

  session.subscribe(renderStatus);
  store.subscribe((state, previous) => {
    if (state.draft !== previous.draft || state.draftIssues !== previous.draftIssues || state.accepted !== previous.accepted || state.units !== previous.units || state.documentVersion !== previous.documentVersion) render(state);
  });
  // The terrain's contours follow the accepted scenario.
  const drawTerrain = (state: AppState) => void parts.terrain?.show(terrainFeatures(state.accepted.scenario.site, figureUnits(state.units).length).features);
  store.subscribe((state, previous) => (state.accepted !== previous.accepted || state.units !== previous.units) && drawTerrain(state));
  drawTerrain(store.get());
  render(store.get());
  renderStatus();

  return el(
    'section',
    { class: 'panel-section site-panel', attrs: { 'aria-label': 'Site' } },
    mapNeeded,
    el('p', { class: 'note', text: 'Draw on the map (no map tiles are needed). What you draw is written into the scenario: Run and Save use it. Check the drawing against the site survey; the local range-safety code decides the distances.' }),
    // Kept in view while the tab scrolls: it says what the map expects now.
    el('div', { class: 'site-sticky' }, status, statusRow),
    section('Pad and boundary', [
      el('h3', { text: 'Pad' }),
      padText,
      el('div', { class: 'row' }, editor ? padButton : null),
      padIssues,
      el('h3', { text: 'Boundary' }),
      boundaryText,
      el('div', { class: 'row' }, editor ? boundaryDraw : null, editor ? boundaryEdit : null, boundaryRemove),
      boundaryIssues,
    ]),
    section('Terrain and forecast', [
      el('div', { class: 'row' }, groundButton, groundInput),
      el('p', { class: 'note', text: 'Or drop the files anywhere on the page. They stay in this page only; keep them beside the saved scenario for the command line.' }),
      terrainBox,
      forecastBox,
    ]),
    section('Marked areas', [
      el('div', { class: 'row' }, el('label', { text: 'Kind of the next area', attrs: { for: kindId } }), nextKind, editor ? drawArea : null),
      areaList,
      el('div', { class: 'row' }, importButton, importInput),
      el('p', { class: 'note', text: 'Imported polygons become areas: a placemark\u2019s name, and a kind (spectators, parking, road, building, water, other) and a head count given as "kind" and "people" in its data; one named "boundary" becomes the boundary.' }),
      importStatus,
    ]),
  );
}

/** A part of the tab the reader can fold away (all open at first). */
function section(title: string, children: (Node | null)[]): HTMLElement {
  return el('details', { class: 'site-section', attrs: { open: '' } }, el('summary', { text: title }), ...children);
}

function issuesNode(issues: readonly Issue[], path: string): HTMLElement {
  const mine = issues.filter((i) => issueConcerns(i, path));
  return mine.length > 0 ? el('div', { class: 'alert', attrs: { role: 'alert' } }, issueList(mine)) : el('div');
}

/** `weather.forecast` set, and the typed wind fields the forecast replaces removed (cross-checks.ts). */
function withForecast(doc: ScenarioDocument, file: string, time: string): ScenarioDocument {
  let next = withValue(doc, ['weather', 'forecast'], { file, time });
  for (const key of ['speed', 'from', 'profile']) if (valueAt(next.json, ['weather', 'wind', key]) !== undefined) next = withValue(next, ['weather', 'wind', key], undefined);
  const wind = valueAt(next.json, ['weather', 'wind']);
  if (wind !== null && typeof wind === 'object' && Object.keys(wind).length === 0) next = withValue(next, ['weather', 'wind'], undefined);
  return next;
}

/** The forecast's wind written as typed fields (as `strewn forecast --write-profile` does) and the file dropped. */
function withoutForecast(doc: ScenarioDocument, state: AppState): ScenarioDocument {
  const wind = state.accepted.scenario.weather.wind;
  const round = (x: number) => Number(x.toFixed(2));
  let next = withValue(doc, ['weather', 'forecast'], undefined);
  if (state.accepted.scenario.weather.forecast) {
    next = withValue(next, ['weather', 'wind', 'speed'], round(wind.speed));
    next = withValue(next, ['weather', 'wind', 'from'], round(wind.from));
    if (wind.profile) next = withValue(next, ['weather', 'wind', 'profile'], wind.profile.map((r) => ({ altitude: round(r.altitude), speed: round(r.speed), from: round(r.from) })));
  } else {
    next = withValue(next, ['weather', 'wind', 'speed'], round(wind.speed));
    next = withValue(next, ['weather', 'wind', 'from'], round(wind.from));
  }
  return next;
}
