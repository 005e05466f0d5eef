/**
 * One flight's inputs after its spreads were drawn: the values that differ between Monte-Carlo
 * samples. Reused between samples (set in place), so the hot loop allocates nothing.
 */
export interface FlightInputs {
  /** Mean wind speed at the reference height, m/s. */
  windSpeed: number;
  /** Angle added to every wind direction, deg. */
  windTurn: number;
  /** Dryden σ_w for this sample, m/s (0: no turbulence). */
  sigmaW: number;
  /**
   * Rocket rail tilt from vertical and its azimuth, deg. The tilt may be negative or pass 90°
   * after a spread: the rail then leans the other way (see launch-direction.ts).
   */
  tilt: number;
  azimuth: number;
  /** Lean across the vertical plane of the nominal lean (rocket rail or projectile elevation), deg. */
  leanAcross: number;
  /** Direction of a thrust misalignment around the body axis, deg (rigid-body rockets). */
  misalignmentDirection: number;
  /** Projectile: speed (m/s), elevation (deg), azimuth (deg), height (m). Release: speed, heading, height. */
  speed: number;
  elevation: number;
  heading: number;
  height: number;
  east: number;
  north: number;
  /** Multiplies the thrust curve (total impulse), 1 nominal. */
  impulseScale: number;
  /** Mass without propellant, kg. */
  mass: number;
  /** Multiplies the body drag coefficient, 1 nominal. */
  cdScale: number;
  /** Seconds added to every stage's delay (result clamped at 0). */
  delayOffset: number;
  /** Multiplies every stage's descent rate (drag area divided by its square), 1 nominal. */
  rateFactor: number;
  /** Angle between thrust line and body axis, deg (rigid-body rockets). */
  misalignment: number;
  /** Balance point ready to fly, m from the nose tip (rigid-body rockets; NaN: the shape's). */
  cg: number;
  /** Per recovery stage: 1 when this sample's failure mode stops it deploying. */
  skipStage: Uint8Array;
}

export function emptyInputs(stageCount: number): FlightInputs {
  return {
    windSpeed: 0, windTurn: 0, sigmaW: 0,
    tilt: 0, azimuth: 0, leanAcross: 0, misalignmentDirection: 0,
    speed: 0, elevation: 0, heading: 0, height: 0, east: 0, north: 0,
    impulseScale: 1, mass: 1, cdScale: 1, delayOffset: 0, rateFactor: 1,
    misalignment: 0, cg: NaN,
    skipStage: new Uint8Array(stageCount),
  };
}
