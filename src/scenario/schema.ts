import { z } from 'zod';
import { crossCheck, isRecord } from './cross-checks.js';
import { describeValue, formatPath, unknownFieldMessage } from './errors.js';
import {
  drag,
  fail,
  featureCollection,
  forbidden,
  headCount,
  leaf,
  lineString,
  levels,
  NOT_NEGATIVE,
  ok,
  oneOf,
  optionalQuantity,
  optionalText,
  polygon,
  POSITIVE,
  pressureHint,
  quantity,
  samples,
  seed,
  shear,
  temperatureHint,
  text,
  turbulence,
  uncertaintyShape,
  version,
  type LeafResult,
  type PathPart,
} from './fields.js';
import { parseValidTime } from './time.js';
import { casualtyTable, peopleDensity, perFlight, riskLevels, shelteredShare } from './risk-fields.js';
import { shapeIssues } from './shape-checks.js';
import type { AreaKind, Issue, TriggerKind, VehicleKind } from './types.js';
import { rawJsonIssues } from './raw-guards.js';

/**
 * The raw scenario file (format version 1) as zod schemas. Structure and types are checked by
 * zod; every single value is read by a converter from fields.ts that turns units into SI and
 * checks its range, so a parsed file holds only SI numbers. Checks that span fields (a failure
 * naming a stage, exactly one of two fields, ...) live in cross-checks.ts and run on the raw JSON,
 * so they are reported even when other parts of the file are broken.
 */

export const DEFAULT_MAX_SAMPLES = 10_000_000;
/**
 * Farthest a distance on the site may reach (minimum distance, keep-out margin, release offset):
 * flights and zones are computed in a flat local frame that holds within a few hundred kilometres.
 */
export const MAX_SITE_DISTANCE = 500_000;
const FLAT_FRAME_HINT = "Strewn's flat local frame holds only within a few hundred kilometres of the pad";
/** Highest pad latitude, degrees north or south. */
export const MAX_PAD_LATITUDE = 89.9;
/** Most pieces of one fragment class: every piece is flown, so the count multiplies the run's work. */
export const MAX_FRAGMENT_COUNT = 1000;
export const VEHICLE_KINDS: readonly VehicleKind[] = ['rocket', 'projectile', 'release'];
export const TRIGGER_KINDS: readonly TriggerKind[] = ['apogee', 'altitude', 'time'];
export const AREA_KINDS: readonly AreaKind[] = ['spectators', 'parking', 'road', 'building', 'water', 'other'];

// ---------------------------------------------------------------------------------------------
// Objects. Every object rejects fields it does not know: they are almost always typos.

interface UnknownFieldParams {
  unknownField: true;
  known: string[];
}

function unknownField(known: string[]) {
  return z.unknown().superRefine((_value, ctx) => {
    const params: UnknownFieldParams = { unknownField: true, known };
    ctx.addIssue({ code: 'custom', message: 'unknown field', params });
  });
}

/** An object whose unknown fields are errors naming the field and the fields it could have meant. */
function strict<S extends z.core.$ZodLooseShape>(shape: S): z.ZodType<z.output<z.ZodObject<S>>> {
  // Typed without the catch-all's index signature: a parse that succeeds has no unknown keys.
  return z.object(shape).catchall(unknownField(Object.keys(shape))) as unknown as z.ZodType<z.output<z.ZodObject<S>>>;
}

const siteSchema = strict({
  pad: strict({
    // The local frame (src/analysis/geodesy.ts) is exact to 89.9°; nearer the pole every
    // longitude meets, so the pad must stay 11 km or more from it.
    lat: quantity('angle', { min: -MAX_PAD_LATITUDE, max: MAX_PAD_LATITUDE, hint: () => 'Strewn does not work within 0.1° (11 km) of a pole' }),
    lon: quantity('angle', { min: -180, max: 180 }),
    elevation: optionalQuantity('length'),
  }),
  minimumDistance: optionalQuantity('length', { min: 0, max: MAX_SITE_DISTANCE, hint: () => FLAT_FRAME_HINT }),
  boundary: polygon.optional(),
  areas: z
    .array(
      strict({
        name: text('a name in quotes'),
        kind: oneOf(AREA_KINDS),
        geometry: polygon,
        people: headCount,
        density: peopleDensity,
        sheltered: shelteredShare,
      }),
    )
    .optional(),
  basemap: featureCollection,
  terrain: text('a GeoTIFF elevation model path in quotes, relative to the scenario file').optional(),
});

