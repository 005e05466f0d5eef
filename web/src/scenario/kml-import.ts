import { kml } from '@tmcw/togeojson';
import type { Feature, Geometry } from 'geojson';
import { AREA_KINDS } from '../../../src/scenario/schema.js';
import { closedPolygon, outerRing, type RawArea } from './site-edits.js';

/**
 * Areas of the site from a KML file (read with @tmcw/togeojson) or a GeoJSON file: every polygon
 * becomes an area of the scenario format (`name`, `kind`, `geometry`, optional `people`), a
 * multi-polygon one area per part. What each feature is comes from its own properties, which KML
 * writes as the placemark's name and ExtendedData:
 *   - `kind`: one of the format's area kinds, any letter case; anything else becomes `other`
 *     (the Site tab lets the user pick the kind);
 *   - `kind` "boundary", or a name that is "boundary" / "site boundary": the site's boundary;
 *   - `people`: a head count (a number, or a text holding one).
 * Lines and points are not areas: they are counted and said to be skipped. Heights in the
 * positions (KML writes lon,lat,alt) are dropped; positions are rounded to 7 decimals.
 *
 * @example
 *   const found = importSiteText('site.kml', text);
 *   found.areas;     // [{ name: 'Crowd line', kind: 'spectators', geometry: {...}, people: 80 }]
 *   found.boundary;  // the polygon named "boundary", if any
 */

export interface ImportedSite {
  areas: RawArea[];
  boundary?: { type: 'Polygon'; coordinates: unknown[] };
  /** Features that are not polygons, by geometry type ("2 LineString"). */
  skipped: string[];
}

export class SiteImportError extends Error {}

/** Parses XML text; the page passes the browser's DOMParser, a Node test @xmldom/xmldom's. */
export type XmlParser = (text: string) => Document;

const browserParser: XmlParser = (text) => new DOMParser().parseFromString(text, 'text/xml');

/** Reads a KML (.kml) or GeoJSON (.geojson, .json) file's text into areas. */
export function importSiteText(fileName: string, text: string, parseXml: XmlParser = browserParser): ImportedSite {
  if (/\.kml$/i.test(fileName) || /^\s*(<\?xml|<kml)/i.test(text)) return fromFeatures(kmlFeatures(text, parseXml));
  return fromFeatures(geoJsonFeatures(text));
}

function kmlFeatures(text: string, parseXml: XmlParser): Feature[] {
  let doc: Document;
  try {
    doc = parseXml(text);
  } catch (error) {
    throw new SiteImportError(`not readable as KML (${error instanceof Error ? error.message : String(error)})`);
  }
  // The browser's DOMParser does not throw: it returns a document holding a <parsererror>.
  const broken = doc.getElementsByTagName('parsererror')[0];
  if (broken) throw new SiteImportError(`not readable as KML: ${(broken.textContent ?? '').trim().split('\n')[0]}`);
  if (doc.getElementsByTagName('Placemark').length === 0) throw new SiteImportError('no Placemark in the file; expected KML placemarks holding polygons');
  return kml(doc as never, { skipNullGeometry: true }).features as Feature[];
}

function geoJsonFeatures(text: string): Feature[] {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new SiteImportError(`not readable as GeoJSON (${error instanceof Error ? error.message : String(error)})`);
  }
  const object = json as { type?: unknown; features?: unknown; geometry?: unknown };
  if (object?.type === 'FeatureCollection' && Array.isArray(object.features)) return object.features as Feature[];
  if (object?.type === 'Feature') return [object as Feature];
  if (typeof object?.type === 'string' && 'coordinates' in (object as object)) return [{ type: 'Feature', properties: {}, geometry: object as unknown as Geometry }];
  throw new SiteImportError(`type ${JSON.stringify(object?.type ?? null)} is not a GeoJSON FeatureCollection, Feature or geometry`);
}

function fromFeatures(features: readonly Feature[]): ImportedSite {
  const out: ImportedSite = { areas: [], skipped: [] };
  const skipped = new Map<string, number>();
  let unnamed = 0;
  for (const feature of features) {
    const geometry = feature?.geometry;
    const polygons = geometry?.type === 'Polygon' ? [geometry.coordinates] : geometry?.type === 'MultiPolygon' ? geometry.coordinates : [];
    if (polygons.length === 0) {
      const type = geometry?.type ?? 'no geometry';
      skipped.set(type, (skipped.get(type) ?? 0) + 1);
      continue;
    }
    const properties = (feature.properties ?? {}) as Record<string, unknown>;
    const name = typeof properties.name === 'string' && properties.name.trim() !== '' ? properties.name.trim() : `Imported area ${++unnamed}`;
    const kindText = typeof properties.kind === 'string' ? properties.kind.trim().toLowerCase() : '';
    polygons.forEach((rings, part) => {
      const polygon = flatPolygon(rings);
      if (!polygon) {
        skipped.set('Polygon without positions', (skipped.get('Polygon without positions') ?? 0) + 1);
        return;
      }
      if (kindText === 'boundary' || /^(site )?boundary$/i.test(name)) {
        out.boundary = polygon;
        return;
      }
      const area: RawArea = { name: polygons.length > 1 ? `${name} ${part + 1}` : name, kind: (AREA_KINDS as readonly string[]).includes(kindText) ? kindText : 'other', geometry: polygon };
      const people = typeof properties.people === 'number' ? properties.people : typeof properties.people === 'string' ? Number(properties.people) : NaN;
      if (Number.isFinite(people)) area.people = people;
      out.areas.push(area);
    });
  }
  out.skipped = [...skipped].map(([type, n]) => `${n} ${type}`);
  return out;
}

/** Rings as 2-D positions, each closed; the outer ring's corners through closedPolygon. */
function flatPolygon(rings: unknown): { type: 'Polygon'; coordinates: unknown[] } | null {
  if (!Array.isArray(rings) || rings.length === 0) return null;
  const asCorners = rings.map((ring) => outerRing({ coordinates: [Array.isArray(ring) ? ring.map((p) => (Array.isArray(p) ? p.slice(0, 2) : p)) : ring] }));
  if (asCorners.some((c) => c === null || c.length === 0)) return null;
  const [outer, ...holes] = asCorners as [number, number][][];
  return closedPolygon(outer!, holes.map((h) => closedPolygon(h).coordinates[0]));
}
