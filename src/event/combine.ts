/**
 * From the flown items to the event's figures. Flights are independent, so expectations add:
 * an item that flies N times contributes N times its per-flight expected landings per area,
 * expected casualties and individual risk (for a released object with a rate, times its chance
 * of coming down per operation). The chance of at least one landing in an area over the whole
 * event is 1 − Π (1 − p_item)^N.
 *
 * @example
 * const totals = combineEvent(plan, outcomes);
 * totals.total.expectedCasualties   // for the whole event
 */
import { featureCollection, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import type { AnalysisResult } from '../analysis/index.js';
import { densityAt, densityGrid, type DensityGrid } from '../analysis/density.js';
import { createLocalFrame, type LocalFrame } from '../analysis/geodesy.js';
import { traceRegion } from '../analysis/contours.js';
import { polygonsArea, polygonsToEastNorth, polygonsToLonLat, farthestVertex } from '../analysis/projectGeometry.js';
import { windPolygon } from '../analysis/rings.js';
import type { LandingSet } from '../analysis/types.js';
import type { RunSummary } from '../report/run-summary.js';
import { chanceOverDuration } from '../scenario/normalize.js';
import type { EventItem, EventPlan } from './event-file.js';
import type { ItemHarm } from './casualty.js';

export interface ItemOutcome {
  item: EventItem;
  set: LandingSet;
  analysis: AnalysisResult | null;
  summary: RunSummary;
  harm: ItemHarm | null;
}

/** Individual-risk levels drawn for the event (chance per event of harm to one person standing there). */
export const EVENT_RISK_LEVELS = [1e-4, 1e-5, 1e-6];

export interface EventItemRow {
  name: string;
  source: string;
  flights: number;
  /** Chance that one flight puts the object on the ground at all (below 1 only for a release with a rate). */
  chancePerFlight: number;
  samples: number;
  failedSamples: number;
  keepOut_m2: number | null;
  reach_m: number | null;
  expectedCasualtiesPerFlight: number | null;
  expectedCasualties: number | null;
  window?: { start: string; end: string };
  folder: string;
}

export interface EventAreaRow {
  name: string;
  kind: string;
  people?: number;
  /** Expected number of landings in the area over the event. */
  expectedLandings: number;
  /** Chance of at least one landing in the area over the event. */
  chanceOfAnyLanding: number;
  /** Expected casualties over the event (areas with a head count). */
  expectedCasualties?: number;
  /** Items with at least one landing in the area. */
  byItem: { name: string; expectedLandings: number }[];
}

export interface EventTotals {
  name: string;
  flights: number;
  items: EventItemRow[];
  areas: EventAreaRow[];
  total: { expectedCasualties: number; expectedLandingsInAreas: number };
  /** Keep-out zones of the items (lon/lat) and their union. */
  zones: { name: string; zone: Feature<Polygon | MultiPolygon> }[];
  union: Feature<Polygon | MultiPolygon> | null;
  unionArea_m2: number | null;
  unionReach_m: number | null;
  /** Individual risk over the whole event on a grid (metres from the event pad), and its lines. */
  individualRisk: {
    grid: DensityGrid | null;
    max: number;
    lines: { level: number; geometry: MultiPolygon; area_m2: number }[];
  };
  harmModel: string | null;
}

/** Chance that one flight of the item ends in a landing: 1, or the release's 1 − e^(−λT). */
export function chancePerFlight(item: EventItem): number {
  const l = item.scenario.launch;
  if (l.kind === 'release' && l.rate !== undefined && l.duration !== undefined) return chanceOverDuration(l.rate, l.duration);
  return 1;
}

export function itemFolder(index: number, name: string): string {
  const slug = name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40);
  return `items/${String(index + 1).padStart(2, '0')}-${slug || 'item'}`;
}

export function combineEvent(plan: EventPlan, outcomes: ItemOutcome[]): EventTotals {
  const frame = createLocalFrame(plan.site.pad);
  const items: EventItemRow[] = outcomes.map((o, i) => {
    const c = chancePerFlight(o.item);
    const perFlight = o.harm === null ? null : o.harm.total * c;
    const row: EventItemRow = {
      name: o.item.name,
      source: o.item.source,
      flights: o.item.flights,
      chancePerFlight: c,
      samples: o.summary.samples,
      failedSamples: o.summary.failedSamples,
      keepOut_m2: o.analysis === null ? null : o.summary.keepOut.area_m2,
      reach_m: o.analysis === null ? null : o.summary.keepOut.maxDistance_m,
      expectedCasualtiesPerFlight: perFlight,
      expectedCasualties: perFlight === null ? null : perFlight * o.item.flights,
      folder: itemFolder(i, o.item.name),
    };
    if (o.item.window) row.window = o.item.window;
    return row;
  });

  const areas: EventAreaRow[] = plan.site.areas.map((area) => {
    let expectedLandings = 0;
    let noneProbability = 1;
    let casualties: number | undefined;
    const byItem: EventAreaRow['byItem'] = [];
    outcomes.forEach((o, i) => {
      const row = o.analysis?.areas.find((a) => a.name === area.name);
      if (!row) return;
      const p = row.probability * items[i].chancePerFlight;
      // With a breakup a flight may put many pieces in the area: count them; the chance is of any.
      const landings = (row.expectedLandings ?? row.probability) * items[i].chancePerFlight;
      const n = o.item.flights;
      expectedLandings += n * landings;
      noneProbability *= Math.pow(1 - p, n);
      if (landings > 0) byItem.push({ name: o.item.name, expectedLandings: n * landings });
      const harm = o.harm?.areas.find((a) => a.name === area.name);
      if (harm !== undefined) casualties = (casualties ?? 0) + n * items[i].chancePerFlight * harm.expectedCasualties;
    });
    const out: EventAreaRow = { name: area.name, kind: area.kind, expectedLandings, chanceOfAnyLanding: 1 - noneProbability, byItem };
    if (area.people !== undefined) out.people = area.people;
    if (casualties !== undefined) out.expectedCasualties = casualties;
    return out;
  });

  const zones = outcomes.flatMap((o) => (o.analysis === null ? [] : [{ name: o.item.name, zone: o.analysis.keepOut as Feature<Polygon | MultiPolygon> }]));
  let unionZone: Feature<Polygon | MultiPolygon> | null = null;
  if (zones.length > 0) {
    const features = zones.map((z) => z.zone);
    unionZone = union(featureCollection(features.length > 1 ? features : [features[0], features[0]])) as Feature<Polygon | MultiPolygon> | null;
  }
  const unionMetres = unionZone === null ? null : polygonsToEastNorth(frame, unionZone.geometry);
  const harmed = outcomes.filter((o) => o.harm !== null);
  return {
    name: plan.name,
    flights: outcomes.reduce((s, o) => s + o.item.flights, 0),
    items,
    areas,
    total: {
      expectedCasualties: items.reduce((s, r) => s + (r.expectedCasualties ?? 0), 0),
      expectedLandingsInAreas: areas.reduce((s, a) => s + a.expectedLandings, 0),
    },
    zones,
    union: unionZone,
    unionArea_m2: unionMetres === null ? null : polygonsArea(unionMetres),
    unionReach_m: unionMetres === null ? null : farthestVertex(unionMetres),
    individualRisk: eventIndividualRisk(frame, outcomes, items),
    harmModel: harmed.length > 0 ? harmed[0].harm!.model : null,
  };
}

