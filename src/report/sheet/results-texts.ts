/**
 * The checks of a results folder's files, on their texts: the same whether the texts come from
 * the disk (read-results.ts, for `strewn sheet` and `strewn compare`) or from files the user picked
 * in the page (a saved run to compare with). Pure: no file system here.
 *
 * @example
 *   const input = resultsFromTexts('results/a', { 'summary.json': text, ... });  // throws ResultsFolderError
 */
import { hashScenario } from '../../scenario/hash.js';
import type { Scenario } from '../../scenario/types.js';
import type { RunSummary } from '../run-summary.js';
import type { ReviewFacts } from './review-facts.js';
import { roundCentimetre, thinLandings, type ContourProps, type KeepOutProps, type LandingPoints, type PolygonFeatures, type SheetInput } from './sheet-input.js';

/** A problem with the results folder or one of its files; the message names the file. */
export class ResultsFolderError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ResultsFolderError';
  }
}

type Json = unknown;

/** A file's path for messages (the page has no paths, only the folder's name). */
export function join(folder: string, name: string): string {
  return folder === '' ? name : `${folder.replace(/[\\/]+$/, '')}/${name}`;
}

/** JSON text of a file of a folder; bad JSON is a ResultsFolderError naming the file. */
export function parse(folder: string, name: string, text: string): Json {
  try {
    return JSON.parse(text);
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    throw new ResultsFolderError(`${join(folder, name)}: not valid JSON (${detail})`);
  }
}

/** Field checks that name the file and the field path in their message. */
export class Check {
  constructor(private readonly file: string) {}

  fail(path: string, expected: string, value: unknown): never {
    const shown = value === undefined ? 'nothing' : JSON.stringify(value)?.slice(0, 60) ?? String(value);
    throw new ResultsFolderError(`${this.file}: ${path || 'the file'} should be ${expected}, found ${shown}`);
  }

  object(value: unknown, path: string): Record<string, unknown> {
    if (value === null || typeof value !== 'object' || Array.isArray(value)) this.fail(path, 'an object', value);
    return value as Record<string, unknown>;
  }

  array(value: unknown, path: string): unknown[] {
    if (!Array.isArray(value)) this.fail(path, 'a list', value);
    return value as unknown[];
  }

  text(value: unknown, path: string): string {
    if (typeof value !== 'string') this.fail(path, 'text', value);
    return value as string;
  }

  /** A number; null is accepted where `nullable` (JSON writes NaN as null). */
  number(value: unknown, path: string, nullable = false): number {
    if (nullable && value === null) return NaN;
    if (typeof value !== 'number' || !Number.isFinite(value)) this.fail(path, 'a number', value);
    return value as number;
  }

  polygonGeometry(value: unknown, path: string): void {
    const g = this.object(value, path);
    if (g.type !== 'Polygon' && g.type !== 'MultiPolygon') this.fail(`${path}.type`, '"Polygon" or "MultiPolygon"', g.type);
    const polygons = g.type === 'Polygon' ? [g.coordinates] : this.array(g.coordinates, `${path}.coordinates`);
    polygons.forEach((rings, i) => {
      this.array(rings, `${path}.coordinates[${i}]`).forEach((ring, j) => {
        this.array(ring, `${path}.coordinates[${i}][${j}]`).forEach((p, k) => {
          const pos = this.array(p, `${path}.coordinates[${i}][${j}][${k}]`);
          this.number(pos[0], `${path}.coordinates[${i}][${j}][${k}][0]`);
          this.number(pos[1], `${path}.coordinates[${i}][${j}][${k}][1]`);
        });
      });
    });
  }
}

