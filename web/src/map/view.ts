import type { GeoJSONSource, Map as MapLibreMap, ScaleControl } from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import { createLocalFrame } from '../../../src/analysis/geodesy.js';
import type { AcceptedScenario } from '../scenario/validate.js';
import type { Study } from '../study/compose.js';
import { percent as sheetPercent } from '../../../src/report/sheet/units.js';
import { WORDS } from '../../../src/report/symbols.js';
import { inUnit } from '../units/format.js';
import { figureUnits, type UnitSystem } from '../units/systems.js';
import { attachLandingHover } from './hover.js';
import { MARKER_PIXEL_RATIO, markerImage, markerImageId } from './markers.js';
import { LegendControl } from './legend.js';
import { PadMarker } from './pad-marker.js';
import { KEEP_OUT_FILL, MODE_STYLE_COUNT } from './palette.js';
import { SOURCES, layersOf, type LayerGroup, type SourceId } from './style.js';
import { USER_BASEMAP_SOURCE, applyBackground, type Background } from './tiles.js';
import { WindArrowControl } from './wind-arrow.js';
import {
  EMPTY_COLLECTION,
  areaFeatures,
  basemapFeatures,
  boundaryFeatures,
  boundsOf,
  contourFeatures,
  riskMapFeatures,
  keepOutFeatures,
  landingFeatures,
  ringFeatures,
  ringRadii,
  trackFeatures,
} from './features.js';

type Corner = 'top-left' | 'top-right' | 'bottom-left' | 'bottom-right';
const CORNERS: readonly Corner[] = ['bottom-right', 'bottom-left', 'top-right', 'top-left'];
/** A map narrower than this starts with the legend folded away: open, it would cover half of it. */
const NARROW_MAP_PX = 640;

interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

function overlap(a: Rect, b: Rect): number {
  const w = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
  const h = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
  return w > 0 && h > 0 ? w * h : 0;
}

/** What the map shows: the accepted scenario, and the study when there is one. */
export interface MapScene {
  accepted: AcceptedScenario;
  study: Study | null;
  /** The study belongs to the accepted scenario (otherwise its figures are not put on the areas). */
  current: boolean;
  units: UnitSystem;
}

/**
 * Everything drawn on the map, updated from the page's state. Keeps the data it last gave each
 * source: framing the view reads it back, and so do the browser tests (through the test hook).
 */
export class MapView {
  private readonly given = new Map<SourceId, FeatureCollection>();
  private readonly wind = new WindArrowControl();
  private readonly legend = new LegendControl();
  private readonly pad: PadMarker;
  private scene: MapScene | null = null;
  private basemapFailed = false;
  private faded = false;
  private landingOpacity: unknown = null;
  /** Told when the optional basemap fails to load. */
  onBasemapError: (message: string) => void = () => {};
  private readonly styleReady: Promise<void>;

  constructor(
    readonly map: MapLibreMap,
    private readonly scale: ScaleControl,
    onPadMoved: (lon: number, lat: number) => void,
  ) {
    map.addControl(this.wind, 'top-right');
    map.addControl(this.legend, 'bottom-right');
    // Opened or folded by the reader: its size changed, so it may fit better in another corner.
    this.legend.element.addEventListener('toggle', () => this.placeLegend());
    // The reader's own opening or folding (a click or a key on the summary) decides from then on.
    this.legend.element.querySelector('summary')?.addEventListener('click', () => (this.legendFoldDecided = true));
    map.on('resize', () => this.placeLegend());
    this.pad = new PadMarker(map, { onDrag: (lon, lat) => this.drawRings(lon, lat), onMoved: onPadMoved });
    // Ring spacing follows the zoom, so a few rings are always in view.
    map.on('moveend', () => {
      const pad = this.scene?.accepted.scenario.site.pad;
      if (pad) this.drawRings(pad.lon, pad.lat);
    });
    this.styleReady = new Promise<void>((resolve) => {
      if (map.isStyleLoaded()) resolve();
      else map.once('load', () => resolve());
    }).then(() => {
      for (let m = 0; m < MODE_STYLE_COUNT; m++) map.addImage(markerImageId(m), markerImage(m), { pixelRatio: MARKER_PIXEL_RATIO });
    });
    // A basemap the user asked for may fail to load (no network, a wrong URL, a damaged file):
    // that is said once in the Map tab, not left as a stream of console errors.
    map.on('error', (event) => {
      const source = (event as { sourceId?: string }).sourceId;
      if (source === USER_BASEMAP_SOURCE) {
        if (!this.basemapFailed) this.onBasemapError(`some basemap tiles could not be loaded (${event.error?.message ?? 'unknown error'})`);
        this.basemapFailed = true;
        return;
      }
      console.error(event.error);
    });
    attachLandingHover(map, 'landings', () => {
      const s = this.scene;
      return s?.study ? { set: s.study.set, height: figureUnits(s.units).length } : null;
    });
  }

