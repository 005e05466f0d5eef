import { standardAtmosphere, geopotentialAltitude, emptyAirState, hydrostaticPressure } from './atmosphere.js';
import { GAMMA, R_AIR } from './constants.js';

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

  constructor(padElevation: number, temperature?: number, pressure?: number) {
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
    for (let i = 0; i < n; i++) {
      const h = geopotentialAltitude(padElevation + (i - BELOW_NODES) * STEP);
      standardAtmosphere(h, s);
      const t = s.temperature + dT;
      const p = hydrostaticPressure(this.padPressure, padH, h, dT);
      this.density[i] = p / (R_AIR * t);
      this.sound[i] = Math.sqrt(GAMMA * R_AIR * t);
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
  const x = height * INV_STEP + BELOW_NODES;
  if (!(x > 0)) return table[0];
  if (x >= last) return table[last];
  const i = x | 0;
  const f = x - i;
  return table[i] + f * (table[i + 1] - table[i]);
}
