/**
 * The one symbol set of Strewn: how the keep-out zone, the probability regions, the landings by
 * mode, the marked areas and the site furniture look, and the words that name them. The review
 * sheet (src/report/sheet) and the browser workspace (web/src/map) both read THIS object, so a
 * zone printed on the sheet and the same zone on the screen look and read the same.
 *
 * Sizes are in points (1/72 inch), as on the sheet; the page scales them to screen pixels with
 * `SCREEN_PX_PER_PT` (lines) and `SCREEN_MARKER_PX_PER_PT` (markers), the same symbol drawn a little
 * larger for a screen seen from further away. Dashes are in points too.
 *
 * Chosen so the map reads when printed in grey or seen with a colour-vision deficiency: every class
 * that matters differs by more than hue. Probability regions step from dark to light AND from solid
 * to dashed to dotted; the keep-out zone is the heaviest line; landing modes differ by shape.
 *
 * @example
 *   import { SYMBOLS, contourSymbol } from '../symbols.js';
 *   SYMBOLS.keepOut.line.color   // '#8a1c12' on the sheet and on the page
 *   contourSymbol(1).dash        // [6, 3]
 */

/** A line: colour, width and dashes in points. */
export interface LineSymbol {
  color: string;
  width: number;
  dash?: number[];
  cap?: 'butt' | 'round' | 'square';
  join?: 'miter' | 'round' | 'bevel';
}

export interface FillSymbol {
  color: string;
  /** 0..1, default 1. */
  opacity?: number;
}

export type MarkerShape = 'dot' | 'square' | 'triangle' | 'diamond' | 'cross';

export interface MarkerSymbolStyle {
  shape: MarkerShape;
  color: string;
  /** Half the symbol's width, points. */
  size: number;
  opacity: number;
}

export interface AreaSymbol {
  fill: FillSymbol;
  line: LineSymbol;
  /** What the legend calls this kind of area. */
  label: string;
}

const KEEP_OUT_RED = '#8a1c12';

/** Landing markers by mode index: the nominal mode as small grey dots, failure modes as shapes. */
const MODES: readonly MarkerSymbolStyle[] = [
  { shape: 'dot', color: '#3d3d3d', size: 0.9, opacity: 0.55 },
  { shape: 'triangle', color: '#b03a22', size: 1.9, opacity: 0.9 },
  { shape: 'square', color: '#1d6583', size: 1.6, opacity: 0.9 },
  { shape: 'diamond', color: '#7a5a00', size: 1.9, opacity: 0.9 },
  { shape: 'cross', color: '#5a2784', size: 1.8, opacity: 0.9 },
];

