import { z } from 'zod';
import { isRecord } from './cross-checks.js';
import { closestMatch, describeValue, unknownFieldMessage } from './errors.js';
import { convertQuantity, siUnit, type Dimension, type Quantity } from './units.js';
import { polygonShapeProblem } from './area-shape.js';
import { NAME_CONTROL } from './safe-text.js';
import { UNCERTAINTY_NAMES, type LineStringGeometry, type PolygonGeometry, type Spread, type UncertaintyName } from './types.js';

/**
 * Readers for single fields of the scenario file, as zod schemas. Each takes the value as
 * written and returns it in SI (or checked and typed), or reports what is wrong with it. The
 * objects that hold them are in schema.ts.
 */

export type PathPart = string | number;
export interface LeafProblem {
  /** Relative to the leaf, for problems inside a list or object (`[2]`, `coordinates[0][3]`). */
  path?: PathPart[];
  message: string;
}
export type LeafResult<T> = { ok: true; value: T } | { ok: false; problems: LeafProblem[] };

export const ok = <T>(value: T): LeafResult<T> => ({ ok: true, value });
export const fail = (message: string, path?: PathPart[]): LeafResult<never> => ({ ok: false, problems: [{ message, path }] });

export function leaf<T>(read: (value: unknown) => LeafResult<T>) {
  return z.unknown().transform((value, ctx): T => {
    const result = read(value);
    if (result.ok) return result.value;
    for (const problem of result.problems) {
      ctx.addIssue({ code: 'custom', message: problem.message, path: problem.path ?? [], input: value });
    }
    return z.NEVER;
  });
}

/** Inclusive `min`/`max`, exclusive `above`/`below`. */
export interface Bounds {
  min?: number;
  max?: number;
  above?: number;
  below?: number;
  /** Extra advice when the value is out of range, e.g. "did you mean '18 C'?". */
  hint?: (given: unknown, quantity: Quantity) => string | undefined;
}

function boundsProblem(given: unknown, q: Quantity, dimension: Dimension, b: Bounds): string | undefined {
  const v = q.value;
  // Inclusive bounds allow for the rounding of a unit conversion: -100 C is 173.14999999999998 K
  // in binary floating point, and must meet a bound of 173.15 K.
  const slack = (bound: number) => 1e-12 * Math.max(1, Math.abs(bound));
  const tooLow = (b.min !== undefined && v < b.min - slack(b.min)) || (b.above !== undefined && v <= b.above);
  const tooHigh = (b.max !== undefined && v > b.max + slack(b.max)) || (b.below !== undefined && v >= b.below);
  if (!tooLow && !tooHigh) return undefined;
  const unit = siUnit(dimension) === '' ? '' : ` ${siUnit(dimension)}`;
  const lo = b.min ?? b.above;
  const hi = b.max ?? b.below;
  let expected: string;
  if (lo !== undefined && hi !== undefined) {
    const excluded = [b.above !== undefined ? lo : undefined, b.below !== undefined ? hi : undefined].filter((x) => x !== undefined);
    expected = `is outside ${lo}–${hi}${unit}${excluded.length > 0 ? ` (excluding ${excluded.join(' and ')})` : ''}`;
  } else if (lo !== undefined) {
    expected = `is out of range; expected ${b.above !== undefined ? 'more than' : 'at least'} ${lo}${unit}`;
  } else {
    expected = `is out of range; expected ${b.below !== undefined ? 'less than' : 'at most'} ${hi}${unit}`;
  }
  const hint = b.hint?.(given, q);
  return `${q.shown} ${expected}${hint === undefined ? '' : `; ${hint}`}`;
}

/** Reads one quantity in SI and checks its range; `allowRelative` lets "8 %" through as a fraction. */
export function readQuantity(
  value: unknown,
  dimension: Dimension,
  bounds: Bounds = {},
  allowRelative = false,
): LeafResult<Quantity> {
  const result = convertQuantity(value, dimension, { allowRelative });
  if (!result.ok) return fail(result.message);
  const quantity: Quantity = { value: result.value, relative: result.relative, shown: result.shown };
  const problem = boundsProblem(value, quantity, dimension, bounds);
  return problem === undefined ? ok(quantity) : fail(problem);
}

export const quantity = (dimension: Dimension, bounds: Bounds = {}) =>
  leaf((value): LeafResult<number> => {
    const r = readQuantity(value, dimension, bounds);
    return r.ok ? ok(r.value.value) : r;
  });

