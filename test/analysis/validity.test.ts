import { describe, expect, it } from 'vitest';
import { booleanValid } from '@turf/turf';
import { kml as kmlToGeoJSON } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import type { Geometry, Polygon, MultiPolygon } from 'geojson';
import { analyze, writeContoursGeoJSON, writeKeepOutGeoJSON, writeKml } from '../../src/analysis/index.js';
import { hasRfc7946Winding } from '../../src/analysis/rings.js';
import { polygonsOf } from '../../src/analysis/projectGeometry.js';
import { makeRun, makeSite, mixtureSet } from './fixtures.js';
import { strictlyValid } from './strictValidity.js';

// Checks: turf's booleanValid plus the stricter OGC simple-features rules in strictValidity.ts,
// RFC 7946 §3.1.6 winding (exterior counter-clockwise, holes clockwise), and KML 2.2 (OGC 07-147r2)
// read back by @tmcw/togeojson with @xmldom/xmldom's DOMParser.

// A ring-shaped (annular) mode makes contours with holes; a far mode makes MultiPolygons.
function annularSet() {
  const base = mixtureSet('validity', [
    { name: 'nominal', probability: 0.9, samples: 12_000, shape: { sigmaMajor: 60, sigmaMinor: 45, azimuthDeg: 70 } },
    {
      name: 'drogue only',
      probability: 0.1,
      samples: 3_000,
      shape: { sigmaMajor: 50, sigmaMinor: 30, azimuthDeg: 10, meanEast: 700, meanNorth: -300 },
    },
  ]);
  // Push the nominal points out onto a ring of radius ~200 m so the dense region has a hole.
  for (let i = 0; i < 12_000; i++) {
    const r = Math.hypot(base.east[i], base.north[i]) || 1;
    const scale = (200 + base.east[i] * 0.3) / r;
    base.east[i] *= scale;
    base.north[i] *= scale;
  }
  return base;
}

const site = makeSite({
  minimumDistance: 120,
  areas: [
    {
      name: 'Spectators & "friends" <north>',
      kind: 'spectators',
      people: 150,
      geometry: {
        type: 'Polygon',
        coordinates: [[[-105.2, 40.104], [-105.198, 40.104], [-105.198, 40.105], [-105.2, 40.105], [-105.2, 40.104]]],
      },
    },
  ],
});

describe('polygon validity, winding and KML round trip', () => {
  const set = annularSet();
  const result = analyze(set, site, makeRun({ levels: [0.3, 0.5, 0.9, 0.99] }));

  it('the fixture really produces holes and several parts (so the checks below test something)', () => {
    const withHoles = result.contours.features.some((f) => f.geometry.coordinates.some((p) => p.length > 1));
    const multiPart = result.contours.features.some((f) => f.geometry.coordinates.length > 1);
    expect(withHoles).toBe(true);
    expect(multiPart).toBe(true);
  });

  it('the checks can fail: a bow-tie is invalid and a clockwise exterior is wrongly wound', () => {
    const bowTie = { type: 'Polygon' as const, coordinates: [[[0, 0], [1, 1], [1, 0], [0, 1], [0, 0]]] };
    // turf's booleanValid alone accepts a bow-tie, hence the stricter check used below.
    expect(strictlyValid(bowTie)).toBe('a ring crosses itself');
    const overlappingParts = {
      type: 'MultiPolygon' as const,
      coordinates: [[[[0, 0], [2, 0], [2, 2], [0, 2], [0, 0]]], [[[1, 1], [3, 1], [3, 3], [1, 3], [1, 1]]]],
    };
    expect(strictlyValid(overlappingParts)).not.toBeNull();
    expect(hasRfc7946Winding([[[[0, 0], [0, 1], [1, 1], [1, 0], [0, 0]]]])).toBe(false);
  });

  it('every contour passes turf booleanValid and has RFC 7946 winding', () => {
    for (const f of result.contours.features) {
      expect(booleanValid(f)).toBe(true);
      expect(strictlyValid(f.geometry)).toBeNull();
      expect(hasRfc7946Winding(f.geometry.coordinates)).toBe(true);
    }
  });

  it('the keep-out zone passes booleanValid, has RFC 7946 winding and contains the minimum-distance circle', () => {
    expect(booleanValid(result.keepOut)).toBe(true);
    expect(strictlyValid(result.keepOut.geometry)).toBeNull();
    expect(hasRfc7946Winding(polygonsOf(result.keepOut.geometry))).toBe(true);
    expect(result.keepOut.properties.maxDistance_m).toBeGreaterThan(120 + 25);
  });

  it('written GeoJSON keeps validity and winding after rounding', () => {
    const contours = JSON.parse(writeContoursGeoJSON(result));
    for (const f of contours.features) {
      expect(booleanValid(f)).toBe(true);
      expect(strictlyValid(f.geometry)).toBeNull();
      expect(hasRfc7946Winding(f.geometry.coordinates)).toBe(true);
    }
    const keepOut = JSON.parse(writeKeepOutGeoJSON(result)).features[0];
    expect(booleanValid(keepOut)).toBe(true);
    expect(strictlyValid(keepOut.geometry)).toBeNull();
  });

  it('KML parses back with togeojson to the same rings, lon/lat order, names escaped', () => {
    const text = writeKml(result, site, 'Field <A> & B');
    const dom = new DOMParser().parseFromString(text, 'text/xml');
    const parsed = kmlToGeoJSON(dom as unknown as Document);
    const written = JSON.parse(writeContoursGeoJSON(result));
    const ringsOf = (g: Geometry | null): number[][][][] => {
      if (!g) return [];
      if (g.type === 'Polygon') return [(g as Polygon).coordinates];
      if (g.type === 'MultiPolygon') return (g as MultiPolygon).coordinates;
      if (g.type === 'GeometryCollection') return g.geometries.flatMap(ringsOf);
      return [];
    };
    const named = (name: string) => parsed.features.find((f) => f.properties?.name === name);
    for (const f of written.features) {
      const back = named(`${f.properties.level * 100} % landing region`);
      expect(back).toBeDefined();
      expect(ringsOf(back!.geometry)).toEqual(f.geometry.coordinates);
    }
    const keepOut = JSON.parse(writeKeepOutGeoJSON(result)).features[0];
    expect(ringsOf(named('Keep-out zone')!.geometry)).toEqual(polygonsOf(keepOut.geometry));
    const pad = named('Pad')!;
    expect(pad.geometry).toEqual({ type: 'Point', coordinates: [site.pad.lon, site.pad.lat] });
    expect(named('Spectators & "friends" <north>')).toBeDefined();
    expect(parsed.features.length).toBe(result.contours.features.length + 3);
  });
});
