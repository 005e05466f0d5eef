import { createHash } from 'node:crypto';
import { closeSync, existsSync, fstatSync, openSync, readFileSync, readSync, readdirSync, statSync } from 'node:fs';
import { endianness } from 'node:os';
import { join } from 'node:path';
import { COLUMN_TYPES, columnTypeName, resultColumns, type Column, type ColumnTypeName } from '../dispersion/columns.js';
import { allocateChunk, type ChunkResult } from '../dispersion/runner.js';
import type { ShardSpec, StudyIdentity } from '../dispersion/shards.js';
import { hashScenario } from '../scenario/hash.js';
import type { Issue, Scenario } from '../scenario/types.js';
import { VERSION } from '../version.js';
import { UsageError } from './errors.js';
import type { OutputFolder } from './output-folder.js';

/**
 * A shard folder: what one `strewn run --shard K/N` flew, for `strewn merge` to put together.
 *
 *   shard.json    the manifest (this study's identity, the sample range, the columns, a checksum)
 *   scenario.json the normalised scenario as flown (its hash is shard.json's scenarioHash)
 *   columns.bin   every per-sample result column, raw typed-array bytes one after another
 *
 * The columns are found generically (src/dispersion/columns.ts), so a column added to the flight
 * result is carried through shards and merges without touching this file.
 */

export const SHARD_MANIFEST = 'shard.json';
export const SHARD_COLUMNS = 'columns.bin';
const FORMAT = 'strewn shard';
const FORMAT_VERSION = 1;

interface ColumnEntry {
  name: string;
  type: ColumnTypeName;
  byteOffset: number;
  byteLength: number;
}

export interface ShardManifest extends StudyIdentity {
  format: string;
  formatVersion: number;
  version: string;
  scenarioName: string;
  shard: ShardSpec;
  first: number;
  count: number;
  byteOrder: string;
  columns: ColumnEntry[];
  columnsSha256: string;
  /** The scenario's warnings as the run printed them (they go into the merged summary). */
  warnings: Issue[];
}

/** Columns start on 8-byte boundaries so each can be viewed in place with its own type. */
function align8(n: number): number {
  return Math.ceil(n / 8) * 8;
}

/** Writes the shard's three files into the (staging) output folder. */
export function writeShardFolder(
  out: OutputFolder,
  chunk: ChunkResult,
  study: StudyIdentity & { scenario: Scenario; warnings: Issue[]; shard: ShardSpec },
): ShardManifest {
  const columns: ColumnEntry[] = [];
  // The file's pieces in order: each column's own bytes (a view, not a copy: a shard of millions
  // of samples is not held twice) and the zero bytes that align the next column.
  const pieces: Uint8Array[] = [];
  let offset = 0;
  for (const [name, array] of resultColumns(chunk)) {
    columns.push({ name, type: columnTypeName(array), byteOffset: offset, byteLength: array.byteLength });
    pieces.push(new Uint8Array(array.buffer, array.byteOffset, array.byteLength));
    const next = align8(offset + array.byteLength);
    if (next > offset + array.byteLength) pieces.push(new Uint8Array(next - offset - array.byteLength));
    offset = next;
  }
  const hash = createHash('sha256');
  for (const piece of pieces) hash.update(piece);
  const manifest: ShardManifest = {
    format: FORMAT,
    formatVersion: FORMAT_VERSION,
    version: VERSION,
    scenarioName: study.scenario.name,
    scenarioHash: study.scenarioHash,
    seed: study.seed,
    samples: study.samples,
    shard: study.shard,
    first: chunk.start,
    count: chunk.count,
    byteOrder: endianness(),
    columns,
    columnsSha256: hash.digest('hex'),
    warnings: study.warnings,
  };
  out.write(SHARD_COLUMNS, pieces);
  out.write('scenario.json', JSON.stringify(study.scenario, null, 2) + '\n');
  out.write(SHARD_MANIFEST, JSON.stringify(manifest, null, 2) + '\n');
  return manifest;
}

/**
 * The shard folders an argument names: the folder itself when it holds shard.json, else its
 * `shard-*` sub-folders that do (so `strewn merge results/x-shards` takes every shard there).
 */
