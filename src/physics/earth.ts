import { G0 } from './constants.js';

/**
 * The Earth as a flight in the pad's local east-north-up frame sees it: gravity straight down with
 * the WGS 84 normal gravity at the pad's latitude and the height above sea level, and the Coriolis
 * acceleration −2 Ω × v of the rotating frame. The frame is kept flat (curvature and the
 * centrifugal term beyond what normal gravity already holds are left out).
 *
 * Normal gravity on the ellipsoid by Somigliana's closed formula, and its change with height by
 * the second-order free-air correction, both as NIMA TR8350.2 (3rd ed., 2000) gives them
 * (eq. 4-1 and 4-3, constants from its tables 3.1–3.4). Heights above sea level stand in for
 * heights above the ellipsoid (the geoid separation, tens of metres, changes g by ~1e-5 m/s²).
 */
export interface Earth {
  /** Magnitude of gravity (m/s²) at a height above the pad (m), pointing straight down. */
  gravityAt(height: number): number;
  /** d(gravity)/d(height) (1/s²), for the Jacobian of the stiff stepper. */
  gravitySlopeAt(height: number): number;
  /** Earth's rotation in the local frame, rad/s: north and up components (east is zero). */
  readonly omegaNorth: number;
  readonly omegaUp: number;
}

/** WGS 84 constants (NIMA TR8350.2). */
export const WGS84 = {
  /** Semi-major axis, m. */
  a: 6_378_137,
  /** Flattening. */
  f: 1 / 298.257223563,
  /** Angular velocity of the Earth, rad/s. */
  omega: 7.292115e-5,
  /** Normal gravity at the equator and at the poles, m/s². */
  gammaEquator: 9.7803253359,
  gammaPole: 9.8321849378,
  /** Somigliana's constant k = (b γp) / (a γe) − 1. */
  k: 0.00193185265241,
  /** First eccentricity squared. */
  e2: 0.00669437999013,
  /** m = ω² a² b / GM. */
  m: 0.00344978650684,
} as const;

/** WGS 84 normal gravity (m/s²) on the ellipsoid at a latitude (deg): Somigliana, TR8350.2 eq. 4-1. */
export function normalGravity(latitudeDeg: number): number {
  const s2 = Math.sin((latitudeDeg * Math.PI) / 180) ** 2;
  return (WGS84.gammaEquator * (1 + WGS84.k * s2)) / Math.sqrt(1 - WGS84.e2 * s2);
}

/**
 * Normal gravity (m/s²) at a latitude (deg) and a height (m) above the ellipsoid: the free-air
 * correction of TR8350.2 eq. 4-3, γ_h = γ [1 − (2/a)(1 + f + m − 2 f sin²φ) h + (3/a²) h²].
 */
export function normalGravityAt(latitudeDeg: number, height: number): number {
  const s2 = Math.sin((latitudeDeg * Math.PI) / 180) ** 2;
  const { a, f, m } = WGS84;
  return normalGravity(latitudeDeg) * (1 - (2 / a) * (1 + f + m - 2 * f * s2) * height + (3 / (a * a)) * height * height);
}

/**
 * The rotating WGS 84 Earth at a pad. Gravity is a quadratic in height, so the hot loop pays two
 * multiplications.
 *
 * @example
 * const earth = new EarthModel(52, 30);
 * earth.gravityAt(0); // ≈ 9.8127 m/s² at the pad
 * const acc = new Float64Array(3);
 * addCoriolis(earth, 0, 0, -50, acc); // a falling body is pushed east: acc[0] > 0
 */
export class EarthModel implements Earth {
  readonly omegaNorth: number;
  readonly omegaUp: number;
  private readonly c0: number;
  private readonly c1: number;
  private readonly c2: number;

  constructor(latitudeDeg: number, padElevation: number) {
    const phi = (latitudeDeg * Math.PI) / 180;
    this.omegaNorth = WGS84.omega * Math.cos(phi);
    this.omegaUp = WGS84.omega * Math.sin(phi);
    const s2 = Math.sin(phi) ** 2;
    const { a, f, m } = WGS84;
    const g = normalGravity(latitudeDeg);
    // γ(h0 + z) expanded in z about the pad: γ [1 − b1 (h0 + z) + b2 (h0 + z)²].
    const b1 = (2 / a) * (1 + f + m - 2 * f * s2);
    const b2 = 3 / (a * a);
    const h0 = padElevation;
    this.c0 = g * (1 - b1 * h0 + b2 * h0 * h0);
    this.c1 = g * (-b1 + 2 * b2 * h0);
    this.c2 = g * b2;
  }

  gravityAt(height: number): number {
    return this.c0 + height * (this.c1 + height * this.c2);
  }

  gravitySlopeAt(height: number): number {
    return this.c1 + 2 * height * this.c2;
  }
}

/**
 * Standard gravity g0 everywhere and no rotation: the Earth of textbook closed forms (tests that
 * compare with them use it).
 */
export function uniformEarth(g: number = G0): Earth {
  return { gravityAt: () => g, gravitySlopeAt: () => 0, omegaNorth: 0, omegaUp: 0 };
}

/**
 * Adds the Coriolis acceleration −2 Ω × v (m/s²) of a velocity (east, north, up) to acc[0..2],
 * with Ω = (0, Ω_north, Ω_up) in the local frame.
 */
export function addCoriolis(earth: Earth, ve: number, vn: number, vu: number, acc: Float64Array): void {
  const on = earth.omegaNorth;
  const ou = earth.omegaUp;
  // Ω × v = (Ωn vu − Ωu vn, Ωu ve, −Ωn ve)
  acc[0] -= 2 * (on * vu - ou * vn);
  acc[1] -= 2 * (ou * ve);
  acc[2] += 2 * (on * ve);
}
