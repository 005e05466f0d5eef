import { csvParseRows } from 'd3-dsv';
import type { LandingSet } from './types.js';
import type { LocalFrame } from './geodesy.js';
import { excerpt, restoreFormulaText } from '../scenario/safe-text.js';

/** A problem in a landings file, with the line it is on (1-based; 0 for the file as a whole). */
export class LandingsInputError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(line > 0 ? `line ${line}: ${message}` : message);
    this.name = 'LandingsInputError';
  }
}

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
/** Sample numbers are kept as 32-bit unsigned integers. */
const MAX_SAMPLE_INDEX = 0xffffffff;
/** Farthest a recorded landing may lie from the pad, m (the local frame's reach). */
export const MAX_LANDING_DISTANCE = 500_000;

/** Fewest landings that make a density estimate worth drawing. */
export const MIN_LANDINGS = 10;

/**
 * Reads landing points recorded elsewhere (trackers, recovered positions, another run): a CSV with
 * a header and either `east_m,north_m` (metres from the pad) or `lat,lon` (WGS 84 degrees), and
 * optionally `mode` (a name) and `weight` (a positive number; default 1). Columns may come in any
 * order; other columns are ignored, so a `landings.csv` written by `strewn run` reads back as is.
 *
 * For the risk model: `impact_energy_J`, or `impact_speed_m_s` with `mass_kg` (energy ½ m v²), and
 * optionally `impact_angle_deg` (above the horizontal; absent means vertical). A risk column that is
 * present must hold a number on every row: a blank is an error, not a harmless impact.
 *
 * Each mode's probability is its share of the total weight.
 *
 * A `part` column (as `strewn run` writes: 'whole', or the fragment class of a piece) marks files
 * where one sample may have many landing rows, each with its sample's weight: then the weights
 * are scaled so that the samples (each counted once, by the `sample` column) add up to one flight,
 * and the rows of a mode add up to its expected landings per flight, as in the run (parts.ts).
 *
 * @example
 * readLandingsCsv('east_m,north_m\n12.5,-40\n…', frame)
 */
