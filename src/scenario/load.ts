import { ScenarioError } from './errors.js';
import { isRecord } from './cross-checks.js';
import { DEFAULT_SHEAR, DEFAULT_WIND_HEIGHT, normalizeScenario } from './normalize.js';
import { isForecastInputError, resolveForecast, type ResolvedForecast } from '../forecast/resolve.js';
import { profileAt } from '../physics/wind.js';
import { isoTime } from './time.js';
import { resolveRelativePath } from './thrust.js';
import type { ParsedScenario } from './schema.js';
import { DemError, type Dem } from '../terrain/dem.js';
import { localTerrainGrid } from '../terrain/local-grid.js';
import { createLocalFrame } from '../analysis/geodesy.js';
import { validateScenario, vehicleKindOf } from './schema.js';
import { loadThrustCurve, type LoadedThrust } from './thrust.js';
import { UNCERTAINTY_NAMES, type ForecastSource, type Spread, type TerrainGrid, type UncertaintyName } from './types.js';
import { scenarioWarnings } from './warnings.js';
import { rawJsonIssues } from './raw-guards.js';
import { withUnitSlipWarnings } from './unit-slips.js';
import { geometryWarnings } from './geometry-warnings.js';
import type { Issue, Scenario } from './types.js';

/**
 * From parsed JSON to the normalised scenario. Runs in Node and in a browser alike: nothing here
 * touches the file system; a CSV thrust curve is read through the injected `readText`.
 */

export interface ParseOptions {
  /** Folder of the scenario file; relative CSV paths are resolved against it. */
  baseDir?: string;
  /** Reads a file's text (a CSV thrust curve). Without it, only inline curves can be used. */
  readText?: (path: string) => string;
  /** Highest `run.samples` accepted (default 10,000,000). */
  maxSamples?: number;
  /** Reads a file's bytes (a GRIB2 forecast). Without it, a scenario with `weather.forecast` is refused. */
  readBytes?: (path: string) => Uint8Array;
  /**
   * Elevation models already read (GeoTIFF decoding is asynchronous), by `site.terrain` as written.
   * Without one, a scenario with `site.terrain` is refused.
   */
  dems?: ReadonlyMap<string, Dem | Error>;
}

export interface ParsedScenarioResult {
  scenario: Scenario;
  /** Values outside common practice; the scenario is still usable. */
  warnings: Issue[];
}

/** Validates and normalises a scenario; throws `ScenarioError` listing every problem found. */
export function parseScenario(json: unknown, options: ParseOptions = {}): ParsedScenarioResult {
  const validation = validateScenario(json, { maxSamples: options.maxSamples });
  // A file built to break readers (reserved keys, absurd nesting) is not read any further.
  if (rawJsonIssues(json).length > 0) throw new ScenarioError(validation.issues);
  const thrust = motorThrust(json, options);
  const issues = inFileOrder([...validation.issues, ...(thrust?.issues ?? [])]);
  if (issues.length > 0) throw new ScenarioError(issues);
  if (validation.parsed === undefined) throw new Error('parseScenario: validation returned neither a scenario nor issues');
  const curve = thrust?.curve === undefined ? undefined : { curve: thrust.curve, source: thrust.source };
  const forecast = applyForecast(validation.parsed, options);
  const scenario = normalizeScenario(validation.parsed, curve);
  if (forecast) finishForecast(scenario, forecast, validation.parsed);
  if (validation.parsed.site.terrain !== undefined) scenario.site.terrain = terrainGrid(validation.parsed.site.terrain, scenario, options);
  return { scenario, warnings: inFileOrder(withUnitSlipWarnings(json, scenario.vehicle.kind, [...geometryWarnings(scenario.site), ...scenarioWarnings(scenario)])) };
}

/** `site.terrain`: the elevation model on the flight's east/north grid, heights above the pad. */
function terrainGrid(file: string, scenario: Scenario, options: ParseOptions): TerrainGrid {
  const dem = options.dems?.get(file);
  const fail = (message: string) => new ScenarioError([{ path: 'site.terrain', message }]);
  if (dem === undefined) throw fail('an elevation model cannot be read here; run the scenario from the command line');
  if (dem instanceof Error) throw fail(`'${file}': ${dem.message}`);
  try {
    return localTerrainGrid(dem, scenario.site.pad.elevation, createLocalFrame(scenario.site.pad), file);
  } catch (error) {
    if (error instanceof DemError) throw fail(`'${file}': ${error.message}`);
    throw error;
  }
}

interface AppliedForecast {
  resolved: ResolvedForecast;
  file: string;
  window?: number;
}

/**
 * Reads `weather.forecast` and writes its wind (speed and direction at the reference height, the
 * profile rows) and the pad's temperature and pressure (unless the file gives them) into the parsed
 * weather, so the rest of the loading treats them as if typed in.
 */
