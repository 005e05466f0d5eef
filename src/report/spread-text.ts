import { nominalValue } from '../dispersion/draw.js';
import { normalizeDirection } from '../scenario/normalize.js';
import type { Scenario, Spread, UncertaintyName } from '../scenario/types.js';
import { significant, type UnitFormatter } from './format-number.js';

/**
 * Spreads as they are flown. A spread's numbers are offsets added to the nominal value (or, for
 * "8 %", fractions of it), so a sheet that printed "uniform 100 ft to 160 ft" for a launch height
 * of 130 ft would claim heights the run never flies. Every place that shows a spread (check, the
 * sheet, the page) prints the nominal value, the offsets, and the values flown:
 * "130 ft, −30 to +30 ft → 100–160 ft".
 *
 * For a normal spread the values shown are the nominal ± 2 sd (about 95 % of draws), or ± the
 * limit where the spread is cut off there or closer.
 */

const MINUS = '\u2212';

/** The value in the parameter's own unit: "130 ft", "5°", "Cd 0.45", "160 N s". */
function valueIn(name: UncertaintyName, x: number, u: UnitFormatter): string {
  switch (name) {
    case 'wind.speed':
    case 'wind.gust':
    case 'launch.speed':
      return u.speed(x);
    case 'wind.from':
    case 'launch.azimuth':
      return `${significant(normalizeDirection(x), 3)}\u00b0`;
    case 'launch.tilt':
    case 'launch.elevation':
    case 'motor.misalignment':
      return `${significant(x, 3)}\u00b0`;
    case 'vehicle.cg':
      return u.shortLength(x);
    case 'launch.height':
      return u.shortLength(x);
    case 'motor.impulse':
      return u.impulse(x);
    case 'vehicle.mass':
      return u.mass(x);
    case 'vehicle.drag':
      return `Cd ${significant(x, 3)}`;
    case 'recovery.delay':
      return `${significant(x, 3)} s`;
    case 'recovery.rate':
      return u.descentRate(x);
    default:
      // A spread added later without its own wording here: the SI number, never nothing.
      return significant(x, 3);
  }
}

/** An offset with its sign: "+30 ft", "−30 ft", "+8 %". */
function signed(text: string, x: number): string {
  const bare = text.replace(/^[-\u2212]/, '');
  return x > 0 ? `+${bare}` : x < 0 ? `${MINUS}${bare}` : bare;
}

/** "100 ft" and "160 ft" as "100–160 ft"; different units (or "Cd") stay whole: "Cd 0.40 to 0.56". */
function span(a: string, b: string, sep = '\u2013'): string {
  const unitA = /^(\S+)\s(.+)$/.exec(a);
  const unitB = /^(\S+)\s(.+)$/.exec(b);
  if (unitA && unitB && unitA[2] === unitB[2] && /^[-\u2212+\d]/.test(a)) return `${unitA[1]}${sep}${unitB[1]} ${unitA[2]}`;
  if (unitA && unitB && unitA[1] === 'Cd' && unitB[1] === 'Cd') return `Cd ${unitA[2]}${sep}${unitB[2]}`;
  return `${a}${sep === '\u2013' ? ' to ' : sep}${b}`;
}

function offsetText(name: UncertaintyName, x: number, spread: Spread, u: UnitFormatter): string {
  if (spread.relative) return signed(`${significant(Math.abs(x) * 100, 3)} %`, x);
  if (name === 'wind.from' || name === 'launch.azimuth') return signed(`${significant(Math.abs(x), 3)}\u00b0`, x);
  if (name === 'vehicle.drag') return signed(significant(Math.abs(x), 3), x);
  return signed(valueIn(name, Math.abs(x), u), x);
}

/** Offsets from the nominal at the two ends of what is shown. */
function ends(spread: Spread): { lo: number; hi: number; note: string } {
  if (spread.kind === 'uniform') return { lo: spread.lo, hi: spread.hi, note: '' };
  const k = spread.limit !== undefined && spread.limit <= 2 ? spread.limit : 2;
  const note = spread.limit !== undefined && spread.limit <= 2 ? `, cut at ${significant(spread.limit, 3)} sd` : `${spread.limit !== undefined ? `, cut at ${significant(spread.limit, 3)} sd` : ''}; ±2 sd`;
  return { lo: -k * spread.sd, hi: k * spread.sd, note };
}

/** What the nominal is called where a spread acts on more than one value. */
function nominalWords(sc: Scenario, name: UncertaintyName, u: UnitFormatter, compact: boolean): string | undefined {
  if (name === 'recovery.delay' && sc.recovery.length > 1) return compact ? "each stage's delay" : `each stage's delay (${sc.recovery.map((s) => `${s.name} ${significant(s.delay, 3)} s`).join(', ')})`;
  if (name === 'recovery.rate' && sc.recovery.length > 0) {
    const last = sc.recovery[sc.recovery.length - 1]!;
    return `${last.name} ${u.descentRate(nominalValue(sc, name))}${compact ? '' : " at sea level (every stage's rate scales alike)"}`;
  }
  if (name === 'vehicle.drag' && sc.vehicle.drag.cd.length > 1) return `Cd ${significant(sc.vehicle.drag.cd[0]!, 3)} at Mach ${significant(sc.vehicle.drag.mach[0]!, 2)}${compact ? '' : ' (the whole table scales alike)'}`;
  return undefined;
}

/**
 * One spread as flown: "130 ft, −30 to +30 ft → 100–160 ft", "250°, sd 12°; ±2 sd → 226°–274°",
 * "1.2 kg, sd 2 %; ±2 sd → 1.15–1.25 kg".
 */
export function spreadAsFlown(sc: Scenario, name: UncertaintyName, spread: Spread, u: UnitFormatter, options: { compact?: boolean } = {}): string {
  const compact = options.compact === true;
  const nominal = nominalValue(sc, name);
  const scale = spread.relative ? Math.abs(nominal) : 1;
  const ends_ = ends(spread);
  const { lo, hi } = ends_;
  // Compact (the sheet): the ±2 sd rule is said once for the whole list, not on every spread.
  const note = compact ? '' : ends_.note;
  const given = spread.kind === 'uniform' ? span(offsetText(name, spread.lo, spread, u), offsetText(name, spread.hi, spread, u), ' to ') : `sd ${offsetText(name, spread.sd, spread, u).replace(/^\+/, '')}`;
  const nominalText = nominalWords(sc, name, u, compact) ?? valueIn(name, nominal, u);
  if (name === 'recovery.delay' && sc.recovery.length > 1 && compact) return `${nominalText}, ${given}`;
  if (name === 'recovery.delay' && sc.recovery.length > 1) {
    const flown = sc.recovery.map((s) => `${s.name} ${span(valueIn(name, Math.max(0, s.delay + lo * scale), u), valueIn(name, Math.max(0, s.delay + hi * scale), u))}`).join(', ');
    return `${nominalText}, ${given}${note} → ${flown}`;
  }
  const direction = name === 'wind.from' || name === 'launch.azimuth';
  const flown = direction && (hi - lo) * scale >= 360 ? 'any direction' : span(valueIn(name, nominal + lo * scale, u), valueIn(name, nominal + hi * scale, u));
  return `${nominalText}, ${given}${note} → ${flown}`;
}

/** Every spread of the scenario as flown, in the draw order. */
export function spreadsAsFlown(sc: Scenario, u: UnitFormatter): { name: UncertaintyName; text: string }[] {
  return (Object.keys(sc.uncertainty) as UncertaintyName[]).map((name) => ({ name, text: spreadAsFlown(sc, name, sc.uncertainty[name]!, u) }));
}
