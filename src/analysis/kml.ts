/**
 * result.kml (OGC KML 2.2, OGC 07-147r2): contours, keep-out zone, pad placemark and site areas.
 * Coordinates are "lon,lat" tuples separated by spaces (KML's order, like GeoJSON's); rings keep
 * the GeoJSON winding (exterior counter-clockwise). All text is XML-escaped.
 *
 * @example
 *   fs.writeFileSync('result.kml', writeKml(result, site, 'Club field, 12 June'));
 */
import type { Site } from '../scenario/types.js';
import { COORDINATE_DECIMALS, roundTo } from './geojsonWriters.js';
import type { AnalysisResult } from './index.js';
import { polygonsOf } from './projectGeometry.js';
import type { Ring } from './rings.js';
import type { AreaGeometry, MultiPolygon, Polygon } from './types.js';
import { xmlCharacters } from '../scenario/safe-text.js';
import { riskFeatures } from '../risk/geojson.js';

export function escapeXml(text: string): string {
  return xmlCharacters(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

const CAUTION =
  'Indicative results. They support, and never replace, the range-safety code that governs the site, ' +
  'the judgement of the responsible safety officer, and local law.';

/** KML colours are aabbggrr hex. */
const STYLES: Record<string, { line: string; fill: string }> = {
  contour: { line: 'ff0080ff', fill: '330080ff' },
  keepout: { line: 'ff0000ff', fill: '400000ff' },
  area: { line: 'ffff8000', fill: '30ff8000' },
  // Individual-risk lines: deep violet, no fill; lines the samples do not resolve are paler.
  risk: { line: 'ff800040', fill: '00000000' },
  riskUnknown: { line: '80c080a0', fill: '00000000' },
  standing: { line: 'ff000000', fill: '00000000' },
};

function ringXml(ring: Ring): string {
  const tuples = ring.map((p) => `${roundTo(p[0], COORDINATE_DECIMALS)},${roundTo(p[1], COORDINATE_DECIMALS)}`);
  return `<LinearRing><coordinates>${tuples.join(' ')}</coordinates></LinearRing>`;
}

function polygonXml(rings: Ring[]): string {
  const [outer, ...holes] = rings;
  return (
    '<Polygon><outerBoundaryIs>' +
    ringXml(outer) +
    '</outerBoundaryIs>' +
    holes.map((h) => `<innerBoundaryIs>${ringXml(h)}</innerBoundaryIs>`).join('') +
    '</Polygon>'
  );
}

function geometryXml(geometry: AreaGeometry): string {
  const polygons = polygonsOf(geometry);
  if (polygons.length === 1) return polygonXml(polygons[0]);
  return `<MultiGeometry>${polygons.map(polygonXml).join('')}</MultiGeometry>`;
}

function dataXml(data: Record<string, string | number | boolean | undefined>): string {
  const entries = Object.entries(data).filter(([, v]) => v !== undefined);
  return (
    '<ExtendedData>' +
    entries.map(([k, v]) => `<Data name="${escapeXml(k)}"><value>${escapeXml(String(v))}</value></Data>`).join('') +
    '</ExtendedData>'
  );
}

function placemark(
  name: string,
  style: string,
  geometry: string,
  data: Record<string, string | number | boolean | undefined>,
  description?: string,
): string {
  return (
    `<Placemark><name>${escapeXml(name)}</name>` +
    (description ? `<description>${escapeXml(description)}</description>` : '') +
    `<styleUrl>#${style}</styleUrl>${dataXml(data)}${geometry}</Placemark>`
  );
}

/** Layers "Individual risk" (one placemark per level) and "Standing distance" (the octant ring). */
function riskFolders(result: AnalysisResult, site: Site): string {
  const features = riskFeatures(result.risk!, site.pad);
  const lines = features
    .filter((f) => f.properties?.kind === 'individual-risk' && (f.geometry as MultiPolygon).coordinates.length > 0)
    .map((f) => {
      const p = f.properties as { level: number; resolved: boolean; area_m2: number; maxDistance_m: number; samplesNeeded: number | null };
      return placemark(
        `Individual risk ${p.level.toExponential(0)} per flight${p.resolved ? '' : ' (not resolved by the samples)'}`,
        p.resolved ? 'risk' : 'riskUnknown',
        geometryXml(f.geometry as MultiPolygon),
        { level: p.level, resolved: p.resolved, area_m2: p.area_m2, maxDistance_m: p.maxDistance_m, samplesNeeded: p.samplesNeeded ?? undefined },
      );
    })
    .join('');
  const ring = features
    .filter((f) => f.properties?.kind === 'standing-distance')
    .map((f) =>
      placemark(
        `Risk under ${(f.properties as { level: number }).level.toExponential(0)} per flight beyond this line`,
        'standing',
        polygonXml((f.geometry as Polygon).coordinates as Ring[]),
        f.properties as Record<string, number>,
      ),
    )
    .join('');
  return `<Folder><name>Individual risk</name>${lines}</Folder><Folder><name>Standing distance</name>${ring}</Folder>`;
}

export function writeKml(result: AnalysisResult, site: Site, title = 'Strewn landing analysis'): string {
  const styles = Object.entries(STYLES)
    .map(
      ([id, s]) =>
        `<Style id="${id}"><LineStyle><color>${s.line}</color><width>2</width></LineStyle>` +
        `<PolyStyle><color>${s.fill}</color></PolyStyle></Style>`,
    )
    .join('');
  const contours = result.contours.features
    .filter((f) => f.geometry.coordinates.length > 0)
    .map((f) =>
      placemark(
        `${roundTo(f.properties.level * 100, 3)} % landing region`,
        'contour',
        geometryXml(f.geometry),
        {
          level: f.properties.level,
          area_m2: roundTo(f.properties.area_m2, 1),
          maxDistance_m: roundTo(f.properties.maxDistance_m, 1),
        },
      ),
    )
    .join('');
  const k = result.keepOut.properties;
  const keepOut = placemark(
    'Keep-out zone',
    'keepout',
    geometryXml(result.keepOut.geometry),
    { level: k.level, margin_m: k.margin_m, area_m2: roundTo(k.area_m2, 1), maxDistance_m: roundTo(k.maxDistance_m, 1) },
    `Union of: ${k.parts.join('; ')}.`,
  );
  const areas = site.areas
    .map((area) => {
      const figures = result.areas.find((a) => a.name === area.name);
      return placemark(
        area.name,
        'area',
        geometryXml(area.geometry),
        {
          kind: area.kind,
          hits: figures?.hits,
          probability: figures?.probability,
          upper95: figures?.upper95,
          people: area.people,
          expectedCasualties: figures?.expectedCasualties,
          expectedCasualtiesUpper95: figures?.casualtiesUpper95,
          maxIndividualRisk: figures?.maxIndividualRisk,
        },
        figures?.note,
      );
    })
    .join('');
  const risk = result.risk ? riskFolders(result, site) : '';
  const pad =
    `<Placemark><name>Pad</name><Point><coordinates>` +
    `${roundTo(site.pad.lon, COORDINATE_DECIMALS)},${roundTo(site.pad.lat, COORDINATE_DECIMALS)}` +
    `</coordinates></Point></Placemark>`;
  return (
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    '<kml xmlns="http://www.opengis.net/kml/2.2"><Document>' +
    `<name>${escapeXml(title)}</name><description>${escapeXml(CAUTION)}</description>` +
    styles +
    `<Folder><name>Landing regions</name>${contours}</Folder>` +
    `<Folder><name>Keep-out zone</name>${keepOut}</Folder>` +
    pad +
    `<Folder><name>Areas</name>${areas}</Folder>` +
    risk +
    '</Document></kml>\n'
  );
}
