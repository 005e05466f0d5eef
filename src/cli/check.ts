import { AirModel } from '../physics/air.js';
import { FAILURE_REASONS } from '../flight/status.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { nominalFigureLines, nominalFigures } from '../report/stability.js';

export const CHECK_HELP = `Usage: strewn check <scenario.json> [--max-samples N]

Validates a scenario file and prints it normalised: every quantity in SI units (m, kg, s, m/s, N,
Pa, K, m²; angles in degrees), every default filled in. Warnings for values outside common
practice go to stderr. Exit 0 when the scenario is valid, 2 when it is not.

Options:
  --max-samples N   accept run.samples above the usual cap of 10,000,000
  -h, --help        this help
`;

export async function checkCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('check', args, { 'max-samples': { type: 'string' } });
  if (values.help) {
    process.stdout.write(CHECK_HELP);
    return 0;
  }
  const path = onePositional('check', positionals, 'scenario file');
  const maxSamples = integerOption('max-samples', values['max-samples'] as string | undefined, 1, Number.MAX_SAFE_INTEGER);
  const loaded = loadForCommand(path, maxSamples);
  const sc = loaded.scenario;
  // Show the air the flight will actually meet, also where the file left it to the standard atmosphere.
  const air = new AirModel(sc.site.pad.elevation, sc.weather.temperature, sc.weather.pressure);
  const shown = {
    ...sc,
    weather: { ...sc.weather, temperature: air.padTemperature, pressure: air.padPressure },
  };
  process.stdout.write(JSON.stringify(shown, null, 2) + '\n');
  const n = loaded.nominal;
  const status = n.status === 0 ? `lands ${Math.hypot(n.east, n.north).toFixed(0)} m from the pad after ${n.flightTime.toFixed(1)} s` : `fails: ${FAILURE_REASONS[n.status]}`;
  process.stderr.write(`scenario '${sc.name}' is valid (hash ${loaded.hash.slice(0, 12)}); nominal flight: apogee ${n.apogee.toFixed(0)} m, ${status}\n`);
  for (const line of nominalFigureLines(nominalFigures(sc, n))) process.stderr.write(`${line}\n`);
  printWarnings(loaded.warnings);
  return 0;
}
