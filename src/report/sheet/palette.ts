/**
 * The sheet's colours and line styles. Chosen so that the map still reads when printed in grey or
 * seen with a colour-vision deficiency: every class that matters differs by more than hue —
 * probability contours step from dark to light AND from solid to dashed to dotted; the keep-out
 * zone is the heaviest line on the page; landing modes differ by marker shape.
 */
import type { Fill, MarkerSymbol, Stroke } from './display-list.js';

export const INK = '#141414';
export const INK_SOFT = '#4a4a4a';
export const PAPER = '#ffffff';

/** Contour styles from the innermost (lowest) level outwards; levels past the fourth reuse the last. */
export const CONTOUR_STYLES: Stroke[] = [
  { color: '#33196b', width: 1.7, join: 'round' },
  { color: '#5e45b3', width: 1.5, dash: [6, 3], join: 'round' },
  { color: '#8f7bd6', width: 1.5, dash: [0.1, 2.6], cap: 'round', join: 'round' },
  { color: '#b3a7e6', width: 1.3, dash: [7, 2.5, 1.5, 2.5], join: 'round' },
];

export function contourStyle(index: number): Stroke {
  return CONTOUR_STYLES[Math.min(index, CONTOUR_STYLES.length - 1)];
}

/** Contour label colours: the line's hue, dark enough to read as 8 pt text. */
const CONTOUR_LABEL_COLORS = ['#33196b', '#46308f', '#56419f', '#56419f'];

export function contourLabelColor(index: number): string {
  return CONTOUR_LABEL_COLORS[Math.min(index, CONTOUR_LABEL_COLORS.length - 1)];
}

export const KEEP_OUT_STROKE: Stroke = { color: '#8a1c12', width: 3.2, join: 'round' };
export const KEEP_OUT_FILL: Fill = { color: '#8a1c12', opacity: 0.06 };
export const MINIMUM_DISTANCE_STROKE: Stroke = { color: '#8a1c12', width: 1, dash: [4, 2] };
export const BOUNDARY_STROKE: Stroke = { color: '#262626', width: 1.2, dash: [9, 3, 2, 3] };
/**
 * Where people may stand (the octant ring of the individual-risk criterion): dark green-black with
 * a long dash and two dots, unlike any contour, the boundary (one dot) or the keep-out zone (solid,
 * heaviest). A ring the samples do not resolve is drawn thin and grey, its pattern kept.
 */
export const STANDING_STROKE: Stroke = { color: '#0e4a3a', width: 1.9, dash: [8, 2, 1.2, 2, 1.2, 2], join: 'round' };
export const STANDING_UNRESOLVED_STROKE: Stroke = { color: '#7d8f88', width: 1.1, dash: [8, 2, 1.2, 2, 1.2, 2], join: 'round' };
export const RING_STROKE: Stroke = { color: '#8c8c8c', width: 0.6, dash: [2, 3] };

export interface AreaStyle {
  fill: Fill;
  stroke: Stroke;
  label: string;
}

export const AREA_STYLES: Record<string, AreaStyle> = {
  spectators: { fill: { color: '#f2b45a', opacity: 0.6 }, stroke: { color: '#874600', width: 1.3 }, label: 'Spectators' },
  parking: { fill: { color: '#c6c6d8', opacity: 0.65 }, stroke: { color: '#4c4c66', width: 1 }, label: 'Parking' },
  road: { fill: { color: '#b3a998', opacity: 0.75 }, stroke: { color: '#574c40', width: 1 }, label: 'Road' },
  building: { fill: { color: '#a8766a', opacity: 0.75 }, stroke: { color: '#48271e', width: 1 }, label: 'Building' },
  water: { fill: { color: '#98c5e6', opacity: 0.75 }, stroke: { color: '#2b6791', width: 1 }, label: 'Water' },
  other: { fill: { color: '#e2dab0', opacity: 0.65 }, stroke: { color: '#6b613c', width: 1 }, label: 'Other' },
};

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

/** Landing markers by mode index: the nominal mode as small grey dots, failure modes as shapes. */
const MODE_MARKERS: ModeMarker[] = [
  { symbol: 'dot', color: '#3d3d3d', size: 0.9, opacity: 0.55 },
  { symbol: 'triangle', color: '#b03a22', size: 1.9, opacity: 0.9 },
  { symbol: 'square', color: '#1d6583', size: 1.6, opacity: 0.9 },
  { symbol: 'diamond', color: '#7a5a00', size: 1.9, opacity: 0.9 },
  { symbol: 'cross', color: '#5a2784', size: 1.8, opacity: 0.9 },
];

export function modeMarker(index: number): ModeMarker {
  return MODE_MARKERS[index < MODE_MARKERS.length ? index : 1 + ((index - 1) % (MODE_MARKERS.length - 1))];
}

export const LABEL_BACKING: Fill = { color: PAPER, opacity: 0.85 };
