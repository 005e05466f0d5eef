import type { ExpressionSpecification, GeoJSONSource, Map as MapLibreMap, MapMouseEvent, MapTouchEvent } from 'maplibre-gl';
import type { Feature, FeatureCollection } from 'geojson';
import type { Store } from '../app/store.js';
import type { ScenarioDocument } from '../scenario/document.js';
import { issueConcerns } from '../panels/issues.js';
import { freshAreaName, rawAreas, targetPath, targetRing, withNewArea, withRing, type LonLat, type SiteTarget } from '../scenario/site-edits.js';
import type { SiteMode, SiteSession } from './site-session.js';

/**
 * Drawing and editing the site's polygons on the map, and placing the pad by a click.
 *
 * Hand-written rather than a drawing plugin: the scenario document is the one record of the site
 * (undo by editing, the validator's own messages, Save and Run all read it), whereas the plugins
 * for maplibre keep a feature store and modes of their own that would have to be mirrored both
 * ways, and refuse a self-crossing ring in their own words instead of letting the command line's
 * check say what is wrong. What is needed is small: click to add a corner, drag a corner,
 * drag a mid-edge handle to add one, right-click or Delete to remove one, close.
 *
 * Draw: each click adds a corner; a click on the first corner, a double-click or Enter closes
 * (three corners at least), Backspace takes the last one back, Escape stops. Edit: every change
 * is written into the scenario at once, so a crossing ring shows its message and holds Run back.
 */

const SOURCE = 'site-edit';
/** How near (px) a pointer must be to a handle to take it. */
const GRAB_PX = 9;
const EDIT_COLOR = '#1F4FA8';
const BAD_COLOR = '#B3261E';

export interface SiteEditorActions {
  editDraft(edit: (draft: ScenarioDocument) => ScenarioDocument): void;
  movePad(lon: number, lat: number): void;
}

export class SiteEditor {
  private hover: LonLat | null = null;
  private drag: { index: number; moved: boolean } | null = null;
  /** Kind given to the next area drawn (the Site tab's choice). */
  nextKind = 'other';