  /** Resolves once the style has loaded and the sources exist. */
  ready(): Promise<void> {
    return this.styleReady;
  }

  /** Sources given new data whose map source is not yet told (see `show`). */
  private held: Set<SourceId> | null = null;

  private setData(id: SourceId, data: FeatureCollection): void {
    this.given.set(id, data);
    if (this.held) this.held.add(id);
    else (this.map.getSource(id) as GeoJSONSource | undefined)?.setData(data);
  }

  /** Hands the held sources' data to the map. */
  private release(): void {
    const held = this.held;
    this.held = null;
    for (const id of held ?? []) (this.map.getSource(id) as GeoJSONSource | undefined)?.setData(this.given.get(id) ?? EMPTY_COLLECTION);
  }

  /** The features last given to a source. */
  sourceData(id: SourceId): FeatureCollection {
    return this.given.get(id) ?? EMPTY_COLLECTION;
  }

  async show(scene: MapScene, options: { fit: 'site' | 'results' | 'none' }): Promise<void> {
    await this.styleReady;
    // The data is handed to the map only after the view is framed: a source told first builds
    // its tiles for the old zoom, then again for the new one, and each build is drawn.
    this.held = new Set();
    try {
      this.showHeld(scene, options);
    } finally {
      this.release();
    }
  }

  private showHeld(scene: MapScene, options: { fit: 'site' | 'results' | 'none' }): void {
    this.decideLegendFold();
    const previous = this.scene;
    this.scene = scene;
    const { scenario, nominal } = scene.accepted;
    const units = figureUnits(scene.units);
    const site = scenario.site;

    if (previous?.accepted !== scene.accepted || previous.units !== scene.units) {
      const basemap = basemapFeatures(site);
      this.setData(SOURCES.basemap, basemap.shapes);
      this.setData(SOURCES.basemapLabels, basemap.labels);
      this.setData(SOURCES.boundary, boundaryFeatures(site));
      const track = trackFeatures(nominal, units.length, scenario.vehicle.kind);
      this.setData(SOURCES.track, track.shapes);
      this.setData(SOURCES.trackLabels, track.labels);
      this.pad.place(site.pad.lon, site.pad.lat);
      this.wind.show(scenario.weather.wind, units.speed);
      this.scale.setUnit(scene.units === 'metric' ? 'metric' : 'imperial');
    }

    const study = scene.study;
    const figures = scene.current && study?.analysis ? study.analysis.areas.map((a) => ({ hits: a.hits, probability: a.probability, upper95: a.upper95 })) : [];
    // The sheet's words and number formatting, so a label reads the same on paper and on screen.
    const areas = areaFeatures(site, figures, (f) => WORDS.areaChance(f.hits, sheetPercent(f.probability), sheetPercent(f.upper95)));
    this.setData(SOURCES.areas, areas.shapes);
    this.setData(SOURCES.areaLabels, areas.labels);

    if (previous?.study !== study || previous.units !== scene.units) {
      if (study) {
        const frame = createLocalFrame(study.accepted.scenario.site.pad);
        this.setData(SOURCES.landings, landingFeatures(study.set, frame));
        const contours = study.analysis ? contourFeatures(study.analysis) : { shapes: EMPTY_COLLECTION, labels: EMPTY_COLLECTION };
        this.setData(SOURCES.contours, contours.shapes);
        this.setData(SOURCES.contourLabels, contours.labels);
        const zone = study.analysis ? keepOutFeatures(study.analysis, units.length) : { shapes: EMPTY_COLLECTION, labels: EMPTY_COLLECTION };
        this.setData(SOURCES.keepOut, zone.shapes);
        this.setData(SOURCES.keepOutLabel, zone.labels);
        const risk = study.analysis ? riskMapFeatures(study.analysis, study.accepted.scenario.site.pad) : { shapes: EMPTY_COLLECTION, labels: EMPTY_COLLECTION };
        this.setData(SOURCES.risk, risk.shapes);
        this.setData(SOURCES.riskLabels, risk.labels);
      } else {
        for (const id of [SOURCES.landings, SOURCES.contours, SOURCES.contourLabels, SOURCES.keepOut, SOURCES.keepOutLabel, SOURCES.risk, SOURCES.riskLabels]) this.setData(id, EMPTY_COLLECTION);
      }
    }
    // Results from an earlier version of the scenario stay visible, but faded.
    const faded = study !== null && !scene.current;
    if (faded !== this.faded) {
      this.faded = faded;
      if (faded) this.landingOpacity = this.map.getPaintProperty('landings', 'icon-opacity');
      this.map.setPaintProperty('landings', 'icon-opacity', faded ? 0.3 : (this.landingOpacity as number));
      this.map.setPaintProperty('keepout-fill', 'fill-opacity', (KEEP_OUT_FILL.opacity ?? 1) * (faded ? 0.4 : 1));
    }

    this.drawRings(site.pad.lon, site.pad.lat);
    const k = study?.analysis?.keepOut.properties;
    this.legend.show({
      modes: study?.set.modeNames ?? [],
      levels: study?.analysis?.levels ?? [],
      keepOut: k ? { level: k.level, parts: k.parts, margin: k.margin_m > 0 ? inUnit(k.margin_m, units.length) : null } : null,
      areaKinds: [...new Set(site.areas.map((a) => a.kind as string))],
      hasTrack: nominal.track.length > 1,
      hasBoundary: site.boundary !== undefined,
      risk: study?.analysis?.risk ? { levels: study.analysis.risk.lines.map((l) => ({ level: l.level, resolved: l.resolved })), standingLevel: study.analysis.risk.standingLevel, standingResolved: study.analysis.risk.standingLine.resolved } : null,
    });

    if (options.fit === 'site') this.fitSite();
    else if (options.fit === 'results') this.fitResults();
    this.placeLegend();
  }

