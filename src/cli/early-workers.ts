import { nodeWorkerCount, nodeWorkerFactory, prestartWorkers } from '../pool/node.js';

/** Worker threads started before a command's own code is loaded (see `startRunWorkers`). */
export type EarlyWorkers = ReturnType<typeof prestartWorkers>;

/** The most worker threads `strewn run --workers` accepts (run.ts checks the option; this only reads it). */
const MOST_WORKERS = 256;

/**
 * Starts the engine threads of `strewn run` first thing, so they load the engine while this
 * thread loads the command, reads the scenario and flies the nominal flight. Only the worker
 * count is read here, leniently: run.ts parses and checks every option itself, and a count it
 * rejects (or `--help`) starts nothing. A count read differently from run.ts's costs time only:
 * the pool creates any thread it lacks and `dispose` ends those it did not take, and no result
 * depends on the thread that flies a sample.
 *
 * @example
 *   const early = startRunWorkers(['scenario.json', '--workers', '2']); // two threads loading
 */
export function startRunWorkers(args: readonly string[]): EarlyWorkers | undefined {
  const count = requestedWorkers(args);
  if (count === undefined) return undefined;
  try {
    return prestartWorkers(nodeWorkerFactory(), count);
  } catch {
    // A missing worker script is reported by run.ts with its own message.
    return undefined;
  }
}

/** The worker count `args` ask for (default every core), or undefined for help or an unusable count. */
export function requestedWorkers(args: readonly string[]): number | undefined {
  let text: string | undefined;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--') break;
    if (a === '-h' || a === '--help') return undefined;
    if (a === '--workers') text = args[++i];
    else if (a.startsWith('--workers=')) text = a.slice('--workers='.length);
  }
  if (text === undefined) return nodeWorkerCount();
  const count = Number(text.replace(/_/g, ''));
  return Number.isInteger(count) && count >= 1 && count <= MOST_WORKERS ? count : undefined;
}