export function checkSummary(folder: string, json: Json): RunSummary {
  const c = new Check(join(folder, 'summary.json'));
  const s = c.object(json, '');
  c.text(s.name, 'name');
  c.number(s.samples, 'samples');
  c.number(s.failedSamples, 'failedSamples');
  c.text(s.seed, 'seed');
  const hash = c.text(s.scenarioHash, 'scenarioHash');
  if (!/^[0-9a-f]{64}$/.test(hash)) c.fail('scenarioHash', '64 hexadecimal digits', hash);
  c.text(s.version, 'version');
  for (const key of ['apogee_m', 'flightTime_s']) {
    const spread = c.object(s[key], key);
    for (const q of ['mean', 'p05', 'p50', 'p95', 'max']) c.number(spread[q], `${key}.${q}`, true);
  }
  c.array(s.failures, 'failures').forEach((f, i) => {
    const o = c.object(f, `failures[${i}]`);
    c.text(o.reason, `failures[${i}].reason`);
    c.number(o.samples, `failures[${i}].samples`);
  });
  c.array(s.modes, 'modes').forEach((m, i) => {
    const o = c.object(m, `modes[${i}]`);
    c.text(o.name, `modes[${i}].name`);
    c.number(o.probability, `modes[${i}].probability`);
    c.number(o.samples, `modes[${i}].samples`);
    if (o.landed !== undefined) c.number(o.landed, `modes[${i}].landed`);
  });
  c.array(s.contours, 'contours').forEach((x, i) => {
    const o = c.object(x, `contours[${i}]`);
    for (const q of ['level', 'area_m2', 'maxDistance_m', 'samplesInBand']) c.number(o[q], `contours[${i}].${q}`);
  });
  const k = c.object(s.keepOut, 'keepOut');
  for (const q of ['level', 'margin_m']) c.number(k[q], `keepOut.${q}`);
  for (const q of ['area_m2', 'maxDistance_m', 'outsideShare', 'outsideUpper95']) c.number(k[q], `keepOut.${q}`, true);
  c.array(s.areas, 'areas').forEach((a, i) => {
    const o = c.object(a, `areas[${i}]`);
    c.text(o.name, `areas[${i}].name`);
    c.text(o.kind, `areas[${i}].kind`);
    for (const q of ['hits', 'probability', 'upper95']) c.number(o[q], `areas[${i}].${q}`);
  });
  c.array(s.warnings, 'warnings').forEach((w, i) => c.text(w, `warnings[${i}]`));
  c.array(s.scenarioWarnings ?? [], 'scenarioWarnings').forEach((w, i) => c.text(w, `scenarioWarnings[${i}]`));
  if (s.farthestLanding !== null && s.farthestLanding !== undefined) {
    const f = c.object(s.farthestLanding, 'farthestLanding');
    c.number(f.distance_m, 'farthestLanding.distance_m');
    c.number(f.bearing_deg, 'farthestLanding.bearing_deg');
  }
  return { ...(s as unknown as RunSummary), scenarioWarnings: (s.scenarioWarnings as string[] | undefined) ?? [], farthestLanding: (s.farthestLanding as RunSummary['farthestLanding']) ?? null };
}

/**
 * The scenario as the run loaded it. Its hash must equal summary.json's, which also proves it is a
 * complete normalised scenario (any edit changes the hash).
 */
function checkScenario(folder: string, json: Json, summary: RunSummary): Scenario {
  const file = join(folder, 'scenario.json');
  const c = new Check(file);
  const s = c.object(json, '');
  const hash = hashScenario(s as unknown as Scenario);
  if (hash !== summary.scenarioHash) {
    throw new ResultsFolderError(`${file}: its hash ${hash.slice(0, 12)}… differs from scenarioHash ${summary.scenarioHash.slice(0, 12)}… in summary.json; the files come from different runs or were edited`);
  }
  // The hash ties the content to what the run used; these checks guard against a folder written
  // by a program that shares the hash but not the shape (and give a readable message if so).
  const site = c.object(s.site, 'site');
  const pad = c.object(site.pad, 'site.pad');
  c.number(pad.lat, 'site.pad.lat');
  c.number(pad.lon, 'site.pad.lon');
  c.array(site.areas, 'site.areas').forEach((a, i) => {
    const o = c.object(a, `site.areas[${i}]`);
    c.text(o.name, `site.areas[${i}].name`);
    c.polygonGeometry(o.geometry, `site.areas[${i}].geometry`);
  });
  if (site.boundary !== undefined) c.polygonGeometry(site.boundary, 'site.boundary');
  c.object(s.vehicle, 'vehicle');
  c.object(s.launch, 'launch');
  c.array(s.recovery, 'recovery');
  c.object(c.object(s.weather, 'weather').wind, 'weather.wind');
  return s as unknown as Scenario;
}

function checkReview(folder: string, json: Json): ReviewFacts {
  const c = new Check(join(folder, 'review.json'));
  const r = c.object(json, '');
  if (r.strewnReview !== 1) c.fail('strewnReview', 'the number 1', r.strewnReview);
  if (Number.isNaN(new Date(c.text(r.computedAt, 'computedAt')).getTime())) c.fail('computedAt', 'an ISO 8601 date', r.computedAt);
  c.array(r.areas, 'areas').forEach((a, i) => {
    const o = c.object(a, `areas[${i}]`);
    c.text(o.name, `areas[${i}].name`);
    if (typeof o.intersectsKeepOut !== 'boolean') c.fail(`areas[${i}].intersectsKeepOut`, 'true or false', o.intersectsKeepOut);
    c.number(o.people, `areas[${i}].people`, true);
    c.number(o.expectedCasualties, `areas[${i}].expectedCasualties`, true);
    // Absent in folders written before the risk model.
    if (o.casualtiesUpper95 !== undefined) c.number(o.casualtiesUpper95, `areas[${i}].casualtiesUpper95`, true);
    if (o.maxIndividualRisk !== undefined) c.number(o.maxIndividualRisk, `areas[${i}].maxIndividualRisk`, true);
  });
  if (r.keepOutOutsideBoundary !== null) {
    const b = c.object(r.keepOutOutsideBoundary, 'keepOutOutsideBoundary');
    c.number(b.area_m2, 'keepOutOutsideBoundary.area_m2');
    c.number(b.share, 'keepOutOutsideBoundary.share');
  }
  return r as unknown as ReviewFacts;
}

