/**
 * The event file (`*.event.json`, version 1): the site once, then the items that fly during the
 * event, each a scenario (a file beside the event file, or inline) with how many times it flies
 * and optional overrides. Runs in Node and in a browser alike: files are read through the
 * injected `readText`, as for thrust curves.
 *
 * Every item's scenario flies at the event's site: the event's `site` replaces the scenario's
 * own (the item's `pad` may move its pad). Overrides replace the scenario's field of the same
 * name: `motor` (vehicle.motor), `samples` and `seed` (run.samples, run.seed).
 *
 * @example
 * const plan = parseEventFile(json, { baseDir: 'events', readText });
 * plan.items[0].flights   // 12
 */
import { isRecord } from '../scenario/cross-checks.js';
import { describeValue, ScenarioError } from '../scenario/errors.js';
import { hashScenario } from '../scenario/hash.js';
import { parseJsonText } from '../scenario/json-text.js';
import { parseScenario } from '../scenario/load.js';
import { stabilityWarnings } from '../flight/stability-warnings.js';
import type { Issue, Scenario, Site } from '../scenario/types.js';

export const EVENT_FIELDS = ['strewnEvent', 'name', 'notes', 'site', 'items', 'run'] as const;
export const ITEM_FIELDS = ['name', 'scenario', 'flights', 'window', 'pad', 'motor', 'samples', 'seed'] as const;

/** Largest number of flights one item may stand for (a typo guard, far above any real event). */
export const MAX_FLIGHTS = 1_000_000;

export interface EventItem {
  name: string;
  /** Where the scenario came from: its path as written, or "inline". */
  source: string;
  /** How many times the item flies during the event. */
  flights: number;
  /** When it flies, ISO 8601 texts as written (for later use with a forecast). */
  window?: { start: string; end: string };
  scenario: Scenario;
  hash: string;
  warnings: Issue[];
}

export interface EventPlan {
  strewnEvent: 1;
  name: string;
  notes?: string;
  site: Site;
  items: EventItem[];
}

export interface EventParseOptions {
  baseDir?: string;
  readText?: (path: string) => string;
  joinPath?: (base: string, path: string) => string;
  maxSamples?: number;
}

function unknownFields(value: Record<string, unknown>, known: readonly string[], at: string): Issue[] {
  return Object.keys(value)
    .filter((k) => !known.includes(k))
    .map((k) => ({ path: at === '' ? k : `${at}.${k}`, message: `unknown field; expected one of ${known.join(', ')}` }));
}

function isIsoTime(text: unknown): text is string {
  return typeof text === 'string' && /^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:\d\d)$/.test(text) && !Number.isNaN(Date.parse(text));
}