/**
 * Optional fields are wrapped in zod's `.optional()`: a leaf reader on its own counts as required,
 * and zod reports an absent key as missing.
 */
export const optionalQuantity = (dimension: Dimension, bounds: Bounds = {}) => quantity(dimension, bounds).optional();

export const POSITIVE: Bounds = { above: 0 };
export const NOT_NEGATIVE: Bounds = { min: 0 };

export const text = (what: string) =>
  leaf((value): LeafResult<string> => {
    if (typeof value === 'string' && NAME_CONTROL.test(value)) {
      const code = NAME_CONTROL.exec(value)![0].codePointAt(0)!;
      return fail(`${describeValue(value.replace(new RegExp(NAME_CONTROL.source, 'g'), '?'))} holds the control character U+${code.toString(16).toUpperCase().padStart(4, '0')}; names may hold only printable characters (and tabs or line breaks)`);
    }
    if (typeof value === 'string' && value.trim() !== '') return ok(value);
    if (value === undefined) return fail(`missing (required); expected ${what}`);
    return fail(`${describeValue(value)} is ${typeof value === 'string' ? 'empty' : 'not text'}; expected ${what}`);
  });

export const optionalText = leaf((value): LeafResult<string> => {
  if (typeof value === 'string') return ok(value);
  return fail(`${describeValue(value)} is not text; expected text in quotes`);
}).optional();

export function oneOf<T extends string>(choices: readonly T[]) {
  return leaf((value): LeafResult<T> => {
    if (typeof value === 'string' && (choices as readonly string[]).includes(value)) return ok(value as T);
    const list = choices.map((c) => `'${c}'`).join(', ');
    if (value === undefined) return fail(`missing (required); expected one of ${list}`);
    const guess = typeof value === 'string' ? closestMatch(value, choices) : undefined;
    return fail(`${describeValue(value)} is not one of ${list}${guess === undefined ? '' : ` (did you mean '${guess}'?)`}`);
  });
}

/** A field that must not be there, with the reason (e.g. a motor on a projectile). */
export const forbidden = (reason: string) => leaf((): LeafResult<never> => fail(reason)).optional();

export const version = leaf((value): LeafResult<1> => {
  if (value === 1) return ok(1);
  if (value === undefined) return fail('missing (required); expected the format version, the number 1');
  return fail(`${describeValue(value)} is not a format version this program reads; expected the number 1`);
});

/** Reference drag: a constant Cd, or rows [mach, cd] with Mach strictly increasing. */
export type RawDrag = number | Array<[number, number]>;

export const drag = leaf((value): LeafResult<RawDrag> => {
  if (typeof value === 'number') {
    if (Number.isFinite(value) && value > 0) return ok(value);
    return fail(`${describeValue(value)} is out of range; expected a drag coefficient more than 0`);
  }
  if (!Array.isArray(value) || value.length === 0) {
    return fail(`${value === undefined ? 'missing (required)' : describeValue(value)}; expected a drag coefficient (e.g. 0.5) or a table [[mach, cd], ...]`);
  }
  const problems: LeafProblem[] = [];
  const rows: Array<[number, number]> = [];
  value.forEach((row: unknown, i) => {
    if (!isFinitePair(row)) {
      problems.push({ path: [i], message: `${describeValue(row)} is not a [mach, cd] pair of numbers` });
      return;
    }
    const [mach, cd] = row;
    if (mach < 0) problems.push({ path: [i], message: `Mach ${mach} is negative` });
    if (!(cd > 0)) problems.push({ path: [i], message: `Cd ${cd} is out of range; expected more than 0` });
    const previous = rows[rows.length - 1];
    if (previous !== undefined && !(mach > previous[0])) {
      problems.push({ path: [i], message: `Mach ${mach} is not above the previous row's ${previous[0]}; Mach must strictly increase` });
    }
    rows.push([mach, cd]);
  });
  return problems.length > 0 ? { ok: false, problems } : ok(rows);
});

function isFinitePair(row: unknown): row is [number, number] {
  return Array.isArray(row) && row.length === 2 && row.every((x) => typeof x === 'number' && Number.isFinite(x));
}

