import type { ExpressionSpecification, GeoJSONSource, LayerSpecification, Map as MapLibreMap } from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import { eventItemZoneSymbol, riskLineSymbol, SYMBOLS, WORDS, type LineSymbol } from '../../../src/report/symbols.js';
import { smallRate } from '../../../src/report/sheet/units.js';
import { el, replaceChildren } from '../panels/dom.js';
import { EMPTY_COLLECTION, boundsOf } from './features.js';
import { AREA_KINDS, BOUNDARY, KEEP_OUT, KEEP_OUT_FILL, areaStyle, screenLine, type LineStyle } from './palette.js';
import { FONT, LAYER_GROUPS, SOURCES, layersOf, offlineStyle, type LayerGroup } from './style.js';

/**
 * What the page draws over the scenario's map, in layers of its own (so the scenario's layers and
 * their switches in the Map tab stay as they are): a drone operation's route or area; an event
 * (its site, every item's keep-out zone and their union, the individual-risk lines over the event,
 * its pads), which hides the scenario's layers while it is shown; and the two zones of a
 * comparison. Every line is a symbol of src/report/symbols.ts, as on the sheets.
 */

export const OVERLAY_SOURCES = {
  route: 'release-route',
  eventBasemap: 'event-basemap',
  eventBasemapLabels: 'event-basemap-labels',
  eventSite: 'event-site',
  eventAreaLabels: 'event-area-labels',
  eventZones: 'event-zones',
  eventZoneLabels: 'event-zone-labels',
  eventRisk: 'event-risk',
  eventPads: 'event-pads',
  compare: 'compare-zones',
} as const;

export type OverlaySourceId = (typeof OVERLAY_SOURCES)[keyof typeof OVERLAY_SOURCES];

const ITEM_STYLES = SYMBOLS.eventItemZones.length;

function paint(s: LineStyle): Record<string, unknown> {
  return { 'line-color': s.color, 'line-width': s.width, ...(s.dash.length ? { 'line-dasharray': s.dash } : {}) };
}

function byAreaKind(pick: (kind: string) => string | number): ExpressionSpecification {
  const cases: unknown[] = [];
  for (const kind of AREA_KINDS) cases.push(kind, pick(kind));
  return ['match', ['get', 'areaKind'], ...cases, pick('other')] as unknown as ExpressionSpecification;
}

/**
 * The event site's own basemap, drawn exactly as the scenario's (the same layer definitions from
 * style.ts, on sources of the event's), since the plan may be for another place than the scenario.
 */
function basemapLayers(): { scenario: string[]; event: LayerSpecification[] } {
  const base = offlineStyle().layers.filter((l) => 'source' in l && (l.source === SOURCES.basemap || l.source === SOURCES.basemapLabels));
  return {
    scenario: base.map((l) => l.id),
    event: base.map((l) => ({ ...l, id: `event-${l.id}`, source: (l as { source: string }).source === SOURCES.basemap ? OVERLAY_SOURCES.eventBasemap : OVERLAY_SOURCES.eventBasemapLabels }) as LayerSpecification),
  };
}
const BASEMAP_LAYERS = basemapLayers();

/** Layers drawn with the event view on the map: the event's own (the scenario's are hidden meanwhile). */
const EVENT_LAYERS = [...BASEMAP_LAYERS.event.map((l) => l.id), 'event-area-fill', 'event-area-line', 'event-boundary', 'event-route-area-fill', 'event-route-area-line', 'event-route-path', 'event-union-fill', 'event-union-line', ...Array.from({ length: ITEM_STYLES }, (_, i) => `event-item-zone-${i}`), 'event-risk-0', 'event-risk-1', 'event-risk-2', 'event-pad', 'event-pad-centre', 'event-area-label', 'event-zone-label'];
const SCENARIO_OVERLAY_LAYERS = ['route-area-fill', 'route-area-line', 'route-path', 'compare-a', 'compare-b'];

