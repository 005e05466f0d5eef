import type { Wind } from '../scenario/types.js';

const DEG = Math.PI / 180;

/**
 * Mean wind by height above the pad, as east/north components of the air's velocity (m/s).
 *
 * Either a power law U(z) = U_ref (z / z_ref)^α with one direction, or a profile table whose speed
 * and direction are interpolated linearly between rows (direction along the shorter arc), the top
 * row held above and the power law (anchored on the lowest row) below it. A profile is tabulated
 * once at 1 m spacing so the hot loop never searches rows or calls trigonometric functions.
 *
 * Each Monte-Carlo sample may change the reference speed and turn the whole wind by an angle:
 * `setSample` does that without allocating.
 */
export class MeanWind {
  static readonly PROFILE_STEP = 1;

  private readonly nominalSpeed: number;
  private readonly nominalFrom: number;
  private readonly refHeight: number;
  private readonly shear: number;
  /** Profile table (nominal orientation), or null for a pure power law. */
  private readonly tableEast: Float64Array | null = null;
  private readonly tableNorth: Float64Array | null = null;
  private readonly tableLast: number = 0;

  // Per-sample state.
  private refSpeed: number;
  private scale = 1;
  private cos = 1;
  private sin = 0;
  /** Unit vector the air moves toward, for the power-law case. */
  private towardEast = 0;
  private towardNorth = 0;

  constructor(wind: Wind) {
    this.nominalSpeed = wind.speed;
    this.nominalFrom = wind.from;
    this.refHeight = wind.height;
    this.shear = wind.shear;
    this.refSpeed = wind.speed;
    if (wind.profile && wind.profile.length > 0) {
      const rows = [...wind.profile].sort((a, b) => a.altitude - b.altitude);
      const top = rows[rows.length - 1].altitude;
      const n = Math.ceil(top / MeanWind.PROFILE_STEP) + 2;
      this.tableEast = new Float64Array(n);
      this.tableNorth = new Float64Array(n);
      this.tableLast = n - 1;
      for (let i = 0; i < n; i++) {
        const [speed, from] = profileAt(rows, i * MeanWind.PROFILE_STEP, wind.shear);
        this.tableEast[i] = -speed * Math.sin(from * DEG);
        this.tableNorth[i] = -speed * Math.cos(from * DEG);
      }
    }
    this.setSample(wind.speed, 0);
  }

  /**
   * Sets this sample's wind: `speed` is the mean speed at the reference height (m/s), `turn` an
   * angle (deg) added to every direction.
   */
  setSample(speed: number, turn: number): void {
    this.refSpeed = Math.max(0, speed);
    this.scale = this.nominalSpeed > 0 ? this.refSpeed / this.nominalSpeed : 1;
    this.cos = Math.cos(turn * DEG);
    this.sin = Math.sin(turn * DEG);
    const from = (this.nominalFrom + turn) * DEG;
    this.towardEast = -Math.sin(from);
    this.towardNorth = -Math.cos(from);
  }

  /** Wind speed at a height (m/s), for turbulence intensities. */
  speedAt(height: number): number {
    const out = scratch;
    this.at(height, out);
    return Math.hypot(out[0], out[1]);
  }

  /** Writes the east and north components (m/s) at `height` above the pad into out[0], out[1]. */
  at(height: number, out: Float64Array): void {
    if (this.tableEast === null) {
      const u = height > 0 ? this.refSpeed * Math.pow(height / this.refHeight, this.shear) : 0;
      out[0] = u * this.towardEast;
      out[1] = u * this.towardNorth;
      return;
    }
    const x = height / MeanWind.PROFILE_STEP;
    let e: number;
    let n: number;
    if (!(x > 0)) {
      e = this.tableEast[0];
      n = this.tableNorth![0];
    } else if (x >= this.tableLast) {
      e = this.tableEast[this.tableLast];
      n = this.tableNorth![this.tableLast];
    } else {
      const i = x | 0;
      const f = x - i;
      e = this.tableEast[i] + f * (this.tableEast[i + 1] - this.tableEast[i]);
      n = this.tableNorth![i] + f * (this.tableNorth![i + 1] - this.tableNorth![i]);
    }
    // Turn by the sample's angle: a wind "from" angle increasing clockwise rotates the vector
    // clockwise on the east/north plane.
    const s = this.scale;
    out[0] = s * (e * this.cos + n * this.sin);
    out[1] = s * (n * this.cos - e * this.sin);
  }
}

const scratch = new Float64Array(2);

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