export const SYMBOLS = {
  keepOut: {
    line: { color: KEEP_OUT_RED, width: 3.2, join: 'round' } as LineSymbol,
    fill: { color: KEEP_OUT_RED, opacity: 0.08 } as FillSymbol,
    /** Its label, in the line's colour. */
    labelColor: KEEP_OUT_RED,
  },
  /** Probability regions from the innermost (lowest) level outwards; levels past the fourth reuse the last. */
  contours: [
    { color: '#33196b', width: 1.7, join: 'round' },
    { color: '#5e45b3', width: 1.5, dash: [6, 3], join: 'round' },
    { color: '#8f7bd6', width: 1.5, dash: [0.1, 2.6], cap: 'round', join: 'round' },
    { color: '#b3a7e6', width: 1.3, dash: [7, 2.5, 1.5, 2.5], join: 'round' },
  ] as readonly LineSymbol[],
  /** Region label colours: the line's hue, dark enough to read as 8 pt text. */
  contourLabels: ['#33196b', '#46308f', '#56419f', '#56419f'] as readonly string[],
  modes: MODES,
  /** Marked areas by kind: what is there decides the look; the chance is written in the label. */
  areas: {
    spectators: { fill: { color: '#f2b45a', opacity: 0.6 }, line: { color: '#874600', width: 1.3 }, label: 'Spectators' },
    parking: { fill: { color: '#c6c6d8', opacity: 0.65 }, line: { color: '#4c4c66', width: 1 }, label: 'Parking' },
    road: { fill: { color: '#b3a998', opacity: 0.75 }, line: { color: '#574c40', width: 1 }, label: 'Road' },
    building: { fill: { color: '#a8766a', opacity: 0.75 }, line: { color: '#48271e', width: 1 }, label: 'Building' },
    water: { fill: { color: '#98c5e6', opacity: 0.75 }, line: { color: '#2b6791', width: 1 }, label: 'Water' },
    other: { fill: { color: '#e2dab0', opacity: 0.65 }, line: { color: '#6b613c', width: 1 }, label: 'Other' },
  } as Readonly<Record<string, AreaSymbol>>,
  minimumDistance: { color: KEEP_OUT_RED, width: 1, dash: [4, 2] } as LineSymbol,
  boundary: { color: '#262626', width: 1.2, dash: [9, 3, 2, 3] } as LineSymbol,
  rings: { color: '#8c8c8c', width: 0.6, dash: [2, 3] } as LineSymbol,
  /** The nominal ground track (the page draws it; the sheet has no track). */
  track: { color: '#141414', width: 1.5 } as LineSymbol,
  /**
   * Individual-risk lines, highest level first: dark teal with dash-and-dot patterns of their own,
   * unlike the regions (solid, dashed, dotted) and the boundary in grey too.
   */
  riskLines: [
    { color: '#0b3d33', width: 1.5, dash: [7, 1.8, 1.5, 1.8], join: 'round' },
    { color: '#1f6b5a', width: 1.4, dash: [7, 1.8, 1.5, 1.8, 1.5, 1.8], join: 'round' },
    { color: '#3f8f7c', width: 1.3, dash: [3.5, 1.8], join: 'round' },
  ] as readonly LineSymbol[],
  /**
   * Where people may stand (the octant ring at the individual criterion): dark green-black, a long
   * dash and two dots. A ring the samples do not resolve is thin and grey, its pattern kept.
   */
  standing: { color: '#0e4a3a', width: 1.9, dash: [8, 2, 1.2, 2, 1.2, 2], join: 'round' } as LineSymbol,
  standingUnresolved: { color: '#7d8f88', width: 1.1, dash: [8, 2, 1.2, 2, 1.2, 2], join: 'round' } as LineSymbol,
  /**
   * Where a released object may fail (drone operations): the route as a dark olive line with a
   * long dash and a short gap, the operating area as a hatched-looking dashed outline on a faint
   * fill. Neither is a result, so both stay lighter than the keep-out zone and differ from the
   * boundary (dash-dot) and the regions (solid, dashed, dotted) by pattern as well as hue.
   */
  releasePath: { color: '#4d5a12', width: 2, dash: [10, 2.5], cap: 'butt', join: 'round' } as LineSymbol,
  releaseArea: {
    line: { color: '#4d5a12', width: 1.4, dash: [10, 2.5], join: 'round' } as LineSymbol,
    fill: { color: '#9aab3c', opacity: 0.14 } as FillSymbol,
  },
  /**
   * An event: each item's own keep-out zone, thin, over the heavy line of their union (the keep-out
   * symbol); item by item dark to light and solid to dashed, so they read apart in grey too.
   */
  eventItemZones: [
    { color: '#1f4e79', width: 1.1, join: 'round' },
    { color: '#2e7d4f', width: 1.1, dash: [5, 2], join: 'round' },
    { color: '#7a4b9c', width: 1.1, dash: [1.5, 2], cap: 'round', join: 'round' },
    { color: '#9c6b1f', width: 1.1, dash: [6, 2, 1.5, 2], join: 'round' },
    { color: '#555555', width: 1.1, dash: [3, 3], join: 'round' },
  ] as readonly LineSymbol[],
  /**
   * Two studies on one map: A (the saved run, or the first folder) solid dark blue, B (the current
   * run, or the second folder) dashed burnt orange; in grey they still differ by the dash.
   */
  compareA: { color: '#1f4e79', width: 2.4, join: 'round' } as LineSymbol,
  compareB: { color: '#b3541e', width: 2.4, dash: [7, 3], join: 'round' } as LineSymbol,
  /** The pad: a ringed dot (white disc, dark ring, dark centre); radii in points. */
  pad: { ring: '#141414', ringWidth: 1.4, radius: 4.2, centre: 1.5 },
  /**
   * The rocket's side view (record page and Setup tab): body outline and fins, and the balance
   * point (CG) and centre of pressure (CP) drawn as labelled stems of our own: CG a stem rising
   * above the body ending in a short crossbar, CP a stem hanging below the body ending in an open
   * square, so they read apart in grey and when printed small. Sizes in points.
   */
  sideView: {
    body: { color: '#262626', width: 0.9 } as LineSymbol,
    bodyFill: { color: '#e8e4dc', opacity: 1 } as FillSymbol,
    fins: { color: '#262626', width: 0.8 } as LineSymbol,
    finFill: { color: '#c9c2b4', opacity: 1 } as FillSymbol,
    cg: { color: '#1d3f8a', width: 1.3, stem: 9, bar: 5 },
    cp: { color: '#8a1c12', width: 1.3, stem: 9, box: 3.2 },
    cgBurnout: { color: '#1d3f8a', width: 0.8, dash: [1.5, 1.5], stem: 6, bar: 4 },
  },
} as const;

