import type { RawDrag } from './fields.js';
import type { ParsedBody, ParsedBreakup, ParsedRocketVehicle, ParsedScenario, ParsedStage, ParsedWeather } from './schema.js';
import { shapeLength } from './shape-checks.js';
// A pure leaf module (no imports): the path length is measured in the same local frame the
// flights and the analysis use.
import { createLocalFrame } from '../analysis/geodesy.js';
import {
  UNCERTAINTY_NAMES,
  type Breakup,
  type FailureMode,
  type FragmentClass,
  type LineStringGeometry,
  type ReleaseLaunch,
  type DragTable,
  type Launch,
  type Motor,
  type RecoveryStage,
  type RiskInput,
  type RocketShape,
  type RunSettings,
  type Scenario,
  type Site,
  type Spread,
  type ThrustCurve,
  type UncertaintyName,
  type Vehicle,
  type Weather,
} from './types.js';

/** Standard gravity, m/s² (the conventional value, exact by definition). */
export const G0 = 9.80665;
/** Sea-level air density of the standard atmosphere, kg/m³; the density a "descent rate" refers to. */
export const SEA_LEVEL_DENSITY = 1.225;

export const DEFAULT_PAD_ELEVATION = 0;
export const DEFAULT_WIND_HEIGHT = 10;
export const DEFAULT_SHEAR = 0.14;
export const DEFAULT_RECOVERY_DELAY = 0;
export const DEFAULT_RUN: RunSettings = {
  samples: 2000,
  seed: '1',
  levels: [0.5, 0.9, 0.99],
  keepOut: { level: 0.99, margin: 25 },
};

/** Cd·A whose steady sea-level descent rate is `rate`: from m g0 = ½ ρ0 v² Cd·A. */
export function dragAreaForDescentRate(mass: number, rate: number): number {
  return (2 * mass * G0) / (SEA_LEVEL_DENSITY * rate * rate);
}

/** Cd·A of a canopy of nominal diameter d whose drag coefficient Cd refers to the area π d²/4. */
export function canopyDragArea(diameter: number, cd: number): number {
  return (cd * Math.PI * diameter * diameter) / 4;
}

/** The steady descent rate under `dragArea` in air of `density` (kg/m³), with standard gravity. */
export function descentRateAtDensity(mass: number, dragArea: number, density: number): number {
  return Math.sqrt((2 * mass * G0) / (density * dragArea));
}

/** The steady sea-level descent rate under `dragArea` (the inverse of dragAreaForDescentRate). */
export function descentRateForDragArea(mass: number, dragArea: number): number {
  return Math.sqrt((2 * mass * G0) / (SEA_LEVEL_DENSITY * dragArea));
}

/** A compass direction in [0, 360), so -10 and 350 become the same number. */
export function normalizeDirection(degrees: number): number {
  const d = degrees % 360;
  return d < 0 ? d + 360 : d === 0 ? 0 : d;
}

/**
 * The validated file as the normalised scenario: defaults filled, reference area and drag areas
 * worked out, directions in [0, 360). `thrust` is the checked motor curve (rockets only).
 */
export function normalizeScenario(parsed: ParsedScenario, thrust?: { curve: ThrustCurve; source: string }): Scenario {
  const scenario: Scenario = {
    strewn: 1,
    name: parsed.name,
    site: normalizeSite(parsed.site),
    vehicle: normalizeVehicle(parsed.body, thrust),
    launch: normalizeLaunch(parsed),
    recovery: (parsed.recovery ?? []).map((stage) => normalizeStage(stage, parsed.body.vehicle.mass)),
    weather: normalizeWeather(parsed.weather),
    uncertainty: normalizeUncertainty(parsed.uncertainty),
    failures: normalizeFailures(parsed),
    run: normalizeRun(parsed.run),
  };
  if (parsed.notes !== undefined) scenario.notes = parsed.notes;
  if (parsed.risk !== undefined) scenario.risk = normalizeRisk(parsed.risk);
  if (parsed.breakup !== undefined) scenario.breakup = normalizeBreakup(parsed.breakup);
  return scenario;
}