/** GeoJSON Polygon (RFC 7946): rings of [lon, lat] positions, each ring closed and at least 4 positions long. */
export const polygon = leaf((value): LeafResult<PolygonGeometry> => {
  if (!isRecord(value)) {
    return fail(`${value === undefined ? 'missing (required)' : describeValue(value)}; expected a GeoJSON Polygon geometry {"type": "Polygon", "coordinates": [...]}`);
  }
  if (value.type !== 'Polygon') {
    const hint = value.type === 'Feature' ? ' (give the feature\'s "geometry", not the feature)' : '';
    return fail(`type ${describeValue(value.type)} is not 'Polygon'${hint}`, ['type']);
  }
  const rings = value.coordinates;
  if (!Array.isArray(rings) || rings.length === 0) {
    return fail(`${describeValue(rings)}; expected a list of rings of [lon, lat] positions`, ['coordinates']);
  }
  const problems: LeafProblem[] = [];
  rings.forEach((ring: unknown, r) => {
    const ringPath = ['coordinates', r];
    if (!Array.isArray(ring) || ring.length < 4) {
      problems.push({ path: ringPath, message: `${describeValue(ring)}; expected a closed ring of at least 4 [lon, lat] positions` });
      return;
    }
    const before = problems.length;
    ring.forEach((position: unknown, p) => {
      const problem = positionProblem(position);
      if (problem !== undefined) problems.push({ path: [...ringPath, p], message: problem });
    });
    if (problems.length > before) return;
    const first = ring[0] as number[];
    const last = ring[ring.length - 1] as number[];
    if (first[0] !== last[0] || first[1] !== last[1]) {
      problems.push({ path: ringPath, message: `the ring is not closed: it starts at ${describeValue(first)} and ends at ${describeValue(last)}; repeat the first position at the end` });
    }
  });
  if (problems.length > 0) return { ok: false, problems };
  const shape = polygonShapeProblem(rings as number[][][]);
  if (shape !== undefined) return fail(shape.message, ['coordinates', shape.ring]);
  return ok({ type: 'Polygon', coordinates: rings as number[][][] });
});

/** GeoJSON LineString (RFC 7946): at least two [lon, lat] positions. */
export const lineString = leaf((value): LeafResult<LineStringGeometry> => {
  if (!isRecord(value)) {
    return fail(`${value === undefined ? 'missing (required)' : describeValue(value)}; expected a GeoJSON LineString geometry {"type": "LineString", "coordinates": [[lon, lat], ...]}`);
  }
  if (value.type !== 'LineString') {
    const hint = value.type === 'Feature' ? ' (give the feature\'s "geometry", not the feature)' : '';
    return fail(`type ${describeValue(value.type)} is not 'LineString'${hint}`, ['type']);
  }
  const positions = value.coordinates;
  if (!Array.isArray(positions) || positions.length < 2) {
    return fail(`${describeValue(positions)}; expected a list of at least two [lon, lat] positions`, ['coordinates']);
  }
  const problems: LeafProblem[] = [];
  positions.forEach((position: unknown, p) => {
    const problem = positionProblem(position);
    if (problem !== undefined) problems.push({ path: ['coordinates', p], message: problem });
  });
  if (problems.length > 0) return { ok: false, problems };
  return ok({ type: 'LineString', coordinates: positions as number[][] });
});

function positionProblem(position: unknown): string | undefined {
  if (!Array.isArray(position) || position.length < 2 || position.length > 3 || !position.every((x) => typeof x === 'number' && Number.isFinite(x))) {
    return `${describeValue(position)} is not a [lon, lat] position`;
  }
  const [lon, lat] = position as [number, number];
  if (lon < -180 || lon > 180) return `longitude ${lon} is outside -180–180 deg (positions are [lon, lat])`;
  if (lat < -90 || lat > 90) return `latitude ${lat} is outside -90–90 deg (positions are [lon, lat])`;
  return undefined;
}

export interface RawFeatureCollection {
  type: 'FeatureCollection';
  features: unknown[];
}

/** Passed through untouched; only its outline is checked so the map code can rely on it. */
export const featureCollection = leaf((value): LeafResult<RawFeatureCollection> => {
  if (isRecord(value) && value.type === 'FeatureCollection' && Array.isArray(value.features)) {
    return ok(value as unknown as RawFeatureCollection);
  }
  return fail(`${describeValue(value)}; expected a GeoJSON FeatureCollection {"type": "FeatureCollection", "features": [...]}`);
}).optional();

export const headCount = leaf((value): LeafResult<number> => {
  if (typeof value === 'number' && Number.isInteger(value) && value >= 0) return ok(value);
  return fail(`${describeValue(value)} is not a head count; expected a whole number, 0 or more`);
}).optional();

