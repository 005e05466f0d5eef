import { EARTH_RADIUS_GEOPOTENTIAL, G0, R_AIR } from '../physics/constants.js';
import { gridIndex, type Grib2Field, type LatLonGrid } from './grib2.js';

/**
 * The wind, temperature and pressure a forecast gives over the pad: the fields of a GRIB2 file
 * interpolated bilinearly in latitude/longitude to the pad and linearly in time between the two
 * forecast steps around the chosen valid time, then stacked by height.
 *
 * Fields read (WMO GRIB2 code tables 4.1/4.2, discipline 0):
 *   geopotential height (category 3, parameter 5), temperature (0, 0), u and v wind (2, 2 and 2, 3)
 *   on isobaric surfaces (table 4.5 type 100); u and v at 10 m above ground (type 103, value 10);
 *   surface pressure (3, 0 on type 1) and the model's ground height (3, 5 on type 1) when present.
 *
 * Geopotential height is turned into geometric height with the 1976 standard atmosphere's Earth
 * radius (z = r H / (r − H)); the heights are then taken above the pad's elevation. Isobaric levels
 * at or below the pad (the model extrapolates them under its ground) are left out of the wind
 * rows but still used to find the pad's temperature and pressure.
 *
 * @example
 *   const p = forecastProfile(readGrib2(bytes), { lat: 52.1, lon: 5.2, elevation: 3 }, Date.parse('2011-01-15T12:00Z'));
 *   p.nominal.wind; // [{ altitude, speed, from }, ...] ready for weather.wind.profile
 */

export interface Pad {
  lat: number;
  lon: number;
  elevation: number;
}

export interface LevelValues {
  /** Pa. */
  pressure: number;
  /** Geometric height above sea level, m. */
  height: number;
  /** K. */
  temperature: number;
  /** m/s, toward east and north. */
  u: number;
  v: number;
}

export interface WindRow {
  altitude: number;
  speed: number;
  from: number;
}

export interface AirRow {
  altitude: number;
  temperature: number;
  pressure: number;
}

/** One profile over the pad (one ensemble member, or the deterministic forecast). */
export interface PadProfile {
  member?: number;
  /** Every isobaric level, lowest pressure last removed; sorted by height, lowest first. */
  levels: LevelValues[];
  /** 10 m wind from the file, if present. */
  wind10?: { u: number; v: number };
  /** Surface pressure (Pa) and model ground height (m) at the pad, if present. */
  surfacePressure?: number;
  modelGround?: number;
  /** Rows for weather.wind.profile: 10 m wind (if present) and every level above the pad. */
  wind: WindRow[];
  /** Temperature and pressure by altitude above the pad (altitude 0 = the pad). */
  air: AirRow[];
}

export interface ForecastProfile {
  /** The valid time asked for, ms UTC. */
  time: number;
  /** The forecast steps (valid times, ms UTC) interpolated between; one when the time is a step. */
  steps: number[];
  /** Reference (analysis) time of the run, ms UTC. */
  referenceTime: number;
  /** Ensemble members found (empty for a deterministic file). */
  members: number[];
  /** The profile the run uses: the one forecast, or the ensemble mean (u, v, height, T averaged). */
  nominal: PadProfile;
  /** One profile per member (only with two or more members). */
  perMember: PadProfile[];
  /** Valid times the file holds, ms UTC, sorted. */
  validTimes: number[];
}

export class ForecastError extends Error {}

const KIND = {
  height: (f: Grib2Field) => f.discipline === 0 && f.category === 3 && f.parameter === 5,
  temperature: (f: Grib2Field) => f.discipline === 0 && f.category === 0 && f.parameter === 0,
  u: (f: Grib2Field) => f.discipline === 0 && f.category === 2 && f.parameter === 2,
  v: (f: Grib2Field) => f.discipline === 0 && f.category === 2 && f.parameter === 3,
  pressure: (f: Grib2Field) => f.discipline === 0 && f.category === 3 && f.parameter === 0,
};
const ISOBARIC = 100;
const GROUND = 1;
const ABOVE_GROUND = 103;

