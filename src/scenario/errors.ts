import type { Issue } from './types.js';

/**
 * Every problem found in a scenario, reported together so the user can fix them in one pass.
 * Thrown for input mistakes only; the message is meant to be shown as is, without a stack trace.
 */
export class ScenarioError extends Error {
  readonly issues: Issue[];

  constructor(issues: Issue[], heading = 'The scenario has problems') {
    super(formatIssues(issues, heading));
    this.name = 'ScenarioError';
    this.issues = issues;
  }
}

/** "heading (n):" followed by one "  - path: message" line per issue. */
export function formatIssues(issues: Issue[], heading = 'The scenario has problems'): string {
  const count = issues.length === 1 ? '1 problem' : `${issues.length} problems`;
  const lines = issues.map((issue) => `  - ${formatIssue(issue)}`);
  return [`${heading} (${count}):`, ...lines].join('\n');
}

export function formatIssue(issue: Issue): string {
  return issue.path === '' ? issue.message : `${issue.path}: ${issue.message}`;
}

/**
 * Joins a field path the way users read it: `recovery[1].descentRate`, `site.areas[0].geometry`.
 * Uncertainty names keep their own dots (`uncertainty.wind.speed`), which reads the same way.
 */
export function formatPath(parts: ReadonlyArray<PropertyKey>, prefix = ''): string {
  let out = prefix;
  for (const part of parts) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out === '' ? String(part) : `.${String(part)}`;
  }
  return out;
}

/** Shows a value given in the file, short enough for a one-line message. */
export function describeValue(value: unknown): string {
  if (value === undefined) return 'missing';
  if (typeof value === 'string') return `'${truncate(value, 60)}'`;
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (value === null || typeof value === 'boolean') return String(value);
  try {
    return truncate(JSON.stringify(value) ?? String(value), 60);
  } catch {
    return String(value);
  }
}

function truncate(text: string, max: number): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

/** For a field the file should not have: names it, guesses the intended one, lists the valid ones. */
export function unknownFieldMessage(key: string, known: readonly string[]): string {
  const guess = closestMatch(key, known);
  const suggestion = guess === undefined ? '' : ` (did you mean '${guess}'?)`;
  return `'${key}' is not a field here${suggestion}; expected one of: ${known.join(', ')}`;
}

/** The candidate nearest to a misspelt word (at most two edits away, or one for short words). */
export function closestMatch(word: string, candidates: readonly string[]): string | undefined {
  const allowed = word.length <= 4 ? 1 : 2;
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    const distance = editDistance(word.toLowerCase(), candidate.toLowerCase());
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return bestDistance <= allowed ? best : undefined;
}

/** Levenshtein distance (insertions, deletions, substitutions). */
function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const substitution = previous[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1);
      current.push(Math.min(previous[j]! + 1, current[j - 1]! + 1, substitution));
    }
    previous = current;
  }
  return previous[b.length]!;
}
