import { existsSync, readFileSync } from 'node:fs';
import { writeSingleFile } from './output-folder.js';
import { readGrib2 } from '../forecast/grib2.js';
import { isForecastInputError, resolveForecast } from '../forecast/resolve.js';
import { validTimes } from '../forecast/profile.js';
import { profileAt } from '../physics/wind.js';
import { isoTime, parseValidTime } from '../scenario/time.js';
import { parseCommandArgs, onePositional } from './args.js';
import { UsageError } from './errors.js';

export const FORECAST_HELP = `Usage: strewn forecast <file.grib2> --pad LAT,LON [--elevation M] [--time T] [--window H]
                      [--write-profile FILE] [--force]

Reads a GRIB2 forecast (regular latitude/longitude grid; geopotential height, temperature and u/v
wind on pressure levels, 10 m wind and surface pressure where present), interpolates it to the pad
(bilinear in latitude/longitude, linear in time between forecast steps) and prints the wind and
air profile a scenario with weather.forecast would fly.

Options:
  --pad LAT,LON        the pad, degrees (WGS 84), e.g. --pad 52.10,5.18 (south or west:
                       --pad=-33.9,18.4)
  --elevation M        pad elevation above sea level, m (default: the model's own ground height
                       there, when the file has it, else 0)
  --time T             valid time, ISO 8601 with its zone, e.g. 2026-06-01T14:00Z (default: the
                       first time in the file); the file's times are listed
  --window H           hours either side of T whose steps also enter the wind spread
  --write-profile FILE write {"wind": {...}, "temperature", "pressure"} for a scenario's
                       weather block (the wind profile as weather.wind.profile)
  --force              overwrite FILE if it exists
  -h, --help           this help

A forecast is one input among several: check it against observations on the day, and follow the
local range-safety code and licensed practice.
`;

export async function forecastCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs('forecast', args, {
    pad: { type: 'string' },
    elevation: { type: 'string' },
    time: { type: 'string' },
    window: { type: 'string' },
    'write-profile': { type: 'string' },
    force: { type: 'boolean' },
  });
  if (values.help) {
    process.stdout.write(FORECAST_HELP);
    return 0;
  }
  const file = onePositional('forecast', positionals, 'GRIB2 file');
  const padText = values.pad as string | undefined;
  if (padText === undefined) throw new UsageError('forecast: --pad LAT,LON is required (see strewn forecast --help)');
  const m = /^\s*(-?\d+(?:\.\d+)?)\s*,\s*(-?\d+(?:\.\d+)?)\s*$/.exec(padText);
  const lat = m ? Number(m[1]) : NaN;
  const lon = m ? Number(m[2]) : NaN;
  if (!(Math.abs(lat) <= 90) || !(Math.abs(lon) <= 360)) throw new UsageError(`--pad: '${padText}' is not LAT,LON in degrees (latitude -90 to 90, longitude -180 to 360), e.g. 52.10,5.18`);
  const window = values.window === undefined ? undefined : Number(values.window);
  if (window !== undefined && !(window > 0 && Number.isFinite(window))) throw new UsageError(`--window: '${values.window}' is not a positive number of hours`);
  const out = values['write-profile'] as string | undefined;
  if (out !== undefined && existsSync(out) && !values.force) throw new UsageError(`--write-profile: '${out}' exists; add --force to overwrite it`);

  let bytes: Uint8Array;
  try {
    bytes = readFileSync(file);
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    throw new UsageError(`forecast: cannot read '${file}': ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : String(error)}`);
  }
  try {
    const fields = readGrib2(bytes);
    const times = validTimes(fields);
    let time = times[0];
    if (values.time !== undefined) {
      time = parseValidTime(values.time as string);
      if (!Number.isFinite(time)) throw new UsageError(`--time: '${values.time}' is not an ISO 8601 date-time with its zone, e.g. 2026-06-01T14:00Z`);
    }
    if (time === undefined) throw new UsageError(`forecast: '${file}' holds no u/v wind on pressure levels`);
    let elevation = values.elevation === undefined ? undefined : Number(values.elevation);
    if (elevation !== undefined && !Number.isFinite(elevation)) throw new UsageError(`--elevation: '${values.elevation}' is not a number of metres`);
    let elevationNote = '';
    if (elevation === undefined) {
      const probe = resolveForecast(bytes, { time }, { lat, lon, elevation: 0 });
      elevation = probe.profile.nominal.modelGround !== undefined ? Math.round(probe.profile.nominal.modelGround) : 0;
      elevationNote = probe.profile.nominal.modelGround !== undefined ? " (the model's ground height there; give --elevation for the real pad)" : ' (no ground height in the file; give --elevation)';
    }
    const r = resolveForecast(bytes, { time, window: window === undefined ? undefined : window * 3600 }, { lat, lon, elevation });
    const p = r.profile;
    const lines: string[] = [];
    lines.push(`forecast ${file}: run of ${isoTime(p.referenceTime)}, valid times ${p.validTimes.map(isoTime).join(', ')}`);
    lines.push(`pad ${lat}, ${lon}, elevation ${elevation} m${elevationNote}; valid time ${isoTime(time)}${p.steps.length === 2 ? ` (linear between ${isoTime(p.steps[0])} and ${isoTime(p.steps[1])})` : ''}`);
    if (p.members.length > 0) lines.push(`ensemble: mean of ${p.members.length} members (${p.members.join(', ')})`);
    lines.push('');
    lines.push('altitude above pad (m)   speed (m/s)   from (deg)   temperature (K)   pressure (hPa)');
    const air = new Map(r.air.map((row) => [row.altitude, row]));
    for (const row of r.wind) {
      const a = air.get(row.altitude);
      lines.push(`${row.altitude.toFixed(0).padStart(22)}   ${row.speed.toFixed(1).padStart(11)}   ${row.from.toFixed(0).padStart(10)}   ${a ? a.temperature.toFixed(1).padStart(15) : '               '}   ${a ? (a.pressure / 100).toFixed(1).padStart(14) : ''}`);
    }
    lines.push(`pad air: ${r.air[0].temperature.toFixed(1)} K, ${(r.air[0].pressure / 100).toFixed(1)} hPa`);
    if (r.spread) {
      lines.push(`wind spread from ${r.spreadFrom} profiles (layer 0-${r.spread.layerTop} m): wind.speed sd ${(r.spread.speedSd * 100).toFixed(1)} %, wind.from sd ${r.spread.fromSd.toFixed(1)} deg`);
    }
    lines.push('');
    lines.push('A forecast is one input: check it against observations on the day and follow the local range-safety code.');
    process.stdout.write(lines.join('\n') + '\n');
    if (out !== undefined) {
      const [speed, from] = profileAt(r.wind, 10, 0.14);
      const fragment = {
        wind: { speed: Math.round(speed * 100) / 100, from: Math.round(from * 10) / 10, profile: r.wind },
        temperature: r.air[0].temperature,
        pressure: r.air[0].pressure,
      };
      writeSingleFile(out, JSON.stringify(fragment, null, 2) + '\n');
      process.stderr.write(`wrote ${out}: put its fields into the scenario's "weather" block\n`);
    }
    return 0;
  } catch (error) {
    if (isForecastInputError(error)) throw new UsageError(`forecast: '${file}': ${error.message}`);
    throw error;
  }
}