export type SymbolSet = typeof SYMBOLS;

export function contourSymbol(index: number): LineSymbol {
  return SYMBOLS.contours[Math.min(index, SYMBOLS.contours.length - 1)]!;
}

export function riskLineSymbol(index: number): LineSymbol {
  return SYMBOLS.riskLines[Math.min(index, SYMBOLS.riskLines.length - 1)]!;
}

/** The zone line of an event's item `index`; past the table the styles repeat. */
export function eventItemZoneSymbol(index: number): LineSymbol {
  return SYMBOLS.eventItemZones[index % SYMBOLS.eventItemZones.length]!;
}

export function contourLabelSymbolColor(index: number): string {
  return SYMBOLS.contourLabels[Math.min(index, SYMBOLS.contourLabels.length - 1)]!;
}

/** Marker of a mode; past the table the failure shapes repeat (the nominal dot never does). */
export function modeSymbol(index: number): MarkerSymbolStyle {
  return MODES[modeSymbolIndex(index)]!;
}

/** Which row of the marker table a mode index uses. */
export function modeSymbolIndex(index: number): number {
  const n = MODES.length;
  return index < n ? index : 1 + ((index - 1) % (n - 1));
}

export function areaSymbol(kind: string): AreaSymbol {
  return SYMBOLS.areas[kind] ?? SYMBOLS.areas.other!;
}

/** Screen pixels per point for lines on the page. */
export const SCREEN_PX_PER_PT = 1.4;
/** Screen pixels per point for landing markers (tiny on paper, they need more on a screen). */
export const SCREEN_MARKER_PX_PER_PT = 2.4;

/**
 * The words for the things drawn, the same on the sheet and the page. `percent` and `level` are
 * passed in so each medium keeps its number formatting module.
 */
export const WORDS = {
  keepOut: 'Keep-out zone',
  /** '99 % region + 25 m' under the zone's name. */
  keepOutRecipe: (level: string, margin: string) => `${level} region + ${margin}`,
  /** What the zone is made of, from its `parts`: '99 % region, mode hulls, grown by 25 m'. */
  keepOutMadeOf: (parts: readonly string[], level: string, margin: string | null) => {
    const words: string[] = [];
    if (parts.some((p) => p.endsWith('density region'))) words.push(`${level} region`);
    if (parts.some((p) => p.startsWith('convex hull'))) words.push('mode hulls');
    if (parts.some((p) => p.startsWith('minimum distance'))) words.push('minimum distance');
    const made = words.length > 1 ? `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}` : (words[0] ?? 'zone');
    return margin !== null ? `${made}, grown by ${margin}` : made;
  },
  contour: (level: string) => `${level} of landings fall inside`,
  landings: (mode: string) => `Landings, ${mode}`,
  pad: 'Pad',
  rings: 'Range rings, distance from the pad',
  boundary: 'Site boundary',
  track: 'Nominal ground track',
  /**
   * A marked area's chance per flight with its one-sided 95 % upper bound. An area no sample
   * landed in says so in words, because "0 %" would read as "cannot happen".
   */
  areaChance: (hits: number, probability: string, upper95: string) => (hits === 0 ? `no landing (95 % bound ${upper95})` : `${probability} (95 % bound ${upper95})`),
  /** The standing ring: 'Individual risk under 1.0e-6 per flight beyond this line (by octant)'. */
  standing: (level: string, resolved: boolean) => `Individual risk under ${level} per flight beyond this line (by octant)${resolved ? '' : '; not resolved by the samples'}`,
  riskLine: (level: string, resolved: boolean) => `Individual risk ${level} per flight or more${resolved ? '' : ' (faint: not resolved)'}`,
  releasePath: 'Route flown (failure anywhere along it)',
  releaseArea: 'Area flown over (failure anywhere inside)',
  eventItemZone: (name: string) => `Zone: ${name}`,
  eventUnion: 'Event keep-out zone (all items)',
  eventRiskLine: (level: string) => `Individual risk ${level} per event or more`,
  sideViewCg: 'CG',
  sideViewCp: 'CP',
  sideViewCgBurnout: 'CG at burnout',
  sideViewCaption: (marginCal: string) => `Side view to scale; static margin ${marginCal} cal at lift-off (CP aft of CG is stable)`,
  areaChanceNote: 'Area labels: chance per flight that a landing falls inside, and its one-sided 95 % upper bound.',
} as const;
