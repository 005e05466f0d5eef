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
import { landingFigures } from './landing-columns.js';
import type { LandingSubset } from './thinning.js';

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

/** Features per chunk yielded by `landingsGeoJSONChunks` (small, so a chunk's strings die young; see landings-csv.ts). */
const CHUNK = 1_000;

/**
 * landings.geojson in pieces, so a caller can stream a million points to a file without holding one
 * string of a quarter gigabyte (V8 caps a string near 512 M characters). With `subset` (see
 * thinning.ts) only those landings are written, with the subset's weights, and the collection
 * says so in a `subset` member (RFC 7946 §6.1 foreign member) before its features.
 *
 * @example
 *   for (const piece of landingsGeoJSONChunks(set, site.pad)) stream.write(piece);
 */
export function* landingsGeoJSONChunks(set: LandingSet, pad: { lat: number; lon: number }, subset: LandingSubset | null = null): Generator<string> {
  const frame = createLocalFrame(pad);
  const names = set.modeNames.map((name) => JSON.stringify(name));
  // Which part landed, when the object may break up (absent otherwise, so those files keep their bytes).
  const parts = set.part && set.partNames ? set.partNames.map((name) => JSON.stringify(name)) : null;
  const figures = landingFigures(set);
  const known = new Map(figures.map((f) => [f.name, f]));
  // The fixed properties keep their place (and null when absent); other figures follow them.
  const fixed = [['apogee_m', 1], ['flight_time_s', 2], ['impact_speed_m_s', 2]] as const;
  const extra = figures.filter((f) => !fixed.some(([name]) => name === f.name));
  const count = subset ? subset.index.length : set.east.length;
  yield subset
    ? `{"type":"FeatureCollection","subset":${JSON.stringify({ ...subset.description, note: `a subset of the landings; landings.fgb and landings.csv hold all ${subset.description.of}` })},"features":[`
    : '{"type":"FeatureCollection","features":[';
  for (let from = 0; from < count; from += CHUNK) {
    const to = Math.min(count, from + CHUNK);
    const features: string[] = new Array(to - from);
    for (let k = from; k < to; k++) {
      const i = subset ? subset.index[k] : k;
      const weight = subset ? subset.weight[k] : set.weight[i];
      const [lon, lat] = frame.toLonLat(set.east[i], set.north[i]);
      let more = '';
      for (const [name, decimals] of fixed) {
        const f = known.get(name);
        more += `,"${name}":${f ? String(roundTo(f.values[i], decimals)) : 'null'}`;
      }
      for (const f of extra) more += `,${JSON.stringify(f.name)}:${roundTo(f.values[i], f.decimals)}`;
      features[k - from] =
        `{"type":"Feature","geometry":{"type":"Point","coordinates":[${roundTo(lon, COORDINATE_DECIMALS)},` +
        `${roundTo(lat, COORDINATE_DECIMALS)}]},"properties":{"sample":${set.sample ? set.sample[i] : i},` +
        `"mode":${names[set.mode[i]] ?? 'null'},${parts ? `"part":${parts[set.part![i]]},` : ''}"east_m":${roundTo(set.east[i], 2)},` +
        `"north_m":${roundTo(set.north[i], 2)}${more},` +
        `"weight":${Number(weight.toPrecision(6))}}}`;
    }
    yield (from > 0 ? ',' : '') + features.join(',');
  }
  yield ']}';
}

/** landings.geojson as one string: one Point feature per landed sample. */
export function writeLandingsGeoJSON(set: LandingSet, pad: { lat: number; lon: number }): string {
  return Array.from(landingsGeoJSONChunks(set, pad)).join('');
}
