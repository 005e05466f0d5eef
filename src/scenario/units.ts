import { ScenarioError, describeValue } from './errors.js';

/**
 * Quantities in a scenario file: a plain number already in SI (degrees for angles, kelvin for
 * temperatures, a fraction for `fraction`), or a string "<number> <unit>". Conversion factors are
 * the exact definitions (international foot and pound, nautical mile), so a round trip through any
 * unit gives the same double on every machine.
 */
export type Dimension =
  | 'length'
  | 'speed'
  | 'mass'
  | 'force'
  | 'impulse'
  | 'pressure'
  | 'temperature'
  | 'area'
  | 'energy'
  | 'angle'
  | 'time'
  | 'fraction'
  | 'number'
  | 'rate'
  | 'inertia';

const FOOT = 0.3048;
const INCH = 0.0254;
const MILE = 1609.344;
const POUND = 0.45359237;
const POUND_FORCE = 4.4482216152605;

type ToSI = (x: number) => number;
const scale =
  (factor: number): ToSI =>
  (x) =>
    x * factor;

interface DimensionInfo {
  /** "a length", used in "expected a length (m, km, …)". */
  label: string;
  /** The SI unit that plain numbers are in, shown after converted values; '' for fractions. */
  si: string;
  /** Units shown to the user when they got one wrong; aliases are accepted but not listed. */
  listed: string[];
  units: Record<string, ToSI>;
}

/** Area units are the squares of these length units, spelled m2, m² or m^2. */
const AREA_BASES: Record<string, number> = { m: 1, cm: 0.01, mm: 0.001, ft: FOOT, in: INCH };

function areaUnits(): Record<string, ToSI> {
  const units: Record<string, ToSI> = {};
  for (const [name, length] of Object.entries(AREA_BASES)) {
    for (const suffix of ['2', '²', '^2']) units[`${name}${suffix}`] = scale(length * length);
  }
  return units;
}

/** Moment-of-inertia units: a mass unit times a squared length unit ("kg m2", "lb in²", "g cm^2"). */
function inertiaUnits(): Record<string, ToSI> {
  const masses: Record<string, number> = { kg: 1, g: 0.001, lb: POUND, oz: POUND / 16 };
  const units: Record<string, ToSI> = {};
  for (const [m, mf] of Object.entries(masses)) {
    for (const [l, lf] of Object.entries(AREA_BASES)) {
      for (const suffix of ['2', '²', '^2']) units[`${m} ${l}${suffix}`] = scale(mf * lf * lf);
    }
  }
  return units;
}