  /** Where the legend sits now. */
  legendCorner: Corner = 'bottom-right';

  /**
   * Puts the legend in the map corner where it covers least of what was found: the keep-out zone,
   * its label, the marked areas' labels and the pad. On a narrow map it starts folded away
   * (the reader opens it); once the reader opens or folds it, the page leaves that choice alone.
   */
  placeLegend(): void {
    const box = this.legend.element;
    const container = this.map.getContainer();
    const width = container.clientWidth;
    const height = container.clientHeight;
    this.decideLegendFold();
    const keep: Rect[] = [];
    const rectAround = (lon: number, lat: number, w: number, h: number): Rect => {
      const p = this.map.project([lon, lat]);
      return { x: p.x - w / 2, y: p.y - h / 2, w, h };
    };
    const zone = boundsOf(this.sourceData(SOURCES.keepOut));
    if (zone) {
      const a = this.map.project([zone[0], zone[3]]);
      const b = this.map.project([zone[2], zone[1]]);
      keep.push({ x: a.x, y: a.y, w: b.x - a.x, h: b.y - a.y });
    }
    // Labels count more than area: a hidden label hides a figure.
    for (const f of this.sourceData(SOURCES.keepOutLabel).features) if (f.geometry.type === 'Point') keep.push(rectAround(f.geometry.coordinates[0]!, f.geometry.coordinates[1]!, 160, 60), rectAround(f.geometry.coordinates[0]!, f.geometry.coordinates[1]!, 160, 60));
    for (const f of this.sourceData(SOURCES.areaLabels).features) if (f.geometry.type === 'Point') keep.push(rectAround(f.geometry.coordinates[0]!, f.geometry.coordinates[1]!, 140, 40));
    const pad = this.scene?.accepted.scenario.site.pad;
    if (pad) keep.push(rectAround(pad.lon, pad.lat, 40, 40));
    const w = box.offsetWidth;
    const natural = Math.max(box.scrollHeight, box.offsetHeight);
    const othersIn = (corner: Corner): number => {
      const holder = container.querySelector<HTMLElement>(`.maplibregl-ctrl-${corner}`);
      return holder ? [...holder.children].filter((c) => c !== box).reduce((sum, c) => sum + (c as HTMLElement).offsetHeight + 10, 0) : 0;
    };
    // Never taller than the map leaves in its corner's column (the list scrolls instead): a legend
    // taller than the map would push its fold control off the map, under the page's top bar.
    const room = (corner: Corner): number => Math.max(60, Math.min(height - othersIn(corner) - 20, 0.6 * window.innerHeight));
    const costOf = (corner: Corner): number => {
      const others = othersIn(corner);
      const h = Math.min(natural, room(corner));
      const x = corner.endsWith('left') ? 10 : width - w - 10;
      const y = corner.startsWith('top') ? others + 10 : height - others - h - 10;
      const r = { x, y, w, h };
      return keep.reduce((sum, k) => sum + overlap(r, k), 0);
    };
    let best = this.legendCorner;
    let bestCost = costOf(best);
    for (const corner of CORNERS) {
      const cost = costOf(corner);
      if (cost < bestCost - 1) {
        best = corner;
        bestCost = cost;
      }
    }
    if (best !== this.legendCorner) {
      this.legendCorner = best;
      const holder = container.querySelector<HTMLElement>(`.maplibregl-ctrl-${best}`);
      if (holder) {
        if (best.startsWith('bottom')) holder.prepend(box);
        else holder.append(box);
      }
    }
    box.style.maxHeight = `${Math.floor(room(best))}px`;
    box.dataset.corner = best;
  }
  private legendFoldDecided = false;

