import { formatPath } from './errors.js';
import type { Issue } from './types.js';

/**
 * Checks on parsed JSON before any schema sees it, against files built to break a reader:
 * - keys that name parts of JavaScript's object machinery (`__proto__`, `constructor`,
 *   `prototype`): JSON.parse keeps them as plain keys, but copying such a key into another object
 *   changes that object's prototype, so a reader would see it silently dropped or worse. They are
 *   reported as unknown fields;
 * - nesting deeper than any scenario needs: every recursive reader (validation, hashing, writing)
 *   would run out of stack, which surfaced as an internal error instead of a message.
 * The walk uses its own stack (no recursion), so it copes with any depth. Hand-written because it
 * is a dozen lines with no library that does exactly this.
 */

/** A GeoJSON basemap polygon needs 5 levels below its feature; 64 is far more than any real file. */
export const MAX_NESTING = 64;
const MACHINERY_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

export function rawJsonIssues(json: unknown): Issue[] {
  const issues: Issue[] = [];
  const stack: { value: unknown; path: (string | number)[] }[] = [{ value: json, path: [] }];
  let tooDeep = false;
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    if (value === null || typeof value !== 'object') continue;
    if (path.length > MAX_NESTING) {
      if (!tooDeep) issues.push({ path: formatPath(path.slice(0, 2)), message: `lists or objects are nested more than ${MAX_NESTING} levels deep inside this field; no scenario needs that many` });
      tooDeep = true;
      continue;
    }
    if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) stack.push({ value: value[i], path: [...path, i] });
      continue;
    }
    for (const key of Object.keys(value)) {
      if (MACHINERY_KEYS.has(key)) {
        if (issues.length < 20) issues.push({ path: formatPath([...path, key]), message: `'${key}' is not a field here (a name reserved by JavaScript); remove it` });
        continue;
      }
      stack.push({ value: (value as Record<string, unknown>)[key], path: [...path, key] });
    }
  }
  return issues;
}