function normalizeSite(site: ParsedScenario['site']): Site {
  const out: Site = {
    pad: { lat: site.pad.lat, lon: site.pad.lon, elevation: site.pad.elevation ?? DEFAULT_PAD_ELEVATION },
    areas: (site.areas ?? []).map((area) => {
      const copy: Site['areas'][number] = { name: area.name, kind: area.kind, geometry: area.geometry };
      if (area.people !== undefined) copy.people = area.people;
      if (area.density !== undefined) copy.density = area.density;
      if (area.sheltered !== undefined) copy.sheltered = area.sheltered;
      return copy;
    }),
  };
  if (site.minimumDistance !== undefined) out.minimumDistance = site.minimumDistance;
  if (site.boundary !== undefined) out.boundary = site.boundary;
  if (site.basemap !== undefined) out.basemap = site.basemap;
  return out;
}

/** Only what the file gave; src/risk/settings.ts fills the defaults (so old hashes stay). */
function normalizeRisk(risk: NonNullable<ParsedScenario['risk']>): RiskInput {
  const out: RiskInput = {};
  if (risk.casualtyEnergy !== undefined) out.casualtyEnergy = risk.casualtyEnergy;
  if (risk.casualtyProbability !== undefined) out.casualtyProbability = risk.casualtyProbability;
  if (risk.personRadius !== undefined) out.personRadius = risk.personRadius;
  if (risk.personHeight !== undefined) out.personHeight = risk.personHeight;
  if (risk.objectRadius !== undefined) out.objectRadius = risk.objectRadius;
  if (risk.levels !== undefined) out.levels = [...risk.levels].sort((a, b) => b - a);
  if (risk.criteria !== undefined) {
    out.criteria = {};
    if (risk.criteria.individual !== undefined) out.criteria.individual = risk.criteria.individual;
    if (risk.criteria.collective !== undefined) out.criteria.collective = risk.criteria.collective;
  }
  return out;
}

function normalizeVehicle(body: ParsedBody, thrust: { curve: ThrustCurve; source: string } | undefined): Vehicle {
  const v = body.vehicle;
  // The schema's cross-checks guarantee exactly one of diameter and referenceArea.
  const referenceArea = v.referenceArea ?? (Math.PI * v.diameter! * v.diameter!) / 4;
  const vehicle: Vehicle = { kind: body.kind, mass: v.mass, referenceArea, drag: dragTable(v.drag) };
  if (body.kind === 'rocket') {
    if (thrust === undefined) throw new Error('normalizeScenario: a rocket needs its checked thrust curve');
    const parsedMotor = body.vehicle.motor;
    const motor: Motor = { thrust: thrust.curve, source: thrust.source, propellantMass: parsedMotor.propellantMass };
    if (parsedMotor.length !== undefined) motor.length = parsedMotor.length;
    vehicle.motor = motor;
    if (body.vehicle.shape !== undefined) {
      // The shape requires a diameter (checked): the nose base and the calibre.
      vehicle.diameter = v.diameter;
      vehicle.shape = normalizeShape(body.vehicle);
    }
  }
  return vehicle;
}

/** Defaults of vehicle.shape filled: length, inertia (m L²/12, m ready to fly), motorEnd. */
function normalizeShape(v: ParsedRocketVehicle): RocketShape {
  const shape = v.shape!;
  const length = shapeLength(v);
  const readyMass = v.mass + v.motor.propellantMass;
  return {
    nose: { form: shape.nose.form, length: shape.nose.length },
    transitions: (shape.transitions ?? []).map((t) => ({ position: t.position, length: t.length, foreDiameter: t.foreDiameter, aftDiameter: t.aftDiameter })),
    fins: shape.fins.map((f) => ({ count: f.count, position: f.position, rootChord: f.rootChord, tipChord: f.tipChord, span: f.span, sweep: f.sweep })),
    length,
    cg: shape.cg,
    inertia: shape.inertia ?? (readyMass * length * length) / 12,
    motorEnd: shape.motorEnd ?? length,
  };
}

