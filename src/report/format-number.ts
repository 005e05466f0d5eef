/**
 * THE one place where numbers are formatted for people: the terminal text (run, check, analyze,
 * envelope), the review sheet and the browser page all call these. Metric or imperial throughout;
 * converted values are rounded for reading (4.9 m/s, not 4.917 m/s; 18 mph (8.0 m/s), not
 * 8.04672 m/s; descent rates in ft/s; distances and margins in whole feet). Values written back
 * into scenario files are NOT formatted here: they keep every digit (see web/src/units/format.ts
 * fieldNumber).
 *
 * Conversions use the exact definitions (international foot 0.3048 m, mile 5280 ft, acre 43 560 ft², pound 0.45359237 kg,
 * pound-force 4.4482216152605 N, inch of mercury 3386.389 Pa).
 *
 * @example
 *   const u = unitFormatter('imperial');
 *   u.length(1609.344)   // '1.00 mi'
 *   u.area(4046.8564224) // '1.00 acres'
 *   unitFormatter('metric').area(25_000) // '2.50 ha'
 */

export type UnitSystem = 'metric' | 'imperial';

export const FOOT_M = 0.3048;
export const MILE_M = 1609.344;
export const ACRE_M2 = 4046.8564224;
export const MPH_M_S = 0.44704;
const POUND_KG = 0.45359237;
const POUND_FORCE_N = 4.4482216152605;
const INCH_HG_PA = 3386.389;
const INCH_M = 0.0254;