const DIMENSIONS: Record<Dimension, DimensionInfo> = {
  length: {
    label: 'a length',
    si: 'm',
    listed: ['m', 'km', 'cm', 'mm', 'ft', 'in', 'mi'],
    units: {
      m: scale(1),
      km: scale(1000),
      cm: scale(0.01),
      mm: scale(0.001),
      ft: scale(FOOT),
      in: scale(INCH),
      mi: scale(MILE),
    },
  },
  speed: {
    label: 'a speed',
    si: 'm/s',
    listed: ['m/s', 'km/h', 'mph', 'kn', 'ft/s'],
    units: {
      'm/s': scale(1),
      'km/h': (x) => x / 3.6,
      mph: (x) => (x * MILE) / 3600,
      kn: (x) => (x * 1852) / 3600,
      'ft/s': scale(FOOT),
    },
  },
  mass: {
    label: 'a mass',
    si: 'kg',
    listed: ['kg', 'g', 'lb', 'oz'],
    units: { kg: scale(1), g: scale(0.001), lb: scale(POUND), oz: (x) => (x * POUND) / 16 },
  },
  force: {
    label: 'a force',
    si: 'N',
    listed: ['N', 'kN', 'lbf'],
    units: { N: scale(1), kN: scale(1000), lbf: scale(POUND_FORCE) },
  },
  impulse: {
    label: 'an impulse',
    si: 'N s',
    listed: ['N s', 'lbf s'],
    // "N·s" and "N*s" reach this table as "N s" (see normaliseUnit).
    units: { 'N s': scale(1), Ns: scale(1), 'lbf s': scale(POUND_FORCE) },
  },
  pressure: {
    label: 'a pressure',
    si: 'Pa',
    listed: ['Pa', 'hPa', 'kPa', 'inHg'],
    units: { Pa: scale(1), hPa: scale(100), mbar: scale(100), kPa: scale(1000), inHg: scale(3386.389) },
  },
  temperature: {
    label: 'a temperature',
    si: 'K',
    listed: ['C', 'F', 'K'],
    units: {
      K: scale(1),
      C: (x) => x + 273.15,
      '°C': (x) => x + 273.15,
      F: (x) => ((x - 32) * 5) / 9 + 273.15,
      '°F': (x) => ((x - 32) * 5) / 9 + 273.15,
    },
  },
  area: {
    label: 'an area',
    si: 'm2',
    listed: ['m2', 'cm2', 'mm2', 'ft2', 'in2'],
    units: areaUnits(),
  },
  energy: {
    label: 'an energy',
    si: 'J',
    listed: ['J', 'kJ', 'ft lbf'],
    // "ft·lbf" and "ft*lbf" reach this table as "ft lbf" (see normaliseUnit).
    units: { J: scale(1), kJ: scale(1000), 'ft lbf': scale(FOOT * POUND_FORCE), 'ft-lbf': scale(FOOT * POUND_FORCE) },
  },
  angle: {
    label: 'an angle',
    si: 'deg',
    listed: ['deg', 'rad'],
    units: { deg: scale(1), '°': scale(1), rad: (x) => (x * 180) / Math.PI },
  },
  time: {
    label: 'a time',
    si: 's',
    listed: ['s', 'ms', 'min', 'h'],
    units: { s: scale(1), ms: scale(0.001), min: scale(60), h: scale(3600) },
  },
  fraction: {
    label: "a fraction such as 0.05 or '5 %'",
    si: '',
    listed: [],
    units: { '%': (x) => x / 100 },
  },
  inertia: {
    label: 'a moment of inertia',
    si: 'kg m2',
    listed: ['kg m2', 'g cm2', 'lb ft2', 'lb in2'],
    units: inertiaUnits(),
  },
  number: {
    label: 'a plain number',
    si: '',
    listed: [],
    units: {},
  },
  // How often something happens per unit of flying time (a failure rate). Read only from text
  // with a unit: a bare 0.05 could mean per second or per hour, and the two differ 3600-fold.
  rate: {
    label: "a rate per flight time such as '0.05 /h'",
    si: '/s',
    listed: ['/h', '/min', '/s'],
    units: {
      '/s': scale(1),
      '/min': (x) => x / 60,
      '/h': (x) => x / 3600,
      '/hour': (x) => x / 3600,
      'per hour': (x) => x / 3600,
      'per flight hour': (x) => x / 3600,
    },
  },
};

/** "a speed (m/s, km/h, mph, kn, ft/s)". */
export function expectedText(dimension: Dimension): string {
  const info = DIMENSIONS[dimension];
  return info.listed.length === 0 ? info.label : `${info.label} (${info.listed.join(', ')})`;
}

/** The unit plain numbers are read in, for messages: "m/s", "deg", "" for fractions. */
export function siUnit(dimension: Dimension): string {
  return DIMENSIONS[dimension].si;
}

export interface QuantityOptions {
  /** Accept "8 %" as a fraction of the nominal value (uncertainty spreads only). */
  allowRelative?: boolean;
}

export interface Quantity {
  /** SI value, or a fraction of the nominal when `relative`. */
  value: number;
  relative: boolean;
  /** The value as the user wrote it, with the SI value added when a unit was converted. */
  shown: string;
}

export type QuantityResult = ({ ok: true } & Quantity) | { ok: false; message: string };

// A decimal number, optionally signed, optionally with an exponent; then the unit (possibly none).
const QUANTITY_PATTERN = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/s;

/**
 * Converts one quantity to SI without knowing where it sits in the file; the message on failure is
 * the part after "field: ". Use `parseQuantity` when you have the field path and want an exception.
 */