/** A constant Cd becomes a one-row table; the table is held constant outside its rows anyway. */
export function dragTable(drag: RawDrag): DragTable {
  if (typeof drag === 'number') return { mach: [0], cd: [drag] };
  return { mach: drag.map((row) => row[0]), cd: drag.map((row) => row[1]) };
}

function normalizeLaunch(parsed: ParsedScenario): Launch {
  const body = parsed.body;
  switch (body.kind) {
    case 'rocket':
      return { kind: 'rocket', rail: body.launch.rail, tilt: body.launch.tilt, azimuth: normalizeDirection(body.launch.azimuth) };
    case 'projectile':
      return {
        kind: 'projectile',
        speed: body.launch.speed,
        elevation: body.launch.elevation,
        azimuth: normalizeDirection(body.launch.azimuth),
        height: body.launch.height ?? 0,
      };
    case 'release': {
      const l = body.launch;
      const out: ReleaseLaunch = {
        kind: 'release',
        height: l.height,
        speed: l.speed,
        heading: normalizeDirection(l.heading ?? 0),
        east: l.east ?? 0,
        north: l.north ?? 0,
      };
      if (l.heading === undefined) out.headingFree = true;
      if (l.path !== undefined) out.path = l.path;
      if (l.area !== undefined) out.area = l.area;
      const duration = l.duration ?? (l.path !== undefined && l.speed > 0 ? pathLength(parsed.site.pad, l.path) / l.speed : undefined);
      if (duration !== undefined) out.duration = duration;
      if (l.rate !== undefined) out.rate = l.rate;
      return out;
    }
  }
}

/** Length of a path in metres, measured in the pad's local frame (as the flights are). */
export function pathLength(pad: { lat: number; lon: number }, path: LineStringGeometry): number {
  const frame = createLocalFrame(pad);
  let length = 0;
  let last: [number, number] | undefined;
  for (const [lon, lat] of path.coordinates) {
    const p = frame.toEastNorth(lon, lat);
    if (last !== undefined) length += Math.hypot(p[0] - last[0], p[1] - last[1]);
    last = p;
  }
  return length;
}

/**
 * Chance per operation of a hazard with constant rate λ over a time T: 1 − e^(−λT) (the
 * exponential failure law, e.g. P. D. T. O'Connor, Practical Reliability Engineering, ch. 2).
 */
export function chanceOverDuration(rate: number, duration: number): number {
  return -Math.expm1(-rate * duration);
}

/**
 * Failure modes with a chance per flight. Modes given as rates compete over the operation (the
 * first failure ends it): together they take 1 − e^(−ΛT) with Λ the sum of their rates, and each
 * its share λ/Λ of that; a single rate mode is exactly 1 − e^(−λT).
 */
function normalizeFailures(parsed: ParsedScenario): FailureMode[] {
  const failures = parsed.failures ?? [];
  const launch = parsed.body.kind === 'release' ? parsed.body.launch : undefined;
  const duration = launch?.duration ?? 0;
  const totalRate = failures.reduce((sum, f) => sum + (f.rate ?? 0), 0);
  const together = chanceOverDuration(totalRate, duration);
  return failures.map((f) => {
    const out: FailureMode = { name: f.name, probability: f.probability ?? 0, effect: f.effect ?? 'skip', stage: f.stage };
    if (f.effect === 'early' && f.time !== undefined) out.time = f.time;
    if (f.rate !== undefined) {
      out.rate = f.rate;
      out.probability = totalRate > 0 ? (f.rate / totalRate) * together : 0;
    }
    return out;
  });
}

/**
 * The breakup with each piece's drag area, reference area and casualty radius worked out: from
 * `diameter` (A = π d²/4, radius d/2), from `referenceArea` (radius √(A/π)), or from `dragArea`
 * alone (Cd taken as 1, so A = Cd·A and radius √(A/π)); `radius` overrides the casualty radius.
 */