/** A number with thousands separators and a fixed count of decimals. */
export function grouped(x: number, decimals = 0): string {
  // One formatter per decimal count, made once: toLocaleString with options builds a new
  // Intl.NumberFormat at every call (about a tenth of a millisecond), and the sheet and the
  // terminal call this thousands of times. The text is the same (ECMA-402: toLocaleString is
  // defined as formatting with a new NumberFormat of the same locale and options).
  let f = groupedFormats[decimals];
  if (f === undefined) f = groupedFormats[decimals] = new Intl.NumberFormat('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
  return f.format(x);
}
const groupedFormats: Intl.NumberFormat[] = [];

/**
 * `digits` significant figures for small quantities (no trailing zeros), none lost for big ones:
 * 0.0999 → '0.1', 1234.5 → '1,235'.
 */
function sig(x: number, digits = 3): string {
  if (x === 0) return '0';
  // Round first, so 0.009999 counts as 0.01 when choosing the decimals.
  const rounded = Number(x.toPrecision(digits));
  const magnitude = Math.floor(Math.log10(Math.abs(rounded)));
  const decimals = Math.max(0, digits - 1 - magnitude);
  // Number formatting takes at most 100 decimals; far below any real value, say it in powers of ten.
  if (decimals > 20) return rounded.toExponential(digits - 1).replace(/\.?0+e/, 'e');
  let f = sigFormats[decimals];
  if (f === undefined) f = sigFormats[decimals] = new Intl.NumberFormat('en', { minimumFractionDigits: 0, maximumFractionDigits: decimals });
  return f.format(rounded);
}
const sigFormats: Intl.NumberFormat[] = [];

const NA = 'n/a';

export const HECTARE_M2 = 10_000;

/**
 * THE rule for areas everywhere (sheet, page, terminal): below one hectare (acre) in m² (ft²),
 * from one hectare (acre) up in hectares (acres) with two decimals. Land is measured in hectares
 * and acres; small zones read better in square metres or feet.
 * 1 ha = 10,000 m² (SI Brochure, 9th ed., table 8); 1 acre = 43,560 ft² (NIST Handbook 44, app. C).
 */
export function areaText(m2: number | null | undefined, system: UnitSystem): string {
  if (!ok(m2)) return NA;
  if (system === 'metric') return m2 < HECTARE_M2 ? `${grouped(m2)} m\u00b2` : `${grouped(m2 / HECTARE_M2, 2)} ha`;
  return m2 < ACRE_M2 ? `${grouped(m2 / (FOOT_M * FOOT_M))} ft\u00b2` : `${grouped(m2 / ACRE_M2, 2)} acres`;
}const ok = (x: number | null | undefined): x is number => typeof x === 'number' && Number.isFinite(x);

export interface UnitFormatter {
  system: UnitSystem;
  /** Distances on the ground and heights: m/km or ft/mi. */
  length(m: number | null | undefined): string;
  /** Short lengths (rails, diameters): m or ft; mm or in for diameters via `diameter`. */
  shortLength(m: number | null | undefined): string;
  diameter(m: number | null | undefined): string;
  area(m2: number | null | undefined): string;
  /** Reference and drag areas of the vehicle: cm² or in². */
  smallArea(m2: number | null | undefined): string;
  /** Speeds through the air and wind: m/s or mph; one decimal below 10, whole above. */
  speed(mps: number | null | undefined): string;
  /** Descent rates under a canopy: m/s or ft/s (never mph: the trade gives descent rates in ft/s). */
  descentRate(mps: number | null | undefined): string;
  /** Short distances that people pace out (margins, minimum distances): whole m or whole ft. */
  distance(m: number | null | undefined): string;
  force(n: number | null | undefined): string;
  /** Air density, kg/m³ or lb/ft³. */
  density(kgm3: number | null | undefined): string;
  mass(kg: number | null | undefined): string;
  impulse(ns: number | null | undefined): string;
  temperature(k: number | null | undefined): string;
  pressure(pa: number | null | undefined): string;
  /** Metres in the unit ring and scale labels are written in (m or ft). */
  lengthUnit: { name: string; metres: number };
}

export function unitFormatter(system: UnitSystem): UnitFormatter {
  const metric = system === 'metric';
  return {
    system,
    length: (m) => {
      if (!ok(m)) return NA;
      if (metric) return Math.abs(m) < 10_000 ? `${grouped(m)} m` : `${grouped(m / 1000, 1)} km`;
      const ft = m / FOOT_M;
      return Math.abs(m) < MILE_M ? `${grouped(ft)} ft` : `${grouped(m / MILE_M, 2)} mi`;
    },
    shortLength: (m) => (!ok(m) ? NA : metric ? `${sig(m)} m` : `${sig(m / FOOT_M)} ft`),
    diameter: (m) => (!ok(m) ? NA : metric ? `${sig(m * 1000)} mm` : `${sig(m / INCH_M)} in`),
    area: (m2) => {
      if (!ok(m2)) return NA;
      return areaText(m2, system);
    },
    smallArea: (m2) => (!ok(m2) ? NA : metric ? `${sig(m2 * 1e4)} cm\u00b2` : `${sig(m2 / (INCH_M * INCH_M))} in\u00b2`),
    speed: (v) => (!ok(v) ? NA : metric ? `${readable(v)} m/s` : `${readable(v / MPH_M_S)} mph`),
    descentRate: (v) => (!ok(v) ? NA : metric ? `${readable(v)} m/s` : `${readable(v / FOOT_M)} ft/s`),
    distance: (m) => (!ok(m) ? NA : metric ? `${grouped(m)} m` : `${grouped(m / FOOT_M)} ft`),
    force: (n) => (!ok(n) ? NA : metric ? `${sig(n)} N` : `${sig(n / POUND_FORCE_N)} lbf`),
    density: (d) => (!ok(d) ? NA : metric ? `${sig(d)} kg/m\u00b3` : `${sig(d / (POUND_KG / FOOT_M ** 3), 3)} lb/ft\u00b3`),
    mass: (kg) => (!ok(kg) ? NA : metric ? `${sig(kg)} kg` : `${sig(kg / POUND_KG)} lb`),
    impulse: (ns) => (!ok(ns) ? NA : metric ? `${sig(ns)} N s` : `${sig(ns / POUND_FORCE_N)} lbf s`),
    temperature: (k) => (!ok(k) ? NA : metric ? `${grouped(k - 273.15, 1)} \u00b0C` : `${grouped(((k - 273.15) * 9) / 5 + 32, 1)} \u00b0F`),
    pressure: (pa) => (!ok(pa) ? NA : metric ? `${grouped(pa / 100, 1)} hPa` : `${grouped(pa / INCH_HG_PA, 2)} inHg`),
    lengthUnit: metric ? { name: 'm', metres: 1 } : { name: 'ft', metres: FOOT_M },
  };
}

/**
 * One decimal below 10, whole numbers from 10 (4.9, 8.0, 18, 130): what a person reads off a
 * gauge. Hand-written because Intl rounding options differ between Node and browser versions.
 */
export function readable(x: number): string {
  return Math.abs(x) < 9.95 ? grouped(x, 1) : grouped(x);
}

/** The unit system people read first, and the other one in brackets: "18 mph (8.0 m/s)". */
export function withOther(system: UnitSystem, pick: (u: UnitFormatter) => (si: number) => string, si: number): string {
  const other: UnitSystem = system === 'metric' ? 'imperial' : 'metric';
  return `${pick(unitFormatter(system))(si)} (${pick(unitFormatter(other))(si)})`;
}

export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

/** A probability per flight as a percentage with two significant figures ('0.29 %', '< 0.001 %'). */
export function percent(p: number | null | undefined): string {
  if (!ok(p)) return NA;
  if (p === 0) return '0 %';
  const x = p * 100;
  if (x < 0.001) return '< 0.001 %';
  return `${sig(x, 2)} %`;
}

/** A probability level such as 0.9 or 0.995 as '90 %' or '99.5 %'. */
export function levelText(level: number): string {
  const x = Math.round(level * 1e6) / 1e4;
  return `${x} %`;
}

/** A plain number with n significant figures, or n/a. */
export function significant(x: number | null | undefined, digits = 3): string {
  return ok(x) ? sig(x, digits) : NA;
}

/** A small rate such as an expected casualty figure: '0', '0.012', or '2.8e-6' below 0.001. */
export function smallRate(x: number | null | undefined, digits = 2): string {
  if (!ok(x)) return NA;
  if (x === 0 || Math.abs(x) >= 0.001) return sig(x, digits);
  const [mantissa, exponent] = x.toExponential(digits - 1).split('e');
  return `${mantissa}e${Number(exponent)}`;
}
