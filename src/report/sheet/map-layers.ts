/**
 * The map's geographic layers in page coordinates: basemap, site boundary, areas, contours, the
 * keep-out zone, range rings, landing points and the pad. Each turns lon/lat (or east/north)
 * geometry into display-list shapes through the map view; none of them places text.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { LocalFrame } from '../../analysis/geodesy.js';
import { polygonsToEastNorth } from '../../analysis/projectGeometry.js';
import type { PathCommand, Shape } from './display-list.js';
import type { Candidate } from './labels.js';
import type { MapView } from './map-view.js';
import { BASEMAP_OTHER_LINE, BASEMAP_OTHER_POLYGON, BASEMAP_STYLES, type BasemapStyle } from './palette.js';

export type Metres = [number, number];
export type PagePoint = [number, number];

/** Polygons (lists of rings) in metres from the pad. */
export function polygonsInMetres(frame: LocalFrame, geometry: Polygon | MultiPolygon): Metres[][][] {
  return polygonsToEastNorth(frame, geometry).map((rings) => rings.map((ring) => ring.map((p) => [p[0], p[1]] as Metres)));
}

/** Rings as one path (every ring closed); fill it even-odd so holes stay open. */
export function polygonsPath(view: MapView, polygons: Metres[][][]): PathCommand[] {
  const d: PathCommand[] = [];
  for (const rings of polygons) {
    for (const ring of rings) {
      ring.forEach(([e, n], i) => d.push([i === 0 ? 'M' : 'L', ...view.toPage(e, n)] as PathCommand));
      if (ring.length > 0) d.push(['Z']);
    }
  }
  return d;
}

export function linesPath(view: MapView, lines: Metres[][]): PathCommand[] {
  const d: PathCommand[] = [];
  for (const line of lines) line.forEach(([e, n], i) => d.push([i === 0 ? 'M' : 'L', ...view.toPage(e, n)] as PathCommand));
  return d;
}

/** A basemap feature reduced to what the sheet draws. */
export interface BasemapItem {
  kind: string;
  name?: string;
  style: BasemapStyle;
  polygons: Metres[][][];
  lines: Metres[][];
}

function isPositionList(x: unknown): x is number[][] {
  return Array.isArray(x) && x.every((p) => Array.isArray(p) && p.length >= 2 && typeof p[0] === 'number' && typeof p[1] === 'number' && Number.isFinite(p[0]) && Number.isFinite(p[1]));
}

/**
 * Reads the scenario's basemap (a GeoJSON FeatureCollection passed through untouched): polygons
 * and lines are kept, styled by their `kind` property; anything else (points, malformed
 * geometry) is skipped, since the basemap is only context.
 */
export function readBasemap(frame: LocalFrame, basemap: { features: unknown[] } | undefined): BasemapItem[] {
  const items: BasemapItem[] = [];
  for (const raw of basemap?.features ?? []) {
    if (raw === null || typeof raw !== 'object') continue;
    const f = raw as { geometry?: { type?: string; coordinates?: unknown }; properties?: Record<string, unknown> | null };
    const kind = typeof f.properties?.kind === 'string' ? f.properties.kind : 'other';
    const name = typeof f.properties?.name === 'string' ? f.properties.name : undefined;
    const type = f.geometry?.type;
    const coords = f.geometry?.coordinates;
    const toMetres = (ring: number[][]) => ring.map((p) => frame.toEastNorth(p[0], p[1]) as Metres);
    if (type === 'Polygon' || type === 'MultiPolygon') {
      const polys = (type === 'Polygon' ? [coords] : coords) as unknown[];
      if (!Array.isArray(polys) || !polys.every((rings) => Array.isArray(rings) && rings.every(isPositionList))) continue;
      const style = BASEMAP_STYLES[kind]?.fill ? BASEMAP_STYLES[kind] : BASEMAP_OTHER_POLYGON;
      items.push({ kind: BASEMAP_STYLES[kind]?.fill ? kind : 'other', name, style, polygons: (polys as number[][][][]).map((rings) => rings.map(toMetres)), lines: [] });
    } else if (type === 'LineString' || type === 'MultiLineString') {
      const lines = (type === 'LineString' ? [coords] : coords) as unknown[];
      if (!Array.isArray(lines) || !lines.every(isPositionList)) continue;
      const known = BASEMAP_STYLES[kind] && !BASEMAP_STYLES[kind].fill;
      items.push({ kind: known ? kind : 'other', name, style: known ? BASEMAP_STYLES[kind] : BASEMAP_OTHER_LINE, polygons: [], lines: (lines as number[][][]).map(toMetres) });
    }
  }
  return items;
}

