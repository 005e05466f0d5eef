import { planModes } from '../dispersion/modes.js';
import { allocateChunk } from '../dispersion/runner.js';
import { piecesPerSample } from '../dispersion/breakup.js';
import { orderShards, ShardSetError, type ShardPiece } from '../dispersion/shards.js';
import { formatRunSummary } from '../report/run-text.js';
import { parseCommandArgs } from './args.js';
import { UsageError } from './errors.js';
import { interruptSignal } from './interrupt.js';
import { OutputFolder } from './output-folder.js';
import { readShardInto, readShardManifest, readShardScenario, shardFoldersOf, type ShardManifest } from './shard-folder.js';
import { honourInterrupt, writeStudyFiles } from './study-files.js';

export const MERGE_HELP = `Usage: strewn merge <shard folder>… --out DIR [options]

Puts the shards of one study (written by strewn run --shard K/N) together and writes the same
results folder a single strewn run would have written, byte for byte: landings, zones, area
figures, summary and review sheet. A folder that holds shard-* folders stands for all of them.

The shards must belong to one study (same scenario hash, seed and sample count) and hold every
sample exactly once; a missing, repeated or foreign shard stops the merge (exit 2) naming it.
Shards are read one at a time.

Options:
  --out DIR   results folder (required)
  --force     replace DIR if it is not empty
  --quiet     print nothing but errors
  --json      print the summary as JSON on stdout
  -h, --help  this help

Exit status: 0 done, 2 bad input (shards or options), 1 anything else.
`;

export async function mergeCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('merge', args, {
    out: { type: 'string' },
    force: { type: 'boolean' },
    quiet: { type: 'boolean' },
    json: { type: 'boolean' },
  });
  if (values.help) {
    process.stdout.write(MERGE_HELP);
    return 0;
  }
  if (positionals.length === 0) throw new UsageError('merge: expected one or more shard folders (see strewn merge --help)');
  const outDir = values.out as string | undefined;
  if (outDir === undefined) throw new UsageError('merge: --out DIR is required: the folder for the merged results');

  // Every manifest is read and checked before any landing is: a bad set fails fast.
  const folders = positionals.flatMap(shardFoldersOf);
  const pieces: ShardPiece<{ folder: string; manifest: ShardManifest }>[] = folders.map((folder) => {
    const manifest = readShardManifest(folder);
    return { label: folder, identity: manifest, first: manifest.first, count: manifest.count, value: { folder, manifest } };
  });
  let ordered: typeof pieces;
  try {
    ordered = orderShards(pieces);
  } catch (error) {
    if (error instanceof ShardSetError) throw new UsageError(`merge: ${error.message}`);
    throw error;
  }
  const { folder: firstFolder, manifest: first } = ordered[0].value;
  const scenario = readShardScenario(firstFolder, first);
  // Taken before the folder is prepared, so a signal from now on is answered by cleaning up.
  const interrupt = interruptSignal();
  let out: OutputFolder | undefined;
  try {
    out = OutputFolder.prepare(outDir, { force: values.force === true, inputs: ordered.map(({ value }) => value.folder) });
    // Each shard's columns are read straight into their place in the study's columns: no shard
    // is held a second time (readShardInto).
    const all = allocateChunk(0, first.samples, piecesPerSample(scenario));
    for (const { value } of ordered) {
      await honourInterrupt(interrupt.signal);
      readShardInto(all, value.folder, value.manifest);
    }
    const run = { ...all, plan: planModes(scenario.failures, first.samples), seed: first.seed };
    const summary = await writeStudyFiles(out, scenario, first.scenarioHash, run, first.warnings, { signal: interrupt.signal });
    await honourInterrupt(interrupt.signal);
    out.commit();
    if (values.json === true) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (values.quiet !== true) process.stdout.write(formatRunSummary(summary, out.destination));
    return 0;
  } finally {
    out?.discard();
    interrupt.dispose();
  }
}
