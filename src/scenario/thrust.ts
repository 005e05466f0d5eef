import { describeValue } from './errors.js';
import type { Issue, ThrustCurve } from './types.js';

/**
 * Motor thrust curves, written inline as [[t_s, newtons], ...] or kept in a two-column CSV file
 * beside the scenario. Both forms pass the same checks. A curve whose first time is above 0 is
 * rejected rather than padded with [0, 0]: padding would add a ramp the user never wrote and
 * shift the burn, and the fix (add the row yourself) is one line.
 */

export const THRUST_PATH = 'vehicle.motor.thrust';
export const MAX_THRUST_ROWS = 100_000;
/** Past this many bad rows the rest are summarised: a wrong file would otherwise bury every other issue. */
const MAX_ROW_ISSUES = 10;

export interface ThrustResult {
  curve?: ThrustCurve;
  issues: Issue[];
}

export interface LoadedThrust extends ThrustResult {
  /** "inline", or the CSV path as written in the scenario. */
  source: string;
}

export interface TextReader {
  /** Folder of the scenario file; CSV paths are relative to it. */
  baseDir?: string;
  /** Returns a file's text; injected so this module runs in a browser as well as in Node. */
  readText?: (path: string) => string;
}

/** Reads `vehicle.motor.thrust` in either form. */
export function loadThrustCurve(spec: unknown, reader: TextReader = {}, path = THRUST_PATH): LoadedThrust {
  if (Array.isArray(spec)) return { source: 'inline', ...thrustCurveFromRows(spec, path) };
  if (typeof spec !== 'string' || spec.trim() === '') {
    return {
      source: 'inline',
      issues: [{ path, message: `${spec === undefined ? 'missing (required)' : describeValue(spec)}; expected a list of [time s, thrust N] rows or the path of a CSV file` }],
    };
  }
  if (reader.readText === undefined) {
    return {
      source: spec,
      issues: [{ path, message: `'${spec}' is a file path, but no file reader was given to load it; write the curve inline as [[t, N], ...]` }],
    };
  }
  const resolved = resolveRelativePath(reader.baseDir, spec);
  let text: string;
  try {
    text = reader.readText(resolved);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    return { source: spec, issues: [{ path, message: `cannot read '${spec}' (looked for ${resolved}): ${reason}` }] };
  }
  return { source: spec, ...parseThrustCsv(text, spec, path) };
}

/** Checks an inline curve; problems are reported at `path[row]`. */
export function thrustCurveFromRows(rows: unknown, path = THRUST_PATH): ThrustResult {
  if (!Array.isArray(rows)) {
    return { issues: [{ path, message: `${describeValue(rows)}; expected a list of [time s, thrust N] rows` }] };
  }
  if (rows.length > MAX_THRUST_ROWS) {
    return { issues: [{ path, message: `${rows.length} rows is more than the ${MAX_THRUST_ROWS} allowed` }] };
  }
  const issues = new IssueList();
  const time: number[] = [];
  const thrust: number[] = [];
  rows.forEach((row: unknown, i) => {
    if (isNumberPair(row)) {
      time.push(row[0]);
      thrust.push(row[1]);
    } else {
      issues.add({ path: `${path}[${i}]`, message: `${describeValue(row)} is not a [time s, thrust N] pair of numbers` });
    }
  });
  if (issues.count > 0) return { issues: issues.list(path) };
  return finish(time, thrust, (i) => ({ path: `${path}[${i}]`, prefix: '' }), path, '');
}

/**
 * Parses a CSV curve: two columns (time s, thrust N) separated by a comma, semicolon, tab or
 * spaces; an optional header line first; blank lines and lines starting with '#' are skipped.
 * Problems are reported at `path` with the file's line number.
 */
