import type { Feature, FeatureCollection, Geometry, LineString, MultiPolygon, Point, Polygon, Position } from 'geojson';
import type { AnalysisResult } from '../../../src/analysis/index.js';
import type { LocalFrame } from '../../../src/analysis/geodesy.js';
import type { LandingSet } from '../../../src/analysis/types.js';
import type { Site, VehicleKind } from '../../../src/scenario/types.js';
import type { NominalFlight } from '../study/nominal.js';
import { inUnit, level } from '../units/format.js';
import type { Unit } from '../units/systems.js';
import { riskFeatures } from '../../../src/risk/geojson.js';
import { smallRate } from '../../../src/report/sheet/units.js';
import { WORDS, modeSymbolIndex } from '../../../src/report/symbols.js';

/**
 * Map features built from the scenario and the results. Labels sit on point features of their
 * own (one per thing labelled), because maplibre repeats a polygon's label in every tile.
 */

type Props = Record<string, unknown>;

export function collection<G extends Geometry>(features: Feature<G, Props>[]): FeatureCollection<G, Props> {
  return { type: 'FeatureCollection', features };
}

export const EMPTY_COLLECTION: FeatureCollection = collection([]);

function point(coordinates: Position, properties: Props): Feature<Point, Props> {
  return { type: 'Feature', geometry: { type: 'Point', coordinates }, properties };
}

/** The mean of a ring's vertices (without the closing one): a label point inside small, compact shapes. */
export function ringCentre(ring: Position[]): Position {
  const open = ring.length > 1 && ring[0]![0] === ring.at(-1)![0] && ring[0]![1] === ring.at(-1)![1] ? ring.slice(0, -1) : ring;
  let x = 0;
  let y = 0;
  for (const p of open) {
    x += p[0]!;
    y += p[1]!;
  }
  return [x / open.length, y / open.length];
}

/** The vertex half-way along a line, for a label that sits on the line. */
function lineMiddle(coordinates: Position[]): Position {
  return coordinates[Math.floor((coordinates.length - 1) / 2)]!;
}

/** The basemap as given, and a label point for each named feature. */
export function basemapFeatures(site: Site): { shapes: FeatureCollection; labels: FeatureCollection } {
  const features = (site.basemap?.features ?? []) as Feature<Geometry, Props | null>[];
  const labels: Feature<Point, Props>[] = [];
  for (const feature of features) {
    const name = feature.properties?.name;
    if (typeof name !== 'string' || name === '') continue;
    const g = feature.geometry;
    if (g?.type === 'Polygon') labels.push(point(ringCentre(g.coordinates[0]!), { label: name }));
    else if (g?.type === 'LineString') labels.push(point(lineMiddle(g.coordinates), { label: name }));
    else if (g?.type === 'Point') labels.push(point(g.coordinates, { label: name }));
  }
  return { shapes: { type: 'FeatureCollection', features } as FeatureCollection, labels: collection(labels) };
}

export function boundaryFeatures(site: Site): FeatureCollection {
  return site.boundary ? collection([{ type: 'Feature', geometry: site.boundary as Polygon, properties: {} }]) : EMPTY_COLLECTION;
}

/** What the map shows of one marked area's result. */
export interface AreaFigure {
  hits: number;
  probability: number;
  upper95: number;
}

/**
 * The marked areas, each with its kind (the fill, as on the sheet), and a label with the name and,
 * after a run, the chance in the sheet's words. Names are the user's text; maplibre draws them as glyphs.
 */
export function areaFeatures(site: Site, figures: readonly (AreaFigure | undefined)[], describe: (f: AreaFigure) => string): { shapes: FeatureCollection; labels: FeatureCollection } {
  const shapes: Feature<Polygon, Props>[] = [];
  const labels: Feature<Point, Props>[] = [];
  site.areas.forEach((area, i) => {
    const figure = figures[i];
    shapes.push({ type: 'Feature', geometry: area.geometry as Polygon, properties: { index: i, kind: area.kind, hits: figure?.hits ?? null } });
    const text = figure === undefined ? area.name : `${area.name}\n${describe(figure)}`;
    labels.push(point(ringCentre(area.geometry.coordinates[0]!), { label: text }));
  });
  return { shapes: collection(shapes), labels: collection(labels) };
}

