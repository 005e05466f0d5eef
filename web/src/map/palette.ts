/**
 * Colours and line styles shared by the map and its legend. Colours are from the Okabe–Ito set
 * and a light-to-dark yellow–red ramp, which stay distinct for the common kinds of colour
 * blindness; every class also differs in line style, stroke or lightness, so none relies on hue.
 */

/** Landing points by mode index: fill colour and outline (width 0 means no outline). */
export interface PointStyle {
  color: string;
  stroke: string;
  strokeWidth: number;
  radius: number;
}

const MODE_STYLES: readonly PointStyle[] = [
  { color: '#0072B2', stroke: '#0072B2', strokeWidth: 0, radius: 2.6 },
  { color: '#D55E00', stroke: '#FFFFFF', strokeWidth: 1.2, radius: 3.6 },
  { color: '#F0E442', stroke: '#000000', strokeWidth: 1.4, radius: 3.8 },
  { color: '#CC79A7', stroke: '#000000', strokeWidth: 1, radius: 3.4 },
  { color: '#009E73', stroke: '#FFFFFF', strokeWidth: 1.6, radius: 3.4 },
  { color: '#56B4E9', stroke: '#000000', strokeWidth: 1.8, radius: 3.4 },
];

export function modeStyle(mode: number): PointStyle {
  return MODE_STYLES[mode % MODE_STYLES.length]!;
}

export const MODE_STYLE_COUNT = MODE_STYLES.length;

/** Probability contours, innermost level first: darker and more solid towards the centre. */
export interface LineStyle {
  color: string;
  width: number;
  /** maplibre dash array in line widths; empty for solid. */
  dash: number[];
}

const CONTOUR_STYLES: readonly LineStyle[] = [
  { color: '#2A1863', width: 2.6, dash: [] },
  { color: '#6A3D9A', width: 2.2, dash: [4, 2] },
  { color: '#9E6CC0', width: 2, dash: [1, 1.6] },
  { color: '#B99AD6', width: 1.8, dash: [6, 2, 1, 2] },
];

export function contourStyle(index: number): LineStyle {
  return CONTOUR_STYLES[Math.min(index, CONTOUR_STYLES.length - 1)]!;
}

/**
 * Individual-risk lines, highest level first: dark teal, each level its own dash-and-dots pattern
 * so they differ from the contours in grey too. A line the samples do not resolve is drawn faint.
 */
const RISK_STYLES: readonly LineStyle[] = [
  { color: '#0B3D33', width: 2.2, dash: [5, 1.2, 1, 1.2] },
  { color: '#1F6B5A', width: 2, dash: [5, 1.2, 1, 1.2, 1, 1.2] },
  { color: '#3F8F7C', width: 1.8, dash: [2.5, 1.2] },
];

export function riskStyle(index: number): LineStyle {
  return RISK_STYLES[Math.min(index, RISK_STYLES.length - 1)]!;
}

/** Where people may stand: the octant ring at the individual criterion; heavy, long dashes. */
export const STANDING: LineStyle = { color: '#062A22', width: 3, dash: [8, 1.5, 1, 1.5, 1, 1.5] };

export const CONTOUR_FILL = '#6A3D9A';
export const CONTOUR_FILL_OPACITY = 0.1;

export const KEEP_OUT: LineStyle & { hatch: string } = { color: '#D55E00', width: 3, dash: [3, 1.5], hatch: '#D55E00' };

/** Hit probability classes of the marked areas: upper class limits and fills. */
export interface AreaClass {
  /** Upper limit of the class (exclusive); Infinity for the last. */
  below: number;
  fill: string;
  label: string;
}

export const AREA_CLASSES: readonly AreaClass[] = [
  { below: 1e-3, fill: '#FFFFB2', label: 'under 0.1 %' },
  { below: 1e-2, fill: '#FECC5C', label: '0.1–1 %' },
  { below: 1e-1, fill: '#FD8D3C', label: '1–10 %' },
  { below: Infinity, fill: '#E31A1C', label: '10 % or more' },
];

/** Areas no sample landed in are outlined only. */
export const AREA_NO_HITS = '#FFFFFF';
export const AREA_OUTLINE = '#333333';

export function areaClassIndex(probability: number, hits: number): number {
  if (hits === 0) return -1;
  return AREA_CLASSES.findIndex((c) => probability < c.below);
}

export const TRACK: LineStyle = { color: '#111111', width: 2.2, dash: [] };
export const RINGS: LineStyle = { color: '#555555', width: 0.9, dash: [3, 3] };
export const BOUNDARY: LineStyle = { color: '#222222', width: 1.6, dash: [6, 3] };

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