function normalizeBreakup(b: ParsedBreakup): Breakup {
  const out: Breakup = {
    name: b.name,
    trigger: b.trigger,
    delay: b.trigger === 'apogee' ? (b.delay ?? 0) : 0,
    fragments: b.fragments.map((f): FragmentClass => {
      const drag = f.dragArea !== undefined ? 1 : f.drag!;
      const referenceArea = f.dragArea ?? f.referenceArea ?? (Math.PI * f.diameter! * f.diameter!) / 4;
      return {
        name: f.name,
        count: f.count,
        mass: f.mass,
        dragArea: drag * referenceArea,
        drag,
        referenceArea,
        speed: f.speed ?? 0,
        radius: f.radius ?? (f.diameter !== undefined ? f.diameter / 2 : Math.sqrt(referenceArea / Math.PI)),
      };
    }),
  };
  if (b.trigger === 'time') out.time = b.time;
  return out;
}

function normalizeStage(stage: ParsedStage, mass: number): RecoveryStage {
  const out: RecoveryStage = {
    name: stage.name,
    trigger: stage.trigger,
    delay: stage.delay ?? DEFAULT_RECOVERY_DELAY,
    // The cross-checks guarantee exactly one of dragArea, descentRate, and diameter with drag.
    dragArea:
      stage.dragArea ??
      (stage.descentRate !== undefined ? dragAreaForDescentRate(mass, stage.descentRate) : canopyDragArea(stage.diameter!, stage.drag!)),
  };
  if (stage.diameter !== undefined && stage.drag !== undefined) {
    out.canopy = { diameter: stage.diameter, drag: stage.drag };
    if (stage.canopy !== undefined) out.canopy.note = stage.canopy;
  }
  if (stage.trigger === 'altitude') out.altitude = stage.altitude;
  if (stage.trigger === 'time') out.time = stage.time;
  if (stage.descentRate !== undefined) out.descentRate = stage.descentRate;
  return out;
}

function normalizeWeather(weather: ParsedWeather): Weather {
  // The cross-checks guarantee a speed and a direction, and load.ts fills them from a forecast.
  const w = weather.wind ?? {};
  const out: Weather = {
    wind: {
      speed: w.speed!,
      from: normalizeDirection(w.from!),
      height: w.height ?? DEFAULT_WIND_HEIGHT,
      shear: w.shear ?? DEFAULT_SHEAR,
    },
    // Off unless asked for or a gust says the air is gusty: no spreads and no gust means every
    // sample flies the nominal flight.
    turbulence: weather.turbulence ?? w.gust !== undefined,
  };
  if (w.gust !== undefined) out.wind.gust = w.gust;
  if (w.profile !== undefined) {
    out.wind.profile = w.profile
      .map((row) => ({ altitude: row.altitude, speed: row.speed, from: normalizeDirection(row.from) }))
      .sort((a, b) => a.altitude - b.altitude);
  }
  if (weather.temperature !== undefined) out.temperature = weather.temperature;
  if (weather.pressure !== undefined) out.pressure = weather.pressure;
  return out;
}

function normalizeUncertainty(uncertainty: ParsedScenario['uncertainty']): Partial<Record<UncertaintyName, Spread>> {
  const out: Partial<Record<UncertaintyName, Spread>> = {};
  if (uncertainty === undefined) return out;
  // In the fixed order of UNCERTAINTY_NAMES, so the result does not depend on the file's key order.
  for (const name of UNCERTAINTY_NAMES) {
    const spread = uncertainty[name];
    if (spread !== undefined) out[name] = spread;
  }
  return out;
}

function normalizeRun(run: ParsedScenario['run']): RunSettings {
  const out: RunSettings = {
    samples: run?.samples ?? DEFAULT_RUN.samples,
    seed: run?.seed ?? DEFAULT_RUN.seed,
    levels: run?.levels ?? [...DEFAULT_RUN.levels],
    keepOut: {
      level: run?.keepOut?.level ?? DEFAULT_RUN.keepOut.level,
      margin: run?.keepOut?.margin ?? DEFAULT_RUN.keepOut.margin,
    },
  };
  if (run?.units !== undefined) out.units = run.units;
  if (run?.paper !== undefined) out.paper = run.paper;
  return out;
}