/**
 * Ring radii: a round step in the display unit, and enough rings to reach `reach` metres (the
 * farthest corner of the view), about five of them.
 */
export function ringRadii(reach: number, unit: Unit): number[] {
  const steps = unit.text === 'ft' ? [25, 50, 100, 250, 500, 1000, 2000, 2640, 5280, 10_560, 26_400, 52_800] : [10, 25, 50, 100, 250, 500, 1000, 2000, 5000, 10_000, 20_000];
  const reachInUnit = Math.max(reach, 1) / unit.si;
  const step = steps.find((s) => reachInUnit / s <= 7) ?? steps.at(-1)!;
  const radii: number[] = [];
  for (let r = step; r < reachInUnit + step && radii.length < 8; r += step) radii.push(r * unit.si);
  return radii;
}

/** Range rings around the pad (circles in the local frame) and a label at the north of each. */
export function ringFeatures(frame: LocalFrame, radii: readonly number[], unit: Unit): { shapes: FeatureCollection; labels: FeatureCollection } {
  const shapes: Feature<LineString, Props>[] = [];
  const labels: Feature<Point, Props>[] = [];
  for (const r of radii) {
    const ring: Position[] = [];
    for (let deg = 0; deg <= 360; deg += 4) {
      const a = (deg * Math.PI) / 180;
      ring.push(frame.toLonLat(r * Math.sin(a), r * Math.cos(a)));
    }
    shapes.push({ type: 'Feature', geometry: { type: 'LineString', coordinates: ring }, properties: { radius: r } });
    labels.push(point(frame.toLonLat(0, r), { label: inUnit(r, unit) }));
  }
  return { shapes: collection(shapes), labels: collection(labels) };
}

/** Outer rings of a polygon or multipolygon. */
function outerRings(geometry: Polygon | MultiPolygon): Position[][] {
  return geometry.type === 'Polygon' ? [geometry.coordinates[0]!] : geometry.coordinates.map((p) => p[0]!);
}

function extremeVertex(geometry: Polygon | MultiPolygon, better: (a: Position, b: Position) => boolean): Position | null {
  let best: Position | null = null;
  for (const ring of outerRings(geometry)) for (const p of ring) if (best === null || better(p, best)) best = p;
  return best;
}

/**
 * Contour regions with their level's index (for the line style), and one label per level at the
 * region's northernmost point, so nested levels are labelled one above the other.
 */
export function contourFeatures(analysis: AnalysisResult): { shapes: FeatureCollection; labels: FeatureCollection } {
  const shapes: Feature<MultiPolygon, Props>[] = [];
  const labels: Feature<Point, Props>[] = [];
  analysis.contours.features.forEach((f, index) => {
    shapes.push({ type: 'Feature', geometry: f.geometry, properties: { ...f.properties, index } });
    const top = extremeVertex(f.geometry, (a, b) => a[1]! > b[1]!);
    if (top) labels.push(point(top, { label: level(f.properties.level), index, level: f.properties.level }));
  });
  return { shapes: collection(shapes), labels: collection(labels) };
}

/** The keep-out zone and its label at the zone's southernmost point (away from the contour labels). */
export function keepOutFeatures(analysis: AnalysisResult, unit: Unit): { shapes: FeatureCollection; labels: FeatureCollection } {
  const zone = analysis.keepOut;
  const bottom = extremeVertex(zone.geometry, (a, b) => a[1]! < b[1]!);
  const p = zone.properties;
  const text = `${WORDS.keepOut}\n${WORDS.keepOutRecipe(level(p.level), inUnit(p.margin_m, unit))}`;
  return {
    shapes: collection([{ type: 'Feature', geometry: zone.geometry, properties: { level: p.level, area_m2: p.area_m2, maxDistance_m: p.maxDistance_m } }]),
    labels: bottom ? collection([point(bottom, { label: text })]) : EMPTY_COLLECTION,
  };
}

