import { standardAtmosphere, geopotentialAltitude, emptyAirState } from './atmosphere.js';
import { G0, GAMMA, R_AIR } from './constants.js';

/**
 * The air a flight meets: the 1976 standard atmosphere shifted so that it matches the temperature
 * and pressure measured at the pad. Temperature is offset by a constant, pressure scaled by a
 * constant; density and speed of sound follow.
 *
 * The hot loop asks for density and speed of sound many million times a second, so the model is
 * tabulated once per scenario on a fine grid (linear interpolation; relative error below 1e-6 at a
 * 10 m spacing, since the density scale height is about 8 km).
 */
const STEP = 10;
const INV_STEP = 1 / STEP;
const SPAN = 60_000;

/** What the equations of motion need from the air. */
export interface Air {
  /** Density (kg/m³) at a height above the pad (m). */
  densityAt(height: number): number;
  /** Speed of sound (m/s) at a height above the pad (m). */
  speedOfSoundAt(height: number): number;
}

export class AirModel implements Air {
  /** Grid spacing of the table, m. */
  static readonly STEP = STEP;
  /** Table height above the pad, m. */
  static readonly SPAN = SPAN;

  readonly padElevation: number;
  readonly padTemperature: number;
  readonly padPressure: number;
  private readonly density: Float64Array;
  private readonly sound: Float64Array;
  private readonly last: number;

  /**
   * `rows` (optional, from a forecast): temperature by altitude above the pad, sorted. Then the
   * temperature is linear between rows, and above the top row it follows the standard atmosphere's
   * shape offset to meet that row; pressure follows from the hydrostatic equation, integrated up
   * from the pad's pressure with g0 over geopotential height (trapezoids in 1/T on the 10 m grid).
   */
  constructor(padElevation: number, temperature?: number, pressure?: number, rows?: readonly { altitude: number; temperature: number }[]) {
    const std = standardAtmosphere(geopotentialAltitude(padElevation));
    this.padElevation = padElevation;
    this.padTemperature = temperature ?? std.temperature;
    this.padPressure = pressure ?? std.pressure;
    const dT = this.padTemperature - std.temperature;
    const pScale = this.padPressure / std.pressure;
    const n = Math.floor(SPAN / STEP) + 1;
    this.density = new Float64Array(n);
    this.sound = new Float64Array(n);
    this.last = n - 1;
    const s = emptyAirState();
    if (rows !== undefined && rows.length > 0) {
      this.tabulateFromRows(rows, n, s);
      return;
    }
    for (let i = 0; i < n; i++) {
      standardAtmosphere(geopotentialAltitude(padElevation + i * STEP), s);
      const t = s.temperature + dT;
      const p = s.pressure * pScale;
      this.density[i] = p / (R_AIR * t);
      this.sound[i] = Math.sqrt(GAMMA * R_AIR * t);
    }
  }

  private tabulateFromRows(rows: readonly { altitude: number; temperature: number }[], n: number, s: ReturnType<typeof emptyAirState>): void {
    const top = rows[rows.length - 1];
    const topStd = standardAtmosphere(geopotentialAltitude(this.padElevation + top.altitude)).temperature;
    const temperatureAt = (h: number): number => {
      if (h <= rows[0].altitude) return h <= 0 && rows[0].altitude <= 0 ? this.padTemperature : rows[0].altitude <= 0 ? rows[0].temperature : this.padTemperature + (h / rows[0].altitude) * (rows[0].temperature - this.padTemperature);
      for (let k = 1; k < rows.length; k++) {
        if (h <= rows[k].altitude) {
          const a = rows[k - 1], b = rows[k];
          return a.temperature + ((h - a.altitude) / (b.altitude - a.altitude)) * (b.temperature - a.temperature);
        }
      }
      return standardAtmosphere(geopotentialAltitude(this.padElevation + h), s).temperature + (top.temperature - topStd);
    };
    let p = this.padPressure;
    let tPrev = temperatureAt(0);
    let hPrev = geopotentialAltitude(this.padElevation);
    for (let i = 0; i < n; i++) {
      const t = i === 0 ? tPrev : temperatureAt(i * STEP);
      const hNow = geopotentialAltitude(this.padElevation + i * STEP);
      if (i > 0) p *= Math.exp((-G0 * (hNow - hPrev) * (1 / tPrev + 1 / t)) / (2 * R_AIR));
      this.density[i] = p / (R_AIR * t);
      this.sound[i] = Math.sqrt(GAMMA * R_AIR * t);
      tPrev = t;
      hPrev = hNow;
    }
  }

  /** Density (kg/m³) at a height above the pad (m); held constant outside the table. */
  densityAt(height: number): number {
    return interpolate(this.density, height, this.last);
  }

  /** Speed of sound (m/s) at a height above the pad (m). */
  speedOfSoundAt(height: number): number {
    return interpolate(this.sound, height, this.last);
  }
}

function interpolate(table: Float64Array, height: number, last: number): number {
  const x = height * INV_STEP;
  if (!(x > 0)) return table[0];
  if (x >= last) return table[last];
  const i = x | 0;
  const f = x - i;
  return table[i] + f * (table[i + 1] - table[i]);
}
