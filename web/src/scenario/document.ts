/**
 * The scenario as the user has it: the file's JSON exactly as written (units as text, fields in
 * their order), plus the files it refers to. Edits change this document, never the normalised
 * scenario, so "save" gives back a file in the user's own units that the command line reads too.
 */

import type { BinaryFiles } from './ground-files.js';

/** Texts of the files a scenario refers to (a CSV thrust curve), by the path the scenario writes. */
export type AttachedFiles = Readonly<Record<string, string>>;

export interface ScenarioDocument {
  /** The parsed JSON of the scenario file. */
  readonly json: unknown;
  readonly files: AttachedFiles;
  /** Name to save under, e.g. "club-rocket.json". */
  readonly fileName: string;
  /** Binary files it refers to (a GRIB2 forecast, a GeoTIFF terrain), never saved with the JSON. */
  readonly binaries?: BinaryFiles;
}

/** A place in the JSON: object keys and array indices (uncertainty names keep their dots). */
export type FieldPath = readonly (string | number)[];

/** The value at `path`, or undefined where the path does not exist. */
export function valueAt(json: unknown, path: FieldPath): unknown {
  let node: unknown = json;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string | number, unknown>)[key];
  }
  return node;
}

/**
 * A copy of the document with `value` at `path`; `undefined` removes the field. Missing objects
 * on the way are created, so a field the file left to its default can still be set.
 */
export function withValue(doc: ScenarioDocument, path: FieldPath, value: unknown): ScenarioDocument {
  if (path.length === 0) throw new Error('withValue: empty path');
  const json = structuredClone(doc.json) as Record<string | number, unknown>;
  let node: Record<string | number, unknown> = json;
  for (const key of path.slice(0, -1)) {
    const next = node[key];
    if (next === null || typeof next !== 'object') node[key] = {};
    node = node[key] as Record<string | number, unknown>;
  }
  const last = path[path.length - 1]!;
  if (value === undefined) delete node[last];
  else node[last] = value;
  return { ...doc, json };
}

/** The document as a file: two-space indented JSON with a final newline, like the demos. */
export function documentText(doc: ScenarioDocument): string {
  return JSON.stringify(doc.json, null, 2) + '\n';
}

/**
 * Reads a file the scenario refers to. Paths match as written, or by file name alone, because a
 * browser only knows the names of the files the user opened, not their folders.
 */
export function attachedFileReader(files: AttachedFiles): (path: string) => string {
  return (path) => {
    const exact = files[path];
    if (exact !== undefined) return exact;
    const name = baseName(path);
    const byName = Object.entries(files).find(([known]) => baseName(known) === name);
    if (byName) return byName[1];
    throw new Error(`'${name}' was not opened with the scenario; open the scenario file together with it (pick or drop both)`);
  };
}

export function baseName(path: string): string {
  return path.split(/[/\\]/).pop() ?? path;
}
