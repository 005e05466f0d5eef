import { createLocalFrame } from '../../../src/analysis/geodesy.js';
import { flyNominal } from '../../../src/dispersion/runner.js';
import { machWarnings, railExitSpeedWarnings } from '../../../src/scenario/warnings.js';
import { apogeeWarnings } from '../../../src/scenario/plausibility.js';
import { stabilityWarnings } from '../../../src/flight/stability-warnings.js';
import type { Issue, Scenario } from '../../../src/scenario/types.js';
import type { FlightResult } from '../../../src/flight/flight.js';

/** The nominal flight, flown by the engine, as the map draws it. */
export interface NominalFlight {
  /** Ground track as [lon, lat] from launch to landing. */
  track: [number, number][];
  /** Highest point of the track: where and how high (m above the pad). */
  apogee: { lonLat: [number, number]; height: number } | null;
  landed: boolean;
  /** Warnings that only a flight can give (rail-exit speed), as the command line adds them. */
  warnings: Issue[];
  /** The engine's result of that flight (stability figures and the apogee point read it). */
  result: FlightResult;
}

/**
 * Flies the nominal flight once and keeps its ground track. The engine reports the state after
 * every accepted step with y = [east, north, up, ...] metres from the pad; those become map points
 * through the same local frame that places the landings.
 */
export function nominalFlight(scenario: Scenario): NominalFlight {
  const frame = createLocalFrame(scenario.site.pad);
  const track: [number, number][] = [];
  let apogee: NominalFlight['apogee'] = null;
  const result = flyNominal(scenario, (_t, y) => {
    const point = frame.toLonLat(y[0]!, y[1]!);
    track.push(point);
    if (apogee === null || y[2]! > apogee.height) apogee = { lonLat: point, height: y[2]! };
  });
  return {
    result,
    track,
    apogee,
    landed: result.status === 0,
    warnings: [...stabilityWarnings(scenario), ...railExitSpeedWarnings(scenario, result.railExitSpeed), ...machWarnings(scenario, result.maxMach), ...apogeeWarnings(result.apogee)],
  };
}
