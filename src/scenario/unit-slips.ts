import { isRecord } from './cross-checks.js';
import { convertQuantity, formatNumber, type Dimension } from './units.js';
import type { Issue, VehicleKind } from './types.js';

/**
 * Likely unit slips. Plain numbers are SI, and that rule stays; but `"diameter": 4` on a rocket
 * is 4 m, which no hobby rocket is, and the writer almost certainly meant 4 in. For the fields
 * people most often write without a unit, each vehicle kind has a range of common practice; a
 * value outside it is a warning that names the value, the range and, when the value was a plain
 * number, the units in which it would fall inside the range ("did you mean '4 in'?").
 *
 * The ranges are common practice, no source: hobby and high-power rockets from about 13 mm to
 * 300 mm across and a few grams to some tens of kilograms; display shells from about 2 in (50 mm)
 * to 12 in (300 mm); camera drones a few hundred grams to some tens of kilograms, flown below
 * about 120 m (400 ft) above ground. They are deliberately wide: a warning that fires on
 * ordinary scenarios would teach people to ignore it.
 *
 * Only warnings: the scenario still runs exactly as written.
 */

interface Plausible {
  /** Dotted path in the scenario file; `[]` marks each entry of a list. */
  path: string;
  dimension: Dimension;
  /** What the range is for, e.g. "a rocket's diameter". */
  what: string;
  /** Common-practice range in SI. */
  lo: number;
  hi: number;
  /** Unit the range is shown in (scenario-format spelling). */
  shownIn: string;
  /** A typical value in SI: the guesses are offered nearest to it first. */
  typical: number;
  /** Units a plain number is likely to have been meant in. */
  likely: string[];
  /**
   * 'always': warn whenever the value is outside the range. 'slip': only when a plain number
   * would fall inside in a likely unit (fields whose out-of-range values another warning covers).
   */
  when: 'always' | 'slip';
}

const MASS_UNITS = ['g', 'lb', 'oz'];
// Diameters are written in mm or in; cm is rare enough that suggesting it would mostly mislead.
const SHORT_LENGTH_UNITS = ['mm', 'in'];
const FAST_SPEED_UNITS = ['ft/s', 'km/h', 'mph'];
const WIND_SPEED_UNITS = ['mph', 'km/h', 'kn'];

const COMMON: Plausible[] = [
  { path: 'weather.wind.speed', dimension: 'speed', what: 'a wind at a launch', lo: 0, hi: 25, typical: 6.2, shownIn: 'm/s', likely: WIND_SPEED_UNITS, when: 'slip' },
  { path: 'weather.wind.gust', dimension: 'speed', what: 'a gust at a launch', lo: 0, hi: 30, typical: 7.5, shownIn: 'm/s', likely: WIND_SPEED_UNITS, when: 'slip' },
  { path: 'recovery[].descentRate', dimension: 'speed', what: 'a descent rate', lo: 3, hi: 40, typical: 6, shownIn: 'm/s', likely: ['ft/s'], when: 'slip' },
  { path: 'recovery[].diameter', dimension: 'length', what: 'a parachute diameter', lo: 0.1, hi: 10, typical: 1, shownIn: 'm', likely: ['in', 'cm', 'ft'], when: 'always' },
];

const BY_KIND: Record<VehicleKind, Plausible[]> = {
  rocket: [
    { path: 'vehicle.mass', dimension: 'mass', what: "a rocket's mass without propellant", lo: 0.01, hi: 50, typical: 1, shownIn: 'kg', likely: MASS_UNITS, when: 'always' },
    { path: 'vehicle.diameter', dimension: 'length', what: "a rocket's diameter", lo: 0.01, hi: 0.4, typical: 0.063, shownIn: 'mm', likely: SHORT_LENGTH_UNITS, when: 'always' },
    { path: 'vehicle.motor.propellantMass', dimension: 'mass', what: "a hobby motor's propellant", lo: 0.001, hi: 25, typical: 0.16, shownIn: 'kg', likely: MASS_UNITS, when: 'always' },
    { path: 'launch.rail', dimension: 'length', what: 'a launch rail or rod', lo: 0.3, hi: 20, typical: 2.4, shownIn: 'm', likely: ['in', 'ft'], when: 'always' },
    { path: 'recovery[].altitude', dimension: 'length', what: 'a deployment altitude', lo: 10, hi: 2000, typical: 140, shownIn: 'm', likely: ['ft'], when: 'always' },
  ],
  projectile: [
    { path: 'vehicle.mass', dimension: 'mass', what: "a display shell's mass", lo: 0.01, hi: 30, typical: 0.55, shownIn: 'kg', likely: MASS_UNITS, when: 'always' },
    { path: 'vehicle.diameter', dimension: 'length', what: "a display shell's diameter", lo: 0.02, hi: 0.4, typical: 0.089, shownIn: 'mm', likely: SHORT_LENGTH_UNITS, when: 'always' },
    { path: 'launch.speed', dimension: 'speed', what: "a shell's launch speed", lo: 10, hi: 250, typical: 50, shownIn: 'm/s', likely: FAST_SPEED_UNITS, when: 'always' },
    { path: 'launch.height', dimension: 'length', what: 'a launch height above the pad', lo: 0, hi: 50, typical: 1, shownIn: 'm', likely: ['in', 'ft'], when: 'always' },
  ],
  release: [
    { path: 'vehicle.mass', dimension: 'mass', what: "a drone's mass", lo: 0.05, hi: 30, typical: 1.2, shownIn: 'kg', likely: MASS_UNITS, when: 'always' },
    { path: 'vehicle.diameter', dimension: 'length', what: "a drone's reference diameter", lo: 0.05, hi: 2, typical: 0.32, shownIn: 'm', likely: SHORT_LENGTH_UNITS, when: 'always' },
    { path: 'launch.height', dimension: 'length', what: 'a drone flight height', lo: 1, hi: 150, typical: 60, shownIn: 'm', likely: ['ft'], when: 'always' },
    { path: 'launch.speed', dimension: 'speed', what: "a drone's ground speed", lo: 0, hi: 40, typical: 10, shownIn: 'm/s', likely: ['km/h', 'mph', 'kn', 'ft/s'], when: 'always' },
  ],
};

