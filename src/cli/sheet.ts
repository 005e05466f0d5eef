import { renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildSheet } from '../report/sheet/index.js';
import { displayChoices } from './display-options.js';
import { readResultsFolder, ResultsFolderError } from '../report/sheet/read-results.js';
import { ENVELOPE_FILE, readEnvelopeFolder } from '../envelope/read-envelope.js';
import { parseCommandArgs, onePositional } from './args.js';
import { UsageError } from './errors.js';

export const SHEET_HELP = `Usage: strewn sheet <results folder> [options]

Draws the review sheet again from a results folder, without flying: sheet.pdf (page 1 the map,
page 2 the record to sign) and map.svg (page 1 alone). Reads summary.json, scenario.json,
review.json, contours.geojson, keepout.geojson and, when present, landings.geojson. Both files
are replaced only when both are ready.

Options:
  --paper a4|letter          paper size (default: the scenario's run.paper, else a4)
  --units metric|imperial    m, m², m/s or ft/mi, acres/ft², mph (default: the scenario's
                             run.units, else metric)
  --envelope DIR             add the wind-limits page from DIR/envelope.json (written by strewn
                             envelope for the same scenario: its scenarioHash must match)
  -h, --help                 this help

Exit status: 0 done, 2 bad input (folder, files or options), 1 anything else.
`;

export async function sheetCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('sheet', args, {
    paper: { type: 'string' },
    units: { type: 'string' },
    envelope: { type: 'string' },
  });
  if (values.help) {
    process.stdout.write(SHEET_HELP);
    return 0;
  }
  const folder = onePositional('sheet', positionals, 'results folder');
  displayChoices(values);
  const envelopeFolder = values.envelope as string | undefined;
  let input;
  let envelope;
  try {
    input = readResultsFolder(folder);
  } catch (error) {
    if (error instanceof ResultsFolderError) throw new UsageError(error.message);
    throw error;
  }
  try {
    envelope = envelopeFolder === undefined ? undefined : readEnvelopeFolder(envelopeFolder);
  } catch (error) {
    if (error instanceof ResultsFolderError) throw new UsageError(`--envelope: ${error.message}`);
    throw error;
  }
  const { units, paper } = displayChoices(values, input.scenario.run);
  if (envelope && envelope.scenarioHash !== input.summary.scenarioHash) {
    throw new UsageError(
      `--envelope: ${join(envelopeFolder!, ENVELOPE_FILE)} has scenarioHash ${envelope.scenarioHash.slice(0, 12)}… but ${join(folder, 'summary.json')} has ${input.summary.scenarioHash.slice(0, 12)}…; the wind limits were computed for another scenario (or another version of it)`,
    );
  }
  const sheet = buildSheet(input, { paper, units, envelope });
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