const commonVehicle = {
  mass: quantity('mass', POSITIVE),
  diameter: optionalQuantity('length', POSITIVE),
  referenceArea: optionalQuantity('area', POSITIVE),
  drag,
};

export const NOSE_FORMS = ['cone', 'ogive', 'parabola'] as const;

const finCount = leaf((value): LeafResult<3 | 4> => {
  if (value === 3 || value === 4) return ok(value);
  if (value === undefined) return fail('missing (required); expected 3 or 4 fins');
  return fail(`${describeValue(value)} is not a fin count this model knows; expected 3 or 4`);
});

/** vehicle.shape as the format's "vehicle.shape (rockets)" defines it; geometry checks in shape-checks.ts. */
const shapeSchema = strict({
  nose: strict({ form: oneOf(NOSE_FORMS), length: quantity('length', POSITIVE) }),
  transitions: z
    .array(
      strict({
        position: quantity('length', POSITIVE),
        length: quantity('length', POSITIVE),
        foreDiameter: quantity('length', NOT_NEGATIVE),
        aftDiameter: quantity('length', NOT_NEGATIVE),
      }),
    )
    .optional(),
  fins: z
    .array(
      strict({
        count: finCount,
        position: quantity('length', POSITIVE),
        rootChord: quantity('length', POSITIVE),
        tipChord: quantity('length', NOT_NEGATIVE),
        span: quantity('length', POSITIVE),
        sweep: quantity('length'),
      }),
    )
    .min(1),
  length: optionalQuantity('length', POSITIVE),
  cg: quantity('length', POSITIVE),
  inertia: optionalQuantity('inertia', POSITIVE),
  motorEnd: optionalQuantity('length', POSITIVE),
});

const rocketVehicleSchema = strict({
  kind: oneOf(['rocket'] as const),
  ...commonVehicle,
  motor: strict({
    // Checked by thrust.ts, which may have to read a CSV file first (and reports it missing).
    thrust: z.unknown().optional(),
    propellantMass: quantity('mass', POSITIVE),
    length: optionalQuantity('length', POSITIVE),
  }),
  shape: shapeSchema.optional(),
});

const plainVehicleSchema = (kind: 'projectile' | 'release') =>
  strict({
    kind: oneOf([kind] as const),
    ...commonVehicle,
    motor: forbidden(`a ${kind} has no motor; remove it, or set vehicle.kind to 'rocket'`),
    shape: forbidden(`a ${kind} flies as a point mass and has no shape; remove it, or set vehicle.kind to 'rocket'`),
  });

const projectileVehicleSchema = plainVehicleSchema('projectile');
const releaseVehicleSchema = plainVehicleSchema('release');

/** Used only to report problems when vehicle.kind is missing or misspelt. */
const unknownKindVehicleSchema = strict({ kind: oneOf(VEHICLE_KINDS), ...commonVehicle, motor: z.unknown().optional(), shape: z.unknown().optional() });

const rocketLaunchSchema = strict({
  rail: quantity('length', NOT_NEGATIVE),
  tilt: quantity('angle', { min: 0, max: 90 }),
  azimuth: quantity('angle'),
});

const projectileLaunchSchema = strict({
  speed: quantity('speed', POSITIVE),
  elevation: quantity('angle', { min: 0, max: 90 }),
  azimuth: quantity('angle'),
  height: optionalQuantity('length', NOT_NEGATIVE),
});

const releaseLaunchSchema = strict({
  height: quantity('length', POSITIVE),
  speed: quantity('speed', NOT_NEGATIVE),
  // Required unless a path gives it (cross-checks).
  heading: optionalQuantity('angle'),
  east: optionalQuantity('length', { min: -MAX_SITE_DISTANCE, max: MAX_SITE_DISTANCE, hint: () => FLAT_FRAME_HINT }),
  north: optionalQuantity('length', { min: -MAX_SITE_DISTANCE, max: MAX_SITE_DISTANCE, hint: () => FLAT_FRAME_HINT }),
  path: lineString.optional(),
  area: polygon.optional(),
  duration: optionalQuantity('time', POSITIVE),
  rate: optionalQuantity('rate', NOT_NEGATIVE),
});

