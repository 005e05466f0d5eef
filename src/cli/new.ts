import { parseScenario } from '../scenario/load.js';
import { VEHICLE_KINDS } from '../scenario/schema.js';
import { starterScenario, type StarterUnits } from '../scenario/starter.js';
import type { VehicleKind } from '../scenario/types.js';
import { parseCommandArgs, onePositional } from './args.js';
import { UsageError } from './errors.js';
import { writeSingleFile } from './output-folder.js';

export const NEW_HELP = `Usage: strewn new <file.json> --kind rocket|projectile|release [--units metric|imperial] [--force]

Writes a starting scenario for one kind of vehicle: every section filled with invented values
written with their units (metric: m, kg, m/s; imperial: ft, lb, mph, ft/s), at the invented demo
field. Replace the values with your own, then run strewn check on the file. The file validates as
written. The format, field by field: scenarios/README.md.

Options:
  --kind K     rocket, projectile (a firework shell) or release (an object let go in flight, a drone)
  --units U    metric or imperial (default metric); imperial also sets run.units and run.paper
  --force      replace the file if it exists
  -h, --help   this help
`;

export async function newCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('new', args, {
    kind: { type: 'string' },
    units: { type: 'string' },
    force: { type: 'boolean' },
  });
  if (values.help) {
    process.stdout.write(NEW_HELP);
    return 0;
  }
  const path = onePositional('new', positionals, 'file name for the new scenario');
  const kind = values.kind as string | undefined;
  if (kind === undefined) throw new UsageError(`new: give the kind of vehicle with --kind ${VEHICLE_KINDS.join('|')}`);
  if (!(VEHICLE_KINDS as readonly string[]).includes(kind)) throw new UsageError(`--kind: '${kind}' is not one of ${VEHICLE_KINDS.join(', ')}`);
  const units = (values.units as string | undefined) ?? 'metric';
  if (units !== 'metric' && units !== 'imperial') throw new UsageError(`--units: '${units}' is not one of metric, imperial`);
  const json = starterScenario(kind as VehicleKind, units as StarterUnits);
  // The starter must validate; if it ever did not, that is a bug here, not the user's input.
  parseScenario(json);
  try {
    writeSingleFile(path, JSON.stringify(json, null, 2) + '\n', values.force !== true);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === 'EEXIST') throw new UsageError(`new: '${path}' already exists; choose another name or add --force to replace it`);
    if (code === 'ENOENT') throw new UsageError(`new: cannot write '${path}': its folder does not exist`);
    if (code === 'EISDIR') throw new UsageError(`new: '${path}' is a folder; give a file name such as ${path.replace(/\/$/, '')}/scenario.json`);
    throw error;
  }
  process.stdout.write(`${path}\n`);
  process.stderr.write(`wrote a ${kind} scenario in ${units} units; edit it, then: strewn check ${path}\n`);
  return 0;
}
