import type { RawDrag } from './fields.js';
import type { ParsedBody, ParsedRocketVehicle, ParsedScenario, ParsedStage, ParsedWeather } from './schema.js';
import { shapeLength } from './shape-checks.js';
import {
  UNCERTAINTY_NAMES,
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
    launch: normalizeLaunch(parsed.body),
    recovery: (parsed.recovery ?? []).map((stage) => normalizeStage(stage, parsed.body.vehicle.mass)),
    weather: normalizeWeather(parsed.weather),
    uncertainty: normalizeUncertainty(parsed.uncertainty),
    failures: (parsed.failures ?? []).map((f) => ({ name: f.name, probability: f.probability, effect: f.effect ?? 'skip', stage: f.stage })),
    run: normalizeRun(parsed.run),
  };
  if (parsed.notes !== undefined) scenario.notes = parsed.notes;
  if (parsed.risk !== undefined) scenario.risk = normalizeRisk(parsed.risk);
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

function normalizeLaunch(body: ParsedBody): Launch {
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
    case 'release':
      return {
        kind: 'release',
        height: body.launch.height,
        speed: body.launch.speed,
        heading: normalizeDirection(body.launch.heading),
        east: body.launch.east ?? 0,
        north: body.launch.north ?? 0,
      };
  }
}

function normalizeStage(stage: ParsedStage, mass: number): RecoveryStage {
  const out: RecoveryStage = {
    name: stage.name,
    trigger: stage.trigger,
    delay: stage.delay ?? DEFAULT_RECOVERY_DELAY,
    // The cross-checks guarantee exactly one of dragArea and descentRate.
    dragArea: stage.dragArea ?? dragAreaForDescentRate(mass, stage.descentRate!),
  };
  if (stage.trigger === 'altitude') out.altitude = stage.altitude;
  if (stage.trigger === 'time') out.time = stage.time;
  if (stage.descentRate !== undefined) out.descentRate = stage.descentRate;
  return out;
}

function normalizeWeather(weather: ParsedWeather): Weather {
  const w = weather.wind;
  const out: Weather = {
    wind: {
      speed: w.speed,
      from: normalizeDirection(w.from),
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
  return {
    samples: run?.samples ?? DEFAULT_RUN.samples,
    seed: run?.seed ?? DEFAULT_RUN.seed,
    levels: run?.levels ?? [...DEFAULT_RUN.levels],
    keepOut: {
      level: run?.keepOut?.level ?? DEFAULT_RUN.keepOut.level,
      margin: run?.keepOut?.margin ?? DEFAULT_RUN.keepOut.margin,
    },
  };
}