export function shardFoldersOf(argument: string): string[] {
  if (!existsSync(argument) || !statSync(argument).isDirectory()) throw new UsageError(`merge: '${argument}' is not a folder; expected a shard folder written by strewn run --shard`);
  if (existsSync(join(argument, SHARD_MANIFEST))) return [argument];
  const inside = readdirSync(argument)
    .filter((name) => name.startsWith('shard-') && existsSync(join(argument, name, SHARD_MANIFEST)))
    .sort()
    .map((name) => join(argument, name));
  if (inside.length === 0) throw new UsageError(`merge: '${argument}' is not a shard folder (it has no ${SHARD_MANIFEST}, nor shard-* folders holding one)`);
  return inside;
}

/** Reads and checks a shard's manifest against the columns this program writes. */
export function readShardManifest(folder: string): ShardManifest {
  const bad = (what: string) => new UsageError(`merge: shard '${folder}': ${what}`);
  let manifest: ShardManifest;
  try {
    manifest = JSON.parse(readFileSync(join(folder, SHARD_MANIFEST), 'utf8')) as ShardManifest;
  } catch (error) {
    throw bad(`${SHARD_MANIFEST} cannot be read (${error instanceof Error ? error.message : String(error)})`);
  }
  if (manifest === null || typeof manifest !== 'object' || manifest.format !== FORMAT) throw bad(`${SHARD_MANIFEST} is not a strewn shard manifest`);
  if (manifest.formatVersion !== FORMAT_VERSION) throw bad(`shard format ${manifest.formatVersion}; this strewn reads format ${FORMAT_VERSION}`);
  if (manifest.byteOrder !== endianness()) throw bad(`written on a ${manifest.byteOrder} machine; this one is ${endianness()}`);
  const ints = [manifest.samples, manifest.first, manifest.count, manifest.shard?.index, manifest.shard?.count];
  if (!ints.every((n) => Number.isSafeInteger(n) && n >= 0) || manifest.count < 1 || manifest.first + manifest.count > manifest.samples) {
    throw bad(`its sample range ${manifest.first}+${manifest.count} of ${manifest.samples} is not a valid range`);
  }
  if (typeof manifest.scenarioHash !== 'string' || typeof manifest.seed !== 'string' || !Array.isArray(manifest.columns) || !Array.isArray(manifest.warnings)) {
    throw bad(`${SHARD_MANIFEST} lacks scenarioHash, seed, columns or warnings`);
  }
  const expected = resultColumns(allocateChunk(0, 0)).map(([name, array]) => `${name}:${columnTypeName(array)}`).join(', ');
  const got = manifest.columns.map((c) => `${c.name}:${c.type}`).join(', ');
  if (got !== expected) throw bad(`its columns (${got}) differ from the ones this strewn ${VERSION} writes (${expected}); merge shards flown by the same strewn`);
  return manifest;
}

/** The scenario a shard flew, checked against the manifest's hash. */
export function readShardScenario(folder: string, manifest: ShardManifest): Scenario {
  let scenario: Scenario;
  try {
    scenario = JSON.parse(readFileSync(join(folder, 'scenario.json'), 'utf8')) as Scenario;
  } catch (error) {
    throw new UsageError(`merge: shard '${folder}': scenario.json cannot be read (${error instanceof Error ? error.message : String(error)})`);
  }
  if (hashScenario(scenario) !== manifest.scenarioHash) throw new UsageError(`merge: shard '${folder}': scenario.json does not match the scenario hash in ${SHARD_MANIFEST} (was it edited?)`);
  return scenario;
}

/**
 * Reads a shard's columns straight into the study's columns (`whole`, samples from `whole.start`),
 * hashing the file as it goes, so a merge holds no second copy of a shard: each column's bytes go
 * from the file into their place in one read. Throws (exit 2) if the file's size or checksum is
 * wrong; `whole` is then partly overwritten, and the merge stops.
 */