  constructor(
    private readonly map: MapLibreMap,
    private readonly session: SiteSession,
    private readonly store: Store,
    private readonly actions: SiteEditorActions,
    ready: Promise<void>,
  ) {
    void ready.then(() => {
      map.addSource(SOURCE, { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
      const invalid: ExpressionSpecification = ['to-boolean', ['get', 'invalid']];
      map.addLayer({ id: 'site-edit-fill', type: 'fill', source: SOURCE, filter: ['==', ['geometry-type'], 'Polygon'], paint: { 'fill-color': ['case', invalid, BAD_COLOR, EDIT_COLOR], 'fill-opacity': 0.12 } });
      map.addLayer({ id: 'site-edit-line', type: 'line', source: SOURCE, filter: ['==', ['geometry-type'], 'LineString'], paint: { 'line-color': ['case', invalid, BAD_COLOR, EDIT_COLOR], 'line-width': 2.5, 'line-dasharray': [2, 1] } });
      map.addLayer({ id: 'site-edit-mid', type: 'circle', source: SOURCE, filter: ['==', ['get', 'role'], 'mid'], paint: { 'circle-radius': 4, 'circle-color': '#FFFFFF', 'circle-opacity': 0.85, 'circle-stroke-color': EDIT_COLOR, 'circle-stroke-width': 1.5 } });
      map.addLayer({ id: 'site-edit-corner', type: 'circle', source: SOURCE, filter: ['==', ['get', 'role'], 'corner'], paint: { 'circle-radius': 6, 'circle-color': ['case', ['get', 'selected'], EDIT_COLOR, '#FFFFFF'], 'circle-stroke-color': ['case', invalid, BAD_COLOR, EDIT_COLOR], 'circle-stroke-width': 2.5 } });
      this.render();
    });
    session.subscribe((mode) => this.entered(mode));
    store.subscribe((state, previous) => {
      // A new scenario (file, demo) ends any editing; a changed draft may make the ring (in)valid.
      if (state.documentVersion !== previous.documentVersion && this.session.mode.kind !== 'idle') this.session.set({ kind: 'idle' });
      else if (state.draftIssues !== previous.draftIssues || state.draft !== previous.draft) this.render();
    });
    map.on('click', (e) => this.click(e));
    map.on('dblclick', (e) => {
      if (this.session.mode.kind !== 'draw') return;
      e.preventDefault();
      this.finish();
    });
    map.on('mousemove', (e) => this.move(e));
    // While a corner is dragged, the pointer is followed on the whole window (it may leave the
    // canvas, and the map sends no mousemove of its own while a button is held).
    window.addEventListener('mousemove', (e) => {
      if (!this.drag) return;
      const box = map.getContainer().getBoundingClientRect();
      const at = map.unproject([e.clientX - box.left, e.clientY - box.top]);
      this.dragTo([at.lng, at.lat]);
    });
    map.on('mousedown', (e) => this.press(e));
    map.on('contextmenu', (e) => this.removeAt(e));
    window.addEventListener('mouseup', () => this.release());
    // A finger drags a corner as the mouse does (a tap is a click, which draws and places).
    map.on('touchstart', (e) => e.points.length === 1 && this.press(e));
    window.addEventListener('touchmove', (e) => {
      const touch = e.touches[0];
      if (!this.drag || !touch) return;
      const box = map.getContainer().getBoundingClientRect();
      const at = map.unproject([touch.clientX - box.left, touch.clientY - box.top]);
      this.dragTo([at.lng, at.lat]);
    });
    window.addEventListener('touchend', () => this.release());
    document.addEventListener('keydown', (e) => this.key(e));
  }

  /** The features drawn for the polygon in hand (read by the browser tests too). */
  features: FeatureCollection = { type: 'FeatureCollection', features: [] };

  private lastKind: SiteMode['kind'] = 'idle';

  private entered(mode: SiteMode): void {
    const changed = mode.kind !== this.lastKind;
    this.lastKind = mode.kind;
    if (!changed) return this.render();
    this.drag = null;
    const busy = mode.kind !== 'idle';
    // Double-click closes a drawing instead of zooming.
    if (mode.kind === 'draw') this.map.doubleClickZoom.disable();
    else this.map.doubleClickZoom.enable();
    this.map.getCanvas().style.cursor = mode.kind === 'draw' || mode.kind === 'pad' ? 'crosshair' : '';
    this.map.getContainer().dataset.siteMode = mode.kind;
    if (busy) this.map.getCanvas().focus({ preventScroll: true });
    this.render();
  }

  private nearest(points: readonly LonLat[], at: { x: number; y: number }): number {
    let best = -1;
    let bestDistance = GRAB_PX;
    points.forEach((p, i) => {
      const s = this.map.project(p);
      const d = Math.hypot(s.x - at.x, s.y - at.y);
      if (d <= bestDistance) {
        best = i;
        bestDistance = d;
      }
    });
    return best;
  }

  private midpoints(corners: readonly LonLat[]): LonLat[] {
    return corners.map((c, i) => {
      const n = corners[(i + 1) % corners.length]!;
      return [(c[0] + n[0]) / 2, (c[1] + n[1]) / 2];
    });
  }

  private click(e: MapMouseEvent): void {
    const mode = this.session.mode;
    const at: LonLat = [e.lngLat.lng, e.lngLat.lat];
    if (mode.kind === 'pad') {
      this.actions.movePad(at[0], at[1]);
      this.session.set({ kind: 'idle' });
    } else if (mode.kind === 'draw') {
      if (mode.corners.length >= 3 && this.nearest([mode.corners[0]!], e.point) === 0) return this.finish();
      this.session.set({ ...mode, corners: [...mode.corners, at] });
    }
  }

  /** Closes the polygon being drawn and writes it into the scenario. */
  finish(): void {
    const mode = this.session.mode;
    if (mode.kind !== 'draw') return;
    // A double-click's two clicks land on one spot: keep one corner of each cluster.
    const corners = mode.corners.filter((c, i) => {
      if (i === 0) return true;
      const a = this.map.project(c), b = this.map.project(mode.corners[i - 1]!);
      return Math.hypot(a.x - b.x, a.y - b.y) > 3;
    });
    if (corners.length < 3) {
      this.session.set({ ...mode, corners }, `${corners.length === 1 ? 'One corner' : `${corners.length} corners`} so far: an area needs at least three.`);
      return;
    }
    if (mode.target === 'boundary') this.actions.editDraft((doc) => withRing(doc, 'boundary', corners));
    else this.actions.editDraft((doc) => withNewArea(doc, { name: freshAreaName(doc.json), kind: this.nextKind }, corners));
    const state = this.store.get();
    const target: SiteTarget = mode.target === 'boundary' ? 'boundary' : rawAreas(state.draft.json).length - 1;
    const problem = state.draftIssues.find((i) => issueConcerns(i, targetPath(target)));
    const done = mode.target === 'boundary' ? 'Boundary drawn' : 'Area added';
    // Said here too: the list with the message may be scrolled out of view.
    this.session.set({ kind: 'idle' }, problem ? `${done}, but it cannot be used: ${problem.message}. Edit its corners, or delete it.` : mode.target === 'boundary' ? `${done}.` : `${done}: name it and choose its kind below.`);
  }

  private move(e: MapMouseEvent): void {
    const mode = this.session.mode;
    if (mode.kind === 'draw') {
      this.hover = [e.lngLat.lng, e.lngLat.lat];
      this.render();
    } else if (mode.kind === 'edit') {
      if (!this.drag) {
        const on = this.nearest(mode.corners, e.point) >= 0 || this.nearest(this.midpoints(mode.corners), e.point) >= 0;
        this.map.getCanvas().style.cursor = on ? 'move' : '';
      }
    }
  }

  private dragTo(at: LonLat): void {
    const mode = this.session.mode;
    if (!this.drag || mode.kind !== 'edit') return;
    const corners = mode.corners.slice();
    corners[this.drag.index] = at;
    this.drag.moved = true;
    this.session.set({ ...mode, corners });
  }

  private press(e: MapMouseEvent | MapTouchEvent): void {
    const mode = this.session.mode;
    if (mode.kind !== 'edit' || ('button' in e.originalEvent && e.originalEvent.button !== 0)) return;
    const corner = this.nearest(mode.corners, e.point);
    if (corner >= 0) {
      // Taking a handle must not pan the map.
      e.preventDefault();
      this.drag = { index: corner, moved: false };
      this.session.set({ ...mode, selected: corner });
      return;
    }
    const mid = this.nearest(this.midpoints(mode.corners), e.point);
    if (mid >= 0) {
      e.preventDefault();
      const corners = mode.corners.slice();
      corners.splice(mid + 1, 0, [e.lngLat.lng, e.lngLat.lat]);
      this.drag = { index: mid + 1, moved: true };
      this.session.set({ ...mode, corners, selected: mid + 1 });
    } else if (mode.selected !== null) this.session.set({ ...mode, selected: null });
  }

  private release(): void {
    const drag = this.drag;
    this.drag = null;
    const mode = this.session.mode;
    if (drag?.moved && mode.kind === 'edit') this.commit(mode.target, mode.corners);
  }

  private removeAt(e: MapMouseEvent): void {
    const mode = this.session.mode;
    if (mode.kind !== 'edit') return;
    const corner = this.nearest(mode.corners, e.point);
    if (corner < 0) return;
    e.preventDefault();
    e.originalEvent.preventDefault();
    this.removeCorner(corner);
  }

  /** Removes one corner of the polygon being edited (never below three). */
  removeCorner(index: number): void {
    const mode = this.session.mode;
    if (mode.kind !== 'edit') return;
    if (mode.corners.length <= 3) {
      this.session.set(mode, 'A polygon keeps at least three corners; delete the whole area instead.');
      return;
    }
    const corners = mode.corners.filter((_, i) => i !== index);
    this.session.set({ ...mode, corners, selected: null });
    this.commit(mode.target, corners);
  }

  private commit(target: 'boundary' | number, corners: readonly LonLat[]): void {
    this.actions.editDraft((doc) => withRing(doc, target, corners));
  }

  private key(e: KeyboardEvent): void {
    const mode = this.session.mode;
    if (mode.kind === 'idle') return;
    const target = e.target as HTMLElement | null;
    if (target && /^(INPUT|SELECT|TEXTAREA)$/.test(target.tagName)) return;
    if (e.key === 'Escape') {
      this.session.set({ kind: 'idle' }, mode.kind === 'draw' ? 'Drawing stopped; nothing was added.' : '');
    } else if (mode.kind === 'draw' && e.key === 'Enter') {
      e.preventDefault();
      this.finish();
    } else if (mode.kind === 'draw' && e.key === 'Backspace') {
      e.preventDefault();
      this.session.set({ ...mode, corners: mode.corners.slice(0, -1) });
    } else if (mode.kind === 'edit' && (e.key === 'Delete' || e.key === 'Backspace') && mode.selected !== null) {
      e.preventDefault();
      this.removeCorner(mode.selected);
    } else return;
  }

  private render(): void {
    const mode = this.session.mode;
    const features: Feature[] = [];
    if (mode.kind === 'draw' || mode.kind === 'edit') {
      const issues = this.store.get().draftIssues;
      const path = mode.kind === 'edit' ? targetPath(mode.target) : '';
      const invalid = mode.kind === 'edit' && issues.some((i) => issueConcerns(i, path));
      const corners = mode.corners;
      if (mode.kind === 'edit' && corners.length >= 3) {
        // The outline as a line of its own: maplibre leaves a self-crossing polygon's outline undrawn.
        features.push({ type: 'Feature', properties: { invalid }, geometry: { type: 'Polygon', coordinates: [[...corners, corners[0]!]] } });
        features.push({ type: 'Feature', properties: { invalid }, geometry: { type: 'LineString', coordinates: [...corners, corners[0]!] } });
        this.midpoints(corners).forEach((p, i) => features.push({ type: 'Feature', properties: { role: 'mid', index: i, invalid }, geometry: { type: 'Point', coordinates: p } }));
      } else {
        const line = this.hover ? [...corners, this.hover] : corners;
        if (line.length >= 2) features.push({ type: 'Feature', properties: { invalid }, geometry: { type: 'LineString', coordinates: line } });
      }
      corners.forEach((p, i) => features.push({ type: 'Feature', properties: { role: 'corner', index: i, selected: mode.kind === 'edit' && mode.selected === i, invalid }, geometry: { type: 'Point', coordinates: p } }));
    }
    // Polygons of the draft the validator refused are not on the map's own layers (those show the
    // last valid scenario): drawn here in the problem colour, so the user sees what is wrong.
    const { draft, draftIssues } = this.store.get();
    const editing = mode.kind === 'edit' ? mode.target : null;
    const targets: SiteTarget[] = ['boundary', ...rawAreas(draft.json).map((_, i) => i)];
    for (const target of targets) {
      if (target === editing || !draftIssues.some((i) => issueConcerns(i, targetPath(target)))) continue;
      const ring = targetRing(draft.json, target);
      if (!ring || ring.length < 2) continue;
      features.push({ type: 'Feature', properties: { invalid: true, role: 'problem' }, geometry: { type: 'LineString', coordinates: [...ring, ring[0]!] } });
      if (ring.length >= 3) features.push({ type: 'Feature', properties: { invalid: true, role: 'problem' }, geometry: { type: 'Polygon', coordinates: [[...ring, ring[0]!]] } });
    }
    if (mode.kind !== 'draw') this.hover = null;
    this.features = { type: 'FeatureCollection', features };
    (this.map.getSource(SOURCE) as GeoJSONSource | undefined)?.setData(this.features);
  }
}
