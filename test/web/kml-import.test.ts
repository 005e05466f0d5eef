import { DOMParser } from '@xmldom/xmldom';
import { describe, expect, it } from 'vitest';
import { importSiteText, SiteImportError } from '../../web/src/scenario/kml-import.js';
import { closedPolygon, outerRing, withRing, withNewArea } from '../../web/src/scenario/site-edits.js';

/**
 * Areas from KML and GeoJSON files, without a browser (@xmldom/xmldom parses the XML as the
 * browser's DOMParser does in the page).
 */
const parse = (text: string) => new DOMParser().parseFromString(text, 'text/xml') as unknown as Document;

const placemark = (name: string, data: Record<string, string>, coordinates: string) =>
  `<Placemark><name>${name}</name><ExtendedData>${Object.entries(data).map(([k, v]) => `<Data name="${k}"><value>${v}</value></Data>`).join('')}</ExtendedData>
   <Polygon><outerBoundaryIs><LinearRing><coordinates>${coordinates}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>`;

describe('KML and GeoJSON import of site areas', () => {
  it('KML coordinates are lon,lat[,alt] tuples: read as [lon, lat], height dropped (OGC KML 2.2, 07-147r2, §16.9)', () => {
    const kml = `<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"><Document>
      ${placemark('North stand', { kind: 'SPECTATORS', people: '35' }, '8.1,47.2,410 8.2,47.2,410 8.2,47.3,410 8.1,47.2,410')}
      ${placemark('Site Boundary', {}, '8,47 9,47 9,48 8,47')}
      ${placemark('Shed', { kind: 'hangar' }, '8.15,47.25 8.16,47.25 8.16,47.26 8.15,47.25')}
      <Placemark><name>Path</name><LineString><coordinates>8,47 8.1,47.1</coordinates></LineString></Placemark>
    </Document></kml>`;
    const found = importSiteText('site.kml', kml, parse);
    expect(found.areas).toEqual([
      { name: 'North stand', kind: 'spectators', people: 35, geometry: { type: 'Polygon', coordinates: [[[8.1, 47.2], [8.2, 47.2], [8.2, 47.3], [8.1, 47.2]]] } },
      // An unknown kind becomes 'other' (the Site tab lets the user choose), common practice, no source.
      { name: 'Shed', kind: 'other', geometry: { type: 'Polygon', coordinates: [[[8.15, 47.25], [8.16, 47.25], [8.16, 47.26], [8.15, 47.25]]] } },
    ]);
    expect(found.boundary).toEqual({ type: 'Polygon', coordinates: [[[8, 47], [9, 47], [9, 48], [8, 47]]] });
    expect(found.skipped).toEqual(['1 LineString']);
  });

  it('GeoJSON (RFC 7946): a MultiPolygon gives one area per part, holes kept and rings closed', () => {
    const geojson = {
      type: 'FeatureCollection',
      features: [
        {
          type: 'Feature',
          properties: { name: 'Car parks', kind: 'parking', people: '20' },
          geometry: {
            type: 'MultiPolygon',
            coordinates: [
              [[[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]], [[0.2, 0.2], [0.4, 0.2], [0.4, 0.4], [0.2, 0.2]]],
              [[[2, 0], [3, 0], [3, 1]]],
            ],
          },
        },
      ],
    };
    const found = importSiteText('parks.geojson', JSON.stringify(geojson));
    expect(found.areas.map((a) => a.name)).toEqual(['Car parks 1', 'Car parks 2']);
    expect(found.areas[0]!.geometry).toEqual({ type: 'Polygon', coordinates: geojson.features[0]!.geometry.coordinates[0] });
    // An open ring is closed by repeating its first position (RFC 7946 §3.1.6).
    expect((found.areas[1]!.geometry as { coordinates: number[][][] }).coordinates[0]).toEqual([[2, 0], [3, 0], [3, 1], [2, 0]]);
    expect(found.areas[1]!.people).toBe(20);
  });

  it('files that are not KML or GeoJSON are refused with the reason', () => {
    expect(() => importSiteText('x.kml', '<kml><Document></Document></kml>', parse)).toThrow(SiteImportError);
    expect(() => importSiteText('x.kml', '<kml><Document></Document></kml>', parse)).toThrow(/no Placemark/);
    expect(() => importSiteText('x.geojson', '{"type": "Topology"}')).toThrow(/not a GeoJSON FeatureCollection/);
    expect(() => importSiteText('x.geojson', '{oops')).toThrow(/not readable as GeoJSON/);
  });
});

describe('site edits written into the scenario JSON', () => {
  const doc = { json: { site: { pad: { lat: 1, lon: 2 }, areas: [{ name: 'A', kind: 'other', people: 3, geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 0]], [[0.1, 0.1], [0.2, 0.1], [0.2, 0.2], [0.1, 0.1]]] } }] } }, files: {}, fileName: 's.json' };

  it('a new ring keeps the area\u2019s other fields and its holes, rounded to 1e-7 degree and closed', () => {
    const next = withRing(doc, 0, [[0, 0], [2.123456789, 0], [2, 2]]);
    const area = (next.json as any).site.areas[0];
    expect(area.name).toBe('A');
    expect(area.people).toBe(3);
    expect(area.geometry.coordinates).toEqual([[[0, 0], [2.1234568, 0], [2, 2], [0, 0]], [[0.1, 0.1], [0.2, 0.1], [0.2, 0.2], [0.1, 0.1]]]);
    // The document given is not changed.
    expect((doc.json as any).site.areas[0].geometry.coordinates[0]).toHaveLength(4);
  });

  it('outerRing reads back the corners closedPolygon wrote', () => {
    const corners: [number, number][] = [[5, 5], [6, 5], [6, 6], [5, 6]];
    expect(outerRing(closedPolygon(corners))).toEqual(corners);
    expect(outerRing({ coordinates: [[[0, 0], ['x', 1]]] })).toBeNull();
    const added = withNewArea(doc, { name: 'B', kind: 'road' }, corners);
    expect((added.json as any).site.areas.map((a: any) => a.name)).toEqual(['A', 'B']);
  });
});