const stageSchema = strict({
  name: text('a stage name in quotes'),
  trigger: oneOf(TRIGGER_KINDS),
  delay: optionalQuantity('time', NOT_NEGATIVE),
  altitude: optionalQuantity('length', POSITIVE),
  time: optionalQuantity('time', NOT_NEGATIVE),
  dragArea: optionalQuantity('area', POSITIVE),
  descentRate: optionalQuantity('speed', POSITIVE),
  // A canopy given by its size: nominal diameter and the drag coefficient referred to it.
  diameter: optionalQuantity('length', POSITIVE),
  drag: optionalQuantity('number', POSITIVE),
  canopy: optionalText,
});

const profileRowSchema = strict({
  altitude: quantity('length', NOT_NEGATIVE),
  speed: quantity('speed', NOT_NEGATIVE),
  from: quantity('angle'),
});

/** `weather.forecast`: a GRIB2 file and the valid time to read it at (see src/forecast). */
const forecastSchema = strict({
  file: text('a GRIB2 file path in quotes, relative to the scenario file'),
  time: leaf((value): LeafResult<number> => {
    const t = typeof value === 'string' ? parseValidTime(value) : NaN;
    if (Number.isFinite(t)) return ok(t);
    return fail(`${describeValue(value)} is not a time; expected an ISO 8601 date-time with its zone, e.g. '2026-06-01T14:00Z' or '2026-06-01T16:00+02:00'`);
  }),
  window: optionalQuantity('time', POSITIVE),
});

const weatherSchema = strict({
  // Speed and direction come from the forecast when there is one (cross-checks.ts).
  wind: strict({
    speed: optionalQuantity('speed', NOT_NEGATIVE),
    from: optionalQuantity('angle'),
    gust: optionalQuantity('speed', NOT_NEGATIVE),
    height: optionalQuantity('length', POSITIVE),
    shear,
    profile: z.array(profileRowSchema).min(1).optional(),
  }).optional(),
  forecast: forecastSchema.optional(),
  // The range is wide enough for any launch site on Earth and narrow enough to catch a missing unit.
  temperature: optionalQuantity('temperature', { min: 173.15, max: 343.15, hint: temperatureHint }),
  pressure: optionalQuantity('pressure', { min: 30_000, max: 110_000, hint: pressureHint }),
  turbulence,
});

const failureSchema = strict({
  name: text('a name in quotes'),
  // Exactly one of probability and rate (cross-checks).
  probability: optionalQuantity('fraction', { min: 0, max: 1 }),
  rate: optionalQuantity('rate', NOT_NEGATIVE),
  // "skip" is the default effect, so it may be left out; "early" moves a breakup (cross-checks).
  effect: leaf((value): LeafResult<'skip' | 'early'> => {
    if (value === 'skip' || value === 'early') return ok(value);
    return fail(`${describeValue(value)} is not an effect this version knows; expected 'skip' or 'early'`);
  }).optional(),
  stage: text("a recovery stage name, 'all', or the breakup's name"),
  time: optionalQuantity('time', NOT_NEGATIVE),
});

/** One class of pieces of a breakup (cross-checks: one way to give the size). */
const fragmentSchema = strict({
  name: text('a name for this class of pieces in quotes'),
  count: leaf((value): LeafResult<number> => {
    if (typeof value === 'number' && Number.isInteger(value) && value >= 1 && value <= MAX_FRAGMENT_COUNT) return ok(value);
    return fail(`${value === undefined ? 'missing (required)' : describeValue(value)}; expected a whole number of pieces, 1 to ${MAX_FRAGMENT_COUNT}`);
  }),
  mass: quantity('mass', POSITIVE),
  diameter: optionalQuantity('length', POSITIVE),
  referenceArea: optionalQuantity('area', POSITIVE),
  dragArea: optionalQuantity('area', POSITIVE),
  drag: optionalQuantity('number', POSITIVE),
  speed: optionalQuantity('speed', NOT_NEGATIVE),
  radius: optionalQuantity('length', POSITIVE),
});

const breakupSchema = strict({
  name: text('a name for the breakup in quotes'),
  trigger: oneOf(['apogee', 'time'] as const),
  delay: optionalQuantity('time', NOT_NEGATIVE),
  time: optionalQuantity('time', NOT_NEGATIVE),
  fragments: z.array(fragmentSchema).min(1),
});

