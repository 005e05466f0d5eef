/**
 * Local east/north metres around the pad ↔ WGS 84 longitude/latitude.
 *
 * The local frame is the azimuthal equidistant one: a point `east`, `north` metres from the pad lies
 * at geodesic distance hypot(east, north) from the pad, in the direction atan2(east, north)
 * clockwise from true north. Solving a geodesic per point is exact but slow for a million landings,
 * so this module maps the ellipsoid conformally onto Gauss's osculating sphere at the pad (the
 * sphere of radius sqrt(M N) whose scale is 1 with zero gradient at the pad latitude) and solves the
 * problem with spherical trigonometry there. The scale error of that sphere grows with the cube of
 * the distance, so at 10 km from the pad the result matches the geodesic direct problem to well
 * under a millimetre (the tests compare with GeographicLib).
 *
 * @example
 *   const frame = createLocalFrame({ lat: 52.1, lon: -1.3 });
 *   const [lon, lat] = frame.toLonLat(1200, -350);     // 1.2 km east, 350 m south of the pad
 *   const [east, north] = frame.toEastNorth(lon, lat); // ≈ [1200, -350]
 */

/** WGS 84 semi-major axis, m (NIMA TR8350.2). */
export const WGS84_A = 6378137;
/** WGS 84 flattening (NIMA TR8350.2). */
export const WGS84_F = 1 / 298.257223563;

const E2 = WGS84_F * (2 - WGS84_F);
const E = Math.sqrt(E2);
const DEG = Math.PI / 180;

export interface LocalFrame {
  /** The pad in degrees. */
  readonly origin: { lat: number; lon: number };
  /** Metres east/north of the pad → [lon, lat] in degrees (longitude in [-180, 180)). */
  toLonLat(east: number, north: number): [number, number];
  /** [lon, lat] in degrees → [east, north] metres from the pad. */
  toEastNorth(lon: number, lat: number): [number, number];
}

/** Isometric latitude of the ellipsoid. */
function isometricLatitude(phi: number): number {
  return Math.asinh(Math.tan(phi)) - E * Math.atanh(E * Math.sin(phi));
}

/**
 * Geodetic latitude from isometric latitude. `near` is a latitude close to the answer (the pad's):
 * one fixed-point step from it leaves an error of about e² times the latitude difference, and two
 * Newton steps on psi(phi) = psi take that to rounding level.
 */
function latitudeFromIsometric(psi: number, near: number): number {
  let phi = Math.atan(Math.sinh(psi + E * Math.atanh(E * Math.sin(near))));
  for (let k = 0; k < 2; k++) {
    const sinPhi = Math.sin(phi);
    const cosPhi = Math.cos(phi);
    const residual = Math.asinh(sinPhi / cosPhi) - E * Math.atanh(E * sinPhi) - psi;
    const slope = (1 - E2) / ((1 - E2 * sinPhi * sinPhi) * cosPhi);
    phi -= residual / slope;
  }
  return phi;
}

/** Longitude difference wrapped into [-180, 180). */
function wrapDegrees(x: number): number {
  const y = ((((x + 180) % 360) + 360) % 360) - 180;
  return y;
}

/**
 * Build the local frame for a pad. Valid for points within a few hundred kilometres of the pad,
 * away from the poles; the accuracy claim (0.05 m) is checked out to 10 km.
 */
export function createLocalFrame(pad: { lat: number; lon: number }): LocalFrame {
  const phi0 = pad.lat * DEG;
  const sin0 = Math.sin(phi0);
  const cos0 = Math.cos(phi0);
  const w2 = 1 - E2 * sin0 * sin0;
  // Meridian and prime-vertical radii of curvature at the pad.
  const meridianRadius = (WGS84_A * (1 - E2)) / (w2 * Math.sqrt(w2));
  const primeRadius = WGS84_A / Math.sqrt(w2);
  const radius = Math.sqrt(meridianRadius * primeRadius);
  // Gauss's exponent: makes the sphere's scale stationary at the pad latitude.
  const n = Math.sqrt(1 + (E2 * cos0 ** 4) / (1 - E2));
  const chi0 = Math.asin(sin0 / n);
  const sinChi0 = Math.sin(chi0);
  const cosChi0 = Math.cos(chi0);
  const shift = Math.asinh(Math.tan(chi0)) - n * isometricLatitude(phi0);

  function toLonLat(east: number, north: number): [number, number] {
    const s = Math.hypot(east, north);
    if (s === 0) return [pad.lon, pad.lat];
    const d = s / radius;
    const sinAz = east / s;
    const cosAz = north / s;
    const sinD = Math.sin(d);
    const cosD = Math.cos(d);
    const sinChi = sinChi0 * cosD + cosChi0 * sinD * cosAz;
    const chi = Math.asin(Math.max(-1, Math.min(1, sinChi)));
    const lambda = Math.atan2(sinAz * sinD * cosChi0, cosD - sinChi0 * sinChi);
    const psi = (Math.asinh(Math.tan(chi)) - shift) / n;
    const lat = latitudeFromIsometric(psi, phi0) / DEG;
    const lon = wrapDegrees(pad.lon + lambda / n / DEG);
    return [lon, lat];
  }

  function toEastNorth(lon: number, lat: number): [number, number] {
    const chi = Math.atan(Math.sinh(n * isometricLatitude(lat * DEG) + shift));
    const lambda = n * wrapDegrees(lon - pad.lon) * DEG;
    const sinHalfDChi = Math.sin((chi - chi0) / 2);
    const sinHalfL = Math.sin(lambda / 2);
    const cosChi = Math.cos(chi);
    // Haversine form: accurate for the short distances used here.
    const hav = sinHalfDChi * sinHalfDChi + cosChi0 * cosChi * sinHalfL * sinHalfL;
    const d = 2 * Math.asin(Math.min(1, Math.sqrt(hav)));
    if (d === 0) return [0, 0];
    const az = Math.atan2(
      Math.sin(lambda) * cosChi,
      cosChi0 * Math.sin(chi) - sinChi0 * cosChi * Math.cos(lambda),
    );
    const s = radius * d;
    return [s * Math.sin(az), s * Math.cos(az)];
  }

  return { origin: { lat: pad.lat, lon: pad.lon }, toLonLat, toEastNorth };
}

/**
 * Convert many local points at once (typed arrays in, typed arrays out).
 *
 * @example
 *   const { lon, lat } = toLonLatArrays(frame, set.east, set.north);
 */
export function toLonLatArrays(
  frame: LocalFrame,
  east: Float64Array,
  north: Float64Array,
): { lon: Float64Array; lat: Float64Array } {
  const count = east.length;
  const lon = new Float64Array(count);
  const lat = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const p = frame.toLonLat(east[i], north[i]);
    lon[i] = p[0];
    lat[i] = p[1];
  }
  return { lon, lat };
}