export function convertQuantity(
  value: unknown,
  dimension: Dimension,
  options: QuantityOptions = {},
): QuantityResult {
  const info = DIMENSIONS[dimension];
  const expected = expectedText(dimension);
  if (typeof value === 'number') {
    if (dimension === 'rate') {
      return { ok: false, message: `${describeValue(value)} has no unit; a rate needs one, e.g. '${value} /h' (per flight hour) or '${value} /s'` };
    }
    if (!Number.isFinite(value)) return { ok: false, message: `${describeValue(value)} is not a finite number; expected ${expected}` };
    return { ok: true, value, relative: false, shown: withUnit(String(value), info.si) };
  }
  if (typeof value !== 'string') {
    const given = value === undefined ? 'missing (required)' : `${describeValue(value)} is not a number or a "<number> <unit>" text`;
    return { ok: false, message: `${given}; expected ${expected}` };
  }
  const text = value.trim();
  const match = QUANTITY_PATTERN.exec(text);
  if (match === null) {
    return { ok: false, message: `${describeValue(value)} is not a number with a unit; expected ${expected}` };
  }
  const number = Number(match[1]);
  const unit = normaliseUnit(match[2] ?? '');
  if (!Number.isFinite(number)) {
    return { ok: false, message: `${describeValue(value)} is too large to be a finite number; expected ${expected}` };
  }
  if (unit === '') {
    if (info.si === '') {
      return { ok: false, message: `${describeValue(value)} is text; write the plain number ${match[1]} without quotes` };
    }
    // A quoted bare number is usually a forgotten unit rather than a deliberate SI value.
    return {
      ok: false,
      message: `${describeValue(value)} has no unit; write the plain number ${match[1]} for ${info.si}, or add a unit, e.g. '${match[1]} ${info.listed[0]}'; expected ${expected}`,
    };
  }
  if (unit === '%' && options.allowRelative === true && dimension !== 'fraction') {
    return { ok: true, value: number / 100, relative: true, shown: text };
  }
  const toSI = info.units[unit];
  if (toSI !== undefined) {
    const si = toSI(number);
    if (!Number.isFinite(si)) return { ok: false, message: `${describeValue(value)} is too large; expected ${expected}` };
    const isSIUnit = unit === info.si || (dimension === 'angle' && unit === '°');
    return { ok: true, value: si, relative: false, shown: isSIUnit ? text : `${text} (${formatNumber(si)}${info.si ? ` ${info.si}` : ''})` };
  }
  return { ok: false, message: `${describeValue(value)} ${wrongUnitReason(unit)}; expected ${expected}` };
}

/** Like `convertQuantity`, but names the field and throws a `ScenarioError` on bad input. */
export function parseQuantity(
  value: unknown,
  dimension: Dimension,
  field: string,
  options: QuantityOptions = {},
): Quantity {
  const result = convertQuantity(value, dimension, options);
  if (!result.ok) throw new ScenarioError([{ path: field, message: result.message }]);
  return { value: result.value, relative: result.relative, shown: result.shown };
}

/** Six significant figures, without trailing zeros: 0.907185, 5.36448, 1500. */
export function formatNumber(x: number): string {
  return String(Number(x.toPrecision(6)));
}

function withUnit(number: string, unit: string): string {
  return unit === '' ? number : `${number} ${unit}`;
}

/** "N·s", "N*s" and "N  s" all mean "N s". */
function normaliseUnit(unit: string): string {
  return unit.replace(/[·⋅*]/g, ' ').replace(/\s+/g, ' ').trim();
}

function wrongUnitReason(unit: string): string {
  if (unit === '%') return 'is a relative value, which is allowed only in uncertainty spreads';
  const owner = (Object.keys(DIMENSIONS) as Dimension[]).find((d) => unit in DIMENSIONS[d].units);
  if (owner !== undefined) return `has a unit of ${DIMENSIONS[owner].label.replace(/^an? /, '')}`;
  return `has an unknown unit '${unit}'${caseHint(unit)}`;
}

/** Units are case-sensitive (mm is not Mm); point at the intended spelling when only case differs. */
function caseHint(unit: string): string {
  const lower = unit.toLowerCase();
  for (const info of Object.values(DIMENSIONS)) {
    for (const known of Object.keys(info.units)) {
      if (known.toLowerCase() === lower) return ` (did you mean '${known}'?)`;
    }
  }
  return '';
}