const runSchema = (cap: number) =>
  strict({
    samples: samples(cap),
    seed,
    levels,
    keepOut: strict({
      level: optionalQuantity('fraction', { above: 0, below: 1 }),
      margin: optionalQuantity('length', { min: 0, max: MAX_SITE_DISTANCE, hint: () => FLAT_FRAME_HINT }),
    }).optional(),
    // How results are shown (terminal text, sheet): a default that --units and --paper override.
    units: oneOf(['metric', 'imperial'] as const).optional(),
    paper: oneOf(['a4', 'letter'] as const).optional(),
  });

const riskSchema = strict({
  casualtyEnergy: optionalQuantity('energy', NOT_NEGATIVE),
  casualtyProbability: casualtyTable,
  personRadius: optionalQuantity('length', POSITIVE),
  personHeight: optionalQuantity('length', POSITIVE),
  objectRadius: optionalQuantity('length', POSITIVE),
  levels: riskLevels,
  criteria: strict({ individual: perFlight, collective: perFlight }).optional(),
});

/** Every top-level field; vehicle and launch are parsed on their own once vehicle.kind is known. */
const topSchema = (cap: number) =>
  strict({
    strewn: version,
    name: text('a short title in quotes'),
    notes: optionalText,
    site: siteSchema,
    // Parsed by parseBody, which also reports them missing.
    vehicle: z.unknown().optional(),
    launch: z.unknown().optional(),
    recovery: z.array(stageSchema).optional(),
    weather: weatherSchema,
    uncertainty: strict(uncertaintyShape()).optional(),
    failures: z.array(failureSchema).optional(),
    run: runSchema(cap).optional(),
    risk: riskSchema.optional(),
    breakup: breakupSchema.optional(),
  });

// ---------------------------------------------------------------------------------------------
// Parsed (validated, SI) scenario.

type TopOutput = z.output<ReturnType<typeof topSchema>>;

export type ParsedSite = z.output<typeof siteSchema>;
export type ParsedStage = z.output<typeof stageSchema>;
export type ParsedWeather = z.output<typeof weatherSchema>;
export type ParsedFailure = z.output<typeof failureSchema>;
export type ParsedBreakup = z.output<typeof breakupSchema>;
export type ParsedRun = z.output<ReturnType<typeof runSchema>>;
export type ParsedRocketVehicle = z.output<typeof rocketVehicleSchema>;
export type ParsedPlainVehicle = z.output<typeof projectileVehicleSchema>;

export type ParsedBody =
  | { kind: 'rocket'; vehicle: ParsedRocketVehicle; launch: z.output<typeof rocketLaunchSchema> }
  | { kind: 'projectile'; vehicle: ParsedPlainVehicle; launch: z.output<typeof projectileLaunchSchema> }
  | { kind: 'release'; vehicle: ParsedPlainVehicle; launch: z.output<typeof releaseLaunchSchema> };

/** The file after validation: structure as written, every quantity in SI, no defaults yet. */
export type ParsedScenario = Omit<TopOutput, 'vehicle' | 'launch'> & { body: ParsedBody };

export interface ValidateOptions {
  /** Highest `run.samples` accepted (default 10,000,000). */
  maxSamples?: number;
}

export interface Validation {
  /** Present when there are no issues. */
  parsed?: ParsedScenario;
  issues: Issue[];
}

/**
 * Validates a scenario read from JSON and converts its quantities to SI. Collects every problem
 * in the file. The motor's thrust curve is not checked here (it may live in a file); see thrust.ts.
 */
export function validateScenario(json: unknown, options: ValidateOptions = {}): Validation {
  const cap = options.maxSamples ?? DEFAULT_MAX_SAMPLES;
  if (!Number.isInteger(cap) || cap < 1) {
    return { issues: [{ path: 'maxSamples', message: `${describeValue(cap)} is not a sample cap; expected a whole number, 1 or more` }] };
  }
  if (!isRecord(json)) {
    return { issues: [{ path: '', message: `${describeValue(json)}; expected the scenario to be a JSON object {...}` }] };
  }
  const guarded = rawJsonIssues(json);
  if (guarded.length > 0) return { issues: guarded };
  const issues: Issue[] = [];
  const top = parseWith(topSchema(cap), json, [], issues);
  const body = parseBody(json.vehicle, json.launch, issues);
  issues.push(...crossCheck(json, vehicleKindOf(json.vehicle)));
  if (issues.length > 0 || top === undefined || body === undefined) return { issues };
  const { vehicle: _vehicle, launch: _launch, ...rest } = top;
  return { parsed: { ...rest, body }, issues };
}

