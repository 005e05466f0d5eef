import { addProtocol, type Map as MapLibreMap } from 'maplibre-gl';
import { FileSource, PMTiles, Protocol, TileType } from 'pmtiles';
import { BASEMAP_FILL_LAYERS, FIRST_SCENARIO_LAYER } from './style.js';

/**
 * An optional real basemap beneath the scenario: raster tiles from a URL (for users with a
 * network), or a PMTiles archive opened from disk, which works offline. Off by default: the page
 * fetches nothing unless the user asks for it here.
 */
export type Background = { kind: 'none' } | { kind: 'url'; url: string } | { kind: 'pmtiles'; file: File };

export const USER_BASEMAP_SOURCE = 'user-basemap';
const SOURCE = USER_BASEMAP_SOURCE;
const LAYER_PREFIX = 'user-basemap-';

let protocol: Protocol | null = null;

function pmtilesProtocol(): Protocol {
  if (protocol === null) {
    protocol = new Protocol();
    addProtocol('pmtiles', protocol.tile);
  }
  return protocol;
}

function removeBackground(map: MapLibreMap): void {
  for (const layer of map.getStyle().layers) if (layer.id.startsWith(LAYER_PREFIX)) map.removeLayer(layer.id);
  if (map.getSource(SOURCE)) map.removeSource(SOURCE);
}

function dimScenarioBasemap(map: MapLibreMap, dim: boolean): void {
  for (const id of BASEMAP_FILL_LAYERS) map.setPaintProperty(id, 'fill-opacity', dim ? 0.3 : 1);
}

/** Puts the background in place; resolves to a sentence saying what is shown. */
export async function applyBackground(map: MapLibreMap, background: Background): Promise<string> {
  removeBackground(map);
  if (background.kind === 'none') {
    dimScenarioBasemap(map, false);
    return 'The scenario\u2019s own basemap only; nothing is fetched.';
  }
  if (background.kind === 'url') {
    const url = background.url.trim();
    if (!/^https?:\/\/.+\{z\}.*\{x\}.*\{y\}/.test(url)) throw new Error('A tile URL starts with http:// or https:// and contains {z}, {x} and {y}.');
    map.addSource(SOURCE, { type: 'raster', tiles: [url], tileSize: 256, maxzoom: 19 });
    map.addLayer({ id: `${LAYER_PREFIX}raster`, type: 'raster', source: SOURCE }, FIRST_SCENARIO_LAYER);
    dimScenarioBasemap(map, true);
    return 'Raster tiles from the URL given (needs a network).';
  }
  const archive = new PMTiles(new FileSource(background.file));
  const header = await archive.getHeader();
  pmtilesProtocol().add(archive);
  const url = `pmtiles://${background.file.name}`;
  if (header.tileType === TileType.Mvt) {
    const metadata = (await archive.getMetadata()) as { vector_layers?: { id: string }[] } | null;
    const layers = metadata?.vector_layers?.map((l) => l.id) ?? [];
    if (layers.length === 0) throw new Error(`${background.file.name} holds vector tiles but lists no layers, so there is nothing to draw.`);
    map.addSource(SOURCE, { type: 'vector', url });
    // The archive's own styling is unknown: draw every layer in quiet greys beneath the scenario.
    for (const layer of layers) {
      map.addLayer({ id: `${LAYER_PREFIX}${layer}-fill`, type: 'fill', source: SOURCE, 'source-layer': layer, filter: ['==', ['geometry-type'], 'Polygon'], paint: { 'fill-color': '#DAD6CB', 'fill-opacity': 0.6 } }, FIRST_SCENARIO_LAYER);
      map.addLayer({ id: `${LAYER_PREFIX}${layer}-line`, type: 'line', source: SOURCE, 'source-layer': layer, paint: { 'line-color': '#9C978A', 'line-width': 0.8 } }, FIRST_SCENARIO_LAYER);
    }
  } else if (header.tileType === TileType.Png || header.tileType === TileType.Jpeg || header.tileType === TileType.Webp || header.tileType === TileType.Avif) {
    map.addSource(SOURCE, { type: 'raster', url, tileSize: 256 });
    map.addLayer({ id: `${LAYER_PREFIX}raster`, type: 'raster', source: SOURCE }, FIRST_SCENARIO_LAYER);
  } else {
    throw new Error(`${background.file.name}: tile type ${header.tileType} is not one this page can draw (vector or image tiles).`);
  }
  dimScenarioBasemap(map, true);
  return `${background.file.name} (zoom ${header.minZoom}–${header.maxZoom}), read from disk.`;
}
