import type { ExpressionSpecification, LayerSpecification, StyleSpecification, SymbolLayerSpecification } from 'maplibre-gl';
import fontLatin from '@fontsource/noto-sans/files/noto-sans-latin-400-normal.woff2?url';
import fontLatinExt from '@fontsource/noto-sans/files/noto-sans-latin-ext-400-normal.woff2?url';
import { AREA_KINDS, BASEMAP, BOUNDARY, CONTOUR_LEVEL_STYLES, KEEP_OUT, KEEP_OUT_FILL, MODE_STYLE_COUNT, RINGS, SYMBOLS, STANDING, TRACK, areaStyle, contourStyle, modeStyle, riskStyle } from './palette.js';
import { markerImageId } from './markers.js';
import { contourLabelSymbolColor } from '../../../src/report/symbols.js';

/**
 * The map's own style: no tile server, no glyph server, no sprite. Text is drawn from a bundled
 * Noto Sans file named in `font-faces`, so labels look the same on every machine, offline.
 * Every source starts empty; the page fills them with setData.
 */

export const FONT = 'Noto Sans Regular';

export const SOURCES = {
  basemap: 'basemap',
  basemapLabels: 'basemap-labels',
  boundary: 'boundary',
  areas: 'areas',
  areaLabels: 'area-labels',
  rings: 'rings',
  ringLabels: 'ring-labels',
  contours: 'contours',
  contourLabels: 'contour-labels',
  keepOut: 'keepout',
  keepOutLabel: 'keepout-label',
  track: 'track',
  trackLabels: 'track-labels',
  landings: 'landings',
  risk: 'risk',
  riskLabels: 'risk-labels',
} as const;

export type SourceId = (typeof SOURCES)[keyof typeof SOURCES];

/** Layers the settings panel can switch, by group. */
export const LAYER_GROUPS = {
  landings: ['landings'],
  contours: ['contour-line', 'contour-label'],
  keepOut: ['keepout-fill', 'keepout-line', 'keepout-label'],
  areas: ['area-fill', 'area-line', 'area-label'],
  track: ['track-casing', 'track-line', 'track-label'],
  rings: ['ring-line', 'ring-label'],
  risk: ['risk-line', 'risk-standing', 'risk-label'],
} as const;

export type LayerGroup = keyof typeof LAYER_GROUPS;

/** Layers drawn from the scenario's own basemap; dimmed when a real basemap lies beneath. */
export const BASEMAP_FILL_LAYERS = ['basemap-field', 'basemap-woodland'] as const;

/** Where optional tile layers go: above the background, below everything of the scenario. */
export const FIRST_SCENARIO_LAYER = 'basemap-field';


const EMPTY = { type: 'FeatureCollection', features: [] } as const;

function absolute(url: string): string {
  return new URL(url, document.baseURI).href;
}

/** The characters each font file covers (the Latin and Latin Extended subsets of the font). */
const LATIN = ['U+0000-00FF', 'U+0131', 'U+0152-0153', 'U+02BB-02BC', 'U+02C6', 'U+02DA', 'U+02DC', 'U+0304', 'U+0308', 'U+0329', 'U+2000-206F', 'U+20AC', 'U+2122', 'U+2191', 'U+2193', 'U+2212', 'U+2215', 'U+FEFF', 'U+FFFD'];
const LATIN_EXT = ['U+0100-02BA', 'U+02BD-02C5', 'U+02C7-02CC', 'U+02CE-02D7', 'U+02DD-02FF', 'U+1D00-1DBF', 'U+1E00-1E9F', 'U+1EF2-1EFF', 'U+2020', 'U+20A0-20AB', 'U+20AD-20C0', 'U+2113', 'U+2C60-2C7F', 'U+A720-A7FF'];

const label = (size: number, extra: SymbolLayerSpecification['layout'] = {}): SymbolLayerSpecification['layout'] => ({
  'text-font': [FONT],
  'text-size': size,
  'text-field': ['get', 'label'],
  'text-max-width': 12,
  ...extra,
});