/** Sorted distinct valid times of the fields a profile needs. */
export function validTimes(fields: readonly Grib2Field[]): number[] {
  const times = new Set<number>();
  for (const f of fields) if (KIND.u(f) && f.surface.type === ISOBARIC && Number.isFinite(f.validTime)) times.add(f.validTime);
  return [...times].sort((a, b) => a - b);
}

/**
 * The profile over `pad` at valid time `time` (ms UTC). Throws ForecastError when the file has no
 * wind on pressure levels, the time lies outside the file's steps, or the pad is off the grid.
 */
export function forecastProfile(fields: readonly Grib2Field[], pad: Pad, time: number): ForecastProfile {
  const times = validTimes(fields);
  if (times.length === 0) throw new ForecastError('the file holds no u/v wind on pressure levels (GRIB2 discipline 0, category 2, parameters 2 and 3, surface type 100)');
  const iso = (t: number) => new Date(t).toISOString().replace(':00.000Z', 'Z');
  if (time < times[0] || time > times[times.length - 1]) {
    const range = times.length === 1 ? `only ${iso(times[0])}` : `${iso(times[0])} to ${iso(times[times.length - 1])}`;
    throw new ForecastError(`the time ${iso(time)} is outside the forecast steps in the file (${range})`);
  }
  let k = times.findIndex((t) => t >= time);
  const steps = times[k] === time ? [times[k]] : [times[k - 1], times[k]];
  const weight = steps.length === 1 ? 0 : (time - steps[0]) / (steps[1] - steps[0]);
  const members = [...new Set(fields.filter((f) => f.member !== undefined && f.validTime === steps[0] && KIND.u(f)).map((f) => f.member!))].sort((a, b) => a - b);
  const memberList: (number | undefined)[] = members.length >= 2 ? members : [members[0]];
  const perMember = memberList.map((m) => {
    const a = rawAt(fields, pad, steps[0], m);
    const b = steps.length === 1 ? a : rawAt(fields, pad, steps[1], m);
    return finish(blend(a, b, weight), pad, m);
  });
  const referenceTime = fields.find((f) => f.validTime === steps[0] && KIND.u(f))!.referenceTime;
  const nominal = perMember.length === 1 ? perMember[0] : finish(mean(perMember.map(raw)), pad, undefined);

  return { time, steps, referenceTime, members: members.length >= 2 ? members : [], nominal, perMember: perMember.length >= 2 ? perMember : [], validTimes: times };
}

/** Values at the pad, before heights are made relative to it. */
interface Raw {
  levels: LevelValues[];
  wind10?: { u: number; v: number };
  surfacePressure?: number;
  modelGround?: number;
}

function raw(p: PadProfile): Raw {
  const out: Raw = { levels: p.levels };
  if (p.wind10) out.wind10 = p.wind10;
  if (p.surfacePressure !== undefined) out.surfacePressure = p.surfacePressure;
  if (p.modelGround !== undefined) out.modelGround = p.modelGround;
  return out;
}

