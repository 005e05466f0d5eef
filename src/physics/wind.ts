import type { Wind } from '../scenario/types.js';

const DEG = Math.PI / 180;
const ROOT_STEP = 0.05;
const INV_ROOT_STEP = 1 / ROOT_STEP;

/**
 * Mean wind by height above the pad, as east/north components of the air's velocity (m/s).
 *
 * Either a power law U(z) = U_ref (z / z_ref)^α with one direction, or a profile table whose speed
 * and direction are interpolated linearly between rows (direction along the shorter arc), the top
 * row held above and the power law (anchored on the lowest row) below it.
 *
 * Both are tabulated once, on a grid uniform in sqrt(height): fine near the ground where the power
 * law is steep (2.5 mm at the first node), a few metres apart a kilometre up. The hot loop then
 * costs a square root and a linear interpolation instead of a power (relative error of the power
 * law below 1e-4 above 1 m).
 *
 * Each Monte-Carlo sample may change the reference speed and turn the whole wind by an angle:
 * `setSample` does that without allocating.
 */
export class MeanWind {
  /** Grid step in sqrt(metres). */
  static readonly ROOT_STEP = ROOT_STEP;

  private readonly nominalSpeed: number;
  private readonly isPowerLaw: boolean;
  private readonly tableEast: Float64Array;
  private readonly tableNorth: Float64Array;
  private readonly last: number;

  // Per-sample state.
  private scale = 1;
  private cos = 1;
  private sin = 0;

  constructor(wind: Wind, topHeight = 60_000) {
    this.nominalSpeed = referenceSpeed(wind);
    const rows = wind.profile && wind.profile.length > 0 ? [...wind.profile].sort((a, b) => a.altitude - b.altitude) : null;
    this.isPowerLaw = rows === null;
    const top = rows === null ? topHeight : Math.min(topHeight, rows[rows.length - 1].altitude);
    const n = Math.ceil(Math.sqrt(top) / ROOT_STEP) + 2;
    this.tableEast = new Float64Array(n);
    this.tableNorth = new Float64Array(n);
    this.last = n - 1;
    for (let i = 0; i < n; i++) {
      const r = i * ROOT_STEP;
      const z = r * r;
      // A power law is tabulated for 1 m/s at the reference height; `scale` supplies the speed.
      const [speed, from] = rows === null ? [Math.pow(z / wind.height, wind.shear), wind.from] : profileAt(rows, z, wind.shear);
      this.tableEast[i] = -speed * Math.sin(from * DEG);
      this.tableNorth[i] = -speed * Math.cos(from * DEG);
    }
    this.setSample(this.nominalSpeed, 0);
  }

  /**
   * Sets this sample's wind: `speed` is the mean speed at the reference height (m/s), `turn` an
   * angle (deg) added to every direction. A profile is scaled as a whole by speed / (the profile's
   * own speed at the reference height); a profile that is calm at the reference height cannot be
   * scaled and keeps its rows as written (validation warns about a speed spread on it).
   */
  setSample(speed: number, turn: number): void {
    const ref = Math.max(0, speed);
    this.scale = this.isPowerLaw ? ref : this.nominalSpeed > 0 ? ref / this.nominalSpeed : 1;
    this.cos = Math.cos(turn * DEG);
    this.sin = Math.sin(turn * DEG);
  }

  /** Wind speed at a height (m/s), for turbulence intensities. */
  speedAt(height: number): number {
    const out = scratch;
    this.at(height, out);
    return Math.hypot(out[0], out[1]);
  }

  /** Writes the east and north components (m/s) at `height` above the pad into out[0], out[1]. */
  at(height: number, out: Float64Array): void {
    const x = height > 0 ? Math.sqrt(height) * INV_ROOT_STEP : 0;
    const last = this.last;
    const te = this.tableEast, tn = this.tableNorth;
    let e: number;
    let n: number;
    if (x >= last) {
      e = te[last];
      n = tn[last];
    } else {
      const i = x | 0;
      const f = x - i;
      e = te[i] + f * (te[i + 1] - te[i]);
      n = tn[i] + f * (tn[i + 1] - tn[i]);
    }
    // Turn by the sample's angle: a "from" angle increasing clockwise turns the vector clockwise
    // on the east/north plane.
    const s = this.scale;
    out[0] = s * (e * this.cos + n * this.sin);
    out[1] = s * (n * this.cos - e * this.sin);
  }

  /**
   * Writes d/d(height) of what `at` gives (1/s) into out[0], out[1]: the slope of the table's
   * linear piece in sqrt(height) times d sqrt(height)/d height; 0 where the table is held.
   */
  slopeAt(height: number, out: Float64Array): void {
    const x = height > 0 ? Math.sqrt(height) * INV_ROOT_STEP : 0;
    if (!(x > 0) || x >= this.last) {
      out[0] = 0;
      out[1] = 0;
      return;
    }
    const te = this.tableEast, tn = this.tableNorth;
    const i = x | 0;
    // dx/dz = 1 / (2 ROOT_STEP sqrt(z)) = INV_ROOT_STEP² / (2x).
    const d = (INV_ROOT_STEP * INV_ROOT_STEP) / (2 * x);
    const e = (te[i + 1] - te[i]) * d;
    const n = (tn[i + 1] - tn[i]) * d;
    const s = this.scale;
    out[0] = s * (e * this.cos + n * this.sin);
    out[1] = s * (n * this.cos - e * this.sin);
  }
}

const scratch = new Float64Array(2);

/**
 * The nominal mean wind speed at the reference height (m/s): `speed` for a power law, the
 * profile's own speed there when a profile is given (what a `wind.speed` spread scales).
 */
export function referenceSpeed(wind: Wind): number {
  if (!wind.profile || wind.profile.length === 0) return wind.speed;
  const rows = [...wind.profile].sort((a, b) => a.altitude - b.altitude);
  return profileAt(rows, wind.height, wind.shear)[0];
}

/** Speed and direction of a profile table at a height (power law below the lowest row). */
export function profileAt(
  rows: readonly { altitude: number; speed: number; from: number }[],
  height: number,
  shear: number,
): [number, number] {
  const first = rows[0];
  if (height <= first.altitude) {
    if (first.altitude <= 0) return [first.speed, first.from];
    const speed = height > 0 ? first.speed * Math.pow(height / first.altitude, shear) : 0;
    return [speed, first.from];
  }
  for (let i = 1; i < rows.length; i++) {
    const b = rows[i];
    if (height <= b.altitude) {
      const a = rows[i - 1];
      const f = (height - a.altitude) / (b.altitude - a.altitude);
      let turn = b.from - a.from;
      turn = ((turn + 540) % 360) - 180;
      return [a.speed + f * (b.speed - a.speed), a.from + f * turn];
    }
  }
  const last = rows[rows.length - 1];
  return [last.speed, last.from];
}