const halo = { 'text-color': BASEMAP.label, 'text-halo-color': BASEMAP.halo, 'text-halo-width': 1.6 } as const;

function byMode<T>(pick: (mode: number) => T, fallback: T): ExpressionSpecification {
  const cases: unknown[] = [];
  for (let m = 0; m < MODE_STYLE_COUNT; m++) cases.push(m, pick(m));
  // `symbol` is the row of the shared marker table the feature's mode uses (features.ts).
  return ['match', ['get', 'symbol'], ...cases, fallback] as unknown as ExpressionSpecification;
}

function byLevelIndex<T>(pick: (index: number) => T): ExpressionSpecification {
  const cases: unknown[] = [];
  for (let i = 0; i < CONTOUR_LEVEL_STYLES; i++) cases.push(i, pick(i));
  return ['match', ['get', 'index'], ...cases, pick(CONTOUR_LEVEL_STYLES - 1)] as unknown as ExpressionSpecification;
}

/** A paint value by the area's kind, from the shared symbol set (unknown kinds as 'other'). */
function byAreaKind<T>(pick: (kind: string) => T): ExpressionSpecification {
  const cases: unknown[] = [];
  for (const kind of AREA_KINDS) cases.push(kind, pick(kind));
  return ['match', ['get', 'kind'], ...cases, pick('other')] as unknown as ExpressionSpecification;
}

function contourLines(): LayerSpecification[] {
  // maplibre cannot take a dash array from an expression per feature, so each level's style
  // is its own layer, filtered by the level's index.
  return Array.from({ length: CONTOUR_LEVEL_STYLES }, (_, i) => {
    const style = contourStyle(i);
    return {
      id: i === 0 ? 'contour-line' : `contour-line-${i}`,
      type: 'line',
      source: SOURCES.contours,
      // The last style serves every level past it, as on the sheet.
      filter: i === CONTOUR_LEVEL_STYLES - 1 ? ['>=', ['get', 'index'], i] : ['==', ['get', 'index'], i],
      layout: { 'line-join': 'round', 'line-cap': style.cap },
      paint: { 'line-color': style.color, 'line-width': style.width, ...(style.dash.length ? { 'line-dasharray': style.dash } : {}) },
    } as LayerSpecification;
  });
}

function riskLines(): LayerSpecification[] {
  return [0, 1, 2].map((i) => {
    const style = riskStyle(i);
    return {
      id: i === 0 ? 'risk-line' : `risk-line-${i}`,
      type: 'line',
      source: SOURCES.risk,
      filter: ['all', ['==', ['get', 'kind'], 'individual-risk'], ['==', ['get', 'index'], i]],
      layout: { 'line-join': 'round' },
      paint: { 'line-color': style.color, 'line-width': style.width, 'line-dasharray': style.dash, 'line-opacity': ['case', ['get', 'resolved'], 1, 0.4] },
    } as LayerSpecification;
  });
}

