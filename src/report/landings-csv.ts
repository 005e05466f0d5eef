import type { LandingSet } from '../analysis/types.js';
import type { LocalFrame } from '../analysis/geodesy.js';
import { csvField } from '../analysis/areasCsv.js';

/** Column header of landings.csv (the scenario format document fixes it). */
export const LANDINGS_HEADER = 'sample,mode,east_m,north_m,lat,lon,apogee_m,flight_time_s,impact_speed_m_s';
/** Columns the risk model adds (scenario-format.md, "Results"), written when the set carries them. */
export const RISK_COLUMNS = 'impact_energy_J,impact_angle_deg';
/**
 * Last on every row: which part of the object landed ('whole', or the fragment class of a piece)
 * and the weight of its sample, the probability per flight it stands for. Every piece of a sample
 * carries the sample's weight, so a mode's rows add up to its expected landings per flight;
 * `strewn analyze` of this file weights modes (and counts pieces) as the run did.
 */
export const PART_COLUMNS = 'part,weight';

// Small pieces: a piece's row strings stay alive until it is written, and in pieces of 10,000 rows
// they outlived the young generation, so a million rows left ~60 MB of old garbage at the peak
// (1,000 rows: ~30 MB, and faster).
const ROWS_PER_PIECE = 1_000;

/**
 * landings.csv in pieces: one row per landed sample, sorted by sample, numbers at fixed precision
 * so the same run gives the same bytes on any machine (millimetres; 1e-8 degrees ≈ 1 mm).
 *
 * @example
 *   for (const piece of landingsCsvChunks(set, frame)) stream.write(piece);
 */
export function* landingsCsvChunks(set: LandingSet, frame: LocalFrame): Generator<string> {
  const names = set.modeNames.map((n) => csvField(n));
  const risk = set.impactEnergy !== undefined;
  const parts = set.part && set.partNames ? set.partNames.map((n) => csvField(n)) : null;
  yield LANDINGS_HEADER + (risk ? `,${RISK_COLUMNS}` : '') + `,${PART_COLUMNS}` + '\n';
  for (let from = 0; from < set.east.length; from += ROWS_PER_PIECE) {
    const to = Math.min(set.east.length, from + ROWS_PER_PIECE);
    let piece = '';
    for (let i = from; i < to; i++) {
      const [lon, lat] = frame.toLonLat(set.east[i], set.north[i]);
      piece +=
        `${set.sample ? set.sample[i] : i},${names[set.mode[i]]},${set.east[i].toFixed(3)},${set.north[i].toFixed(3)},` +
        `${lat.toFixed(8)},${lon.toFixed(8)},${set.apogee ? set.apogee[i].toFixed(2) : ''},` +
        `${set.flightTime ? set.flightTime[i].toFixed(3) : ''},${set.impactSpeed ? set.impactSpeed[i].toFixed(3) : ''}` +
        (risk ? `,${set.impactEnergy![i].toFixed(3)},${set.impactAngle && Number.isFinite(set.impactAngle[i]) ? set.impactAngle[i].toFixed(2) : ''}` : '') +
        // Ten significant digits: enough for analyze to give a run's figures back, same bytes everywhere.
        `,${parts ? parts[set.part![i]] : 'whole'},${set.weight[i].toPrecision(10)}` +
        '\n';
    }
    yield piece;
  }
}

/** landings.csv as one string. */
export function writeLandingsCsv(set: LandingSet, frame: LocalFrame): string {
  return Array.from(landingsCsvChunks(set, frame)).join('');
}