function overlayLayers(): LayerSpecification[] {
  const route = screenLine(SYMBOLS.releasePath);
  const routeArea = screenLine(SYMBOLS.releaseArea.line);
  const routeFill = SYMBOLS.releaseArea.fill;
  const isPath = ['==', ['get', 'kind'], 'release-path'];
  const isArea = ['==', ['get', 'kind'], 'release-area'];
  const routeLayers = (prefix: string, source: string): LayerSpecification[] => [
    { id: `${prefix}area-fill`, type: 'fill', source, filter: isArea, paint: { 'fill-color': routeFill.color, 'fill-opacity': routeFill.opacity ?? 1 } },
    { id: `${prefix}area-line`, type: 'line', source, filter: isArea, layout: { 'line-join': 'round' }, paint: paint(routeArea) },
    { id: `${prefix}path`, type: 'line', source, filter: isPath, layout: { 'line-join': 'round', 'line-cap': route.cap }, paint: paint(route) },
  ] as LayerSpecification[];
  const S = OVERLAY_SOURCES;
  const label = { 'text-font': [FONT], 'text-field': ['get', 'label'], 'text-max-width': 22 };
  return [
    ...routeLayers('route-', S.route),
    { id: 'compare-a', type: 'line', source: S.compare, filter: ['==', ['get', 'side'], 'a'], layout: { 'line-join': 'round' }, paint: paint(screenLine(SYMBOLS.compareA)) },
    { id: 'compare-b', type: 'line', source: S.compare, filter: ['==', ['get', 'side'], 'b'], layout: { 'line-join': 'round' }, paint: paint(screenLine(SYMBOLS.compareB)) },
    { id: 'event-area-fill', type: 'fill', source: S.eventSite, filter: ['==', ['get', 'kind'], 'area'], paint: { 'fill-color': byAreaKind((k) => areaStyle(k).fill), 'fill-opacity': byAreaKind((k) => areaStyle(k).opacity) } },
    { id: 'event-area-line', type: 'line', source: S.eventSite, filter: ['==', ['get', 'kind'], 'area'], paint: { 'line-color': byAreaKind((k) => areaStyle(k).line.color), 'line-width': byAreaKind((k) => areaStyle(k).line.width) } },
    { id: 'event-boundary', type: 'line', source: S.eventSite, filter: ['==', ['get', 'kind'], 'boundary'], paint: paint(BOUNDARY) },
    ...routeLayers('event-route-', S.eventSite),
    { id: 'event-union-fill', type: 'fill', source: S.eventZones, filter: ['==', ['get', 'kind'], 'union'], paint: { 'fill-color': KEEP_OUT_FILL.color, 'fill-opacity': KEEP_OUT_FILL.opacity ?? 1 } },
    { id: 'event-union-line', type: 'line', source: S.eventZones, filter: ['==', ['get', 'kind'], 'union'], layout: { 'line-join': 'round' }, paint: paint(KEEP_OUT) },
    ...Array.from({ length: ITEM_STYLES }, (_, i) => ({
      id: `event-item-zone-${i}`,
      type: 'line',
      source: S.eventZones,
      // Past the table the styles repeat, as on the event sheet.
      filter: ['all', ['==', ['get', 'kind'], 'item'], ['==', ['%', ['get', 'index'], ITEM_STYLES], i]],
      layout: { 'line-join': 'round', 'line-cap': screenLine(eventItemZoneSymbol(i)).cap },
      paint: paint(screenLine(eventItemZoneSymbol(i))),
    })),
    ...[0, 1, 2].map((k) => ({ id: `event-risk-${k}`, type: 'line', source: S.eventRisk, filter: ['==', ['get', 'index'], k], layout: { 'line-join': 'round' }, paint: paint(screenLine(riskLineSymbol(k))) })),
    { id: 'event-pad', type: 'circle', source: S.eventPads, paint: { 'circle-color': '#FFFFFF', 'circle-radius': SYMBOLS.pad.radius * 1.4, 'circle-stroke-color': SYMBOLS.pad.ring, 'circle-stroke-width': SYMBOLS.pad.ringWidth * 1.4 } },
    { id: 'event-pad-centre', type: 'circle', source: S.eventPads, paint: { 'circle-color': SYMBOLS.pad.ring, 'circle-radius': SYMBOLS.pad.centre * 1.4 } },
    // Under the area labels: maplibre places the top layer's labels first, and an area's figures matter more than the zone's name (the key names it too).
    { id: 'event-zone-label', type: 'symbol', source: S.eventZoneLabels, layout: { ...label, 'text-size': 13, 'text-variable-anchor': ['top', 'bottom', 'left', 'right'], 'text-radial-offset': 0.5, 'text-allow-overlap': false }, paint: { 'text-color': SYMBOLS.keepOut.labelColor, 'text-halo-color': '#FFFFFF', 'text-halo-width': 2 } },
    { id: 'event-area-label', type: 'symbol', source: S.eventAreaLabels, layout: { ...label, 'text-size': 12 }, paint: { 'text-color': '#1A1A1A', 'text-halo-color': '#FFFFFF', 'text-halo-width': 1.6 } },
  ] as LayerSpecification[];
}

