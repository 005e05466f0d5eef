import type { ChunkResult } from './runner.js';

/**
 * The per-sample columns of a chunk, found generically: every typed-array member of a chunk is a
 * column. Whatever columns the flight result grows (impact energy, angle, a fragment's part…),
 * assembling chunks, sending them between threads, and writing and merging shards carry them
 * without a list of names to keep up to date anywhere but `allocateChunk`.
 */

export type Column = Float64Array | Float32Array | Int32Array | Uint32Array | Int16Array | Uint16Array | Int8Array | Uint8Array;

/** Typed-array kinds a column may have, by the name written into shard manifests. */
export const COLUMN_TYPES = {
  Float64Array,
  Float32Array,
  Int32Array,
  Uint32Array,
  Int16Array,
  Uint16Array,
  Int8Array,
  Uint8Array,
} as const;

export type ColumnTypeName = keyof typeof COLUMN_TYPES;

export function columnTypeName(column: Column): ColumnTypeName {
  const name = column.constructor.name;
  if (!(name in COLUMN_TYPES)) throw new Error(`internal error: a result column of type ${name} is not supported`);
  return name as ColumnTypeName;
}

/** [name, array] of every column of a chunk, in the chunk's own member order. */
export function resultColumns(chunk: ChunkResult): [string, Column][] {
  const out: [string, Column][] = [];
  for (const [name, value] of Object.entries(chunk)) if (ArrayBuffer.isView(value)) out.push([name, value as Column]);
  return out;
}

/**
 * Entries per sample of a column: 1 for a sample's own figures, the pieces per sample for the
 * piece columns of a breakup (0 when there is none), so a column holds `count × stride` entries.
 */
export function columnStride(column: Column, count: number): number {
  return count > 0 ? column.length / count : 0;
}

/** Copies every column of `part` into `whole` at the sample offset `part.start - whole.start`. */
export function placeColumns(whole: ChunkResult, part: ChunkResult): void {
  const offset = part.start - whole.start;
  if (offset < 0 || offset + part.count > whole.count) {
    throw new Error(`internal error: samples ${part.start}+${part.count} fall outside ${whole.start}+${whole.count}`);
  }
  const target = whole as unknown as Record<string, Column>;
  for (const [name, column] of resultColumns(part)) {
    const into = target[name];
    if (!into || !ArrayBuffer.isView(into)) throw new Error(`internal error: result column '${name}' is unknown here`);
    const stride = columnStride(column, part.count);
    if (part.count > 0 && into.length !== whole.count * stride) {
      throw new Error(`internal error: result column '${name}' has ${stride} entries per sample here and ${into.length / whole.count} in the whole`);
    }
    into.set(column as never, offset * stride);
  }
}