export function offlineStyle(): StyleSpecification {
  const sources = Object.fromEntries(Object.values(SOURCES).map((id) => [id, { type: 'geojson', data: EMPTY }]));
  const layers: LayerSpecification[] = [
    { id: 'background', type: 'background', paint: { 'background-color': BASEMAP.background } },
    { id: 'basemap-field', type: 'fill', source: SOURCES.basemap, filter: ['==', ['get', 'kind'], 'field'], paint: { 'fill-color': BASEMAP.field, 'fill-outline-color': BASEMAP.fieldOutline } },
    { id: 'basemap-woodland', type: 'fill', source: SOURCES.basemap, filter: ['==', ['get', 'kind'], 'woodland'], paint: { 'fill-color': BASEMAP.woodland, 'fill-outline-color': BASEMAP.woodlandOutline } },
    { id: 'basemap-other-fill', type: 'line', source: SOURCES.basemap, filter: ['all', ['==', ['geometry-type'], 'Polygon'], ['!', ['in', ['get', 'kind'], ['literal', ['field', 'woodland']]]]], paint: { 'line-color': '#9A9A8A', 'line-width': 1 } },
    { id: 'basemap-stream', type: 'line', source: SOURCES.basemap, filter: ['==', ['get', 'kind'], 'stream'], layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': BASEMAP.stream, 'line-width': 2.4 } },
    { id: 'basemap-track', type: 'line', source: SOURCES.basemap, filter: ['==', ['get', 'kind'], 'track'], paint: { 'line-color': BASEMAP.track, 'line-width': 2, 'line-dasharray': [3, 1.5] } },
    { id: 'basemap-hedge', type: 'line', source: SOURCES.basemap, filter: ['==', ['get', 'kind'], 'hedge'], layout: { 'line-cap': 'round' }, paint: { 'line-color': BASEMAP.hedge, 'line-width': 2.6, 'line-dasharray': [0.6, 1.2] } },
    { id: 'basemap-other-line', type: 'line', source: SOURCES.basemap, filter: ['all', ['==', ['geometry-type'], 'LineString'], ['!', ['in', ['get', 'kind'], ['literal', ['stream', 'track', 'hedge']]]]], paint: { 'line-color': '#777777', 'line-width': 1.2 } },
    { id: 'boundary-line', type: 'line', source: SOURCES.boundary, paint: { 'line-color': BOUNDARY.color, 'line-width': BOUNDARY.width, 'line-dasharray': BOUNDARY.dash } },
    { id: 'area-fill', type: 'fill', source: SOURCES.areas, paint: { 'fill-color': byAreaKind((k) => areaStyle(k).fill), 'fill-opacity': byAreaKind((k) => areaStyle(k).opacity) } },
    { id: 'area-line', type: 'line', source: SOURCES.areas, paint: { 'line-color': byAreaKind((k) => areaStyle(k).line.color), 'line-width': byAreaKind((k) => areaStyle(k).line.width) } },
    { id: 'ring-line', type: 'line', source: SOURCES.rings, paint: { 'line-color': RINGS.color, 'line-width': RINGS.width, 'line-dasharray': RINGS.dash } },
    ...contourLines(),
    { id: 'keepout-fill', type: 'fill', source: SOURCES.keepOut, paint: { 'fill-color': KEEP_OUT_FILL.color, 'fill-opacity': KEEP_OUT_FILL.opacity ?? 1 } },
    { id: 'keepout-line', type: 'line', source: SOURCES.keepOut, layout: { 'line-join': 'round' }, paint: { 'line-color': KEEP_OUT.color, 'line-width': KEEP_OUT.width, ...(KEEP_OUT.dash.length ? { 'line-dasharray': KEEP_OUT.dash } : {}) } },
    ...riskLines(),
    { id: 'risk-standing', type: 'line', source: SOURCES.risk, filter: ['==', ['get', 'kind'], 'standing-distance'], layout: { 'line-join': 'round' }, paint: { 'line-color': STANDING.color, 'line-width': STANDING.width, 'line-dasharray': STANDING.dash, 'line-opacity': ['case', ['get', 'resolved'], 1, 0.45] } },
    { id: 'track-casing', type: 'line', source: SOURCES.track, layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': '#FFFFFF', 'line-width': TRACK.width + 2.4 } },
    { id: 'track-line', type: 'line', source: SOURCES.track, layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': TRACK.color, 'line-width': TRACK.width } },
    {
      // The sheet's marker shapes as images (markers.ts); every landing drawn, none hidden by placement.
      id: 'landings',
      type: 'symbol',
      source: SOURCES.landings,
      layout: { 'icon-image': byMode((m) => markerImageId(m), markerImageId(1)), 'icon-allow-overlap': true, 'icon-ignore-placement': true, 'icon-size': 1, 'symbol-sort-key': ['get', 'mode'] },
      paint: { 'icon-opacity': byMode((m) => modeStyle(m).opacity, 0.9) },
    },
    { id: 'basemap-label', type: 'symbol', source: SOURCES.basemapLabels, layout: label(11, { 'text-letter-spacing': 0.04 }), paint: { ...halo, 'text-color': '#5B6B45' } },
    { id: 'ring-label', type: 'symbol', source: SOURCES.ringLabels, layout: label(11, { 'text-offset': [0, -0.6] }), paint: { ...halo, 'text-color': RINGS.color } },
    // A marked area's label (its chance) moves beside the area when a higher label covers its centre.
    { id: 'area-label', type: 'symbol', source: SOURCES.areaLabels, layout: label(12, { 'text-allow-overlap': false, 'text-max-width': 22, 'text-variable-anchor': ['center', 'top', 'bottom', 'left', 'right'], 'text-radial-offset': 0.9, 'text-justify': 'auto' }), paint: { ...halo, 'text-color': '#1A1A1A' } },
    { id: 'track-label', type: 'symbol', source: SOURCES.trackLabels, layout: label(11, { 'text-anchor': 'bottom', 'text-offset': [0, -0.5] }), paint: { ...halo, 'text-color': TRACK.color } },
    { id: 'track-apogee', type: 'circle', source: SOURCES.trackLabels, paint: { 'circle-color': '#FFFFFF', 'circle-radius': 4, 'circle-stroke-color': TRACK.color, 'circle-stroke-width': 2 } },
    // Symbol layers higher in this list are placed first and win a collision: the zone's label, then
    // the contour labels, then the risk labels (the legend names every line, so a label left out
    // on a small cloud loses no meaning). The risk lines nest around the same cloud as the
    // probability regions, whose labels sit at the tops too: a risk label takes a free side.
    { id: 'risk-label', type: 'symbol', source: SOURCES.riskLabels, layout: label(12, { 'text-variable-anchor': ['left', 'right', 'top-left', 'top-right', 'bottom-left', 'bottom-right'], 'text-radial-offset': 0.5, 'text-justify': 'auto', 'text-padding': 3 }), paint: { 'text-color': STANDING.color, 'text-halo-color': '#FFFFFF', 'text-halo-width': 2 } },
    {
      id: 'contour-label',
      type: 'symbol',
      source: SOURCES.contourLabels,
      // Thinned on a small cloud: labels that would collide are left out (the legend names every
      // line style), the outermost region's first, as it bounds the zone.
      layout: label(13, { 'text-anchor': 'bottom', 'text-allow-overlap': false, 'text-padding': 4, 'symbol-sort-key': ['-', 100, ['get', 'index']] }),
      paint: { 'text-color': byLevelIndex((i) => contourLabelSymbolColor(i)), 'text-halo-color': '#FFFFFF', 'text-halo-width': 2 },
    },
    { id: 'keepout-label', type: 'symbol', source: SOURCES.keepOutLabel, layout: label(13, { 'text-anchor': 'top', 'text-allow-overlap': true }), paint: { 'text-color': SYMBOLS.keepOut.labelColor, 'text-halo-color': '#FFFFFF', 'text-halo-width': 2 } },
  ];
  return {
    version: 8,
    name: 'Strewn offline',
    'font-faces': {
      [FONT]: [
        { url: absolute(fontLatin), 'unicode-range': LATIN },
        { url: absolute(fontLatinExt), 'unicode-range': LATIN_EXT },
      ],
    },
    sources: sources as StyleSpecification['sources'],
    layers,
  } as StyleSpecification;
}

/** Every layer id of a group, including the per-level contour line layers. */
export function layersOf(group: LayerGroup): string[] {
  const ids: string[] = [...LAYER_GROUPS[group]];
  if (group === 'contours') for (let i = 1; i < CONTOUR_LEVEL_STYLES; i++) ids.push(`contour-line-${i}`);
  if (group === 'track') ids.push('track-apogee');
  if (group === 'risk') ids.push('risk-line-1', 'risk-line-2');
  return ids;
}
