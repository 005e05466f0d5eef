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
