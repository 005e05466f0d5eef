import { describeValue } from './errors.js';
import { convertQuantity, formatNumber } from './units.js';
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
  if (/[\r\n]/.test(spec)) return { source: 'inline', ...parseThrustCsv(spec, 'inline CSV text', path) };
  if (looksLikeRowsOnOneLine(spec)) {
    return {
      source: 'inline',
      issues: [
        {
          path,
          message: `${describeValue(spec)} looks like thrust rows written on one line, not the path of a CSV file; write the rows as a list [[0, 0], [0.1, 120], ...], or as CSV text with one row per line ("0,0\\n0.1,120\\n...")`,
        },
      ],
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
    if (!Array.isArray(row) || row.length !== 2) {
      issues.add({ path: `${path}[${i}]`, message: `${describeValue(row)} is not a [time, thrust] pair such as [0.05, 420] or ["0.05 s", "94 lbf"]` });
      return;
    }
    const t = convertQuantity(row[0], 'time');
    const f = convertQuantity(row[1], 'force');
    if (!t.ok) issues.add({ path: `${path}[${i}][0]`, message: `time: ${t.message}` });
    if (!f.ok) issues.add({ path: `${path}[${i}][1]`, message: `thrust: ${f.message}` });
    if (t.ok && f.ok) {
      const problem = valueProblem(t.value, 'time', '') ?? valueProblem(f.value, 'thrust', '');
      if (problem !== undefined) {
        issues.add({ path: `${path}[${i}]`, message: problem });
        return;
      }
      time.push(t.value);
      thrust.push(f.value);
    }
  });
  if (issues.count > 0) return { issues: issues.list(path) };
  return finish(time, thrust, (i) => ({ path: `${path}[${i}]`, prefix: '' }), path, '');
}

/**
 * Parses a CSV curve: two columns (time, thrust) separated by a comma, semicolon, tab or spaces;
 * an optional header line first, whose cells may name their unit (`time_s`, `Thrust (lbf)`,
 * `thrust [kN]`; see HEADER_UNITS); blank lines and lines starting with '#' are skipped. Values
 * are converted to s and N. Problems are reported at `path` with the file's line number.
 */
export function parseThrustCsv(text: string, fileLabel: string, path = THRUST_PATH): ThrustResult {
  const issues = new IssueList();
  const time: number[] = [];
  const thrust: number[] = [];
  const lineOfRow: number[] = [];
  let sawFirstLine = false;
  let columns: [ColumnUnit, ColumnUnit] = [HEADER_UNITS.time.s, HEADER_UNITS.thrust.n];
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const where = (lineNumber: number): string => `'${fileLabel}' line ${lineNumber}: `;
  for (let index = 0; index < lines.length; index++) {
    const line = lines[index]!.trim();
    if (line === '' || line.startsWith('#')) continue;
    const lineNumber = index + 1;
    const isFirstLine = !sawFirstLine;
    sawFirstLine = true;
    // Only the first line may be a header, and only if it doesn't start with a number.
    if (isFirstLine && !/^[+-]?\.?\d/.test(line)) {
      const header = readHeader(line);
      if (typeof header === 'string') {
        // A header that cannot be read stops here: every row after it would be read in a unit the file did not mean.
        return { issues: [{ path, message: where(lineNumber) + header }] };
      }
      columns = header;
      continue;
    }
    const fields = splitFields(line);
    if (fields.length !== 2 || !isDecimal(fields[0]!) || !isDecimal(fields[1]!)) {
      issues.add({ path, message: `${where(lineNumber)}${describeValue(line)} is not two numbers (time ${columns[0].label}, thrust ${columns[1].label})` });
      continue;
    }
    const t = Number(fields[0]) * columns[0].factor;
    const f = Number(fields[1]) * columns[1].factor;
    const problem = valueProblem(t, 'time', fields[0]!) ?? valueProblem(f, 'thrust', fields[1]!);
    if (problem !== undefined) {
      issues.add({ path, message: `${where(lineNumber)}${describeValue(line)}: ${problem}` });
      continue;
    }
    if (time.length >= MAX_THRUST_ROWS) {
      return { issues: [{ path, message: `'${fileLabel}' has more than the ${MAX_THRUST_ROWS} rows allowed` }] };
    }
    time.push(t);
    thrust.push(f);
    lineOfRow.push(lineNumber);
  }
  if (issues.count > 0) return { issues: issues.list(path) };
  return finish(time, thrust, (i) => ({ path, prefix: where(lineOfRow[i]!) }), path, `'${fileLabel}': `);
}

interface ColumnUnit {
  /** As shown in messages: "s", "ms", "N", "kN", "lbf". */
  label: string;
  /** To s or N. */
  factor: number;
}

/**
 * Units a header cell may name, by column, keyed in lower case (header units are read in any
 * letter case: within each column no two units differ only by case). The pound-force factor is
 * the exact definition (g0 × 0.45359237 kg).
 */
export const HEADER_UNITS: { time: Record<string, ColumnUnit>; thrust: Record<string, ColumnUnit> } = {
  time: { s: { label: 's', factor: 1 }, ms: { label: 'ms', factor: 0.001 } },
  thrust: {
    n: { label: 'N', factor: 1 },
    kn: { label: 'kN', factor: 1000 },
    lbf: { label: 'lbf', factor: 4.4482216152605 },
  },
};

