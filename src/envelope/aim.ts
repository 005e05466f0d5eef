/**
 * How the crew aims the rail (or mortar) as the wind goes round, for the wind envelope:
 * - `fixed`: the scenario's azimuth whatever the wind (the envelope's original behaviour);
 * - `into-wind`: the launcher leans toward the direction the wind blows from, so the vehicle
 *   weathercocks less far downwind and drifts back over the pad (common practice, no source);
 * - `away-from`: the launcher leans directly away from the centre of a named area (the crowd).
 * The lean itself is the scenario's (rail tilt from vertical, or 90° − elevation for a
 * projectile), capped at `maxTilt`.
 */
import { createLocalFrame } from '../analysis/geodesy.js';
import type { Scenario } from '../scenario/types.js';

export type AimMode = 'fixed' | 'into-wind' | 'away-from';

export interface Aim {
  mode: AimMode;
  /** Area name for `away-from`. */
  area?: string;
  /** Largest lean from vertical, degrees. */
  maxTilt: number;
}

/** Bearing from the pad away from an area's centre (mean of its outer ring's corners), degrees. */
export function bearingAwayFrom(scenario: Scenario, areaName: string): number {
  const area = scenario.site.areas.find((a) => a.name === areaName);
  if (area === undefined) throw new Error(`no area named '${areaName}'`);
  const frame = createLocalFrame(scenario.site.pad);
  const ring = area.geometry.coordinates[0].slice(0, -1).map(([lon, lat]) => frame.toEastNorth(lon, lat));
  const e = ring.reduce((s, p) => s + p[0], 0) / ring.length;
  const n = ring.reduce((s, p) => s + p[1], 0) / ring.length;
  return ((Math.atan2(-e, -n) * 180) / Math.PI + 360) % 360;
}

/** The scenario with the launcher aimed for a wind from `from`; releases are returned unchanged. */
export function aimedScenario(scenario: Scenario, from: number, aim: Aim | undefined): Scenario {
  const l = scenario.launch;
  if (aim === undefined || l.kind === 'release') return scenario;
  // On a calm day there is no wind to turn into: the rail stays where the scenario puts it.
  const calm = scenario.weather.wind.speed === 0 && (scenario.weather.wind.profile ?? []).every((row) => row.speed === 0);
  const azimuth = aim.mode === 'fixed' || (aim.mode === 'into-wind' && calm) ? l.azimuth : aim.mode === 'into-wind' ? from : bearingAwayFrom(scenario, aim.area!);
  if (l.kind === 'rocket') return { ...scenario, launch: { ...l, azimuth, tilt: Math.min(l.tilt, aim.maxTilt) } };
  return { ...scenario, launch: { ...l, azimuth, elevation: Math.max(l.elevation, 90 - aim.maxTilt) } };
}

/** The launcher's azimuth and lean from vertical in a scenario (null for a release). */
export function railOf(scenario: Scenario): { azimuth: number; tilt: number } | null {
  const l = scenario.launch;
  if (l.kind === 'rocket') return { azimuth: l.azimuth, tilt: l.tilt };
  if (l.kind === 'projectile') return { azimuth: l.azimuth, tilt: 90 - l.elevation };
  return null;
}