function rawAt(fields: readonly Grib2Field[], pad: Pad, time: number, member: number | undefined): Raw {
  const at = fields.filter((f) => f.validTime === time && f.member === member);
  const pick = (kind: (f: Grib2Field) => boolean, type: number, value?: number) =>
    at.find((f) => kind(f) && f.surface.type === type && (value === undefined || Math.abs(f.surface.value - value) < 1e-6));
  const pressures = [...new Set(at.filter((f) => f.surface.type === ISOBARIC && KIND.u(f)).map((f) => f.surface.value))];
  const levels: LevelValues[] = [];
  for (const p of pressures) {
    const h = pick(KIND.height, ISOBARIC, p), t = pick(KIND.temperature, ISOBARIC, p), u = pick(KIND.u, ISOBARIC, p), v = pick(KIND.v, ISOBARIC, p);
    // A level needs all four fields; one without height or temperature cannot be placed.
    if (!h || !t || !u || !v) continue;
    levels.push({ pressure: p, height: geometricHeight(valueAt(h, pad)), temperature: valueAt(t, pad), u: valueAt(u, pad), v: valueAt(v, pad) });
  }
  if (levels.length < 2) throw new ForecastError(`at ${new Date(time).toISOString()} the file has fewer than two pressure levels with height, temperature and u/v wind`);
  levels.sort((a, b) => b.pressure - a.pressure);
  const out: Raw = { levels };
  const u10 = pick(KIND.u, ABOVE_GROUND, 10), v10 = pick(KIND.v, ABOVE_GROUND, 10);
  if (u10 && v10) out.wind10 = { u: valueAt(u10, pad), v: valueAt(v10, pad) };
  const sp = pick(KIND.pressure, GROUND);
  if (sp) out.surfacePressure = valueAt(sp, pad);
  const orog = pick(KIND.height, GROUND);
  if (orog) out.modelGround = valueAt(orog, pad);
  return out;
}

function blend(a: Raw, b: Raw, w: number): Raw {
  if (w === 0) return a;
  const mix = (x: number, y: number) => x + w * (y - x);
  const levels: LevelValues[] = [];
  for (const la of a.levels) {
    const lb = b.levels.find((l) => l.pressure === la.pressure);
    if (!lb) continue;
    levels.push({ pressure: la.pressure, height: mix(la.height, lb.height), temperature: mix(la.temperature, lb.temperature), u: mix(la.u, lb.u), v: mix(la.v, lb.v) });
  }
  const out: Raw = { levels };
  if (a.wind10 && b.wind10) out.wind10 = { u: mix(a.wind10.u, b.wind10.u), v: mix(a.wind10.v, b.wind10.v) };
  if (a.surfacePressure !== undefined && b.surfacePressure !== undefined) out.surfacePressure = mix(a.surfacePressure, b.surfacePressure);
  if (a.modelGround !== undefined && b.modelGround !== undefined) out.modelGround = mix(a.modelGround, b.modelGround);
  return out;
}

/** The ensemble mean: u, v, height and temperature averaged level by level. */
function mean(list: Raw[]): Raw {
  const first = list[0];
  const levels = first.levels
    .filter((l) => list.every((r) => r.levels.some((x) => x.pressure === l.pressure)))
    .map((l) => {
      const all = list.map((r) => r.levels.find((x) => x.pressure === l.pressure)!);
      const avg = (key: keyof LevelValues) => all.reduce((s, x) => s + x[key], 0) / all.length;
      return { pressure: l.pressure, height: avg('height'), temperature: avg('temperature'), u: avg('u'), v: avg('v') };
    });
  const out: Raw = { levels };
  if (list.every((r) => r.wind10)) out.wind10 = { u: list.reduce((s, r) => s + r.wind10!.u, 0) / list.length, v: list.reduce((s, r) => s + r.wind10!.v, 0) / list.length };
  if (list.every((r) => r.surfacePressure !== undefined)) out.surfacePressure = list.reduce((s, r) => s + r.surfacePressure!, 0) / list.length;
  if (list.every((r) => r.modelGround !== undefined)) out.modelGround = list.reduce((s, r) => s + r.modelGround!, 0) / list.length;
  return out;
}

