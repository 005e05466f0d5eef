/**
 * The sheet's colours and line styles. The symbols for results and marked areas (zone, regions,
 * landings, areas, rings, boundary) come from the symbol set shared with the page
 * (src/report/symbols.ts); the basemap and paper colours are the sheet's own.
 */
import type { Fill, MarkerSymbol, Stroke } from './display-list.js';
import { contourLabelSymbolColor, contourSymbol, modeSymbol, SYMBOLS } from '../symbols.js';

export const INK = '#141414';
export const INK_SOFT = '#4a4a4a';
export const PAPER = '#ffffff';

/** The shared symbol set (src/report/symbols.ts): the page's map reads the same object. */
export { SYMBOLS } from '../symbols.js';

/** Contour styles from the innermost (lowest) level outwards; levels past the fourth reuse the last. */
export const CONTOUR_STYLES: readonly Stroke[] = SYMBOLS.contours;

export function contourStyle(index: number): Stroke {
  return contourSymbol(index);
}

export function contourLabelColor(index: number): string {
  return contourLabelSymbolColor(index);
}

export const KEEP_OUT_STROKE: Stroke = SYMBOLS.keepOut.line;
export const KEEP_OUT_FILL: Fill = SYMBOLS.keepOut.fill;
export const MINIMUM_DISTANCE_STROKE: Stroke = SYMBOLS.minimumDistance;
export const BOUNDARY_STROKE: Stroke = SYMBOLS.boundary;
export const RING_STROKE: Stroke = SYMBOLS.rings;
export const STANDING_STROKE: Stroke = SYMBOLS.standing;
export const STANDING_UNRESOLVED_STROKE: Stroke = SYMBOLS.standingUnresolved;

export interface AreaStyle {
  fill: Fill;
  stroke: Stroke;
  label: string;
}

/** Area styles by kind, in the order the legend lists them. */
export const AREA_STYLES: Record<string, AreaStyle> = Object.fromEntries(Object.entries(SYMBOLS.areas).map(([kind, a]) => [kind, { fill: a.fill, stroke: a.line, label: a.label }]));

export function areaStyle(kind: string): AreaStyle {
  return AREA_STYLES[kind] ?? AREA_STYLES.other;
}

export interface BasemapStyle {
  fill?: Fill;
  stroke?: Stroke;
  label: string;
}

/** Basemap classes by the `kind` property of a feature; muted, so the results stay on top. */
export const BASEMAP_STYLES: Record<string, BasemapStyle> = {
  field: { fill: { color: '#f0f4e6' }, stroke: { color: '#cdd8b8', width: 0.6 }, label: 'Field' },
  woodland: { fill: { color: '#d3e5c7' }, stroke: { color: '#9fbf8c', width: 0.6 }, label: 'Woodland' },
  water: { fill: { color: '#d4e7f3' }, stroke: { color: '#86b5d6', width: 0.6 }, label: 'Water' },
  stream: { stroke: { color: '#6ba6d0', width: 1.4, cap: 'round', join: 'round' }, label: 'Stream' },
  track: { stroke: { color: '#ad9772', width: 1, dash: [3, 1.5] }, label: 'Track' },
  // Solid, wide and light: nothing like the dotted outer contour, in colour or in grey.
  hedge: { stroke: { color: '#a9c996', width: 2.4, cap: 'round', join: 'round' }, label: 'Hedge' },
};

export const BASEMAP_OTHER_POLYGON: BasemapStyle = { fill: { color: '#f2f2f2' }, stroke: { color: '#c8c8c8', width: 0.6 }, label: 'Other' };
export const BASEMAP_OTHER_LINE: BasemapStyle = { stroke: { color: '#a8a8a8', width: 0.8 }, label: 'Other' };
export const BASEMAP_LABEL = '#5f6b55';
export const BASEMAP_LABEL_BACKING: Fill = { color: PAPER, opacity: 0.55 };

export interface ModeMarker {
  symbol: MarkerSymbol;
  color: string;
  size: number;
  opacity: number;
}

/** Landing markers by mode index, from the shared symbol set. */
export function modeMarker(index: number): ModeMarker {
  const m = modeSymbol(index);
  return { symbol: m.shape, color: m.color, size: m.size, opacity: m.opacity };
}

export const LABEL_BACKING: Fill = { color: PAPER, opacity: 0.85 };