/**
 * Highest values read from a thrust curve. Far above any motor a hobby or display field sees
 * (common practice, no source), low enough that a misplaced exponent or a pasted run of digits
 * is an error rather than a flight that ends in overflow.
 */
export const THRUST_CURVE_LIMITS = { time_s: 10_000, thrust_N: 1e8 } as const;
/** A field longer than this is not a measured value (a 50-MB run of digits would be read as Infinity or 0). */
const MAX_NUMBER_CHARS = 32;

function valueProblem(value: number, column: 'time' | 'thrust', written: string): string | undefined {
  if (written.length > MAX_NUMBER_CHARS) return `a number of ${written.length} characters is not a measured value; expected at most ${MAX_NUMBER_CHARS}`;
  if (!Number.isFinite(value)) return `${column} ${describeValue(written)} is too large to be a finite number`;
  const limit = column === 'time' ? THRUST_CURVE_LIMITS.time_s : THRUST_CURVE_LIMITS.thrust_N;
  if (Math.abs(value) > limit) return `${column} ${formatNumber(value)} ${column === 'time' ? 's' : 'N'} is out of range; expected at most ${formatNumber(limit)} ${column === 'time' ? 's' : 'N'}`;
  return undefined;
}

/** The two header cells, in a CSV separated by , ; or tab, or else by spaces (keeping "Time (s)" whole). */
function headerCells(line: string): string[] {
  if (/[,;\t]/.test(line)) {
    const cells = line.split(/[,;\t]/).map((c) => c.trim());
    if (cells.length > 1 && cells[cells.length - 1] === '') cells.pop();
    return cells;
  }
  return line.match(/[^\s([]+(?:\s*[([][^)\]]*[)\]])?/g) ?? [];
}

/** Splits "Thrust (lbf)", "thrust [lbf]" and "thrust_lbf" into name and unit; a plain "thrust" has no unit. */
export function headerCellUnit(cell: string): { name: string; unit?: string } {
  const bracketed = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]$/.exec(cell);
  if (bracketed !== null) return { name: bracketed[1]!, unit: bracketed[2]! };
  const underscore = /^(.+)_([^_]+)$/.exec(cell);
  if (underscore !== null) return { name: underscore[1]!, unit: underscore[2]! };
  return { name: cell };
}

function readHeader(line: string): [ColumnUnit, ColumnUnit] | string {
  const cells = headerCells(line);
  if (cells.length !== 2) {
    return `${describeValue(line)} is read as a header, but it has ${cells.length} cell${cells.length === 1 ? '' : 's'}; expected two (time, thrust), e.g. 'time_s,thrust_N'`;
  }
  const [timeCell, thrustCell] = cells.map(headerCellUnit) as [{ name: string; unit?: string }, { name: string; unit?: string }];
  if (/thrust|force/i.test(timeCell.name) && /time/i.test(thrustCell.name)) {
    return `${describeValue(line)}: the first column must be the time and the second the thrust; swap the columns`;
  }
  const time = columnUnit(timeCell, 'time', line);
  if (typeof time === 'string') return time;
  const thrust = columnUnit(thrustCell, 'thrust', line);
  if (typeof thrust === 'string') return thrust;
  return [time, thrust];
}

function columnUnit(cell: { name: string; unit?: string }, column: 'time' | 'thrust', line: string): ColumnUnit | string {
  const table = HEADER_UNITS[column];
  if (cell.unit === undefined) return column === 'time' ? table.s! : table.n!;
  const unit = table[cell.unit.toLowerCase()];
  if (unit !== undefined) return unit;
  const known = Object.values(table).map((u) => u.label).join(', ');
  const other = HEADER_UNITS[column === 'time' ? 'thrust' : 'time'][cell.unit.toLowerCase()];
  const hint = other !== undefined ? ` ('${cell.unit}' is a ${column === 'time' ? 'force' : 'time'} unit: are the columns swapped?)` : cell.unit.toLowerCase() === 'lb' ? " (for pounds of thrust write 'lbf')" : '';
  return `header ${describeValue(line)}: the ${column} unit '${cell.unit}' is not understood${hint}; expected one of ${known}, written like '${column}_${Object.values(table)[0]!.label}' or '${column === 'time' ? 'Time' : 'Thrust'} (${Object.values(table)[Object.values(table).length - 1]!.label})'`;
}

/** Text such as "0,0;0.1,120;1,0" or "0 0, 0.1 120": rows pasted on one line rather than a file name. */
function looksLikeRowsOnOneLine(spec: string): boolean {
  return /^\s*[+-]?\.?\d[\d.eE+-]*\s*[,;\s]\s*[+-]?\.?\d/.test(spec) && !/\.(csv|txt|tsv|dat)\s*$/i.test(spec);
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

function isDecimal(field: string): boolean {
  return NUMBER.test(field);
}

/**
 * Resolves a path written in the scenario against the scenario's folder, without node:path so it
 * also works in a browser. Absolute paths (/x, C:\x, \\server\x, scheme://x) are used as written.
 */
export function resolveRelativePath(baseDir: string | undefined, path: string): string {
  if (baseDir === undefined || baseDir === '' || /^(?:[/\\]|[A-Za-z]:[/\\]|[A-Za-z][A-Za-z0-9+.-]*:\/\/)/.test(path)) return path;
  return `${baseDir.replace(/[/\\]+$/, '')}/${path}`;
}