function finish(r: Raw, pad: Pad, member: number | undefined): PadProfile {
  const levels = [...r.levels].sort((a, b) => a.height - b.height);
  const wind: WindRow[] = [];
  if (r.wind10) wind.push({ altitude: 10, ...speedFrom(r.wind10.u, r.wind10.v) });
  for (const l of levels) {
    const altitude = l.height - pad.elevation;
    // Levels under the pad are the model's extrapolation below its ground, and so are levels at a
    // higher pressure than the surface.
    if (altitude <= (wind.length > 0 ? wind[wind.length - 1].altitude : 0)) continue;
    if (r.surfacePressure !== undefined && l.pressure >= r.surfacePressure) continue;
    wind.push({ altitude: round(altitude, 1), ...speedFrom(l.u, l.v) });
  }
  const air: AirRow[] = [{ altitude: 0, ...padAir(levels, pad.elevation) }];
  for (const l of levels) {
    const altitude = l.height - pad.elevation;
    if (altitude > 0) air.push({ altitude: round(altitude, 1), temperature: round(l.temperature, 2), pressure: round(l.pressure, 0) });
  }
  const out: PadProfile = { levels, wind, air };
  if (member !== undefined) out.member = member;
  if (r.wind10) out.wind10 = r.wind10;
  if (r.surfacePressure !== undefined) out.surfacePressure = r.surfacePressure;
  if (r.modelGround !== undefined) out.modelGround = r.modelGround;
  return out;
}

/**
 * Temperature and pressure at the pad's elevation: temperature linear in height between the two
 * levels around it and pressure from the hydrostatic equation with that linear temperature
 * (integrated exactly, with g0 over geometric height: within 0.1 % below 3 km); below the lowest
 * level the lowest layer's lapse rate is carried down.
 */
export function padAir(levels: readonly LevelValues[], elevation: number): { temperature: number; pressure: number } {
  let i = 0;
  while (i < levels.length - 2 && levels[i + 1].height < elevation) i++;
  const a = levels[i], b = levels[i + 1];
  const lapse = (b.temperature - a.temperature) / (b.height - a.height);
  const t = a.temperature + lapse * (elevation - a.height);
  const dz = elevation - a.height;
  const p = Math.abs(lapse) < 1e-9 ? a.pressure * Math.exp((-G0 * dz) / (R_AIR * a.temperature)) : a.pressure * Math.pow(t / a.temperature, -G0 / (R_AIR * lapse));
  return { temperature: round(t, 2), pressure: round(p, 0) };
}

/** Geometric height (m) of a geopotential height (gpm), 1976 standard atmosphere radius. */
export function geometricHeight(geopotential: number): number {
  return (EARTH_RADIUS_GEOPOTENTIAL * geopotential) / (EARTH_RADIUS_GEOPOTENTIAL - geopotential);
}

