const DEG = Math.PI / 180;

/**
 * The unit vector (east, north, up) of a launch direction given as an angle in the vertical plane
 * toward a compass azimuth and a second angle across that plane.
 *
 * `fromVertical` is true for a rocket rail (the angle is the tilt from vertical) and false for a
 * projectile (the angle is the elevation above the horizontal). The in-plane angle is used as it
 * is, with no clamping: a tilt below zero or an elevation past 90° leans the other way. The
 * across angle then turns the direction toward the horizontal normal of that plane,
 * n = (cos az, −sin az, 0), i.e. to the right when looking along the azimuth. Two independent
 * small deviations thus scatter a vertical launch round about the pad, not along one line.
 *
 * @example
 * const d = new Float64Array(3);
 * launchDirection(5, 90, 0, true, d);  // rail 5° from vertical, leaning east: [0.0872, 0, 0.9962]
 * launchDirection(0, 0, 2, true, d);   // vertical rail turned 2° across the (north) plane: leans east
 */
export function launchDirection(angle: number, azimuth: number, across: number, fromVertical: boolean, out: Float64Array): Float64Array {
  const a = angle * DEG;
  const az = azimuth * DEG;
  const horizontal = fromVertical ? Math.sin(a) : Math.cos(a);
  const up = fromVertical ? Math.cos(a) : Math.sin(a);
  const sinAz = Math.sin(az);
  const cosAz = Math.cos(az);
  const e = horizontal * sinAz;
  const n = horizontal * cosAz;
  if (across === 0) {
    out[0] = e;
    out[1] = n;
    out[2] = up;
    return out;
  }
  const c = Math.cos(across * DEG);
  const s = Math.sin(across * DEG);
  out[0] = c * e + s * cosAz;
  out[1] = c * n - s * sinAz;
  out[2] = c * up;
  return out;
}
