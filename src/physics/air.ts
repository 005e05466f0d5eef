import { standardAtmosphere, geopotentialAltitude, emptyAirState, hydrostaticPressure } from './atmosphere.js';
import { G0, GAMMA, R_AIR } from './constants.js';

/**
 * The air a flight meets: the 1976 standard atmosphere shifted so that it matches the temperature
 * and pressure measured at the pad. Temperature is the standard one plus the pad's offset from it
 * at every height; pressure follows from the hydrostatic equation with that temperature, starting
 * from the pad's pressure (g0 with geopotential height, as the standard atmosphere itself does).
 * Density and speed of sound follow. On a standard-temperature day this is the standard pressure
 * profile scaled to the pad's pressure; on a hot day pressure falls more slowly with height.
 *
 * The hot loop asks for density and speed of sound many million times a second, so the model is
 * tabulated once per scenario on a fine grid (linear interpolation; relative error below 1e-6 at a
 * 10 m spacing, since the density scale height is about 8 km).
 */
const STEP = 10;
const INV_STEP = 1 / STEP;
const SPAN = 60_000;
/** The table reaches this far below the pad (valleys, sites below the pad), m. */
const BELOW = 2_000;
const BELOW_NODES = BELOW / STEP;

/** What the equations of motion need from the air. */
export interface Air {
  /** Density (kg/m³) at a height above the pad (m). */
  densityAt(height: number): number;
  /** Speed of sound (m/s) at a height above the pad (m). */
  speedOfSoundAt(height: number): number;
  /** d(density)/d(height) (kg/m⁴) of what `densityAt` returns, for the Jacobian of the stiff stepper. */
  densitySlopeAt(height: number): number;
}

export class AirModel implements Air {
  /** Grid spacing of the table, m. */
  static readonly STEP = STEP;
  /** Table height above the pad, m. */
  static readonly SPAN = SPAN;
  /** Table depth below the pad, m. */
  static readonly BELOW = BELOW;

  readonly padElevation: number;
  readonly padTemperature: number;
  readonly padPressure: number;
  private readonly density: Float64Array;
  private readonly sound: Float64Array;
  private readonly last: number;

  /**
   * `rows` (optional, from a forecast): temperature by altitude above the pad, sorted, the first at
   * the pad. Then the temperature is linear between rows; above the top row it follows the standard
   * atmosphere's shape offset to meet that row, below the pad the lowest layer's lapse rate; pressure
   * follows from the hydrostatic equation from the pad's pressure, with g0 over geopotential height
   * (trapezoids in 1/T on the 10 m grid).
   */
  constructor(padElevation: number, temperature?: number, pressure?: number, rows?: readonly { altitude: number; temperature: number }[]) {
    const padH = geopotentialAltitude(padElevation);
    const std = standardAtmosphere(padH);
    this.padElevation = padElevation;
    this.padTemperature = temperature ?? std.temperature;
    this.padPressure = pressure ?? std.pressure;
    const dT = this.padTemperature - std.temperature;
    const n = BELOW_NODES + Math.floor(SPAN / STEP) + 1;
    this.density = new Float64Array(n);
    this.sound = new Float64Array(n);
    this.last = n - 1;
    const s = emptyAirState();
    if (rows !== undefined && rows.length > 0) {
      this.tabulateFromRows(rows, n, s);
      return;
    }
    for (let i = 0; i < n; i++) {
      const h = geopotentialAltitude(padElevation + (i - BELOW_NODES) * STEP);
      standardAtmosphere(h, s);
      const t = s.temperature + dT;
      const p = hydrostaticPressure(this.padPressure, padH, h, dT);
      this.density[i] = p / (R_AIR * t);
      this.sound[i] = Math.sqrt(GAMMA * R_AIR * t);
    }
  }

  private tabulateFromRows(rows: readonly { altitude: number; temperature: number }[], n: number, s: ReturnType<typeof emptyAirState>): void {
    const top = rows[rows.length - 1];
    const topStd = standardAtmosphere(geopotentialAltitude(this.padElevation + top.altitude)).temperature;
    const padT = this.padTemperature;
    const temperatureAt = (h: number): number => {
      if (rows.length === 1) return padT;
      if (h <= rows[0].altitude) {
        const a = rows[0], b = rows[1];
        return padT + (h - a.altitude) * ((b.temperature - a.temperature) / (b.altitude - a.altitude));
      }
      for (let k = 1; k < rows.length; k++) {
        if (h <= rows[k].altitude) {
          const a = k === 1 ? { altitude: rows[0].altitude, temperature: padT } : rows[k - 1], b = rows[k];
          return a.temperature + ((h - a.altitude) / (b.altitude - a.altitude)) * (b.temperature - a.temperature);
        }
      }
      return standardAtmosphere(geopotentialAltitude(this.padElevation + h), s).temperature + (top.temperature - topStd);
    };
    const heightOf = (i: number) => (i - BELOW_NODES) * STEP;
    const pressure = new Float64Array(n);
    const temps = new Float64Array(n);
    for (let i = 0; i < n; i++) temps[i] = temperatureAt(heightOf(i));
    // Integrate up and down from the pad's node.
    pressure[BELOW_NODES] = this.padPressure;
    const layer = (i: number, j: number) => {
      const dh = geopotentialAltitude(this.padElevation + heightOf(j)) - geopotentialAltitude(this.padElevation + heightOf(i));
      return Math.exp((-G0 * dh * (1 / temps[i] + 1 / temps[j])) / (2 * R_AIR));
    };
    for (let i = BELOW_NODES + 1; i < n; i++) pressure[i] = pressure[i - 1] * layer(i - 1, i);
    for (let i = BELOW_NODES - 1; i >= 0; i--) pressure[i] = pressure[i + 1] * layer(i + 1, i);
    for (let i = 0; i < n; i++) {
      this.density[i] = pressure[i] / (R_AIR * temps[i]);
      this.sound[i] = Math.sqrt(GAMMA * R_AIR * temps[i]);
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

  /** Slope of `densityAt` (kg/m⁴): that of the table's linear piece, 0 where it is held. */
  densitySlopeAt(height: number): number {
    return slope(this.density, height, this.last);
  }
}

function interpolate(table: Float64Array, height: number, last: number): number {
  const x = height * INV_STEP + BELOW_NODES;
  if (!(x > 0)) return table[0];
  if (x >= last) return table[last];
  const i = x | 0;
  const f = x - i;
  return table[i] + f * (table[i + 1] - table[i]);
}

/** Derivative of `interpolate` in height (the right-hand piece at a node). */
function slope(table: Float64Array, height: number, last: number): number {
  const x = height * INV_STEP + BELOW_NODES;
  if (!(x > 0) || x >= last) return 0;
  const i = x | 0;
  return (table[i + 1] - table[i]) * INV_STEP;
}
