import { valueAt, withValue, type ScenarioDocument } from './document.js';

/**
 * Edits of the site as drawn on the map, written into the scenario document the page edits (the
 * JSON as the user has it), so Run, Save and the command line all see the same areas. Positions
 * are [lon, lat] as GeoJSON writes them, rounded to 7 decimals of a degree (about a centimetre).
 * Nothing here checks a shape: the scenario's own validator does, with the command line's words.
 *
 * @example
 *   const doc2 = withNewArea(doc, { name: 'Crowd line', kind: 'spectators' }, [[8.01, 47.31], [8.02, 47.31], [8.02, 47.32]]);
 */

export type LonLat = [number, number];

/** Which polygon of the site: the boundary, or an area by its index in `site.areas`. */
export type SiteTarget = 'boundary' | number;

/** An area as the scenario file holds it (any fields the user wrote are kept as they are). */
export type RawArea = Record<string, unknown> & { name?: unknown; kind?: unknown; geometry?: unknown; people?: unknown };

export function roundDegree(x: number): number {
  return Number(x.toFixed(7));
}

/** The areas of the draft as written (an empty list where there are none or they are not a list). */
export function rawAreas(json: unknown): RawArea[] {
  const areas = valueAt(json, ['site', 'areas']);
  return Array.isArray(areas) ? areas.map((a) => (a !== null && typeof a === 'object' ? (a as RawArea) : {})) : [];
}

function geometryOf(json: unknown, target: SiteTarget): unknown {
  return target === 'boundary' ? valueAt(json, ['site', 'boundary']) : rawAreas(json)[target]?.geometry;
}

/**
 * The outer ring of a polygon as corners (the closing repeat left out), or null where the
 * geometry is not a polygon of numeric positions (then the fields show the validator's message).
 */
export function outerRing(geometry: unknown): LonLat[] | null {
  const coordinates = (geometry as { coordinates?: unknown } | null)?.coordinates;
  const ring = Array.isArray(coordinates) ? coordinates[0] : undefined;
  if (!Array.isArray(ring)) return null;
  const corners: LonLat[] = [];
  for (const p of ring) {
    if (!Array.isArray(p) || typeof p[0] !== 'number' || typeof p[1] !== 'number') return null;
    corners.push([p[0], p[1]]);
  }
  const first = corners[0], last = corners[corners.length - 1];
  if (corners.length > 1 && first && last && first[0] === last[0] && first[1] === last[1]) corners.pop();
  return corners;
}

export function targetRing(json: unknown, target: SiteTarget): LonLat[] | null {
  return outerRing(geometryOf(json, target));
}

/** A GeoJSON Polygon from corners: rounded and closed; `holes` (inner rings) kept as given. */
export function closedPolygon(corners: readonly LonLat[], holes: readonly unknown[] = []): { type: 'Polygon'; coordinates: unknown[] } {
  const ring = corners.map(([lon, lat]) => [roundDegree(lon), roundDegree(lat)]);
  if (ring.length > 0) ring.push([...ring[0]!]);
  return { type: 'Polygon', coordinates: [ring, ...holes] };
}

function holesOf(geometry: unknown): unknown[] {
  const coordinates = (geometry as { coordinates?: unknown } | null)?.coordinates;
  return Array.isArray(coordinates) ? coordinates.slice(1) : [];
}

/** The document with the target's outer ring replaced by `corners` (its holes kept). */
export function withRing(doc: ScenarioDocument, target: SiteTarget, corners: readonly LonLat[]): ScenarioDocument {
  const polygon = closedPolygon(corners, holesOf(geometryOf(doc.json, target)));
  return target === 'boundary' ? withValue(doc, ['site', 'boundary'], polygon) : withValue(doc, ['site', 'areas', target, 'geometry'], polygon);
}

/** The document with one more area at the end of `site.areas`. */
export function withNewArea(doc: ScenarioDocument, fields: { name: string; kind: string; people?: number }, corners: readonly LonLat[]): ScenarioDocument {
  const area: RawArea = { name: fields.name, kind: fields.kind, geometry: closedPolygon(corners) };
  if (fields.people !== undefined) area.people = fields.people;
  return withAreas(doc, [...rawAreas(doc.json), area]);
}

/** The document with `site.areas` replaced (the field removed when the list is empty). */
export function withAreas(doc: ScenarioDocument, areas: readonly RawArea[]): ScenarioDocument {
  return withValue(doc, ['site', 'areas'], areas.length > 0 ? areas : undefined);
}

export function withoutArea(doc: ScenarioDocument, index: number): ScenarioDocument {
  return withAreas(doc, rawAreas(doc.json).filter((_, i) => i !== index));
}

export function withoutBoundary(doc: ScenarioDocument): ScenarioDocument {
  return withValue(doc, ['site', 'boundary'], undefined);
}

/** One field of one area; `undefined` removes it (a head count left empty). */
export function withAreaField(doc: ScenarioDocument, index: number, key: 'name' | 'kind' | 'people' | 'density' | 'sheltered', value: unknown): ScenarioDocument {
  return withValue(doc, ['site', 'areas', index, key], value);
}

/** A name not yet used by an area: "Area 3", "Area 4", … */
export function freshAreaName(json: unknown, stem = 'Area'): string {
  const taken = new Set(rawAreas(json).map((a) => String(a.name)));
  for (let n = taken.size + 1; ; n++) if (!taken.has(`${stem} ${n}`)) return `${stem} ${n}`;
}

/** The path the validator uses for a target ("site.boundary", "site.areas[2]"). */
export function targetPath(target: SiteTarget): string {
  return target === 'boundary' ? 'site.boundary' : `site.areas[${target}]`;
}