/** The table for a kind, for the format reference and the tests. */
export function plausibleRanges(kind: VehicleKind): readonly Plausible[] {
  return [...BY_KIND[kind], ...COMMON];
}

/**
 * Warnings for values outside common practice, with the likely unit of a plain number. `others`
 * are the warnings already found: a slip on a field that already has one (a wind above the
 * launch limit, a descent rate above 40 m/s) is added to that warning rather than repeated.
 */
export function withUnitSlipWarnings(raw: unknown, kind: VehicleKind, others: Issue[]): Issue[] {
  if (!isRecord(raw)) return others;
  const out = others.map((w) => ({ ...w }));
  for (const rule of plausibleRanges(kind)) {
    for (const { path, value } of valuesAt(raw, rule.path)) {
      const found = judge(rule, path, value);
      if (found === undefined) continue;
      const existing = rule.when === 'slip' ? out.find((w) => w.path === path) : undefined;
      if (existing !== undefined) existing.message = `${existing.message}; ${found.advice}`;
      else out.push(found.issue);
    }
  }
  return out;
}

/** The unit-slip warnings alone. */
export function unitSlipWarnings(raw: unknown, kind: VehicleKind): Issue[] {
  return withUnitSlipWarnings(raw, kind, []);
}

function judge(rule: Plausible, path: string, written: unknown): { issue: Issue; advice: string } | undefined {
  const q = convertQuantity(written, rule.dimension);
  if (!q.ok || (q.value >= rule.lo && q.value <= rule.hi)) return undefined;
  const guesses =
    typeof written === 'number'
      ? rule.likely.filter((unit) => {
          const c = convertQuantity(`${written} ${unit}`, rule.dimension);
          return c.ok && c.value >= rule.lo && c.value <= rule.hi;
        })
          .sort((a, b) => distanceFromTypical(rule, `${written} ${a}`) - distanceFromTypical(rule, `${written} ${b}`))
      : [];
  if (rule.when === 'slip' && guesses.length === 0) return undefined;
  const range = `${shown(rule.lo, rule)}–${shown(rule.hi, rule)} ${rule.shownIn}`;
  const advice =
    guesses.length > 0
      ? `a plain number is in ${siName(rule.dimension)}: did you mean ${guesses.map((u) => `'${written} ${u}'`).join(' or ')}?`
      : 'check the value and its unit';
  return { issue: { path, message: `${q.shown} is outside the ${range} common for ${rule.what}; ${advice}` }, advice };
}

function distanceFromTypical(rule: Plausible, text: string): number {
  const c = convertQuantity(text, rule.dimension);
  return c.ok ? Math.abs(Math.log(Math.max(c.value, 1e-9) / rule.typical)) : Infinity;
}

function shown(si: number, rule: Plausible): string {
  const one = convertQuantity(`1 ${rule.shownIn}`, rule.dimension);
  return formatNumber(one.ok ? si / one.value : si);
}

function siName(dimension: Dimension): string {
  return ({ mass: 'kilograms', length: 'metres', speed: 'm/s' } as Partial<Record<Dimension, string>>)[dimension] ?? 'SI units';
}

/** The values at a dotted path; `a[].b` visits every entry of the list `a`. */
function valuesAt(root: Record<string, unknown>, path: string): Array<{ path: string; value: unknown }> {
  let here: Array<{ path: string; value: unknown }> = [{ path: '', value: root }];
  for (const part of path.split('.')) {
    const list = part.endsWith('[]');
    const key = list ? part.slice(0, -2) : part;
    const next: Array<{ path: string; value: unknown }> = [];
    for (const h of here) {
      if (!isRecord(h.value) || !Object.prototype.hasOwnProperty.call(h.value, key)) continue;
      const value = h.value[key];
      const at = h.path === '' ? key : `${h.path}.${key}`;
      if (!list) next.push({ path: at, value });
      else if (Array.isArray(value)) value.forEach((v, i) => next.push({ path: `${at}[${i}]`, value: v }));
    }
    here = next;
  }
  return here.filter((h) => h.value !== undefined);
}