/**
 * Individual-risk lines (index = level's rank, highest first, for the line style) and the
 * standing-distance ring, with a label at the ring's eastern edge and at each line's top.
 */
export function riskMapFeatures(analysis: AnalysisResult, pad: { lat: number; lon: number }): { shapes: FeatureCollection; labels: FeatureCollection } {
  if (!analysis.risk) return { shapes: EMPTY_COLLECTION, labels: EMPTY_COLLECTION };
  const features = riskFeatures(analysis.risk, pad);
  const labels: Feature<Point, Props>[] = [];
  let index = 0;
  const shapes = features.map((f) => {
    const p = { ...(f.properties as Props) };
    if (p.kind === 'individual-risk') {
      p.index = index++;
      const top = extremeVertex(f.geometry as MultiPolygon, (a, b) => a[1]! > b[1]!);
      if (top) labels.push(point(top, { label: `${rateText(p.level as number)}${p.resolved ? '' : ' (not resolved)'}` }));
    } else {
      p.resolved = analysis.risk!.standingLine.resolved;
      const east = extremeVertex(f.geometry as Polygon, (a, b) => a[0]! > b[0]!);
      if (east) labels.push(point(east, { label: `stand beyond: under ${rateText(p.level as number)}` }));
    }
    return { ...f, properties: p } as Feature<Geometry, Props>;
  });
  return { shapes: collection(shapes), labels: collection(labels) };
}

/** A chance per flight as the sheet writes it ('1.0e-6', '0.012'). */
export function rateText(x: number): string {
  return smallRate(x);
}

/** One point per landed sample; `i` indexes the landing set, where the hover finds the figures. */
export function landingFeatures(set: LandingSet, frame: LocalFrame): FeatureCollection {
  const features: Feature<Point, Props>[] = new Array(set.east.length);
  for (let i = 0; i < set.east.length; i++) {
    features[i] = point(frame.toLonLat(set.east[i]!, set.north[i]!), { i, mode: set.mode[i]!, symbol: modeSymbolIndex(set.mode[i]!) });
  }
  return collection(features);
}

/** The nominal ground track and a marked apogee point labelled with its height. */
export function trackFeatures(nominal: NominalFlight, height: Unit, kind: VehicleKind): { shapes: FeatureCollection; labels: FeatureCollection } {
  if (nominal.track.length < 2) return { shapes: EMPTY_COLLECTION, labels: EMPTY_COLLECTION };
  // A released object starts at its highest point: there the mark is the release, not an apogee.
  const name = kind === 'release' ? 'nominal release at' : 'nominal apogee';
  const labels = nominal.apogee ? [point(nominal.apogee.lonLat, { label: `${name} ${inUnit(nominal.apogee.height, height)}` })] : [];
  return {
    shapes: collection([{ type: 'Feature', geometry: { type: 'LineString', coordinates: nominal.track }, properties: {} }]),
    labels: collection(labels),
  };
}

/** [west, south, east, north] of every coordinate in the collections, or null when empty. */
export function boundsOf(...collections: FeatureCollection[]): [number, number, number, number] | null {
  let w = Infinity, s = Infinity, e = -Infinity, n = -Infinity;
  const visit = (c: unknown): void => {
    if (Array.isArray(c) && typeof c[0] === 'number') {
      w = Math.min(w, c[0]); e = Math.max(e, c[0]);
      s = Math.min(s, c[1] as number); n = Math.max(n, c[1] as number);
    } else if (Array.isArray(c)) c.forEach(visit);
  };
  for (const fc of collections) for (const f of fc.features) if (f.geometry && 'coordinates' in f.geometry) visit(f.geometry.coordinates);
  return Number.isFinite(w) ? [w, s, e, n] : null;
}
