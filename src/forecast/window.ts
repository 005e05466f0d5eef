import { readGrib2, type Grib2Field } from './grib2.js';
import { forecastProfile, validTimes, type Pad } from './profile.js';
import { profileAt } from '../physics/wind.js';

/**
 * The forecast wind hour by hour over one day (UTC), at the reference height the envelope is drawn
 * for: the launch window. Each hour inside the file's forecast steps is interpolated like the run's
 * own time (bilinear to the pad, linear between steps); hours outside the steps are left out.
 *
 * The envelope scales and turns the profile of the scenario's chosen time; an hour is judged by its
 * wind at the reference height against that envelope, so a day whose profile changes shape much is
 * judged only approximately (the chart says so).
 *
 * @example
 *   hourlyWinds(bytes, pad, Date.parse('2026-06-01T14:00Z'), 10, 0.14); // [{ time, speed, from }, ...]
 */
export interface HourWind {
  /** ms UTC. */
  time: number;
  speed: number;
  from: number;
}

export function hourlyWinds(source: Uint8Array | readonly Grib2Field[], pad: Pad, dayOf: number, height: number, shear: number): HourWind[] {
  const fields = source instanceof Uint8Array ? readGrib2(source) : source;
  const times = validTimes(fields);
  if (times.length === 0) return [];
  const day = new Date(dayOf);
  const start = Date.UTC(day.getUTCFullYear(), day.getUTCMonth(), day.getUTCDate());
  const out: HourWind[] = [];
  for (let h = 0; h < 24; h++) {
    const t = start + h * 3_600_000;
    if (t < times[0] || t > times[times.length - 1]) continue;
    const p = forecastProfile(fields, pad, t);
    const [speed, from] = profileAt(p.nominal.wind, height, shear);
    out.push({ time: t, speed: Math.round(speed * 100) / 100, from: Math.round(from * 10) / 10 });
  }
  return out;
}
