import { InputFileError, readRegularFile, SIZE_LIMITS } from '../scenario/open-file.js';
import { basename, extname, join } from 'node:path';
import { analyze } from '../analysis/index.js';
import { createLocalFrame } from '../analysis/geodesy.js';
import { readLandingsCsv, LandingsInputError } from '../analysis/landings-input.js';
import { summaryParts } from '../analysis/summary.js';
import { writeContoursGeoJSON, writeKeepOutGeoJSON, landingsGeoJSONChunks } from '../analysis/geojsonWriters.js';
import { writeAreasCsv } from '../analysis/areasCsv.js';
import { writeKml } from '../analysis/kml.js';
import { loadScenarioFileWithTerrain } from '../scenario/file.js';
import type { RunSettings, Site } from '../scenario/types.js';
import { MAX_PAD_LATITUDE } from '../scenario/schema.js';
import { CAUTION } from '../report/caution.js';
import { findingLines } from '../report/run-text.js';
import { grouped, unitFormatter } from '../report/format-number.js';
import { convertQuantity } from '../scenario/units.js';
import { DISPLAY_OPTIONS, displayChoices } from './display-options.js';
import { scenarioHash } from '../scenario/hash.js';
import type { Scenario } from '../scenario/types.js';
import { reviewFacts, runDate } from '../report/sheet/review-facts.js';
import { sheetInputFromTexts } from '../report/sheet/sheet-input.js';
import { SheetThread } from './sheet-thread.js';
import { interruptSignal } from './interrupt.js';
import { honourInterrupt } from './study-files-light.js';
import { VERSION } from '../version.js';
import { riskSettings, riskSummary, type RiskSettings } from '../risk/index.js';
import { writeRiskGeoJSON } from '../risk/geojson.js';
import { riskLinesText } from '../report/risk-text.js';
import { parseCommandArgs, onePositional } from './args.js';
import { OutputFolder } from './output-folder.js';
import { UsageError } from './errors.js';

export const ANALYZE_HELP = `Usage: strewn analyze <landings.csv> (--pad LAT,LON[,ELEV] | --scenario FILE) [options]

Draws probability contours, the keep-out zone and area figures from landing points recorded
elsewhere (tracker positions, recovered rockets, another tool's output). The CSV needs a header
and either east_m,north_m (metres from the pad) or lat,lon (WGS 84 degrees); optional columns
mode (a name) and weight (a positive number). A landings.csv from strewn run reads back as is.
With --scenario and impact_energy_J (or impact_speed_m_s and mass_kg) columns, and optionally
impact_angle_deg (vertical when absent), it also gives the risk to people with the scenario's
risk settings: individual-risk lines (risk.geojson), standing distances and expected casualties.

Options:
  --pad LAT,LON[,ELEV]  the pad in degrees (and metres above sea level)
  --scenario FILE       take the pad, boundary, areas, levels and keep-out settings from a scenario
  --levels P,P,…        probability levels (default 0.5,0.9,0.99 or the scenario's)
  --keep-out P          keep-out level (default 0.99 or the scenario's)
  --margin M            keep-out margin (default 25 m or the scenario's); a bare number is
                        metres, or give a unit: '80 ft'
  --units U             metric or imperial, for the printed summary and the sheet (default:
                        the scenario's run.units, else metric)
  --paper P             a4 or letter, for sheet.pdf (default: the scenario's run.paper, else a4)

With --scenario the folder also holds scenario.json, review.json, sheet.pdf and map.svg, and
strewn sheet redraws them; without it there is no site or input record to draw a sheet from.
  --out DIR             results folder (default: results/<file name>-analysis)
  --force               replace DIR if strewn wrote it (never a folder holding the input)
  --allow-outside-files the scenario may name files outside its own folder
  --quiet               print nothing but errors
  --json                print the summary as JSON on stdout
  -h, --help            this help
`;

function numbers(option: string, text: string, count: [number, number]): number[] {
  const parts = text.split(',').map((p) => p.trim());
  const values = parts.map(Number);
  if (parts.length < count[0] || parts.length > count[1] || values.some((v) => !Number.isFinite(v)) || parts.some((p) => p === '')) {
    throw new UsageError(`--${option}: '${text}' is not ${count[0] === count[1] ? count[0] : `${count[0]} to ${count[1]}`} numbers separated by commas`);
  }
  return values;
}