export function parseThrustCsv(text: string, fileLabel: string, path = THRUST_PATH): ThrustResult {
  const issues = new IssueList();
  const time: number[] = [];
  const thrust: number[] = [];
  const lineOfRow: number[] = [];
  let sawFirstLine = false;
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  for (let index = 0; index < lines.length; index++) {
    const line = lines[index]!.trim();
    if (line === '' || line.startsWith('#')) continue;
    const fields = splitFields(line);
    const isFirstLine = !sawFirstLine;
    sawFirstLine = true;
    // Only the first line may be a header, and only if it doesn't start with a number.
    if (isFirstLine && !NUMBER.test(fields[0] ?? '')) continue;
    const lineNumber = index + 1;
    if (fields.length !== 2 || !NUMBER.test(fields[0]!) || !NUMBER.test(fields[1]!)) {
      issues.add({ path, message: `'${fileLabel}' line ${lineNumber}: ${describeValue(line)} is not two numbers (time s, thrust N)` });
      continue;
    }
    if (time.length >= MAX_THRUST_ROWS) {
      return { issues: [{ path, message: `'${fileLabel}' has more than the ${MAX_THRUST_ROWS} rows allowed` }] };
    }
    time.push(Number(fields[0]));
    thrust.push(Number(fields[1]));
    lineOfRow.push(lineNumber);
  }
  if (issues.count > 0) return { issues: issues.list(path) };
  return finish(time, thrust, (i) => ({ path, prefix: `'${fileLabel}' line ${lineOfRow[i]}: ` }), path, `'${fileLabel}': `);
}

interface RowPlace {
  path: string;
  prefix: string;
}

/** The checks both forms share: enough rows, starts at 0, strictly increasing, no negative thrust, some impulse. */
function finish(
  time: number[],
  thrust: number[],
  place: (row: number) => RowPlace,
  path: string,
  wholePrefix: string,
): ThrustResult {
  if (time.length < 2) {
    return { issues: [{ path, message: `${wholePrefix}${time.length} row${time.length === 1 ? '' : 's'}; a thrust curve needs at least 2` }] };
  }
  const issues = new IssueList();
  const at = (row: number, message: string): void => {
    const { path: rowPath, prefix } = place(row);
    issues.add({ path: rowPath, message: prefix + message });
  };
  if (time[0] !== 0) {
    at(0, `the curve starts at ${time[0]} s; it must start at t = 0 (add a row [0, 0] if the motor starts from rest)`);
  }
  for (let i = 1; i < time.length; i++) {
    if (!(time[i]! > time[i - 1]!)) {
      at(i, `time ${time[i]} s is not after the previous row's ${time[i - 1]} s; times must strictly increase`);
    }
  }
  for (let i = 0; i < thrust.length; i++) {
    if (thrust[i]! < 0) at(i, `thrust ${thrust[i]} N is negative; thrust must be 0 or more`);
  }
  if (issues.count === 0 && thrust.every((f) => f === 0)) {
    issues.add({ path, message: `${wholePrefix}every thrust value is 0; the motor would deliver no impulse` });
  }
  if (issues.count > 0) return { issues: issues.list(path) };
  return { curve: { time, thrust }, issues: [] };
}

/** Keeps the first few row problems and counts the rest. */
class IssueList {
  private readonly kept: Issue[] = [];
  count = 0;

  add(issue: Issue): void {
    this.count++;
    if (this.kept.length < MAX_ROW_ISSUES) this.kept.push(issue);
  }

  list(path: string): Issue[] {
    const hidden = this.count - this.kept.length;
    if (hidden <= 0) return this.kept;
    return [...this.kept, { path, message: `and ${hidden} more row problem${hidden === 1 ? '' : 's'} like these` }];
  }
}

// A plain decimal number: no hex, no "Infinity", no empty string (which Number() would read as 0).
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function splitFields(line: string): string[] {
  const fields = line.split(/\s*[,;]\s*|\s+/);
  // A trailing separator ("0.1,12,") is harmless; any other empty field is not.
  if (fields.length > 1 && fields[fields.length - 1] === '') fields.pop();
  return fields;
}

function isNumberPair(row: unknown): row is [number, number] {
  return (
    Array.isArray(row) &&
    row.length === 2 &&
    typeof row[0] === 'number' &&
    typeof row[1] === 'number' &&
    Number.isFinite(row[0]) &&
    Number.isFinite(row[1])
  );
}

/**
 * Resolves a path written in the scenario against the scenario's folder, without node:path so it
 * also works in a browser. Absolute paths (/x, C:\x, \\server\x, scheme://x) are used as written.
 */
export function resolveRelativePath(baseDir: string | undefined, path: string): string {
  if (baseDir === undefined || baseDir === '' || /^(?:[/\\]|[A-Za-z]:[/\\]|[A-Za-z][A-Za-z0-9+.-]*:\/\/)/.test(path)) return path;
  return `${baseDir.replace(/[/\\]+$/, '')}/${path}`;
}