export const shear = optionalQuantity('number', { min: 0, max: 1 });

export const turbulence = leaf((value): LeafResult<boolean> => {
  if (typeof value === 'boolean') return ok(value);
  return fail(`${describeValue(value)} is not true or false`);
}).optional();

/** A plain number that reads as a plausible Celsius temperature is almost always one with its unit left off. */
export const temperatureHint = (given: unknown, q: Quantity): string | undefined =>
  typeof given === 'number' && q.value > -90 && q.value < 60 ? `a plain number is in kelvin; did you mean '${given} C'?` : undefined;

export const pressureHint = (given: unknown): string | undefined => {
  if (typeof given !== 'number') return undefined;
  if (given >= 300 && given <= 1100) return `a plain number is in pascals; did you mean '${given} hPa'?`;
  if (given >= 30 && given <= 110) return `a plain number is in pascals; did you mean '${given} kPa'?`;
  return undefined;
};

export const samples = (cap: number) =>
  leaf((value): LeafResult<number> => {
    if (typeof value !== 'number' || !Number.isInteger(value) || value < 1) {
      return fail(`${describeValue(value)} is not a sample count; expected a whole number, 1 or more`);
    }
    if (value > cap) return fail(`${value} is more than the cap of ${cap} samples; use fewer, or raise the cap with the maxSamples option`);
    return ok(value);
  }).optional();

export const seed = leaf((value): LeafResult<string> => {
  if (typeof value === 'string' && value !== '') return ok(value);
  if (typeof value === 'number' && Number.isFinite(value)) return ok(String(value));
  return fail(`${describeValue(value)} is not a seed; expected a number or non-empty text`);
}).optional();

/**
 * A non-empty list of fractions strictly between 0 and 1; `problemWith(value, shown, earlier)`
 * adds the list's own rule (increasing, each once). Every item's problem is reported.
 */
export function readFractionList(
  value: unknown,
  example: string,
  problemWith: (value: number, shown: string, earlier: readonly number[]) => string | undefined,
): LeafResult<number[]> {
  if (!Array.isArray(value) || value.length === 0) return fail(`${describeValue(value)}; expected a list of ${example}`);
  const problems: LeafProblem[] = [];
  const out: number[] = [];
  value.forEach((item: unknown, i) => {
    const r = readQuantity(item, 'fraction', { above: 0, below: 1 });
    if (!r.ok) {
      problems.push(...r.problems.map((p) => ({ ...p, path: [i] })));
      return;
    }
    const problem = problemWith(r.value.value, r.value.shown, out);
    if (problem !== undefined) problems.push({ path: [i], message: problem });
    out.push(r.value.value);
  });
  return problems.length > 0 ? { ok: false, problems } : ok(out);
}

/** Probability levels for contours: fractions strictly between 0 and 1, strictly increasing. */
export const levels = leaf((value): LeafResult<number[]> =>
  readFractionList(value, 'probabilities like [0.5, 0.9, 0.99]', (v, shown, earlier) => {
    const previous = earlier[earlier.length - 1];
    return previous !== undefined && !(v > previous) ? `${shown} is not above the previous level ${previous}; levels must increase` : undefined;
  }),
).optional();

// ---------------------------------------------------------------------------------------------
// Uncertainty spreads.

export interface SpreadRule {
  dimension: Dimension;
  /** 'only': must be "N %"; 'never': a percentage has no meaning (a compass direction). */
  relative: 'allowed' | 'only' | 'never';
  /** Why a percentage is refused (with 'never'), as the message says it. */
  why?: string;
}

/** The unit each parameter's absolute spread is in; `recovery.rate` scales drag areas, so it is relative only. */
export const SPREAD_RULES: Record<UncertaintyName, SpreadRule> = {
  'wind.speed': { dimension: 'speed', relative: 'allowed' },
  'wind.from': { dimension: 'angle', relative: 'never' },
  'wind.gust': { dimension: 'speed', relative: 'allowed' },
  // A lean is turned by two angles drawn from the spread (in and across the lean's plane), so it
  // must be an angle: a percentage of a vertical rail's 0° would be no lean at all.
  'launch.tilt': { dimension: 'angle', relative: 'never', why: 'a launch lean spread is an angle' },
  'launch.azimuth': { dimension: 'angle', relative: 'never' },
  'launch.speed': { dimension: 'speed', relative: 'allowed' },
  'launch.elevation': { dimension: 'angle', relative: 'never', why: 'a launch lean spread is an angle' },
  'launch.height': { dimension: 'length', relative: 'allowed' },
  'motor.impulse': { dimension: 'impulse', relative: 'allowed' },
  'vehicle.mass': { dimension: 'mass', relative: 'allowed' },
  'vehicle.drag': { dimension: 'number', relative: 'allowed' },
  'recovery.delay': { dimension: 'time', relative: 'allowed' },
  'recovery.rate': { dimension: 'number', relative: 'only' },
  'motor.misalignment': { dimension: 'angle', relative: 'never', why: 'the nominal misalignment is 0, so a percentage of it is nothing' },
  'vehicle.cg': { dimension: 'length', relative: 'allowed' },
};