export function readLandingsCsv(text: string, frame: LocalFrame): LandingSet {
  const rows = csvParseRows(text.replace(/^\uFEFF/, ''));
  // Line numbers count every line of the file, blank ones included.
  const lines: number[] = [];
  {
    let line = 1;
    const physical = text.replace(/^\uFEFF/, '').split(/\r?\n/);
    for (const l of physical) {
      if (l.trim() !== '') lines.push(line);
      line++;
    }
  }
  // Blank lines are skipped (a line of empty cells is a row, and fails as one).
  const nonEmpty = rows.filter((r) => !(r.length === 1 && r[0].trim() === ''));
  if (nonEmpty.length === 0) throw new LandingsInputError(0, 'the file is empty; expected a header line and at least 10 landing rows');
  const header = nonEmpty[0].map((h) => h.trim().toLowerCase());
  const col = (name: string) => header.indexOf(name);
  const east = col('east_m');
  const north = col('north_m');
  const lat = col('lat');
  const lon = col('lon');
  const local = east >= 0 && north >= 0;
  if (!local && !(lat >= 0 && lon >= 0)) {
    throw new LandingsInputError(lines[0], `the header '${excerpt(nonEmpty[0].join(','))}' has neither east_m and north_m nor lat and lon columns`);
  }
  const modeCol = col('mode');
  const weightCol = col('weight');
  const sampleCol = col('sample');
  const energyCol = col('impact_energy_j');
  const speedCol = col('impact_speed_m_s');
  const massCol = col('mass_kg');
  const angleCol = col('impact_angle_deg');
  const partCol = col('part');
  const withEnergy = energyCol >= 0 || (speedCol >= 0 && massCol >= 0);
  const body = nonEmpty.slice(1);
  if (body.length < MIN_LANDINGS) {
    throw new LandingsInputError(0, `the file has ${body.length} landing row${body.length === 1 ? '' : 's'}; expected at least ${MIN_LANDINGS}`);
  }
  const n = body.length;
  const set = {
    east: new Float64Array(n),
    north: new Float64Array(n),
    weight: new Float64Array(n),
    mode: new Uint8Array(n),
    sample: new Uint32Array(n),
  };
  const impactEnergy = withEnergy ? new Float64Array(n) : undefined;
  const impactSpeed = speedCol >= 0 ? new Float64Array(n) : undefined;
  const impactAngle = withEnergy && angleCol >= 0 ? new Float64Array(n) : undefined;
  const modeNames: string[] = [];
  const part = partCol >= 0 ? new Uint8Array(n) : undefined;
  const partNames: string[] = [];
  const number = (row: string[], c: number, what: string, line: number): number => {
    const cell = (row[c] ?? '').trim();
    // Plain decimals only: Number() would also read '0x10' as 16, '' as 0 and '1e400' as Infinity.
    const v = DECIMAL.test(cell) ? Number(cell) : NaN;
    if (!Number.isFinite(v)) throw new LandingsInputError(line, `${what} is '${excerpt(cell)}'; expected a decimal number`);
    return v;
  };
  body.forEach((row, i) => {
    const line = lines[i + 1] ?? i + 2;
    if (local) {
      set.east[i] = number(row, east, 'east_m', line);
      set.north[i] = number(row, north, 'north_m', line);
    } else {
      const la = number(row, lat, 'lat', line);
      const lo = number(row, lon, 'lon', line);
      if (Math.abs(la) > 90) throw new LandingsInputError(line, `lat is ${la}; expected −90 to 90 degrees`);
      if (Math.abs(lo) > 180) throw new LandingsInputError(line, `lon is ${lo}; expected −180 to 180 degrees`);
      const [e, nn] = frame.toEastNorth(lo, la);
      set.east[i] = e;
      set.north[i] = nn;
    }
    const distance = Math.hypot(set.east[i], set.north[i]);
    if (distance > MAX_LANDING_DISTANCE) {
      throw new LandingsInputError(line, `the landing is ${Math.round(distance / 1000).toLocaleString('en')} km from the pad; the flat local frame holds only within ${MAX_LANDING_DISTANCE / 1000} km (check the unit and the pad)`);
    }
    const w = weightCol >= 0 ? number(row, weightCol, 'weight', line) : 1;
    if (!(w > 0)) throw new LandingsInputError(line, `weight is ${w}; expected a positive number`);
    set.weight[i] = w;
    const name = modeCol >= 0 ? restoreFormulaText((row[modeCol] ?? '').trim()) || 'nominal' : 'nominal';
    let m = modeNames.indexOf(name);
    if (m < 0) {
      if (modeNames.length === 255) throw new LandingsInputError(line, 'more than 255 different modes');
      m = modeNames.push(name) - 1;
    }
    set.mode[i] = m;
    if (part) {
      const partName = restoreFormulaText((row[partCol] ?? '').trim()) || 'whole';
      let k = partNames.indexOf(partName);
      if (k < 0) {
        if (partNames.length === 255) throw new LandingsInputError(line, 'more than 255 different parts');
        k = partNames.push(partName) - 1;
      }
      part[i] = k;
    }
    if (impactSpeed) {
      impactSpeed[i] = number(row, speedCol, 'impact_speed_m_s', line);
      if (impactSpeed[i] < 0) throw new LandingsInputError(line, `impact_speed_m_s is ${impactSpeed[i]}; expected 0 or more`);
    }
    if (impactEnergy) {
      if (energyCol >= 0) {
        impactEnergy[i] = number(row, energyCol, 'impact_energy_J', line);
      } else {
        const mass = number(row, massCol, 'mass_kg', line);
        if (!(mass > 0)) throw new LandingsInputError(line, `mass_kg is ${mass}; expected a positive mass`);
        impactEnergy[i] = 0.5 * mass * impactSpeed![i] * impactSpeed![i];
      }
      if (impactEnergy[i] < 0) throw new LandingsInputError(line, `impact energy is ${impactEnergy[i]} J; expected 0 or more`);
    }
    if (impactAngle) {
      impactAngle[i] = number(row, angleCol, 'impact_angle_deg', line);
      if (!(impactAngle[i] > 0 && impactAngle[i] <= 90)) {
        throw new LandingsInputError(line, `impact_angle_deg is ${impactAngle[i]}; expected above 0 and at most 90 degrees above the horizontal`);
      }
    }
    const sampleCell = sampleCol >= 0 ? (row[sampleCol] ?? '').trim() : '';
    if (/^\d+$/.test(sampleCell)) {
      const index = Number(sampleCell);
      if (!(index <= MAX_SAMPLE_INDEX)) throw new LandingsInputError(line, `sample is '${excerpt(sampleCell)}'; expected a whole number up to ${MAX_SAMPLE_INDEX.toLocaleString('en')}`);
      set.sample[i] = index;
    } else set.sample[i] = i;
  });
  // Scaled by the largest weight first, so weights near the top of the number range (1e308)
  // do not add up to Infinity.
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, set.weight[i]);
  for (let i = 0; i < n; i++) set.weight[i] /= largest;
  // With parts, a sample's weight counts once for the flight however many rows it has.
  const once = new Uint8Array(n);
  if (part && !(partNames.length === 1 && partNames[0] === 'whole')) {
    const seen = new Set<number>();
    for (let i = 0; i < n; i++) if (!seen.has(set.sample[i])) { seen.add(set.sample[i]); once[i] = 1; }
  } else once.fill(1);
  let total = 0;
  for (let i = 0; i < n; i++) if (once[i] === 1) total += set.weight[i];
  const modeProbability = modeNames.map((_, m) => {
    let s = 0;
    for (let i = 0; i < n; i++) if (set.mode[i] === m && once[i] === 1) s += set.weight[i];
    return s / total;
  });
  // Weights as probabilities, so every figure reads as a share of flights.
  for (let i = 0; i < n; i++) set.weight[i] /= total;
  return {
    ...set,
    modeNames,
    modeProbability,
    ...(impactSpeed ? { impactSpeed } : {}),
    ...(impactEnergy ? { impactEnergy } : {}),
    ...(impactAngle ? { impactAngle } : {}),
    // A file whose every row is a whole object (any run without a breakup) reads as before.
    ...(part && !(partNames.length === 1 && partNames[0] === 'whole') ? { part, partNames, partRadius: partNames.map(() => NaN) } : {}),
  };
}
