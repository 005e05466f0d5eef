import { AirModel } from '../physics/air.js';
import { FAILURE_REASONS } from '../flight/status.js';
import { descentRateAtDensity, descentRateForDragArea } from '../scenario/normalize.js';
import type { Scenario } from '../scenario/types.js';
import { unitFormatter, withOther, type UnitFormatter } from '../report/format-number.js';
import { spreadsAsFlown } from '../report/spread-text.js';
import { inputWords } from '../report/sheet/input-names.js';
import { parseCommandArgs, integerOption, onePositional } from './args.js';
import { loadForCommand, printWarnings } from './scenario-input.js';
import { DISPLAY_OPTIONS, displayChoices } from './display-options.js';
import { nominalFigureLines, nominalFigures } from '../report/stability.js';

export const CHECK_HELP = `Usage: strewn check <scenario.json> [--units metric|imperial] [--max-samples N] [--allow-outside-files]

Validates a scenario file and prints it normalised on stdout: every quantity in SI units (m, kg,
s, m/s, N, Pa, K, m²; angles in degrees), every default filled in. On stderr: the nominal flight,
each spread as it is flown (nominal value, offsets, values flown), each recovery stage's descent
rate at the pad's air density, and warnings for values outside common practice (likely unit
slips among them). Exit 0 when the scenario is valid, 2 when it is not.

Options:
  --units U         metric or imperial, for the text on stderr (default: the scenario's
                    run.units, else metric); the JSON on stdout is always SI
  --max-samples N   accept run.samples above the usual cap of 10,000,000
  --allow-outside-files  let the scenario name files outside its own folder
  -h, --help        this help
`;

export async function checkCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('check', args, { 'max-samples': { type: 'string' }, 'allow-outside-files': { type: 'boolean' }, units: DISPLAY_OPTIONS.units });
  if (values.help) {
    process.stdout.write(CHECK_HELP);
    return 0;
  }
  const path = onePositional('check', positionals, 'scenario file');
  const maxSamples = integerOption('max-samples', values['max-samples'] as string | undefined, 1, Number.MAX_SAFE_INTEGER);
  displayChoices(values);
  const loaded = await loadForCommand(path, maxSamples, values['allow-outside-files'] === true);
  const sc = loaded.scenario;
  const u = unitFormatter(displayChoices(values, sc.run).units);
  // Show the air the flight will actually meet, also where the file left it to the standard atmosphere.
  const air = new AirModel(sc.site.pad.elevation, sc.weather.temperature, sc.weather.pressure, sc.weather.air);
  const t = sc.site.terrain;
  const shown = {
    ...sc,
    // The terrain grid is summarised: its heights are thousands of numbers.
    site: t ? { ...sc.site, terrain: { file: t.file, east0: t.east0, north0: t.north0, step: t.step, nx: t.nx, ny: t.ny, lowest: Math.min(...t.heights), highest: Math.max(...t.heights) } } : sc.site,
    weather: { ...sc.weather, temperature: air.padTemperature, pressure: air.padPressure },
  };
  process.stdout.write(JSON.stringify(shown, null, 2) + '\n');
  const n = loaded.nominal;
  // With a breakup the nominal flight's figures are its farthest piece's (dispersion/breakup.ts).
  const landing = sc.breakup ? `breaks up ('${sc.breakup.name}'); its farthest piece lands` : 'lands';
  const status = n.status === 0 ? `${landing} ${u.length(Math.hypot(n.east, n.north))} from the pad after ${n.flightTime.toFixed(1)} s` : `fails: ${FAILURE_REASONS[n.status]}`;
  const lines = [`scenario '${sc.name}' is valid (hash ${loaded.hash.slice(0, 12)}); nominal flight: apogee ${u.length(n.apogee)}, ${status}`];
  lines.push(...spreadLines(sc, u), ...descentLines(sc, u, air.densityAt(0)));
  process.stderr.write(lines.join('\n') + '\n');
  for (const line of nominalFigureLines(nominalFigures(sc, n))) process.stderr.write(`${line}\n`);
  printWarnings(loaded.warnings);
  return 0;
}

function spreadLines(sc: Scenario, u: UnitFormatter): string[] {
  const spreads = spreadsAsFlown(sc, u);
  if (spreads.length === 0) return ['spreads: none (every sample flies the nominal flight)'];
  return ['spreads as flown (nominal, offsets → values flown):', ...spreads.map((s) => `  ${inputWords(s.name)}: ${s.text}`)];
}

/**
 * Drag coefficients of canopies referred to their nominal diameter (flat circular about 0.75–0.8,
 * conical 0.75–0.9, hemispherical 0.62–0.77, cross 0.6–0.85): T. W. Knacke, Parachute Recovery
 * Systems Design Manual (1992), table of canopy types, from memory. Hobby makers often quote
 * larger figures (about 1.5) referred to the inflated or projected diameter; the two must not be mixed.
 */
export const CANOPY_NOTE =
  "a canopy's drag coefficient depends on its shape and on the diameter it refers to: referred to the nominal (flat) diameter, flat circular about 0.75–0.8, conical 0.75–0.9, hemispherical 0.62–0.77, cross 0.6–0.85; figures near 1.5 refer to the smaller inflated diameter. Use the maker's figure with the diameter it was measured for";

function descentLines(sc: Scenario, u: UnitFormatter, padDensity: number): string[] {
  if (sc.recovery.length === 0) return [];
  const lines = [`descent rates at the pad's air density (${u.density(padDensity)}), with the mass without propellant:`];
  for (const s of sc.recovery) {
    const atPad = descentRateAtDensity(sc.vehicle.mass, s.dragArea, padDensity);
    const seaLevel = descentRateForDragArea(sc.vehicle.mass, s.dragArea);
    const given = s.canopy
      ? `${u.descentRate(seaLevel)} at sea level; canopy ${u.diameter(s.canopy.diameter)} across, Cd ${s.canopy.drag}${s.canopy.note ? ` (${s.canopy.note})` : ''}, drag area ${u.smallArea(s.dragArea)}`
      : s.descentRate !== undefined
        ? `given as ${u.descentRate(s.descentRate)} at sea level`
        : `${u.descentRate(seaLevel)} at sea level; drag area ${u.smallArea(s.dragArea)}`;
    lines.push(`  ${s.name}: ${withOther(u.system, (f) => f.descentRate, atPad)} at the pad, ${given}`);
  }
  if (sc.recovery.some((s) => s.canopy)) lines.push(`  note: ${CANOPY_NOTE}`);
  return lines;
}
