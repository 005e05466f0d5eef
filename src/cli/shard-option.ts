import type { ShardSpec } from '../dispersion/shards.js';
import { UsageError } from './errors.js';

/** Environment variables a batch engine sets to tell each copy of one command which shard it is. */
export const SHARD_INDEX_VARIABLES = ['JOB_COMPLETION_INDEX', 'SLURM_ARRAY_TASK_ID'] as const;

/**
 * `--shard K/N`: shard K (0-based, 0 ≤ K < N) of N. `--shard auto/N` takes K from the batch
 * engine: JOB_COMPLETION_INDEX (a Kubernetes Indexed Job) or SLURM_ARRAY_TASK_ID (a Slurm job
 * array, numbered from 0). Both set to different numbers is refused rather than guessed.
 */
export function parseShardOption(text: string | undefined, env: NodeJS.ProcessEnv, samples: number): ShardSpec | null {
  if (text === undefined) return null;
  const match = /^\s*(auto|\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (!match) throw new UsageError(`--shard: '${text}' is not a shard; expected K/N (shard K of N, K counted from 0, e.g. 0/4) or auto/N (K from ${SHARD_INDEX_VARIABLES.join(' or ')})`);
  const count = Number(match[2]);
  if (!Number.isSafeInteger(count) || count < 1) throw new UsageError(`--shard: '${text}': N must be a whole number of at least 1`);
  if (count > samples) throw new UsageError(`--shard: '${text}': ${count} shards for ${samples} samples would leave shards empty; expected N of at most ${samples}`);
  let indexText = match[1];
  let source = '--shard';
  if (indexText === 'auto') {
    const set = SHARD_INDEX_VARIABLES.filter((name) => env[name] !== undefined && env[name] !== '');
    if (set.length === 0) throw new UsageError(`--shard: '${text}' takes K from ${SHARD_INDEX_VARIABLES.join(' or ')}, but neither is set`);
    const values = new Set(set.map((name) => env[name]!.trim()));
    if (values.size > 1) throw new UsageError(`--shard: '${text}': ${set.map((name) => `${name}=${env[name]}`).join(' and ')} disagree; unset one or give K`);
    indexText = [...values][0];
    source = set[0];
    if (!/^\d+$/.test(indexText)) throw new UsageError(`${source}: '${indexText}' is not a shard number; expected a whole number from 0 to ${count - 1}`);
  }
  const index = Number(indexText);
  if (!Number.isSafeInteger(index) || index >= count) {
    throw new UsageError(`${source}: shard ${indexText} of ${count} does not exist; expected a whole number from 0 to ${count - 1} (shards count from 0)`);
  }
  return { index, count };
}

/** Folder name of shard K of N inside the --out folder. */
export function shardFolderName(shard: ShardSpec): string {
  return `shard-${String(shard.index).padStart(String(shard.count - 1).length, '0')}-of-${shard.count}`;
}