const SPREAD_FIELDS = ['sd', 'limit', 'range'];

function readSpreadValue(value: unknown, rule: SpreadRule, bounds: Bounds, path: PathPart[]): LeafResult<Quantity> {
  const r = readQuantity(value, rule.dimension, bounds, true);
  if (!r.ok) return { ok: false, problems: r.problems.map((p) => ({ ...p, path })) };
  if (rule.relative === 'never' && r.value.relative) {
    return fail(`${r.value.shown} is relative, but ${rule.why ?? 'a compass direction cannot vary by a percentage'}; give degrees, e.g. '5 deg'`, path);
  }
  if (rule.relative === 'only' && !r.value.relative) {
    return fail(`${r.value.shown} is not relative; this spread scales every stage's drag area, so write it as a percentage, e.g. '10 %'`, path);
  }
  return r;
}

function spread(rule: SpreadRule) {
  return leaf((value): LeafResult<Spread> => {
    if (!isRecord(value)) return fail(`${describeValue(value)}; expected {"sd": q}, {"sd": q, "limit": k} or {"range": [lo, hi]}`);
    const problems: LeafProblem[] = [];
    for (const key of Object.keys(value)) {
      if (!SPREAD_FIELDS.includes(key)) problems.push({ path: [key], message: unknownFieldMessage(key, SPREAD_FIELDS) });
    }
    const hasSd = value.sd !== undefined;
    const hasRange = value.range !== undefined;
    if (hasSd === hasRange) {
      problems.push({ message: hasSd ? 'give either sd or range, not both' : 'missing sd or range; expected {"sd": q} or {"range": [lo, hi]}' });
    }
    if (hasRange && value.limit !== undefined) problems.push({ path: ['limit'], message: 'limit applies to an sd spread only' });
    if (problems.length > 0) return { ok: false, problems };

    if (hasSd) {
      const sd = readSpreadValue(value.sd, rule, NOT_NEGATIVE, ['sd']);
      let limit: number | undefined;
      if (value.limit !== undefined) {
        const k = readQuantity(value.limit, 'number', POSITIVE);
        if (!k.ok) problems.push(...k.problems.map((p) => ({ ...p, path: ['limit'] })));
        else limit = k.value.value;
      }
      if (!sd.ok) return { ok: false, problems: [...sd.problems, ...problems] };
      if (problems.length > 0) return { ok: false, problems };
      const normal: Spread = { kind: 'normal', sd: sd.value.value, relative: sd.value.relative };
      if (limit !== undefined) normal.limit = limit;
      return ok(normal);
    }

    const range = value.range;
    if (!Array.isArray(range) || range.length !== 2) return fail(`${describeValue(range)}; expected [lo, hi]`, ['range']);
    const lo = readSpreadValue(range[0], rule, {}, ['range', 0]);
    const hi = readSpreadValue(range[1], rule, {}, ['range', 1]);
    if (!lo.ok || !hi.ok) return { ok: false, problems: [...(lo.ok ? [] : lo.problems), ...(hi.ok ? [] : hi.problems)] };
    if (lo.value.relative !== hi.value.relative) return fail('write both ends as percentages or neither', ['range']);
    if (lo.value.value > hi.value.value) return fail(`lo ${lo.value.shown} is above hi ${hi.value.shown}`, ['range']);
    return ok({ kind: 'uniform', lo: lo.value.value, hi: hi.value.value, relative: lo.value.relative });
  }).optional();
}

export function uncertaintyShape() {
  const shape = {} as Record<UncertaintyName, ReturnType<typeof spread>>;
  for (const name of UNCERTAINTY_NAMES) shape[name] = spread(SPREAD_RULES[name]);
  return shape;
}
