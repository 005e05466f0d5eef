import { EARTH_RADIUS_GEOPOTENTIAL, G0, GAMMA, R_AIR } from './constants.js';

/**
 * U.S. Standard Atmosphere, 1976, up to 84.852 km geopotential altitude.
 *
 * Each layer has a base geopotential altitude and a temperature lapse rate; base temperatures and
 * pressures follow from the sea-level values by the hydrostatic equation, so nothing is tabulated
 * by hand except the layer definitions themselves.
 */

const LAYER_BASE_H = [0, 11_000, 20_000, 32_000, 47_000, 51_000, 71_000, 84_852];
const LAYER_LAPSE = [-0.0065, 0, 0.001, 0.0028, 0, -0.0028, -0.002];
const T0 = 288.15;
const P0 = 101_325;

const baseT = new Float64Array(LAYER_LAPSE.length);
const baseP = new Float64Array(LAYER_LAPSE.length);
{
  let t = T0;
  let p = P0;
  for (let i = 0; i < LAYER_LAPSE.length; i++) {
    baseT[i] = t;
    baseP[i] = p;
    const dh = LAYER_BASE_H[i + 1] - LAYER_BASE_H[i];
    const lapse = LAYER_LAPSE[i];
    const tTop = t + lapse * dh;
    p = lapse === 0 ? p * Math.exp((-G0 * dh) / (R_AIR * t)) : p * Math.pow(tTop / t, -G0 / (R_AIR * lapse));
    t = tTop;
  }
}

/** Highest geopotential altitude the model covers, m. */
export const ATMOSPHERE_TOP = LAYER_BASE_H[LAYER_BASE_H.length - 1];

export interface AirState {
  temperature: number;
  pressure: number;
  density: number;
  speedOfSound: number;
}

/** Geopotential altitude (m) of a geometric altitude above sea level (m). */
export function geopotentialAltitude(geometric: number): number {
  return (EARTH_RADIUS_GEOPOTENTIAL * geometric) / (EARTH_RADIUS_GEOPOTENTIAL + geometric);
}

/** Standard temperature (K) and pressure (Pa) at a geopotential altitude, written into `out`. */
export function standardAtmosphere(geopotential: number, out: AirState = emptyAirState()): AirState {
  const h = Math.min(Math.max(geopotential, -5_000), ATMOSPHERE_TOP);
  let i = 0;
  while (i < LAYER_LAPSE.length - 1 && h >= LAYER_BASE_H[i + 1]) i++;
  const lapse = LAYER_LAPSE[i];
  const dh = h - LAYER_BASE_H[i];
  const t = baseT[i] + lapse * dh;
  const p =
    lapse === 0
      ? baseP[i] * Math.exp((-G0 * dh) / (R_AIR * baseT[i]))
      : baseP[i] * Math.pow(t / baseT[i], -G0 / (R_AIR * lapse));
  out.temperature = t;
  out.pressure = p;
  out.density = p / (R_AIR * t);
  out.speedOfSound = Math.sqrt(GAMMA * R_AIR * t);
  return out;
}

export function emptyAirState(): AirState {
  return { temperature: 0, pressure: 0, density: 0, speedOfSound: 0 };
}

/**
 * ∫ dH / T(H) from geopotential altitude h1 to h2 (m/K), with T the standard temperature plus a
 * constant offset: exact on each layer, where T is linear in H (ln(T2/T1)/L, or ΔH/T where L = 0).
 * Below the lowest layer base the first layer's lapse rate continues; above the model's top the
 * temperature is held.
 */
export function inverseTemperatureIntegral(h1: number, h2: number, offset: number): number {
  if (h2 < h1) return -inverseTemperatureIntegral(h2, h1, offset);
  let sum = 0;
  let a = h1;
  while (a < h2) {
    let i = 0;
    while (i < LAYER_LAPSE.length - 1 && a >= LAYER_BASE_H[i + 1]) i++;
    const above = a >= ATMOSPHERE_TOP;
    const top = above ? Infinity : i + 1 < LAYER_BASE_H.length ? LAYER_BASE_H[i + 1] : Infinity;
    const b = Math.min(h2, top);
    const lapse = above ? 0 : LAYER_LAPSE[i];
    const tAt = (h: number) => baseT[i] + LAYER_LAPSE[i] * (Math.min(h, ATMOSPHERE_TOP) - LAYER_BASE_H[i]) + offset;
    sum += lapse === 0 ? (b - a) / tAt(a) : Math.log(tAt(b) / tAt(a)) / lapse;
    a = b;
  }
  return sum;
}

/**
 * Pressure (Pa) at geopotential altitude h on a day whose temperature is the standard one plus
 * `offset` (K) at every height, given the pressure p1 at h1: the hydrostatic equation
 * dp/dH = −g0 p / (R T(H)) integrated exactly, as the 1976 standard atmosphere builds its own
 * pressures (with offset 0 this reproduces the standard pressure ratio).
 */
export function hydrostaticPressure(p1: number, h1: number, h: number, offset: number): number {
  return p1 * Math.exp((-G0 / R_AIR) * inverseTemperatureIntegral(h1, h, offset));
}