/** Speed and meteorological direction (where the wind blows FROM, degrees from north). */
export function speedFrom(u: number, v: number): { speed: number; from: number } {
  const speed = Math.hypot(u, v);
  let from = (Math.atan2(-u, -v) * 180) / Math.PI;
  if (from < 0) from += 360;
  return { speed: round(speed, 2), from: speed === 0 ? 0 : round(from, 1) % 360 || 0 };
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

/**
 * Bilinear interpolation of a field at (lat, lon). Longitudes wrap on a grid that goes round the
 * Earth; on a regional grid a pad outside it is an error.
 */
export function valueAt(field: Grib2Field, pad: { lat: number; lon: number }): number {
  const g = field.grid;
  if ((g.scanMode & 0x30) !== 0) throw new ForecastError(`field ${field.index + 1}: scanning mode ${g.scanMode} (columns first or alternating rows) is not supported`);
  const values = cachedValues(field);
  const { x, y, wraps } = fractionalIndex(g, pad.lat, pad.lon);
  const i0 = Math.floor(x), j0 = Math.floor(y);
  const fx = x - i0, fy = y - j0;
  const col = (i: number) => (wraps ? ((i % g.ni) + g.ni) % g.ni : i);
  const at = (i: number, j: number) => values[gridIndex(g, col(i), j)];
  const j1 = fy === 0 ? j0 : j0 + 1;
  const i1 = fx === 0 ? i0 : i0 + 1;
  const value = (1 - fy) * ((1 - fx) * at(i0, j0) + fx * at(i1, j0)) + fy * ((1 - fx) * at(i0, j1) + fx * at(i1, j1));
  if (!Number.isFinite(value)) throw new ForecastError(`field ${field.index + 1} has no value at the grid points around the pad (${pad.lat}, ${pad.lon})`);
  return value;
}

function fractionalIndex(g: LatLonGrid, lat: number, lon: number): { x: number; y: number; wraps: boolean } {
  const jPositive = (g.scanMode & 0x40) !== 0;
  const iNegative = (g.scanMode & 0x80) !== 0;
  const y = jPositive ? (lat - g.la1) / g.dj : (g.la1 - lat) / g.dj;
  const wraps = Math.abs(g.ni * g.di - 360) < 1e-6;
  let dLon = iNegative ? g.lo1 - lon : lon - g.lo1;
  dLon = ((dLon % 360) + 360) % 360;
  const x = dLon / g.di;
  const eps = 1e-9;
  if (y < -eps || y > g.nj - 1 + eps || (!wraps && x > g.ni - 1 + eps)) {
    throw new ForecastError(`the pad (${lat}, ${lon}) lies outside the forecast grid (${g.la1}..${g.la2} N, ${g.lo1}..${g.lo2} E)`);
  }
  return { x: Math.min(Math.max(x, 0), wraps ? x : g.ni - 1), y: Math.min(Math.max(y, 0), g.nj - 1), wraps };
}

const cache = new WeakMap<Grib2Field, Float64Array>();
function cachedValues(field: Grib2Field): Float64Array {
  let v = cache.get(field);
  if (!v) {
    v = field.values();
    cache.set(field, v);
  }
  return v;
}

/**
 * How an ensemble (or a set of profiles) becomes the run's wind spread: for each member the mean
 * wind vector of the layer from the ground to `layerTop` above the pad (the layer a descent under
 * a canopy spends most of its time in) is taken; `wind.speed` gets a normal spread whose sd is the
 * members' speed sd relative to the mean member speed, `wind.from` one whose sd is the circular sd
 * (sqrt(−2 ln R̄), in degrees) of the members' directions.
 */
export function memberSpread(profiles: readonly PadProfile[], layerTop = 1000): { speedSd: number; fromSd: number; layerTop: number } | undefined {
  if (profiles.length < 2) return undefined;
  const vectors = profiles.map((p) => layerMean(p.wind, layerTop));
  const speeds = vectors.map(([u, v]) => Math.hypot(u, v));
  const meanSpeed = speeds.reduce((s, x) => s + x, 0) / speeds.length;
  const sd = Math.sqrt(speeds.reduce((s, x) => s + (x - meanSpeed) ** 2, 0) / (speeds.length - 1));
  let c = 0, s = 0;
  for (const [u, v] of vectors) {
    const speed = Math.hypot(u, v);
    if (speed === 0) continue;
    c += u / speed;
    s += v / speed;
  }
  const rBar = Math.hypot(c, s) / vectors.length;
  const fromSd = rBar >= 1 ? 0 : (Math.sqrt(-2 * Math.log(Math.max(rBar, 1e-12))) * 180) / Math.PI;
  return { speedSd: meanSpeed > 0 ? round(sd / meanSpeed, 4) : 0, fromSd: round(fromSd, 2), layerTop };
}

/** Height-weighted mean wind vector (u, v) of the rows from 0 to `top` (trapezoids on the rows). */
export function layerMean(rows: readonly WindRow[], top: number): [number, number] {
  const vec = (r: WindRow): [number, number] => [-r.speed * Math.sin((r.from * Math.PI) / 180), -r.speed * Math.cos((r.from * Math.PI) / 180)];
  let su = 0, sv = 0, span = 0;
  let prevAlt = 0;
  let prev = vec(rows[0]);
  for (const r of rows) {
    const here = vec(r);
    const alt = Math.min(r.altitude, top);
    if (alt > prevAlt) {
      su += ((prev[0] + here[0]) / 2) * (alt - prevAlt);
      sv += ((prev[1] + here[1]) / 2) * (alt - prevAlt);
      span += alt - prevAlt;
    }
    prev = here;
    prevAlt = Math.max(prevAlt, alt);
    if (r.altitude >= top) break;
  }
  if (span === 0) return prev;
  return [su / span, sv / span];
}
