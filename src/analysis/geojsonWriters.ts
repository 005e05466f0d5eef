/**
 * GeoJSON text for contours.geojson, keepout.geojson and landings.geojson (RFC 7946: WGS 84
 * lon/lat, exterior rings counter-clockwise). Coordinates are written with 8 decimals (about 1 mm),
 * far finer than the results mean and coarse enough to keep files small.
 *
 * @example
 *   fs.writeFileSync('contours.geojson', writeContoursGeoJSON(result));
 *   fs.writeFileSync('landings.geojson', writeLandingsGeoJSON(set, site.pad));
 */
import type { Geometry } from 'geojson';
import { createLocalFrame } from './geodesy.js';
import type { AnalysisResult } from './index.js';
import type { LandingSet } from './types.js';

export const COORDINATE_DECIMALS = 8;

/** Round a number for writing, without trailing zeros. */
export function roundTo(value: number, decimals: number): number {
  const f = Math.pow(10, decimals);
  return Math.round(value * f) / f;
}

/** A copy of a polygonal geometry with rounded coordinates. */
export function roundGeometry<G extends Geometry>(geometry: G, decimals = COORDINATE_DECIMALS): G {
  const round = (value: unknown): unknown =>
    Array.isArray(value) ? value.map(round) : typeof value === 'number' ? roundTo(value, decimals) : value;
  return { ...geometry, coordinates: round((geometry as { coordinates: unknown }).coordinates) } as G;
}

export function writeContoursGeoJSON(result: AnalysisResult): string {
  const features = result.contours.features.map((f) => ({
    type: 'Feature',
    properties: {
      level: f.properties.level,
      area_m2: roundTo(f.properties.area_m2, 1),
      maxDistance_m: roundTo(f.properties.maxDistance_m, 1),
    },
    geometry: roundGeometry(f.geometry),
  }));
  return JSON.stringify({ type: 'FeatureCollection', features });
}

export function writeKeepOutGeoJSON(result: AnalysisResult): string {
  const p = result.keepOut.properties;
  const octants = Object.fromEntries(
    Object.entries(p.octants_m).map(([name, d]) => [name, d === null ? null : roundTo(d, 1)]),
  );
  const feature = {
    type: 'Feature',
    properties: {
      level: p.level,
      margin_m: p.margin_m,
      area_m2: roundTo(p.area_m2, 1),
      maxDistance_m: roundTo(p.maxDistance_m, 1),
      octants_m: octants,
      parts: p.parts,
      outsideShare: result.keepOutOutside.share,
      outsideUpper95: result.keepOutOutside.upper95,
    },
    geometry: roundGeometry(result.keepOut.geometry),
  };
  return JSON.stringify({ type: 'FeatureCollection', features: [feature] });
}

/** Features per chunk yielded by `landingsGeoJSONChunks`. */
const CHUNK = 5_000;

/**
 * landings.geojson in pieces, so a caller can stream a million points to a file without holding one
 * string of a quarter gigabyte (V8 caps a string near 512 M characters).
 *
 * @example
 *   for (const piece of landingsGeoJSONChunks(set, site.pad)) stream.write(piece);
 */
export function* landingsGeoJSONChunks(set: LandingSet, pad: { lat: number; lon: number }): Generator<string> {
  const frame = createLocalFrame(pad);
  const names = set.modeNames.map((name) => JSON.stringify(name));
  const optional = (array: Float64Array | undefined, i: number, decimals: number) =>
    array ? String(roundTo(array[i], decimals)) : 'null';
  yield '{"type":"FeatureCollection","features":[';
  for (let from = 0; from < set.east.length; from += CHUNK) {
    const to = Math.min(set.east.length, from + CHUNK);
    const features: string[] = new Array(to - from);
    for (let i = from; i < to; i++) {
      const [lon, lat] = frame.toLonLat(set.east[i], set.north[i]);
      features[i - from] =
        `{"type":"Feature","geometry":{"type":"Point","coordinates":[${roundTo(lon, COORDINATE_DECIMALS)},` +
        `${roundTo(lat, COORDINATE_DECIMALS)}]},"properties":{"sample":${set.sample ? set.sample[i] : i},` +
        `"mode":${names[set.mode[i]] ?? 'null'},"east_m":${roundTo(set.east[i], 2)},` +
        `"north_m":${roundTo(set.north[i], 2)},"apogee_m":${optional(set.apogee, i, 1)},` +
        `"flight_time_s":${optional(set.flightTime, i, 2)},"impact_speed_m_s":${optional(set.impactSpeed, i, 2)},` +
        `"weight":${Number(set.weight[i].toPrecision(6))}}}`;
    }
    yield (from > 0 ? ',' : '') + features.join(',');
  }
  yield ']}';
}

/** landings.geojson as one string: one Point feature per landed sample. */
export function writeLandingsGeoJSON(set: LandingSet, pad: { lat: number; lon: number }): string {
  return Array.from(landingsGeoJSONChunks(set, pad)).join('');
}
