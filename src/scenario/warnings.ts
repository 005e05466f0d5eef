import { descentRateForDragArea } from './normalize.js';
import { formatNumber } from './units.js';
import type { Issue, Scenario } from './types.js';
import { plausibilityWarnings } from './plausibility.js';

/**
 * Values outside common hobby practice. They are warnings, not errors: the governing numbers are
 * the site's safety code, so Strewn points them out and defers. Thresholds are common practice
 * (no citable source); see the "Facts of the trade" in the project's reference notes.
 */
export const WARNING_LIMITS = {
  /** deg from vertical; rails are kept within about 20–30°. */
  maxRailTilt: 20,
  /** m/s at the surface; launches are usually called off above about 9 m/s (20 mph). */
  maxSurfaceWind: 9,
  /** m/s; slower than this the object drifts very far. */
  minDescentRate: 3,
  /** m/s; faster than this it lands hard (drogues run about 15–30 m/s). */
  maxDescentRate: 40,
  /** m/s; the slowest rail exit usually considered stable (about 50 ft/s). */
  minRailExitSpeed: 15,
  /** Static margin, calibres: under 1 is marginally stable, over 6 overstable (weathercocks hard). */
  minMargin: 1,
  maxMargin: 6,
} as const;

/** A check that needs only the normalised scenario. */
export type ScenarioCheck = (scenario: Scenario) => Issue[];

/** Every warning that can be worked out without flying the vehicle. */
export const scenarioWarnings: ScenarioCheck = (scenario) => [
  ...railTiltWarnings(scenario),
  ...surfaceWindWarnings(scenario),
  ...descentRateWarnings(scenario),
  ...shapeWarnings(scenario),
  ...plausibilityWarnings(scenario),
];

/**
 * A rocket without a shape flies as a point mass, and says so. A shape's static margin needs the
 * aerodynamics of the physics layer, so it is judged above it (src/flight/stability-warnings.ts),
 * where the command line, the page and the event add it to these warnings.
 */
export function shapeWarnings(scenario: Scenario): Issue[] {
  const v = scenario.vehicle;
  if (v.kind !== 'rocket') return [];
  if (v.shape === undefined || v.diameter === undefined || v.motor?.length === undefined) {
    return [{ path: 'vehicle.shape', message: POINT_MASS_ROCKET_WARNING }];
  }
  return [];
}

/** Shown wherever a rocket without a shape is flown (check, run, sheet, page). */
export const POINT_MASS_ROCKET_WARNING =
  "this rocket has no shape, so it flies as a point mass whose thrust turns into the air-relative wind the moment it leaves the rail; that overstates weathercocking (apogee and no-recovery landings too far upwind); give vehicle.shape and motor.length to fly it as a rigid body";

export function railTiltWarnings(scenario: Scenario): Issue[] {
  const launch = scenario.launch;
  if (launch.kind !== 'rocket' || !(launch.tilt > WARNING_LIMITS.maxRailTilt)) return [];
  return [
    {
      path: 'launch.tilt',
      message: `${formatNumber(launch.tilt)} deg is more than the ${WARNING_LIMITS.maxRailTilt} deg from vertical that rails are usually kept within; check the site's safety code`,
    },
  ];
}

/** The mean wind as given (at its reference height, 10 m unless set): the figure launch rules use. */
export function surfaceWindWarnings(scenario: Scenario): Issue[] {
  const speed = scenario.weather.wind.speed;
  if (!(speed > WARNING_LIMITS.maxSurfaceWind)) return [];
  return [
    {
      path: 'weather.wind.speed',
      message: `${formatNumber(speed)} m/s is above the ${WARNING_LIMITS.maxSurfaceWind} m/s (about 20 mph) at which launches are usually called off; check the site's safety code`,
    },
  ];
}

/** Each stage's steady sea-level descent rate, as given or as implied by its drag area. */
export function descentRateWarnings(scenario: Scenario): Issue[] {
  const issues: Issue[] = [];
  scenario.recovery.forEach((stage, i) => {
    const given = stage.descentRate !== undefined;
    const rate = stage.descentRate ?? descentRateForDragArea(scenario.vehicle.mass, stage.dragArea);
    const path = `recovery[${i}].${given ? 'descentRate' : 'dragArea'}`;
    const what = given ? `${formatNumber(rate)} m/s` : `${formatNumber(stage.dragArea)} m2 gives a sea-level descent rate of ${formatNumber(rate)} m/s, which`;
    if (rate < WARNING_LIMITS.minDescentRate) {
      issues.push({ path, message: `${what} is below ${WARNING_LIMITS.minDescentRate} m/s; the '${stage.name}' stage will drift a long way` });
    } else if (rate > WARNING_LIMITS.maxDescentRate) {
      issues.push({ path, message: `${what} is above ${WARNING_LIMITS.maxDescentRate} m/s; the '${stage.name}' stage will land hard` });
    }
  });
  return issues;
}

/** For the flight code, which knows the speed at the end of the rail. */
export function railExitSpeedWarnings(scenario: Scenario, railExitSpeed: number): Issue[] {
  if (scenario.launch.kind !== 'rocket' || !(railExitSpeed < WARNING_LIMITS.minRailExitSpeed)) return [];
  return [
    {
      path: 'launch.rail',
      message: `the rocket leaves the rail at ${formatNumber(railExitSpeed)} m/s, below the ${WARNING_LIMITS.minRailExitSpeed} m/s usually needed for a stable flight; use a longer rail or a stronger motor`,
    },
  ];
}

/** For the flight code: a flight faster than Mach 0.8 leaves the range of the subsonic stability estimates. */
export function machWarnings(scenario: Scenario, maxMach: number): Issue[] {
  if (scenario.vehicle.shape === undefined || !(maxMach > 0.8)) return [];
  return [
    {
      path: 'vehicle.shape',
      message: `the nominal flight reaches Mach ${formatNumber(Number(maxMach.toFixed(2)))}; the stability figures and the rigid-body flight use subsonic estimates (fins corrected only to Mach 0.8), so treat them as rough above it`,
    },
  ];
}