function swatch(s: LineSymbol, fill?: { color: string; opacity?: number }): SVGSVGElement {
  const SVG = 'http://www.w3.org/2000/svg';
  const line = screenLine(s);
  const box = document.createElementNS(SVG, 'svg');
  box.setAttribute('width', '30');
  box.setAttribute('height', '14');
  box.setAttribute('aria-hidden', 'true');
  const shape = document.createElementNS(SVG, fill ? 'rect' : 'line');
  const attrs: Record<string, string> = fill
    ? { x: '2', y: '3', width: '26', height: '8', fill: fill.color, 'fill-opacity': String(fill.opacity ?? 1) }
    : { x1: '2', y1: '7', x2: '28', y2: '7' };
  for (const [k, v] of Object.entries({ ...attrs, stroke: line.color, 'stroke-width': String(line.width) })) shape.setAttribute(k, v);
  if (line.dash.length > 0) shape.setAttribute('stroke-dasharray', line.dash.map((d) => d * line.width).join(' '));
  box.appendChild(shape);
  return box;
}

/** A key entry: the symbol as drawn and its words. */
export function keyEntry(s: LineSymbol, text: string, fill?: { color: string; opacity?: number }): HTMLElement {
  return el('li', {}, swatch(s, fill), el('span', { text }));
}

export class MapOverlay {
  private readonly given = new Map<string, FeatureCollection>();
  private readonly ready: Promise<void>;
  private eventShown = false;
  /** The scenario layers' visibility before the event hid them, restored after. */
  private hidden: { id: string; visibility: unknown }[] = [];
  /** The key of what the overlay draws (a small box on the map, top left). */
  readonly key = el('details', { class: 'maplibregl-ctrl overlay-key', data: { test: 'overlay-key' } });
  /** Whether the reader opened or folded the key (from then on the page leaves it). */
  private keyFoldDecided = false;
  private keys = { route: [] as HTMLElement[], event: [] as HTMLElement[], compare: [] as HTMLElement[] };

  constructor(readonly map: MapLibreMap) {
    this.ready = new Promise<void>((resolve) => {
      if (map.isStyleLoaded()) resolve();
      else map.once('load', () => resolve());
    }).then(() => {
      for (const id of Object.values(OVERLAY_SOURCES)) map.addSource(id, { type: 'geojson', data: this.given.get(id) ?? EMPTY_COLLECTION });
      // Over the scenario's results, under its labels.
      // Labels go on top of every other label: the event's figures are placed first.
      const before = map.getLayer('basemap-label') ? 'basemap-label' : undefined;
      // The event's basemap goes where the scenario's lies, at the bottom of the results.
      const bottom = map.getLayer('boundary-line') ? 'boundary-line' : before;
      for (const layer of BASEMAP_LAYERS.event) map.addLayer(layer, layer.type === 'symbol' ? before : bottom);
      for (const layer of overlayLayers()) map.addLayer(layer, layer.type === 'symbol' ? undefined : before);
      for (const id of EVENT_LAYERS) map.setLayoutProperty(id, 'visibility', this.eventShown ? 'visible' : 'none');
    });
    this.key.hidden = true;
    map.on('resize', () => {
      if (!this.keyFoldDecided) this.key.open = map.getContainer().clientWidth >= 640;
    });
    map.addControl({ onAdd: () => this.key, onRemove: () => this.key.remove() }, 'top-left');
  }

  whenReady(): Promise<void> {
    return this.ready;
  }