/** --pad LAT,LON[,ELEV], checked the same way whether or not a scenario is given too. */
function padOption(text: string, defaultElevation: number): Site['pad'] {
  const [lat, lon, elevation = defaultElevation] = numbers('pad', text, [2, 3]);
  if (Math.abs(lat) > MAX_PAD_LATITUDE) throw new UsageError(`--pad: latitude ${lat} is outside −${MAX_PAD_LATITUDE} to ${MAX_PAD_LATITUDE}; Strewn does not work within 0.1° (11 km) of a pole`);
  if (Math.abs(lon) > 180) throw new UsageError(`--pad: longitude ${lon} is outside −180 to 180`);
  if (Math.abs(elevation) > 100_000) throw new UsageError(`--pad: elevation ${elevation} m is outside −100,000 to 100,000 m`);
  return { lat, lon, elevation };
}

function probability(option: string, v: number): number {
  if (!(v > 0 && v < 1)) throw new UsageError(`--${option}: ${v} is outside 0–1 (exclusive)`);
  return v;
}

export async function analyzeCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('analyze', args, {
    pad: { type: 'string' },
    scenario: { type: 'string' },
    levels: { type: 'string' },
    'keep-out': { type: 'string' },
    margin: { type: 'string' },
    out: { type: 'string' },
    force: { type: 'boolean' },
    quiet: { type: 'boolean' },
    json: { type: 'boolean' },
    'allow-outside-files': { type: 'boolean' },
    ...DISPLAY_OPTIONS,
  });
  if (values.help) {
    process.stdout.write(ANALYZE_HELP);
    return 0;
  }
  const path = onePositional('analyze', positionals, 'landings CSV file');
  displayChoices(values);
  let site: Site;
  const inputs = [path];
  let scenario: Scenario | undefined;
  let scenarioHashText: string | undefined;
  let risk: RiskSettings | undefined;
  let run: RunSettings = { samples: 0, seed: '', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } };
  if (values.scenario !== undefined) {
    const loaded = await loadScenarioFileWithTerrain(values.scenario as string, { allowOutsideFiles: values['allow-outside-files'] === true });
    inputs.push(...loaded.inputFiles);
    site = loaded.scenario.site;
    run = loaded.scenario.run;
    scenario = loaded.scenario;
    scenarioHashText = loaded.hash;
    risk = riskSettings(loaded.scenario);
  } else if (values.pad !== undefined) {
    site = { pad: padOption(values.pad as string, 0), areas: [] };
  } else {
    throw new UsageError('analyze: give the pad with --pad LAT,LON or a scenario with --scenario FILE');
  }
  if (values.pad !== undefined && values.scenario !== undefined) {
    site = { ...site, pad: padOption(values.pad as string, site.pad.elevation) };
  }
  const { units, paper } = displayChoices(values, run);
  if (values.levels !== undefined) {
    const levels = numbers('levels', values.levels as string, [1, 20]).map((v) => probability('levels', v));
    if (levels.some((v, i) => i > 0 && v <= levels[i - 1])) throw new UsageError(`--levels: '${values.levels}' must increase`);
    run = { ...run, levels };
  }
  if (values['keep-out'] !== undefined) run = { ...run, keepOut: { ...run.keepOut, level: probability('keep-out', numbers('keep-out', values['keep-out'] as string, [1, 1])[0]) } };
  if (values.margin !== undefined) {
    const text = (values.margin as string).trim();
    const q = convertQuantity(/^[+-]?[\d.]+(e[+-]?\d+)?$/i.test(text) ? Number(text) : text, 'length');
    if (!q.ok) throw new UsageError(`--margin: ${q.message}`);
    const margin = q.value;
    if (margin < 0) throw new UsageError(`--margin: ${q.shown} is negative`);
    run = { ...run, keepOut: { ...run.keepOut, margin } };
  }

  let text: string;
  try {
    text = readRegularFile(path, SIZE_LIMITS.landingsCsv);
  } catch (error) {
    if (error instanceof InputFileError) throw new UsageError(`${path}: cannot read the file: ${error.message}`);
    throw error;
  }
  const frame = createLocalFrame(site.pad);
  let set;
  try {
    set = readLandingsCsv(text, frame);
    // A fragment's casualty radius comes from the scenario's breakup, by part name.
    const pieces = scenario?.breakup?.fragments;
    if (set.partNames && pieces) set.partRadius = set.partNames.map((name) => pieces.find((f) => f.name === name)?.radius ?? NaN);
  } catch (error) {
    if (error instanceof LandingsInputError) throw new UsageError(`${path}: ${error.message}`);
    throw error;
  }
  // Taken before the folder is prepared: Ctrl-C or SIGTERM from now on stops the command between
  // its steps or while it writes, and removes what it made (exit 130, as for run).
  const interrupt = interruptSignal();
  const signal = interrupt.signal;
  let out: OutputFolder | undefined;
  // The sheet's thread loads the sheet code while this one analyses.
  let sheetThread: SheetThread | undefined;
  try {
    out = OutputFolder.prepare((values.out as string | undefined) ?? join('results', `${basename(path, extname(path))}-analysis`), { force: values.force === true, inputs, say: values.quiet === true || values.json === true ? () => {} : undefined });
    if (scenario) sheetThread = SheetThread.start();
    await honourInterrupt(signal);
    const analysis = analyze(set, site, run, { risk });
    await honourInterrupt(signal);
    const counts = set.modeNames.map((_, m) => set.mode.filter((x) => x === m).length);
    const noFlight = { mean: null, p05: null, p50: null, p95: null, max: null };
    // The fields a run's summary has, so that `strewn sheet` reads this folder too; nothing was
    // flown here, so the flight figures are null and the seed says the landings were recorded.
    const summary = {
      name: scenario ? `${scenario.name}: landings recorded in ${basename(path)}` : `Landings recorded in ${basename(path)}`,
      source: basename(path),
      landings: set.east.length,
      samples: set.east.length,
      failedSamples: 0,
      failures: [],
      seed: 'none (recorded landings)',
      scenarioHash: scenarioHashText ?? scenarioHash(text),
      version: VERSION,
      pad: site.pad,
      apogee_m: noFlight,
      flightTime_s: noFlight,
      farthestLanding: null,
      modes: set.modeNames.map((name, m) => ({ name, probability: set.modeProbability[m], landings: counts[m], samples: counts[m], landed: counts[m] })),
      ...summaryParts(analysis),
      scenarioWarnings: [],
      ...(analysis.risk ? { risk: riskSummary(analysis.risk) } : {}),
      caution: CAUTION,
    };
    const summaryText = JSON.stringify(summary, null, 2) + '\n';
    const contoursText = writeContoursGeoJSON(analysis);
    const keepOutText = writeKeepOutGeoJSON(analysis);
    out.write('summary.json', summaryText);
    out.write('contours.geojson', contoursText);
    out.write('keepout.geojson', keepOutText);
    if (scenario) {
      // With the scenario, the folder holds what the review sheet is drawn from, and the sheet.
      const scenarioText = JSON.stringify(scenario, null, 2) + '\n';
      const reviewText = JSON.stringify(reviewFacts(analysis, runDate()), null, 2) + '\n';
      out.write('scenario.json', scenarioText);
      out.write('review.json', reviewText);
      const sheet = await sheetThread!.draw({ input: sheetInputFromTexts({ summary: summaryText, scenario: scenarioText, review: reviewText, contours: contoursText, keepOut: keepOutText }, set), choices: { units, paper } }, signal);
      out.write('map.svg', sheet.svg);
      out.write('sheet.pdf', sheet.pdf);
    }
    await out.writeAsync('landings.geojson', landingsGeoJSONChunks(set, site.pad), signal);
    if (site.areas.length > 0) out.write('areas.csv', writeAreasCsv(analysis.areas));
    out.write('result.kml', writeKml(analysis, site, `Landings from ${basename(path)}`));
    if (analysis.risk) out.write('risk.geojson', writeRiskGeoJSON(analysis.risk, site.pad));
    await honourInterrupt(signal);
    out.commit();
    if (values.json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (!values.quiet) {
      const lines = [`${basename(path)}: ${grouped(set.east.length)} landings`];
      lines.push(...findingLines(summary, unitFormatter(units)));
      if (summary.risk) lines.push(...riskLinesText(summary.risk));
      else if (set.impactEnergy && risk === undefined) lines.push('  risk           not assessed: the risk model needs the vehicle and risk settings of --scenario');
      lines.push(`  results        ${out.destination}`, '', `CAUTION: ${CAUTION}`, '');
      process.stdout.write(lines.join('\n'));
    }
    return 0;
  } finally {
    sheetThread?.dispose();
    out?.discard();
    interrupt.dispose();
  }
}
