import type { GeoJSONSource, Map as MapLibreMap } from 'maplibre-gl';
import type { Feature, FeatureCollection } from 'geojson';
import { createLocalFrame } from '../../../src/analysis/geodesy.js';
import { terrainContours } from '../../../src/terrain/contours.js';
import type { Site } from '../../../src/scenario/types.js';
import { FONT } from './style.js';
import { inUnit } from '../units/format.js';
import type { Unit } from '../units/systems.js';

/**
 * The scenario's terrain (`site.terrain`) as contour lines on the map, offline: the same
 * d3-contour lines the review sheet draws (src/terrain/contours.ts), from the grid the flights
 * use, every fifth line heavier and labelled with its height above sea level. Drawn under the
 * boundary and the areas, above the scenario's own basemap.
 */

const SOURCE = 'terrain';
const LINE = '#8A6A3C';
/** The first layer of the scenario proper: terrain goes beneath it. */
const BENEATH = 'boundary-line';

export interface TerrainSummary {
  file: string;
  interval: number;
  lines: number;
  /** Lowest and highest ground on the grid, m above sea level. */
  lowest: number;
  highest: number;
}

/** Contour features of a site's terrain in lon/lat (empty without terrain). */
export function terrainFeatures(site: Site, length: Unit): { features: FeatureCollection; summary: TerrainSummary | null } {
  const grid = site.terrain;
  if (!grid) return { features: { type: 'FeatureCollection', features: [] }, summary: null };
  const frame = createLocalFrame(site.pad);
  const { interval, lines } = terrainContours(grid);
  const elevation = site.pad.elevation;
  const features: Feature[] = lines.map((line) => {
    const major = interval > 0 && Math.abs(line.level / interval) % 5 < 1e-6;
    return {
      type: 'Feature',
      properties: { level: line.level, major, label: major ? inUnit(elevation + line.level, length) : '' },
      geometry: { type: 'LineString', coordinates: line.points.map(([e, n]) => frame.toLonLat(e, n)) },
    };
  });
  let lowest = Infinity, highest = -Infinity;
  for (const h of grid.heights) {
    lowest = Math.min(lowest, h);
    highest = Math.max(highest, h);
  }
  return { features: { type: 'FeatureCollection', features }, summary: { file: grid.file, interval, lines: lines.length, lowest: elevation + lowest, highest: elevation + highest } };
}

export class TerrainLayer {
  features: FeatureCollection = { type: 'FeatureCollection', features: [] };
  private readonly ready: Promise<void>;

  constructor(private readonly map: MapLibreMap, ready: Promise<void>) {
    this.ready = ready.then(() => {
      map.addSource(SOURCE, { type: 'geojson', data: this.features });
      const before = map.getLayer(BENEATH) ? BENEATH : undefined;
      map.addLayer({ id: 'terrain-line', type: 'line', source: SOURCE, filter: ['!', ['get', 'major']], paint: { 'line-color': LINE, 'line-width': 0.8, 'line-opacity': 0.7 } }, before);
      map.addLayer({ id: 'terrain-line-major', type: 'line', source: SOURCE, filter: ['get', 'major'], paint: { 'line-color': LINE, 'line-width': 1.6, 'line-opacity': 0.85 } }, before);
      map.addLayer(
        {
          id: 'terrain-label',
          type: 'symbol',
          source: SOURCE,
          filter: ['get', 'major'],
          layout: { 'symbol-placement': 'line', 'text-field': ['get', 'label'], 'text-font': [FONT], 'text-size': 10, 'symbol-spacing': 320 },
          paint: { 'text-color': LINE, 'text-halo-color': '#FFFFFF', 'text-halo-width': 1.4 },
        },
        before,
      );
    });
  }

  async show(features: FeatureCollection): Promise<void> {
    this.features = features;
    await this.ready;
    (this.map.getSource(SOURCE) as GeoJSONSource | undefined)?.setData(features);
  }
}
