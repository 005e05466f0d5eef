import { readGrib2, Grib2Error } from './grib2.js';
import { forecastProfile, memberSpread, validTimes, ForecastError, type AirRow, type ForecastProfile, type Pad, type PadProfile, type WindRow } from './profile.js';

/**
 * `weather.forecast` of a scenario: from the GRIB2 file's bytes to the wind rows, the air rows and
 * (with ensemble members or a time window) the wind spread the run uses.
 *
 * The spread: every profile that stands for the same moment — each ensemble member at the chosen
 * time and, with `window`, each forecast step (and member) whose valid time lies within ±window of
 * it — gives the mean wind vector of the lowest `layerTop` metres (1000 m) above the pad. The speed
 * spread is normal with sd = (sd of those layer speeds) / (their mean), i.e. a `%` spread that
 * scales the whole profile; the direction spread is normal with sd = the circular sd of the layer
 * directions. A spread the file gives itself for wind.speed or wind.from wins over the forecast's.
 *
 * @example
 *   const r = resolveForecast(bytes, { time: Date.parse('2011-01-15T12:00Z') }, { lat: 52, lon: 5, elevation: 0 });
 *   r.wind; // weather.wind.profile rows
 */

export interface ForecastRequest {
  /** Valid time, ms UTC. */
  time: number;
  /** Half-width of the time window whose steps enter the spread, s (optional). */
  window?: number;
}

export interface ResolvedForecast {
  profile: ForecastProfile;
  wind: WindRow[];
  air: AirRow[];
  /** Profiles the spread came from (members and steps in the window). */
  spreadFrom: number;
  spread?: { speedSd: number; fromSd: number; layerTop: number };
}

/**
 * The last answer, by the very bytes and request: the page validates the scenario on every edit,
 * and decoding a forecast's grids takes a few hundred milliseconds. A copy is handed out, so a
 * caller that changes its rows changes nothing here.
 */
let last: { bytes: Uint8Array; key: string; result: ResolvedForecast } | null = null;

export function resolveForecast(bytes: Uint8Array, request: ForecastRequest, pad: Pad): ResolvedForecast {
  const key = JSON.stringify([request.time, request.window ?? null, pad.lat, pad.lon, pad.elevation]);
  if (last === null || last.bytes !== bytes || last.key !== key) last = { bytes, key, result: resolveUncached(bytes, request, pad) };
  return structuredClone(last.result);
}

function resolveUncached(bytes: Uint8Array, request: ForecastRequest, pad: Pad): ResolvedForecast {
  const fields = readGrib2(bytes);
  const profile = forecastProfile(fields, pad, request.time);
  const pool: PadProfile[] = profile.perMember.length >= 2 ? [...profile.perMember] : [profile.nominal];
  if (request.window !== undefined && request.window > 0) {
    const w = request.window * 1000;
    for (const t of validTimes(fields)) {
      if (t === request.time || Math.abs(t - request.time) > w) continue;
      const other = forecastProfile(fields, pad, t);
      pool.push(...(other.perMember.length >= 2 ? other.perMember : [other.nominal]));
    }
  }
  const out: ResolvedForecast = { profile, wind: profile.nominal.wind, air: profile.nominal.air, spreadFrom: pool.length };
  const spread = memberSpread(pool);
  if (spread) out.spread = spread;
  return out;
}

/** Whether an error is a problem with the forecast file or request (an input error, not a bug). */
export function isForecastInputError(error: unknown): error is Error {
  return error instanceof Grib2Error || error instanceof ForecastError;
}
