import type { FlightResult } from '../flight/flight.js';
import { flyNominal } from '../dispersion/runner.js';
import { stabilityFigures } from '../physics/aero.js';
import { MeanWind, referenceSpeed } from '../physics/wind.js';
import type { Scenario } from '../scenario/types.js';

/**
 * The figures people judge a rocket's flight by, for summary.json, `strewn check`, the sheet and
 * the page: stability from the shape (Barrowman, Mach 0), the rail exit of the nominal flight, and
 * where the nominal flight's apogee is.
 */

/** summary.json `stability` (field names fixed by the scenario format). */
export interface StabilitySummary {
  cp_m: number;
  cg_m: number;
  normalForceSlope_per_rad: number;
  margin_cal: number;
  marginBurnout_cal: number;
  railExitSpeed_m_s: number;
  railExitAngleOfAttack_deg: number;
  /** Added: the balance point at burnout, m from the nose tip. */
  cgBurnout_m: number;
}

/** Where the nominal flight's apogee is: height above the pad, distance and bearing from it. */
export interface ApogeePoint {
  height_m: number;
  distance_m: number;
  bearing_deg: number;
}

export interface NominalFigures {
  nominal: FlightResult;
  stability?: StabilitySummary;
  apogee: ApogeePoint | null;
}

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** Compass bearing (deg, clockwise from north) of an east/north offset. */
export function bearingOf(east: number, north: number): number {
  const b = (Math.atan2(east, north) * 180) / Math.PI;
  return round((b + 360) % 360, 1) % 360;
}

/**
 * The angle (deg) between the rail and the air-relative velocity at rail exit: the rocket leaves
 * the rail at `speed` along it, into the nominal mean wind at the height of the rail's end.
 */
export function railExitAngleOfAttack(scenario: Scenario, speed: number): number {
  const l = scenario.launch;
  if (l.kind !== 'rocket' || !(speed > 0)) return NaN;
  const D = Math.PI / 180;
  const rail = [Math.sin(l.tilt * D) * Math.sin(l.azimuth * D), Math.sin(l.tilt * D) * Math.cos(l.azimuth * D), Math.cos(l.tilt * D)];
  const wind = new MeanWind(scenario.weather.wind);
  wind.setSample(referenceSpeed(scenario.weather.wind), 0);
  const w = new Float64Array(3);
  wind.at(l.rail * rail[2], w);
  const rel = [speed * rail[0] - w[0], speed * rail[1] - w[1], speed * rail[2]];
  const along = rel[0] * rail[0] + rel[1] * rail[1] + rel[2] * rail[2];
  return (Math.acos(Math.min(1, along / Math.hypot(rel[0], rel[1], rel[2]))) * 180) / Math.PI;
}

/** Flies the nominal flight once and works out the figures (stability only for rockets with a shape). */
export function nominalFigures(scenario: Scenario, nominal: FlightResult = flyNominal(scenario)): NominalFigures {
  const out: NominalFigures = { nominal, apogee: null };
  if (nominal.status === 0 || nominal.apogeeTime > 0) {
    out.apogee = {
      height_m: round(nominal.apogee, 1),
      distance_m: round(Math.hypot(nominal.apogeeEast, nominal.apogeeNorth), 1),
      bearing_deg: bearingOf(nominal.apogeeEast, nominal.apogeeNorth),
    };
  }
  const v = scenario.vehicle;
  if (v.kind === 'rocket' && v.shape !== undefined && v.diameter !== undefined && v.motor?.length !== undefined) {
    const f = stabilityFigures(v.shape, v.diameter, v.mass, v.motor.propellantMass, v.motor.length);
    out.stability = {
      cp_m: round(f.cp_m, 4),
      cg_m: round(f.cg_m, 4),
      normalForceSlope_per_rad: round(f.normalForceSlope_per_rad, 3),
      margin_cal: round(f.margin_cal, 2),
      marginBurnout_cal: round(f.marginBurnout_cal, 2),
      railExitSpeed_m_s: round(nominal.railExitSpeed, 2),
      railExitAngleOfAttack_deg: round(railExitAngleOfAttack(scenario, nominal.railExitSpeed), 2),
      cgBurnout_m: round(f.cgBurnout_m, 4),
    };
  }
  return out;
}

/** The lines `strewn check` prints about them. */
export function nominalFigureLines(figures: NominalFigures): string[] {
  const lines: string[] = [];
  const s = figures.stability;
  if (s !== undefined) {
    lines.push(
      `stability (Barrowman, subsonic, from the nose tip): CP ${s.cp_m.toFixed(3)} m, CG ${s.cg_m.toFixed(3)} m at lift-off and ${s.cgBurnout_m.toFixed(3)} m at burnout, normal-force slope ${s.normalForceSlope_per_rad.toFixed(2)} per rad`,
      `static margin ${s.margin_cal.toFixed(2)} calibres at lift-off, ${s.marginBurnout_cal.toFixed(2)} at burnout`,
    );
    if (Number.isFinite(s.railExitSpeed_m_s)) {
      lines.push(`rail exit at ${s.railExitSpeed_m_s.toFixed(1)} m/s, angle of attack ${s.railExitAngleOfAttack_deg.toFixed(1)} deg in the scenario's mean wind`);
    }
  }
  const a = figures.apogee;
  if (a !== null) lines.push(`nominal apogee ${a.height_m.toFixed(0)} m above the pad, ${a.distance_m.toFixed(0)} m from it toward ${a.bearing_deg.toFixed(0)} deg`);
  return lines;
}