function applyForecast(parsed: ParsedScenario, options: ParseOptions): AppliedForecast | undefined {
  const request = parsed.weather.forecast;
  if (request === undefined) return undefined;
  const at = (field: string, message: string) => new ScenarioError([{ path: `weather.forecast.${field}`, message }]);
  if (options.readBytes === undefined) {
    throw at('file', 'a forecast file cannot be read here; use `strewn forecast FILE --pad LAT,LON --time T --write-profile` to turn it into weather.wind.profile');
  }
  const path = resolveRelativePath(options.baseDir, request.file);
  let bytes: Uint8Array;
  try {
    bytes = options.readBytes(path);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : error instanceof Error ? error.message : String(error);
    throw at('file', `cannot read '${request.file}' (looked for ${path}): ${reason}`);
  }
  const pad = parsed.site.pad;
  let resolved: ResolvedForecast;
  try {
    resolved = resolveForecast(bytes, { time: request.time, window: request.window }, { lat: pad.lat, lon: pad.lon, elevation: pad.elevation ?? 0 });
  } catch (error) {
    if (isForecastInputError(error)) throw at(/time/.test(error.message) ? 'time' : 'file', `'${request.file}': ${error.message}`);
    throw error;
  }
  const wind = { ...(parsed.weather.wind ?? {}) };
  const height = wind.height ?? DEFAULT_WIND_HEIGHT;
  const [speed, from] = profileAt(resolved.wind, height, wind.shear ?? DEFAULT_SHEAR);
  wind.speed = Math.round(speed * 100) / 100;
  wind.from = Math.round(from * 10) / 10;
  wind.profile = resolved.wind;
  parsed.weather.wind = wind;
  const padAir = resolved.air[0];
  if (parsed.weather.temperature === undefined) parsed.weather.temperature = padAir.temperature;
  if (parsed.weather.pressure === undefined) parsed.weather.pressure = padAir.pressure;
  const out: AppliedForecast = { resolved, file: request.file };
  if (request.window !== undefined) out.window = request.window;
  return out;
}

/** Records where the weather came from, the air rows, and the forecast's wind spread. */
function finishForecast(scenario: Scenario, applied: AppliedForecast, parsed: ParsedScenario): void {
  const { resolved } = applied;
  const p = resolved.profile;
  const source: ForecastSource = {
    file: applied.file,
    time: isoTime(p.time),
    steps: p.steps.map(isoTime),
    referenceTime: isoTime(p.referenceTime),
    members: p.members.length,
  };
  if (applied.window !== undefined) source.window = applied.window;
  // The pad's own row follows the file's temperature and pressure when it gives them.
  const air = resolved.air.map((row) => ({ ...row }));
  air[0] = { altitude: 0, temperature: scenario.weather.temperature ?? air[0].temperature, pressure: scenario.weather.pressure ?? air[0].pressure };
  scenario.weather.air = air;
  if (resolved.spread) {
    const s = resolved.spread;
    source.spread = { profiles: resolved.spreadFrom, speedSd: s.speedSd, fromSdDeg: s.fromSd, layerTop: s.layerTop };
    // A spread written in the file wins; the forecast's fills in what it left open.
    const own = parsed.uncertainty ?? {};
    const spreads: Partial<Record<UncertaintyName, Spread>> = { ...scenario.uncertainty };
    if (own['wind.speed'] === undefined) spreads['wind.speed'] = { kind: 'normal', sd: s.speedSd, relative: true };
    if (own['wind.from'] === undefined) spreads['wind.from'] = { kind: 'normal', sd: s.fromSd, relative: false };
    scenario.uncertainty = Object.fromEntries(UNCERTAINTY_NAMES.filter((n) => spreads[n] !== undefined).map((n) => [n, spreads[n]!]));
  }
  scenario.weather.forecast = source;
}

/** The rocket's thrust curve, read and checked even when other parts of the file are broken. */
function motorThrust(json: unknown, options: ParseOptions): LoadedThrust | undefined {
  if (!isRecord(json) || vehicleKindOf(json.vehicle) !== 'rocket') return undefined;
  const motor = (json.vehicle as Record<string, unknown>).motor;
  // A missing or malformed motor object is reported by the schema.
  if (!isRecord(motor)) return undefined;
  return loadThrustCurve(motor.thrust, { baseDir: options.baseDir, readText: options.readText });
}

const SECTION_ORDER = ['strewn', 'name', 'notes', 'site', 'vehicle', 'launch', 'recovery', 'weather', 'uncertainty', 'failures', 'run'];

/** Issues sorted by the section they belong to, in the order the format lists the sections. */
function inFileOrder(issues: Issue[]): Issue[] {
  const rank = (issue: Issue): number => {
    const section = /^[^.[]*/.exec(issue.path)?.[0] ?? '';
    const index = SECTION_ORDER.indexOf(section);
    return index === -1 ? SECTION_ORDER.length : index;
  };
  return issues
    .map((issue, i) => ({ issue, i, r: rank(issue) }))
    .sort((a, b) => a.r - b.r || a.i - b.i)
    .map((x) => x.issue);
}