  setData(id: OverlaySourceId, data: FeatureCollection): void {
    this.given.set(id, data);
    (this.map.getSource(id) as GeoJSONSource | undefined)?.setData(data);
  }

  sourceData(id: OverlaySourceId): FeatureCollection {
    return this.given.get(id) ?? EMPTY_COLLECTION;
  }

  setRouteKey(kinds: readonly ('path' | 'area')[]): void {
    this.keys.route = kinds.map((k) => (k === 'path' ? keyEntry(SYMBOLS.releasePath, WORDS.releasePath) : keyEntry(SYMBOLS.releaseArea.line, WORDS.releaseArea, SYMBOLS.releaseArea.fill)));
    this.drawKey();
  }

  setCompareKey(entries: HTMLElement[]): void {
    this.keys.compare = entries;
    this.drawKey();
  }

  setEventKey(items: readonly string[], riskLevels: readonly number[], routes: readonly ('path' | 'area')[]): void {
    this.keys.event = [
      keyEntry(SYMBOLS.keepOut.line, WORDS.eventUnion, SYMBOLS.keepOut.fill),
      ...items.map((name, i) => keyEntry(eventItemZoneSymbol(i), WORDS.eventItemZone(name))),
      ...riskLevels.map((level, k) => keyEntry(riskLineSymbol(k), WORDS.eventRiskLine(smallRate(level)))),
      ...[...new Set(routes)].map((k) => (k === 'path' ? keyEntry(SYMBOLS.releasePath, WORDS.releasePath) : keyEntry(SYMBOLS.releaseArea.line, WORDS.releaseArea, SYMBOLS.releaseArea.fill))),
    ];
    this.drawKey();
  }

  private drawKey(): void {
    const entries = this.eventShown ? this.keys.event : [...this.keys.route, ...this.keys.compare];
    this.key.hidden = entries.length === 0;
    const summary = el('summary', { text: this.eventShown ? 'Key: the event' : 'Key' });
    summary.addEventListener('click', () => (this.keyFoldDecided = true));
    replaceChildren(this.key, summary, el('ul', {}, ...entries));
    // Folded on a narrow map, where it would cover most of it, until the reader decides.
    if (!this.keyFoldDecided) this.key.open = this.map.getContainer().clientWidth >= 640;
  }

  /**
   * Shows the event instead of the scenario, or back. The scenario's layers are hidden, not
   * cleared, and come back with the visibility the Map tab gave them.
   */
  async showEvent(on: boolean): Promise<void> {
    await this.ready;
    if (on === this.eventShown) return;
    this.eventShown = on;
    const container = this.map.getContainer();
    container.classList.toggle('event-on-map', on);
    if (on) {
      const ids = [...(Object.keys(LAYER_GROUPS) as LayerGroup[]).flatMap((g) => layersOf(g)), 'boundary-line', ...BASEMAP_LAYERS.scenario, ...SCENARIO_OVERLAY_LAYERS].filter((id) => this.map.getLayer(id));
      this.hidden = ids.map((id) => ({ id, visibility: this.map.getLayoutProperty(id, 'visibility') }));
      for (const { id } of this.hidden) this.map.setLayoutProperty(id, 'visibility', 'none');
      for (const id of EVENT_LAYERS) this.map.setLayoutProperty(id, 'visibility', 'visible');
    } else {
      for (const id of EVENT_LAYERS) this.map.setLayoutProperty(id, 'visibility', 'none');
      for (const { id, visibility } of this.hidden) this.map.setLayoutProperty(id, 'visibility', (visibility as 'visible' | 'none' | undefined) ?? 'visible');
      this.hidden = [];
    }
    this.drawKey();
  }

  get showingEvent(): boolean {
    return this.eventShown;
  }

  /** Frames the given sources (the event's site and zones, say). */
  fitTo(ids: OverlaySourceId[]): void {
    const b = boundsOf(...ids.map((id) => this.sourceData(id)));
    if (!b) return;
    const c = this.map.getContainer();
    const pad = Math.min(60, Math.max(16, Math.min(c.clientWidth, c.clientHeight) / 10));
    this.map.fitBounds([[b[0], b[1]], [b[2], b[3]]], { padding: pad, duration: 0, maxZoom: 18 });
  }
}
