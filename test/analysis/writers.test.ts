import { describe, expect, it } from 'vitest';
import { analyze, summaryParts, writeAreasCsv, writeKml, writeLandingsGeoJSON } from '../../src/analysis/index.js';
import { csvField } from '../../src/analysis/areasCsv.js';
import { escapeXml } from '../../src/analysis/kml.js';
import { createLocalFrame } from '../../src/analysis/geodesy.js';
import { makeRun, makeSite, mixtureSet, PAD } from './fixtures.js';

const frame = createLocalFrame(PAD);
const set = mixtureSet('writers', [
  { name: 'nominal', probability: 0.95, samples: 900, shape: { sigmaMajor: 60, sigmaMinor: 40, azimuthDeg: 10 }, parachute: true },
  { name: 'main "chute" fails, drogue only', probability: 0.05, samples: 100, shape: { sigmaMajor: 30, sigmaMinor: 30, azimuthDeg: 0, meanNorth: 300 } },
]);
set.apogee = Float64Array.from({ length: 1000 }, (_, i) => 300 + i / 10);
set.flightTime = Float64Array.from({ length: 1000 }, (_, i) => 60 + i / 100);
set.sample = Uint32Array.from({ length: 1000 }, (_, i) => 2 * i + 1);
const ring = [[0, 50], [100, 50], [100, 150], [0, 150], [0, 50]].map(([e, n]) => frame.toLonLat(e, n));
const site = makeSite({
  areas: [{ name: 'Car park, north', kind: 'parking', people: 40, geometry: { type: 'Polygon', coordinates: [ring] } }],
});
const result = analyze(set, site, makeRun());

describe('writers', () => {
  it('landings.geojson: one RFC 7946 point per sample, lon/lat order, with sample, mode, apogee, flight time', () => {
    const parsed = JSON.parse(writeLandingsGeoJSON(set, PAD));
    expect(parsed.type).toBe('FeatureCollection');
    expect(parsed.features).toHaveLength(1000);
    const f = parsed.features[950];
    const [lon, lat] = frame.toLonLat(set.east[950], set.north[950]);
    expect(f.geometry.coordinates[0]).toBeCloseTo(lon, 7);
    expect(f.geometry.coordinates[1]).toBeCloseTo(lat, 7);
    expect(f.properties).toMatchObject({ sample: 1901, mode: 'main "chute" fails, drogue only', apogee_m: 395, flight_time_s: 69.5 });
    expect(f.properties.impact_speed_m_s).toBeNull();
  });

  it('areas.csv: header, one row per area, RFC 4180 quoting', () => {
    const csv = writeAreasCsv(result.areas);
    const lines = csv.trimEnd().split('\n');
    expect(lines[0]).toBe('name,kind,hits,probability,upper95,intersects_keep_out,area_m2,people,people_per_m2,sheltered,expected_casualties,expected_casualties_upper95,max_individual_risk,note');
    expect(lines).toHaveLength(2);
    expect(lines[1].startsWith('"Car park, north",parking,')).toBe(true);
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('plain')).toBe('plain');
  });

  it('summary parts have the documented fields', () => {
    const s = summaryParts(result);
    expect(s.contours.map((c) => c.level)).toEqual([0.5, 0.9, 0.99]);
    expect(Object.keys(s.contours[0])).toEqual(expect.arrayContaining(['level', 'area_m2', 'maxDistance_m']));
    expect(s.keepOut).toMatchObject({ level: 0.99, margin_m: 25 });
    expect(s.areas[0]).toMatchObject({ name: 'Car park, north', kind: 'parking' });
    expect(Object.keys(s.areas[0])).toEqual(['name', 'kind', 'hits', 'probability', 'upper95']);
    // Serialisable as it stands.
    expect(JSON.parse(JSON.stringify(result)).contours.features).toHaveLength(3);
  });

  it('KML text is escaped (XML 1.0 predefined entities) and names the caution', () => {
    expect(escapeXml(`a<b & "c" 'd'>`)).toBe('a&lt;b &amp; &quot;c&quot; &apos;d&apos;&gt;');
    const kml = writeKml(result, site, 'Night & day <test>');
    expect(kml).toContain('<name>Night &amp; day &lt;test&gt;</name>');
    expect(kml).toContain('never replace');
    expect(kml).toContain('xmlns="http://www.opengis.net/kml/2.2"');
  });
});
