import { ScenarioError } from './errors.js';
import { isRecord } from './cross-checks.js';
import { normalizeScenario } from './normalize.js';
import { validateScenario, vehicleKindOf } from './schema.js';
import { loadThrustCurve, type LoadedThrust } from './thrust.js';
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
  const scenario = normalizeScenario(validation.parsed, curve);
  return { scenario, warnings: inFileOrder(withUnitSlipWarnings(json, scenario.vehicle.kind, [...geometryWarnings(scenario.site), ...scenarioWarnings(scenario)])) };
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