/** Basemap shapes: all areas first, then all lines, so a stream is never hidden by a field. */
export function basemapShapes(view: MapView, items: BasemapItem[]): Shape[] {
  const fills: Shape[] = [];
  const lines: Shape[] = [];
  for (const item of items) {
    if (item.polygons.length > 0) fills.push({ kind: 'path', className: `basemap basemap-${item.kind}`, d: polygonsPath(view, item.polygons), fill: item.style.fill, stroke: item.style.stroke, evenOdd: true });
    if (item.lines.length > 0) lines.push({ kind: 'path', className: `basemap basemap-${item.kind}`, d: linesPath(view, item.lines), stroke: item.style.stroke });
  }
  return [{ kind: 'group', id: 'basemap', shapes: [...fills, ...lines] }];
}

/** Evenly spaced points along a ring (by length), for label candidates. */
export function pointsAlong(ring: PagePoint[], count: number): PagePoint[] {
  if (ring.length === 0) return [];
  const lengths = [0];
  for (let i = 1; i < ring.length; i++) lengths.push(lengths[i - 1] + Math.hypot(ring[i][0] - ring[i - 1][0], ring[i][1] - ring[i - 1][1]));
  const total = lengths[lengths.length - 1];
  if (total === 0) return [ring[0]];
  const out: PagePoint[] = [];
  let j = 1;
  for (let k = 0; k < count; k++) {
    const s = (total * (k + 0.5)) / count;
    while (j < ring.length - 1 && lengths[j] < s) j++;
    const f = (s - lengths[j - 1]) / (lengths[j] - lengths[j - 1] || 1);
    out.push([ring[j - 1][0] + f * (ring[j][0] - ring[j - 1][0]), ring[j - 1][1] + f * (ring[j][1] - ring[j - 1][1])]);
  }
  return out;
}

/** Largest exterior ring (by extent) of polygons, in page points. */
export function mainRing(view: MapView, polygons: Metres[][][]): PagePoint[] {
  let best: Metres[] = [];
  let bestSize = -1;
  for (const rings of polygons) {
    const ring = rings[0] ?? [];
    let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
    for (const [e, n] of ring) {
      minX = Math.min(minX, e); maxX = Math.max(maxX, e); minY = Math.min(minY, n); maxY = Math.max(maxY, n);
    }
    const size = (maxX - minX) * (maxY - minY);
    if (size > bestSize) {
      bestSize = size;
      best = ring;
    }
  }
  return best.map(([e, n]) => view.toPage(e, n));
}

/**
 * Points along a ring ordered by how close their bearing from the ring's centre is to `preferDeg`
 * (clockwise from north, on the page): labels of different lines start at different sides.
 */
export function ringCandidatePoints(ring: PagePoint[], preferDeg: number, count = 40): PagePoint[] {
  const points = pointsAlong(ring, count);
  const centre = ringCentre(ring);
  const gap = (p: PagePoint) => {
    const bearing = (Math.atan2(p[0] - centre[0], centre[1] - p[1]) * 180) / Math.PI;
    return Math.abs(((((bearing - preferDeg) % 360) + 540) % 360) - 180);
  };
  return points.map((p) => ({ p, g: gap(p) })).sort((a, b) => a.g - b.g).map((x) => x.p);
}

/** Middle of a ring's bounding box. */
export function ringCentre(ring: PagePoint[]): PagePoint {
  let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
  for (const [x, y] of ring) {
    minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
  }
  return [(minX + maxX) / 2, (minY + maxY) / 2];
}

/**
 * Label positions for a line: on the line first (the label's backing breaks it), then standing
 * off it outwards with a leader, for lines too small or crowded to carry a label.
 */
export function lineLabelCandidates(ring: PagePoint[], preferDeg: number): Candidate[] {
  const points = ringCandidatePoints(ring, preferDeg);
  const centre = ringCentre(ring);
  const onLine: Candidate[] = points.map(([x, y]) => ({ x, y, alignX: 0.5, alignY: 0.5 }));
  const offLine: Candidate[] = [];
  for (const distance of [12, 24, 40]) {
    for (const [x, y] of points.slice(0, 16)) {
      const dx = x - centre[0];
      const dy = y - centre[1];
      const length = Math.hypot(dx, dy) || 1;
      const ux = dx / length;
      const uy = dy / length;
      offLine.push({ x: x + ux * distance, y: y + uy * distance, alignX: ux < -0.3 ? 1 : ux > 0.3 ? 0 : 0.5, alignY: uy < -0.3 ? 1 : uy > 0.3 ? 0 : 0.5, leaderFrom: [x, y] });
    }
  }
  return [...onLine, ...offLine];
}
