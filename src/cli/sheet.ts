import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildSheet, type Paper, type UnitSystem } from '../report/sheet/index.js';
import { readResultsFolder, ResultsFolderError } from '../report/sheet/read-results.js';
import { parseCommandArgs, onePositional } from './args.js';
import { UsageError } from './errors.js';

export const SHEET_HELP = `Usage: strewn sheet <results folder> [options]

Draws the review sheet again from a results folder, without flying: sheet.pdf (page 1 the map,
page 2 the record to sign) and map.svg (page 1 alone). Reads summary.json, scenario.json,
review.json, contours.geojson, keepout.geojson and, when present, landings.geojson. Both files
are replaced only when both are ready.

Options:
  --paper a4|letter          paper size (default a4)
  --units metric|imperial    m, m², m/s or ft/mi, acres/ft², mph (default metric)
  -h, --help                 this help

Exit status: 0 done, 2 bad input (folder, files or options), 1 anything else.
`;

function choice<T extends string>(name: string, value: string | undefined, choices: readonly T[], fallback: T): T {
  if (value === undefined) return fallback;
  if (!(choices as readonly string[]).includes(value)) throw new UsageError(`--${name}: '${value}' is not one of ${choices.join(', ')}`);
  return value as T;
}

export async function sheetCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('sheet', args, {
    paper: { type: 'string' },
    units: { type: 'string' },
  });
  if (values.help) {
    process.stdout.write(SHEET_HELP);
    return 0;
  }
  const folder = onePositional('sheet', positionals, 'results folder');
  const paper = choice<Paper>('paper', values.paper as string | undefined, ['a4', 'letter'], 'a4');
  const units = choice<UnitSystem>('units', values.units as string | undefined, ['metric', 'imperial'], 'metric');
  let input;
  try {
    input = readResultsFolder(folder);
  } catch (error) {
    if (error instanceof ResultsFolderError) throw new UsageError(error.message);
    throw error;
  }
  const sheet = buildSheet(input, { paper, units });
  // Written beside the targets under temporary names, then renamed: a failure leaves the old
  // files (or none) rather than half-written ones.
  const files: [string, string | Uint8Array][] = [['sheet.pdf', sheet.pdf], ['map.svg', sheet.svg]];
  const staged: [string, string][] = [];
  try {
    for (const [name, content] of files) {
      const temp = join(folder, `.${name}.partial-${process.pid}`);
      staged.push([temp, join(folder, name)]);
      writeFileSync(temp, content);
    }
    for (const [temp, target] of staged) renameSync(temp, target);
  } finally {
    for (const [temp] of staged) rmSync(temp, { force: true });
  }
  process.stdout.write(`${join(folder, 'sheet.pdf')}\n${join(folder, 'map.svg')}\n`);
  return 0;
}