/** Validates an event file and loads every item's scenario; throws `ScenarioError` listing every problem. */
export function parseEventFile(json: unknown, options: EventParseOptions = {}): EventPlan {
  if (!isRecord(json)) throw new ScenarioError([{ path: '', message: `${describeValue(json)}; expected the event to be a JSON object {...}` }]);
  const issues: Issue[] = [...unknownFields(json, EVENT_FIELDS, '')];
  if (json.strewnEvent !== 1) issues.push({ path: 'strewnEvent', message: `${json.strewnEvent === undefined ? 'missing (required)' : describeValue(json.strewnEvent)}; expected the event format version, the number 1` });
  if (typeof json.name !== 'string' || json.name.trim() === '') issues.push({ path: 'name', message: `${describeValue(json.name)}; expected a short title in quotes` });
  if (json.notes !== undefined && typeof json.notes !== 'string') issues.push({ path: 'notes', message: `${describeValue(json.notes)}; expected text in quotes` });
  if (!isRecord(json.site)) issues.push({ path: 'site', message: `${json.site === undefined ? 'missing (required)' : describeValue(json.site)}; expected the site {"pad": ..., "areas": [...]}, as in a scenario` });
  if (json.run !== undefined) {
    if (!isRecord(json.run)) issues.push({ path: 'run', message: `${describeValue(json.run)}; expected {"samples": N, "seed": "..."}` });
    else issues.push(...unknownFields(json.run, ['samples', 'seed'], 'run'));
  }
  if (!Array.isArray(json.items) || json.items.length === 0) {
    issues.push({ path: 'items', message: `${json.items === undefined ? 'missing (required)' : describeValue(json.items)}; expected a list of at least one item {"scenario": ..., "flights": N}` });
  }
  if (issues.length > 0) throw new ScenarioError(issues);

  const run = (json.run ?? {}) as Record<string, unknown>;
  const items: EventItem[] = [];
  let site: Site | undefined;
  let siteReported = false;
  const names = new Map<string, number>();
  (json.items as unknown[]).forEach((raw, i) => {
    const at = `items[${i}]`;
    if (!isRecord(raw)) {
      issues.push({ path: at, message: `${describeValue(raw)}; expected {"scenario": ..., "flights": N}` });
      return;
    }
    issues.push(...unknownFields(raw, ITEM_FIELDS, at));
    const flights = raw.flights;
    if (!(typeof flights === 'number' && Number.isInteger(flights) && flights >= 1 && flights <= MAX_FLIGHTS)) {
      issues.push({ path: `${at}.flights`, message: `${flights === undefined ? 'missing (required)' : describeValue(flights)}; expected how many times it flies, a whole number from 1 to ${MAX_FLIGHTS.toLocaleString('en')}` });
    }
    let window: EventItem['window'];
    if (raw.window !== undefined) {
      const w = raw.window;
      if (!isRecord(w) || !isIsoTime(w.start) || !isIsoTime(w.end)) {
        issues.push({ path: `${at}.window`, message: `${describeValue(w)}; expected {"start": "2026-06-13T10:00Z", "end": "2026-06-13T16:00Z"} (ISO 8601 with a time zone)` });
      } else if (Date.parse(w.end) <= Date.parse(w.start)) {
        issues.push({ path: `${at}.window.end`, message: `'${w.end}' is not after the start '${w.start}'` });
      } else window = { start: w.start, end: w.end };
    }
    // The scenario: a path beside the event file, or the scenario object itself.
    let scenarioJson: unknown;
    let source = 'inline';
    let baseDir = options.baseDir;
    if (typeof raw.scenario === 'string') {
      source = raw.scenario;
      // An absolute path stands as written (joining it to the plan's folder would make a path that does not exist).
      const absolute = /^(?:[/\\]|[A-Za-z]:[/\\])/.test(raw.scenario);
      const path = options.joinPath && options.baseDir !== undefined && !absolute ? options.joinPath(options.baseDir, raw.scenario) : raw.scenario;
      if (options.readText === undefined) {
        issues.push({ path: `${at}.scenario`, message: `'${raw.scenario}': scenario files cannot be read here; give the scenario inline` });
        return;
      }
      try {
        scenarioJson = parseJsonText(options.readText(path), path);
      } catch (error) {
        if (error instanceof ScenarioError) issues.push(...error.issues.map((x) => ({ path: `${at}.scenario`, message: `${raw.scenario}: ${x.path ? `${x.path}: ` : ''}${x.message}` })));
        else issues.push({ path: `${at}.scenario`, message: `'${raw.scenario}' cannot be read: ${error instanceof Error ? error.message : String(error)}` });
        return;
      }
      const slash = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
      baseDir = slash >= 0 ? path.slice(0, slash) : baseDir;
    } else if (isRecord(raw.scenario)) {
      scenarioJson = raw.scenario;
    } else {
      issues.push({ path: `${at}.scenario`, message: `${raw.scenario === undefined ? 'missing (required)' : describeValue(raw.scenario)}; expected a scenario file name in quotes, or the scenario itself {...}` });
      return;
    }
    if (!isRecord(scenarioJson)) {
      issues.push({ path: `${at}.scenario`, message: `${describeValue(scenarioJson)}; expected a scenario object` });
      return;
    }
    const merged = withOverrides(scenarioJson, json.site as Record<string, unknown>, raw, run);
    let scenario: Scenario;
    let warnings: Issue[];
    try {
      ({ scenario, warnings } = parseScenario(merged, { baseDir, readText: options.readText, maxSamples: options.maxSamples }));
      // The static margin is judged above the scenario layer (it needs the aerodynamics).
      warnings = [...warnings, ...stabilityWarnings(scenario)];
    } catch (error) {
      if (!(error instanceof ScenarioError)) throw error;
      const siteIssues = error.issues.some((x) => x.path === 'site' || x.path.startsWith('site.') || x.path.startsWith('site['));
      for (const x of error.issues) {
        // Site problems are the event's; anything else belongs to the item (as written, or overridden).
        if (x.path === 'site' || x.path.startsWith('site.') || x.path.startsWith('site[')) {
          if (!siteReported) issues.push(x);
        } else if (x.path.startsWith('vehicle.motor') && raw.motor !== undefined) {
          issues.push({ path: `${at}.motor${x.path.slice('vehicle.motor'.length)}`, message: x.message });
        } else if (x.path === 'run.samples' && raw.samples !== undefined) issues.push({ path: `${at}.samples`, message: x.message });
        else if (x.path === 'run.seed' && raw.seed !== undefined) issues.push({ path: `${at}.seed`, message: x.message });
        else issues.push({ path: `${at}.scenario`, message: `${source === 'inline' ? '' : `${source}: `}${x.path}: ${x.message}` });
      }
      if (siteIssues) siteReported = true;
      return;
    }
    site ??= { ...scenario.site, pad: { ...scenario.site.pad } };
    const name = typeof raw.name === 'string' && raw.name.trim() !== '' ? raw.name : scenario.name;
    const earlier = names.get(name);
    if (earlier !== undefined) issues.push({ path: `${at}.name`, message: `'${name}' is already the name of items[${earlier}]; give each item its own name` });
    names.set(name, i);
    const item: EventItem = { name, source, flights: flights as number, scenario, hash: hashScenario(scenario), warnings };
    if (window !== undefined) item.window = window;
    items.push(item);
  });
  if (issues.length > 0) throw new ScenarioError(issues);
  const plan: EventPlan = { strewnEvent: 1, name: json.name as string, site: site!, items };
  if (typeof json.notes === 'string') plan.notes = json.notes;
  return plan;
}