  /**
   * On a narrow map the legend is folded away, on a wide one open, until the reader opens or folds
   * it: from then on that choice stands.
   */
  private decideLegendFold(): void {
    if (this.legendFoldDecided) return;
    const open = this.map.getContainer().clientWidth >= NARROW_MAP_PX;
    if (this.legend.element.open !== open) this.legend.element.open = open;
  }

  /** Rings around a pad position (also while the marker is being dragged). */
  private drawRings(lon: number, lat: number): void {
    const scene = this.scene;
    if (!scene) return;
    const unit = figureUnits(scene.units).length;
    const frame = createLocalFrame({ lat, lon });
    const b = this.map.getBounds();
    const corners: [number, number][] = [[b.getWest(), b.getSouth()], [b.getWest(), b.getNorth()], [b.getEast(), b.getSouth()], [b.getEast(), b.getNorth()]];
    const reach = Math.max(...corners.map(([x, y]) => Math.hypot(...frame.toEastNorth(x, y))));
    const rings = ringFeatures(frame, ringRadii(reach, unit), unit);
    this.setData(SOURCES.rings, rings.shapes);
    this.setData(SOURCES.ringLabels, rings.labels);
  }

  /** Frames the whole site (a new scenario). */
  fitSite(): void {
    this.fitTo(boundsOf(this.sourceData(SOURCES.boundary), this.sourceData(SOURCES.basemap), this.sourceData(SOURCES.keepOut), this.sourceData(SOURCES.track), this.sourceData(SOURCES.areas)));
  }

  /**
   * Frames the results (after a run): the zone, the landings and the track, with the marked
   * areas that lie within reach of the zone, so the people nearest to it stay in view.
   */
  fitResults(): void {
    const scene = this.scene;
    if (!scene?.study) return;
    const pad = scene.accepted.scenario.site.pad;
    const frame = createLocalFrame(pad);
    const reach = 3 * Math.max(scene.study.summary.keepOut.maxDistance_m || 0, scene.study.summary.farthestLanding?.distance_m ?? 0);
    const areas = this.sourceData(SOURCES.areas);
    const near = { ...areas, features: areas.features.filter((f) => f.geometry.type === 'Polygon' && f.geometry.coordinates[0]!.some(([lon, lat]) => Math.hypot(...frame.toEastNorth(lon!, lat!)) <= reach)) };
    this.fitTo(boundsOf(this.sourceData(SOURCES.keepOut), this.sourceData(SOURCES.landings), this.sourceData(SOURCES.track), near));
  }

  /** Fits bounds in the part of the map the legend and the wind card leave free. */
  private fitTo(bounds: [number, number, number, number] | null): void {
    if (!bounds) return;
    const legend = this.legend.width();
    // Never more padding than a third of the map, or fitBounds gives up and zooms far out.
    const width = this.map.getContainer().clientWidth;
    const height = this.map.getContainer().clientHeight;
    const side = Math.min(50, width / 8);
    const right = Math.min(Math.max(side, legend + 30), width / 3);
    const vertical = Math.min(50, height / 8);
    this.map.fitBounds(bounds, { padding: { top: vertical, bottom: vertical, left: side, right }, duration: 0, maxZoom: 17.5 });
  }

  setLayerVisible(group: LayerGroup, visible: boolean): void {
    for (const id of layersOf(group)) if (this.map.getLayer(id)) this.map.setLayoutProperty(id, 'visibility', visible ? 'visible' : 'none');
  }

  async setBackground(background: Background): Promise<string> {
    await this.styleReady;
    this.basemapFailed = false;
    return applyBackground(this.map, background);
  }
}