export function readShardInto(whole: ChunkResult, folder: string, manifest: ShardManifest): void {
  const file = join(folder, SHARD_COLUMNS);
  const bad = (what: string) => new UsageError(`merge: shard '${folder}': ${SHARD_COLUMNS} ${what}`);
  if (!existsSync(file)) throw bad('is missing');
  const last = manifest.columns[manifest.columns.length - 1];
  const size = last ? align8(last.byteOffset + last.byteLength) : 0;
  const offset = manifest.first - whole.start;
  if (offset < 0 || offset + manifest.count > whole.count) throw new Error(`internal error: shard samples ${manifest.first}+${manifest.count} fall outside ${whole.start}+${whole.count}`);
  const target = whole as unknown as Record<string, Column>;
  const hash = createHash('sha256');
  const fd = openSync(file, 'r');
  try {
    if (fstatSync(fd).size !== size) throw bad(`has ${fstatSync(fd).size} bytes; the manifest expects ${size}`);
    let at = 0;
    /** Reads file bytes [at, at + into.length) into `into` and hashes them. */
    const readFully = (into: Uint8Array) => {
      for (let done = 0; done < into.length; ) {
        const got = readSync(fd, into, done, Math.min(1 << 26, into.length - done), at + done);
        if (got <= 0) throw bad('ended early');
        done += got;
      }
      hash.update(into);
      at += into.length;
    };
    const gap = (to: number) => {
      if (to > at) readFully(new Uint8Array(to - at));
    };
    for (const c of manifest.columns) {
      const Type = COLUMN_TYPES[c.type];
      if (c.byteLength % (manifest.count * Type.BYTES_PER_ELEMENT) !== 0) throw bad(`column ${c.name} has ${c.byteLength} bytes for ${manifest.count} samples`);
      const into = target[c.name];
      const stride = c.byteLength / (manifest.count * Type.BYTES_PER_ELEMENT);
      if (!into || !ArrayBuffer.isView(into) || into.constructor !== Type || into.length !== whole.count * stride) {
        throw new Error(`internal error: result column '${c.name}' does not match the study's columns`);
      }
      if (c.byteOffset < at) throw bad(`column ${c.name} overlaps the one before it`);
      gap(c.byteOffset);
      readFully(new Uint8Array(into.buffer, into.byteOffset + offset * stride * Type.BYTES_PER_ELEMENT, c.byteLength));
    }
    gap(size);
  } finally {
    closeSync(fd);
  }
  if (hash.digest('hex') !== manifest.columnsSha256) throw bad('does not match its checksum in the manifest (damaged or edited)');
}

/**
 * Reads a shard's columns into one freshly allocated buffer (so every column can be viewed in
 * place, aligned) after checking its size and checksum.
 */
export function readShardColumns(folder: string, manifest: ShardManifest): ChunkResult {
  const file = join(folder, SHARD_COLUMNS);
  const bad = (what: string) => new UsageError(`merge: shard '${folder}': ${SHARD_COLUMNS} ${what}`);
  if (!existsSync(file)) throw bad('is missing');
  const last = manifest.columns[manifest.columns.length - 1];
  const size = last ? align8(last.byteOffset + last.byteLength) : 0;
  const bytes = new Uint8Array(new ArrayBuffer(size));
  const fd = openSync(file, 'r');
  try {
    if (fstatSync(fd).size !== size) throw bad(`has ${fstatSync(fd).size} bytes; the manifest expects ${size}`);
    for (let at = 0; at < size; ) {
      const got = readSync(fd, bytes, at, Math.min(1 << 26, size - at), at);
      if (got <= 0) throw bad('ended early');
      at += got;
    }
  } finally {
    closeSync(fd);
  }
  if (createHash('sha256').update(bytes).digest('hex') !== manifest.columnsSha256) throw bad('does not match its checksum in the manifest (damaged or edited)');
  const chunk: Record<string, unknown> = { start: manifest.first, count: manifest.count };
  for (const c of manifest.columns) {
    const Type = COLUMN_TYPES[c.type];
    // A sample's own columns hold one entry per sample, a breakup's piece columns a whole number.
    if (c.byteLength % (manifest.count * Type.BYTES_PER_ELEMENT) !== 0) throw bad(`column ${c.name} has ${c.byteLength} bytes for ${manifest.count} samples`);
    chunk[c.name] = new Type(bytes.buffer, c.byteOffset, c.byteLength / Type.BYTES_PER_ELEMENT) as Column;
  }
  return chunk as unknown as ChunkResult;
}
