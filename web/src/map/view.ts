import type { GeoJSONSource, Map as MapLibreMap, ScaleControl } from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import { createLocalFrame } from '../../../src/analysis/geodesy.js';
import type { AcceptedScenario } from '../scenario/validate.js';
import type { Study } from '../study/compose.js';
import { percent } from '../units/format.js';
import { figureUnits, type UnitSystem } from '../units/systems.js';
import { attachLandingHover } from './hover.js';
import { hatchImage } from './hatch.js';
import { LegendControl } from './legend.js';
import { PadMarker } from './pad-marker.js';
import { KEEP_OUT } from './palette.js';
import { KEEP_OUT_HATCH, SOURCES, layersOf, type LayerGroup, type SourceId } from './style.js';
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
      map.addImage(KEEP_OUT_HATCH, hatchImage(KEEP_OUT.hatch));
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

  private setData(id: SourceId, data: FeatureCollection): void {
    this.given.set(id, data);
    (this.map.getSource(id) as GeoJSONSource | undefined)?.setData(data);
  }

  /** The features last given to a source. */
  sourceData(id: SourceId): FeatureCollection {
    return this.given.get(id) ?? EMPTY_COLLECTION;
  }

  async show(scene: MapScene, options: { fit: 'site' | 'results' | 'none' }): Promise<void> {
    await this.styleReady;
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
    const figures = scene.current && study?.analysis ? study.analysis.areas.map((a) => ({ hits: a.hits, probability: a.probability })) : [];
    const areas = areaFeatures(site, figures, (f) => (f.hits === 0 ? 'no landing' : percent(f.probability)));
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
    this.map.setPaintProperty('landings', 'circle-opacity', faded ? 0.3 : 0.85);
    this.map.setPaintProperty('contour-fill', 'fill-opacity', faded ? 0.04 : 0.1);
    this.map.setPaintProperty('keepout-fill', 'fill-opacity', faded ? 0.2 : 0.55);

    this.drawRings(site.pad.lon, site.pad.lat);
    this.legend.show({
      modes: study?.set.modeNames ?? [],
      levels: study?.analysis?.levels ?? [],
      keepOut: study?.analysis ? { level: study.analysis.keepOut.properties.level } : null,
      hasAreas: site.areas.length > 0,
      areaFigures: figures.length > 0,
      hasTrack: nominal.track.length > 1,
      risk: study?.analysis?.risk ? { levels: study.analysis.risk.lines.map((l) => ({ level: l.level, resolved: l.resolved })), standingLevel: study.analysis.risk.standingLevel } : null,
    });

    if (options.fit === 'site') this.fitSite();
    else if (options.fit === 'results') this.fitResults();
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
    this.map.fitBounds(bounds, { padding: { top: 50, bottom: 40, left: 50, right: Math.max(50, legend + 30) }, duration: 0, maxZoom: 17.5 });
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

