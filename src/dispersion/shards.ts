/**
 * Splitting one study into shards that separate processes (or machines) fly, and checking that a
 * set of shards makes up the whole study again. A sample's result depends only on (scenario,
 * seed, sample count, index), so a shard is just a contiguous range of indices.
 */

export interface ShardSpec {
  /** 0-based shard number. */
  index: number;
  /** How many shards the study is split into. */
  count: number;
}

/**
 * Samples of shard `index` of `count`: [first, first + size). Shards differ in size by at most one
 * sample and tile [0, samples) in order.
 *
 * @example shardRange(10, { index: 1, count: 4 }) // [2, 3]: samples 2, 3, 4 (floor(10·k/4) bounds)
 */
export function shardRange(samples: number, shard: ShardSpec): [number, number] {
  const first = Math.floor((samples * shard.index) / shard.count);
  const end = Math.floor((samples * (shard.index + 1)) / shard.count);
  return [first, end - first];
}

/** What identifies the study a shard belongs to: shards merge only when all of this agrees. */
export interface StudyIdentity {
  scenarioHash: string;
  seed: string;
  samples: number;
}

export interface ShardPiece<T> {
  /** Where the shard came from (a folder), named in every complaint about it. */
  label: string;
  identity: StudyIdentity;
  first: number;
  count: number;
  value: T;
}

/** A set of shards that does not make up one study exactly once; the message names the shard. */
export class ShardSetError extends Error {}

/**
 * Checks that the pieces belong to one study and hold every sample exactly once; returns them in
 * sample order. The first piece fixes the study; any piece that disagrees is foreign.
 */
export function orderShards<T>(pieces: readonly ShardPiece<T>[]): ShardPiece<T>[] {
  if (pieces.length === 0) throw new ShardSetError('no shard folders given');
  const study = pieces[0].identity;
  for (const piece of pieces.slice(1)) {
    const id = piece.identity;
    const differs =
      id.scenarioHash !== study.scenarioHash
        ? `scenario hash ${id.scenarioHash.slice(0, 12)}… instead of ${study.scenarioHash.slice(0, 12)}…`
        : id.seed !== study.seed
          ? `seed '${id.seed}' instead of '${study.seed}'`
          : id.samples !== study.samples
            ? `${id.samples} samples instead of ${study.samples}`
            : null;
    if (differs) throw new ShardSetError(`shard '${piece.label}' belongs to another study than '${pieces[0].label}': ${differs}`);
  }
  const sorted = [...pieces].sort((a, b) => a.first - b.first || a.count - b.count);
  let next = 0;
  for (let k = 0; k < sorted.length; k++) {
    const piece = sorted[k];
    if (piece.first < next) {
      const holder = sorted.slice(0, k).find((p) => p.first + p.count > piece.first) ?? sorted[k - 1];
      if (holder.label === piece.label) throw new ShardSetError(`shard '${piece.label}' is given twice`);
      throw new ShardSetError(
        `shard '${piece.label}' repeats samples ${piece.first}–${Math.min(next, piece.first + piece.count) - 1} already in '${holder.label}'`,
      );
    }
    if (piece.first > next) throw new ShardSetError(`samples ${next}–${piece.first - 1} of ${study.samples} are missing: no shard given holds them (the next shard, '${piece.label}', starts at ${piece.first})`);
    next = piece.first + piece.count;
  }
  if (next < study.samples) throw new ShardSetError(`samples ${next}–${study.samples - 1} of ${study.samples} are missing: no shard given holds them`);
  return sorted;
}
