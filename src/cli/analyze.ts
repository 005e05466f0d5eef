import { readFileSync } from 'node:fs';
import { basename, extname, join } from 'node:path';
import { analyze } from '../analysis/index.js';
import { createLocalFrame } from '../analysis/geodesy.js';
import { readLandingsCsv, LandingsInputError } from '../analysis/landings-input.js';
import { summaryParts } from '../analysis/summary.js';
import { writeContoursGeoJSON, writeKeepOutGeoJSON, landingsGeoJSONChunks } from '../analysis/geojsonWriters.js';
import { writeAreasCsv } from '../analysis/areasCsv.js';
import { writeKml } from '../analysis/kml.js';
import { loadScenarioFile } from '../scenario/file.js';
import type { RunSettings, Site } from '../scenario/types.js';
import { CAUTION } from '../report/caution.js';
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
  --margin M            keep-out margin in metres (default 25 or the scenario's)
  --out DIR             results folder (default: results/<file name>-analysis)
  --force               replace DIR if it is not empty
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
  });
  if (values.help) {
    process.stdout.write(ANALYZE_HELP);
    return 0;
  }
  const path = onePositional('analyze', positionals, 'landings CSV file');
  let site: Site;
  let risk: RiskSettings | undefined;
  let run: RunSettings = { samples: 0, seed: '', levels: [0.5, 0.9, 0.99], keepOut: { level: 0.99, margin: 25 } };
  if (values.scenario !== undefined) {
    const loaded = loadScenarioFile(values.scenario as string);
    site = loaded.scenario.site;
    run = loaded.scenario.run;
    risk = riskSettings(loaded.scenario);
  } else if (values.pad !== undefined) {
    const [lat, lon, elevation = 0] = numbers('pad', values.pad as string, [2, 3]);
    if (Math.abs(lat) > 90) throw new UsageError(`--pad: latitude ${lat} is outside −90 to 90`);
    if (Math.abs(lon) > 180) throw new UsageError(`--pad: longitude ${lon} is outside −180 to 180`);
    site = { pad: { lat, lon, elevation }, areas: [] };
  } else {
    throw new UsageError('analyze: give the pad with --pad LAT,LON or a scenario with --scenario FILE');
  }
  if (values.pad !== undefined && values.scenario !== undefined) {
    const [lat, lon, elevation = site.pad.elevation] = numbers('pad', values.pad as string, [2, 3]);
    site = { ...site, pad: { lat, lon, elevation } };
  }
  if (values.levels !== undefined) {
    const levels = numbers('levels', values.levels as string, [1, 20]).map((v) => probability('levels', v));
    if (levels.some((v, i) => i > 0 && v <= levels[i - 1])) throw new UsageError(`--levels: '${values.levels}' must increase`);
    run = { ...run, levels };
  }
  if (values['keep-out'] !== undefined) run = { ...run, keepOut: { ...run.keepOut, level: probability('keep-out', numbers('keep-out', values['keep-out'] as string, [1, 1])[0]) } };
  if (values.margin !== undefined) {
    const [margin] = numbers('margin', values.margin as string, [1, 1]);
    if (margin < 0) throw new UsageError(`--margin: ${margin} m is negative`);
    run = { ...run, keepOut: { ...run.keepOut, margin } };
  }

  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new UsageError(`${path}: cannot read the file${code === 'ENOENT' ? ': no such file' : code === 'EISDIR' ? ': it is a folder' : ''}`);
  }
  const frame = createLocalFrame(site.pad);
  let set;
  try {
    set = readLandingsCsv(text, frame);
  } catch (error) {
    if (error instanceof LandingsInputError) throw new UsageError(`${path}: ${error.message}`);
    throw error;
  }
  const out = OutputFolder.prepare((values.out as string | undefined) ?? join('results', `${basename(path, extname(path))}-analysis`), values.force === true);
  try {
    const analysis = analyze(set, site, run, { risk });
    const summary = {
      source: basename(path),
      landings: set.east.length,
      version: VERSION,
      pad: site.pad,
      modes: set.modeNames.map((name, m) => ({ name, probability: set.modeProbability[m], landings: set.mode.filter((x) => x === m).length })),
      ...summaryParts(analysis),
      ...(analysis.risk ? { risk: riskSummary(analysis.risk) } : {}),
      caution: CAUTION,
    };
    out.write('summary.json', JSON.stringify(summary, null, 2) + '\n');
    out.write('contours.geojson', writeContoursGeoJSON(analysis));
    out.write('keepout.geojson', writeKeepOutGeoJSON(analysis));
    out.write('landings.geojson', landingsGeoJSONChunks(set, site.pad));
    if (site.areas.length > 0) out.write('areas.csv', writeAreasCsv(analysis.areas));
    out.write('result.kml', writeKml(analysis, site, `Landings from ${basename(path)}`));
    if (analysis.risk) out.write('risk.geojson', writeRiskGeoJSON(analysis.risk, site.pad));
    out.commit();
    if (values.json) process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
    else if (!values.quiet) {
      const lines = [`${basename(path)}: ${set.east.length.toLocaleString('en')} landings`];
      for (const c of summary.contours) lines.push(`  ${(c.level * 100).toFixed(0)} % region  ${Math.round(c.area_m2).toLocaleString('en')} m², reaches ${Math.round(c.maxDistance_m)} m from the pad`);
      lines.push(`  keep-out zone ${Math.round(summary.keepOut.area_m2).toLocaleString('en')} m², reaches ${Math.round(summary.keepOut.maxDistance_m)} m`);
      if (summary.risk) lines.push(...riskLinesText(summary.risk));
      else if (set.impactEnergy && risk === undefined) lines.push('  risk          not assessed: the risk model needs the vehicle and risk settings of --scenario');
      for (const w of summary.warnings) lines.push(`  warning       ${w}`);
      lines.push(`  results       ${out.destination}`, '', `CAUTION: ${CAUTION}`, '');
      process.stdout.write(lines.join('\n'));
    }
    return 0;
  } finally {
    out.discard();
  }
}
