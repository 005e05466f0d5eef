import { SCREEN_MARKER_PX_PER_PT, SCREEN_PX_PER_PT, SYMBOLS, areaSymbol, contourSymbol, modeSymbol, riskLineSymbol, type LineSymbol, type MarkerSymbolStyle } from '../../../src/report/symbols.js';

/**
 * The map's colours and line styles: the symbol set shared with the review sheet
 * (src/report/symbols.ts), turned into screen pixels and maplibre's conventions. Nothing here picks
 * a colour of its own for a result; only the page's own basemap colours live here.
 */

export { SYMBOLS };

/** A line as maplibre takes it: width in pixels, dashes in line widths. */
export interface LineStyle {
  color: string;
  width: number;
  /** maplibre dash array in line widths; empty for solid. */
  dash: number[];
  cap: 'butt' | 'round' | 'square';
}

/** A shared line symbol (points) as a screen line (pixels; maplibre dashes count in line widths). */
export function screenLine(s: LineSymbol): LineStyle {
  return { color: s.color, width: s.width * SCREEN_PX_PER_PT, dash: (s.dash ?? []).map((d) => d / s.width), cap: s.cap ?? 'butt' };
}

export function contourStyle(index: number): LineStyle {
  return screenLine(contourSymbol(index));
}

export const CONTOUR_LEVEL_STYLES = SYMBOLS.contours.length;
/** Individual-risk lines (highest level first) and the standing ring, from the shared set. */
export function riskStyle(index: number): LineStyle {
  return screenLine(riskLineSymbol(index));
}
export const STANDING: LineStyle = screenLine(SYMBOLS.standing);

export const KEEP_OUT: LineStyle = screenLine(SYMBOLS.keepOut.line);
export const KEEP_OUT_FILL = SYMBOLS.keepOut.fill;
export const TRACK: LineStyle = screenLine(SYMBOLS.track);
export const RINGS: LineStyle = screenLine(SYMBOLS.rings);
export const BOUNDARY: LineStyle = screenLine(SYMBOLS.boundary);

/** Landing markers by mode, from the shared set, with their size in screen pixels (half-width). */
export interface ScreenMarker extends MarkerSymbolStyle {
  px: number;
}

export function modeStyle(mode: number): ScreenMarker {
  const m = modeSymbol(mode);
  return { ...m, px: m.size * SCREEN_MARKER_PX_PER_PT };
}

/** Distinct marker styles: mode indices past this repeat the failure shapes. */
export const MODE_STYLE_COUNT = SYMBOLS.modes.length;

/** The marked areas' kinds in the legend's order. */
export const AREA_KINDS = Object.keys(SYMBOLS.areas);

export function areaStyle(kind: string) {
  const a = areaSymbol(kind);
  return { fill: a.fill.color, opacity: a.fill.opacity ?? 1, line: screenLine(a.line), label: a.label };
}

export const BASEMAP = {
  background: '#F3F0E6',
  field: '#E2EBCB',
  fieldOutline: '#C3D0A4',
  woodland: '#B7D19B',
  woodlandOutline: '#8DAF6E',
  stream: '#3F88C5',
  track: '#A07F55',
  hedge: '#5E7F3A',
  label: '#3A3A3A',
  halo: '#FFFFFF',
} as const;
