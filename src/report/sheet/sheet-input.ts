/**
 * Everything the review sheet is drawn from, in the shapes the results folder stores it. A run
 * builds it from the very texts it writes (so `strewn sheet` on the folder gives the same bytes),
 * and `readResultsFolder` builds it from the files.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { LandingSet } from '../../analysis/types.js';
import type { Scenario } from '../../scenario/types.js';
import type { RunSummary } from '../run-summary.js';
import type { ReviewFacts } from './review-facts.js';

export interface ContourProps {
  level: number;
  area_m2: number;
  maxDistance_m: number;
}

export interface KeepOutProps {
  level: number;
  margin_m: number;
  area_m2: number;
  maxDistance_m: number;
  octants_m: Record<string, number | null>;
  parts: string[];
  outsideShare: number;
  outsideUpper95: number;
}

export interface PolygonFeatures<P> {
  type: 'FeatureCollection';
  features: { type: 'Feature'; properties: P; geometry: Polygon | MultiPolygon }[];
}

/** Landing points to draw, thinned; `mode` indexes `summary.modes`. */
export interface LandingPoints {
  east: number[];
  north: number[];
  mode: number[];
  /** Landings in the run, before thinning. */
  total: number;
}

export interface SheetInput {
  /** summary.json as read back (a number that was NaN is null there). */
  summary: RunSummary;
  /** The normalised scenario as loaded for the run (its hash is summary.scenarioHash). */
  scenario: Scenario;
  contours: PolygonFeatures<ContourProps> | null;
  keepOut: PolygonFeatures<KeepOutProps> | null;
  review: ReviewFacts;
  landings: LandingPoints | null;
}

/** Most landing points drawn per mode: beyond that the dots only darken the map. */
export const MAX_POINTS_PER_MODE = 2500;

/** Centimetres are plenty on a map (and landings.geojson stores east/north to 2 decimals). */
export function roundCentimetre(x: number): number {
  return Math.round(x * 100) / 100;
}

/**
 * Every k-th landing of each mode so that no mode has more than `max` points; the order in the
 * input is kept, so the choice is the same on every machine.
 */
export function thinLandings(east: ArrayLike<number>, north: ArrayLike<number>, mode: ArrayLike<number>, modeCount: number, max = MAX_POINTS_PER_MODE): LandingPoints {
  const counts = new Array<number>(modeCount).fill(0);
  for (let i = 0; i < mode.length; i++) if (mode[i] >= 0 && mode[i] < modeCount) counts[mode[i]]++;
  const stride = counts.map((c) => Math.max(1, Math.ceil(c / max)));
  const seen = new Array<number>(modeCount).fill(0);
  const out: LandingPoints = { east: [], north: [], mode: [], total: mode.length };
  for (let i = 0; i < mode.length; i++) {
    const m = mode[i];
    if (!(m >= 0 && m < modeCount)) continue;
    if (seen[m]++ % stride[m] !== 0) continue;
    out.east.push(east[i]);
    out.north.push(north[i]);
    out.mode.push(m);
  }
  return out;
}

/** The landing points of a run's landing set, as landings.geojson would give them back. */
export function landingPointsFromSet(set: LandingSet, modeNames: string[]): LandingPoints {
  const toSummaryIndex = set.modeNames.map((name) => modeNames.indexOf(name));
  // A plain loop: Int16Array.from with a map function gathers every value in a list first (~10 bytes a landing).
  const mode = new Int16Array(set.mode.length);
  for (let i = 0; i < mode.length; i++) mode[i] = toSummaryIndex[set.mode[i]] ?? -1;
  // Thinned first, rounded after: the same points as rounding all first, without a copy of
  // every landing as plain arrays.
  const points = thinLandings(set.east, set.north, mode, modeNames.length);
  return { ...points, east: points.east.map(roundCentimetre), north: points.north.map(roundCentimetre) };
}

/** The texts of a results folder the sheet reads (contours and keep-out are absent without an analysis). */
export interface ResultTexts {
  summary: string;
  scenario: string;
  review: string;
  contours: string | null;
  keepOut: string | null;
}

/**
 * The sheet input of a run, read back from the texts the run writes, so a run's sheet and the one
 * `strewn sheet` draws from the folder are made from identical data.
 */
export function sheetInputFromTexts(texts: ResultTexts, set: LandingSet): SheetInput {
  const summary = JSON.parse(texts.summary) as RunSummary;
  return {
    summary,
    scenario: JSON.parse(texts.scenario) as Scenario,
    review: JSON.parse(texts.review) as ReviewFacts,
    contours: texts.contours === null ? null : (JSON.parse(texts.contours) as PolygonFeatures<ContourProps>),
    keepOut: texts.keepOut === null ? null : (JSON.parse(texts.keepOut) as PolygonFeatures<KeepOutProps>),
    landings: set.east.length > 0 ? landingPointsFromSet(set, summary.modes.map((m) => m.name)) : null,
  };
}