/** The item's scenario as it flies at the event: the event's site, the item's pad and overrides. */
function withOverrides(scenario: Record<string, unknown>, site: Record<string, unknown>, item: Record<string, unknown>, run: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...scenario, site: { ...site } };
  if (item.pad !== undefined) (out.site as Record<string, unknown>).pad = item.pad;
  if (item.motor !== undefined) {
    const vehicle = isRecord(scenario.vehicle) ? scenario.vehicle : {};
    out.vehicle = { ...vehicle, motor: item.motor };
  }
  const runOut: Record<string, unknown> = { ...(isRecord(scenario.run) ? scenario.run : {}) };
  if (run.samples !== undefined) runOut.samples = run.samples;
  if (run.seed !== undefined) runOut.seed = run.seed;
  if (item.samples !== undefined) runOut.samples = item.samples;
  if (item.seed !== undefined) runOut.seed = item.seed;
  out.run = runOut;
  return out;
}

/** Parses event text (the file's content); `path` names the file in messages. */
export function parseEventText(text: string, path: string, options: EventParseOptions = {}): EventPlan {
  const json = parseJsonText(text, path);
  try {
    return parseEventFile(json, options);
  } catch (error) {
    if (error instanceof ScenarioError) throw new ScenarioError(error.issues, `${path} has problems`);
    throw error;
  }
}