export function checkPolygonFeatures<P>(folder: string, name: string, json: Json, numbers: string[]): PolygonFeatures<P> {
  const c = new Check(join(folder, name));
  const fc = c.object(json, '');
  if (fc.type !== 'FeatureCollection') c.fail('type', '"FeatureCollection"', fc.type);
  c.array(fc.features, 'features').forEach((f, i) => {
    const o = c.object(f, `features[${i}]`);
    const p = c.object(o.properties, `features[${i}].properties`);
    for (const q of numbers) c.number(p[q], `features[${i}].properties.${q}`);
    c.polygonGeometry(o.geometry, `features[${i}].geometry`);
  });
  return fc as unknown as PolygonFeatures<P>;
}

function checkLandings(folder: string, json: Json, modeNames: string[]): LandingPoints {
  const c = new Check(join(folder, 'landings.geojson'));
  const fc = c.object(json, '');
  if (fc.type !== 'FeatureCollection') c.fail('type', '"FeatureCollection"', fc.type);
  const features = c.array(fc.features, 'features');
  const east: number[] = [];
  const north: number[] = [];
  const mode: number[] = [];
  features.forEach((f, i) => {
    const p = c.object(c.object(f, `features[${i}]`).properties, `features[${i}].properties`);
    east.push(roundCentimetre(c.number(p.east_m, `features[${i}].properties.east_m`)));
    north.push(roundCentimetre(c.number(p.north_m, `features[${i}].properties.north_m`)));
    mode.push(modeNames.indexOf(c.text(p.mode, `features[${i}].properties.mode`)));
  });
  return thinLandings(east, north, mode, modeNames.length);
}


/** The texts of a folder's files by name; a file not given is missing. */
export type FolderTexts = Readonly<Record<string, string | undefined>>;

/**
 * Checks every file the sheet needs, from their texts; landings.geojson is optional (leave it out
 * when it is too big to draw).
 */
export function resultsFromTexts(folder: string, texts: FolderTexts): SheetInput {
  const text = (name: string): string => {
    const t = texts[name];
    if (t === undefined) throw new ResultsFolderError(`${join(folder, name)}: cannot read it: the file is missing`);
    return t;
  };
  const summary = checkSummary(folder, parse(folder, 'summary.json', text('summary.json')));
  if (texts['scenario.json'] === undefined && typeof (summary as unknown as { source?: unknown }).source === 'string') {
    throw new ResultsFolderError(
      `${folder}: written by strewn analyze without --scenario, so it has no site and inputs to draw a sheet from; run strewn analyze again with --scenario FILE (it then writes sheet.pdf itself)`,
    );
  }
  const scenario = checkScenario(folder, parse(folder, 'scenario.json', text('scenario.json')), summary);
  const review = checkReview(folder, parse(folder, 'review.json', text('review.json')));
  // A run with too few landings has no analysis, hence no contour or keep-out files.
  const analysed = summary.contours.length > 0;
  const optionalJson = (name: string): Json | null => {
    if (!analysed && texts[name] === undefined) return null;
    return parse(folder, name, text(name));
  };
  const contoursJson = optionalJson('contours.geojson');
  const keepOutJson = optionalJson('keepout.geojson');
  const contours = contoursJson === null ? null : checkPolygonFeatures<ContourProps>(folder, 'contours.geojson', contoursJson, ['level', 'area_m2', 'maxDistance_m']);
  const keepOut = keepOutJson === null ? null : checkPolygonFeatures<KeepOutProps>(folder, 'keepout.geojson', keepOutJson, ['level', 'margin_m', 'area_m2', 'maxDistance_m']);
  if (keepOut) {
    const c = new Check(join(folder, 'keepout.geojson'));
    if (keepOut.features.length !== 1) c.fail('features', 'one feature', `${keepOut.features.length} features`);
    c.object(keepOut.features[0].properties.octants_m, 'features[0].properties.octants_m');
    c.array(keepOut.features[0].properties.parts, 'features[0].properties.parts');
  }
  let landings: LandingPoints | null = null;
  const landingsText = texts['landings.geojson'];
  if (landingsText !== undefined) {
    landings = checkLandings(folder, parse(folder, 'landings.geojson', landingsText), summary.modes.map((m) => m.name));
    if (landings.total === 0) landings = null;
  }
  return { summary, scenario, review, contours, keepOut, landings };
}