/**
 * Individual risk over the event, IR(x) = Σ_items N c Σ_i exposure_i K_h(x − p_i): each item's
 * exposure-weighted kernel density (its own bandwidth), resampled onto one grid around the event
 * pad and added with its flights as the multiplier.
 */
function eventIndividualRisk(frame: LocalFrame, outcomes: ItemOutcome[], rows: EventItemRow[]): EventTotals['individualRisk'] {
  const layers: { grid: DensityGrid; scale: number }[] = [];
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, finest = Infinity;
  outcomes.forEach((o, i) => {
    if (o.harm === null || o.analysis === null) return;
    let exposureTotal = 0;
    for (let k = 0; k < o.harm.exposure.length; k++) exposureTotal += o.harm.exposure[k];
    if (!(exposureTotal > 0)) return;
    const { east, north } = toEventFrame(frame, o);
    const h = o.analysis.bandwidth;
    const grid = densityGrid(east, north, o.harm.exposure, { east: h.east, north: h.north });
    layers.push({ grid, scale: exposureTotal * o.item.flights * rows[i].chancePerFlight });
    minX = Math.min(minX, grid.x0);
    minY = Math.min(minY, grid.y0);
    maxX = Math.max(maxX, grid.x0 + (grid.nx - 1) * grid.dx);
    maxY = Math.max(maxY, grid.y0 + (grid.ny - 1) * grid.dy);
    finest = Math.min(finest, grid.dx, grid.dy);
  });
  if (layers.length === 0) return { grid: null, max: 0, lines: [] };
  const cell = Math.max(finest, (maxX - minX) / 511, (maxY - minY) / 511);
  const nx = Math.ceil((maxX - minX) / cell) + 1;
  const ny = Math.ceil((maxY - minY) / cell) + 1;
  const east = new Float64Array(nx * ny);
  const north = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) {
    east[j * nx + i] = minX + i * cell;
    north[j * nx + i] = minY + j * cell;
  }
  const values = new Float64Array(nx * ny);
  for (const layer of layers) {
    const d = densityAt(layer.grid, east, north);
    for (let k = 0; k < values.length; k++) values[k] += layer.scale * d[k];
  }
  const grid: DensityGrid = { nx, ny, x0: minX, y0: minY, dx: cell, dy: cell, values };
  let max = 0;
  for (let k = 0; k < values.length; k++) if (values[k] > max) max = values[k];
  const lines = EVENT_RISK_LEVELS.filter((level) => level < max).map((level) => {
    const metres = traceRegion(grid, level);
    return { level, geometry: { type: 'MultiPolygon' as const, coordinates: polygonsToLonLat(frame, metres).map(windPolygon) }, area_m2: polygonsArea(metres) };
  });
  return { grid, max, lines };
}

/** An item's landings in metres from the event pad (the item's pad may be elsewhere on the site). */
function toEventFrame(frame: LocalFrame, o: ItemOutcome): { east: Float64Array; north: Float64Array } {
  const pad = o.item.scenario.site.pad;
  if (pad.lat === frame.origin.lat && pad.lon === frame.origin.lon) return { east: o.set.east, north: o.set.north };
  const own = createLocalFrame(pad);
  const east = new Float64Array(o.set.east.length);
  const north = new Float64Array(o.set.east.length);
  for (let k = 0; k < east.length; k++) {
    const [lon, lat] = own.toLonLat(o.set.east[k], o.set.north[k]);
    [east[k], north[k]] = frame.toEastNorth(lon, lat);
  }
  return { east, north };
}

/** Individual risk at one place (metres from the event pad), by bilinear interpolation. */
export function individualRiskAt(totals: EventTotals, east: number, north: number): number {
  const grid = totals.individualRisk.grid;
  if (grid === null) return 0;
  return densityAt(grid, Float64Array.of(east), Float64Array.of(north))[0];
}