/** The vehicle kind as written, if it is one we know; decides how vehicle and launch are read. */
export function vehicleKindOf(vehicle: unknown): VehicleKind | undefined {
  const kind = isRecord(vehicle) ? vehicle.kind : undefined;
  return VEHICLE_KINDS.find((k) => k === kind);
}

function parseBody(vehicle: unknown, launch: unknown, issues: Issue[]): ParsedBody | undefined {
  const kind = vehicleKindOf(vehicle);
  switch (kind) {
    case 'rocket': {
      const v = parseWith(rocketVehicleSchema, vehicle, ['vehicle'], issues);
      const l = parseWith(rocketLaunchSchema, launch, ['launch'], issues);
      // The shape's geometry can be judged once its numbers are read.
      if (v !== undefined) issues.push(...shapeIssues(v));
      return v && l && { kind, vehicle: v, launch: l };
    }
    case 'projectile': {
      const v = parseWith(projectileVehicleSchema, vehicle, ['vehicle'], issues);
      const l = parseWith(projectileLaunchSchema, launch, ['launch'], issues);
      return v && l && { kind, vehicle: v, launch: l };
    }
    case 'release': {
      const v = parseWith(releaseVehicleSchema, vehicle, ['vehicle'], issues);
      const l = parseWith(releaseLaunchSchema, launch, ['launch'], issues);
      return v && l && { kind, vehicle: v, launch: l };
    }
    default:
      // Without a kind the launch fields cannot be judged (the vehicle.kind issue says why), but a
      // missing launch can still be reported.
      parseWith(unknownKindVehicleSchema, vehicle, ['vehicle'], issues);
      parseWith(z.looseObject({}), launch, ['launch'], issues);
      return undefined;
  }
}

function parseWith<T>(schema: z.ZodType<T>, value: unknown, prefix: PathPart[], issues: Issue[]): T | undefined {
  // jitless: zod would otherwise write and compile a parser (new Function) for every object
  // schema on its first parse, and the schemas here are made afresh for each scenario
  // (topSchema(cap) and the vehicle kinds), so that compiled parser is never reused: skipping it
  // cuts a scenario's validation from about 25 to 15 CPU-ms. The result and the issues are the
  // same (zod's documented option; test/scenario and test/reliability hold them).
  const result = schema.safeParse(value, { reportInput: true, jitless: true });
  if (result.success) return result.data;
  for (const issue of result.error.issues) issues.push(toIssue(issue, prefix));
  return undefined;
}

const TYPE_WORDS: Record<string, string> = {
  object: 'an object {...}',
  array: 'a list [...]',
  string: 'text in quotes',
  number: 'a number',
  boolean: 'true or false',
  nonoptional: 'a value',
};

/** Turns one zod issue into a user-facing issue: dotted path, the value given, what was expected. */
function toIssue(issue: z.core.$ZodIssue, prefix: PathPart[]): Issue {
  const parts = [...prefix, ...issue.path] as PathPart[];
  const path = formatPath(parts);
  const input = (issue as { input?: unknown }).input;
  const given = input === undefined ? 'missing (required)' : describeValue(input);
  switch (issue.code) {
    case 'custom': {
      const params = issue.params as Partial<UnknownFieldParams> | undefined;
      if (params?.unknownField === true) return { path, message: unknownFieldMessage(String(parts[parts.length - 1]), params.known ?? []) };
      return { path, message: issue.message };
    }
    case 'invalid_type':
      return { path, message: `${given}; expected ${TYPE_WORDS[issue.expected] ?? issue.expected}` };
    case 'too_small':
      return { path, message: `${given} is too short; expected at least ${String(issue.minimum)} ${issue.origin === 'array' ? 'entries' : ''}`.trimEnd() };
    default:
      return { path, message: `${given}: ${issue.message}` };
  }
}
