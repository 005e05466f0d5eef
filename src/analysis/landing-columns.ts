import type { LandingSet } from './types.js';

/**
 * The per-landing figures the landing files carry beyond position, mode and weight, with the
 * names and decimals they are written under. Figures listed here get their unit-bearing names;
 * any other Float64Array member a LandingSet grows is written too, under its own name, so a new
 * flight figure reaches the vector files without another list to keep up to date.
 */
const KNOWN: Record<string, { name: string; decimals: number }> = {
  apogee: { name: 'apogee_m', decimals: 1 },
  flightTime: { name: 'flight_time_s', decimals: 2 },
  impactSpeed: { name: 'impact_speed_m_s', decimals: 2 },
};

/** Members of a LandingSet that are not extra figures (position, weighting, bookkeeping). */
const CORE = new Set(['east', 'north', 'weight', 'mode', 'sample']);

export interface LandingFigure {
  /** Name in the file. */
  name: string;
  decimals: number;
  values: Float64Array;
}

/** The extra figures of a landing set, known ones first in their fixed order. */
export function landingFigures(set: LandingSet): LandingFigure[] {
  const record = set as unknown as Record<string, unknown>;
  const known = Object.entries(KNOWN)
    .filter(([key]) => record[key] instanceof Float64Array)
    .map(([key, f]) => ({ ...f, values: record[key] as Float64Array }));
  const other = Object.entries(record)
    .filter(([key, value]) => !CORE.has(key) && !(key in KNOWN) && value instanceof Float64Array && value.length === set.east.length)
    .map(([key, value]) => ({ name: key, decimals: 3, values: value as Float64Array }));
  return [...known, ...other];
}
