import type { DragTable } from '../scenario/types.js';

/**
 * Aerodynamic drag. Drag acts against the velocity of the body relative to the air,
 * v_rel = v − w, with magnitude ½ ρ Cd A |v_rel|²; as an acceleration
 *
 *   a = −(ρ Cd A / 2m) |v_rel| v_rel.
 *
 * The magnitude multiplies the whole vector. Squaring each component separately (−k vx|vx|, …)
 * understates drag whenever the air-relative velocity is oblique and turns it off its line.
 */

/**
 * Writes the drag acceleration for `coefficient` = ρ Cd A / (2m) and the air-relative velocity
 * (vx, vy, vz) into out[offset..offset+2].
 *
 * @example
 * const a = new Float64Array(3);
 * addDragAcceleration(0.01, 3, 4, 0, a, 0); // a = [-0.15, -0.2, 0]: magnitude 0.25 along −(3, 4)
 */
export function addDragAcceleration(
  coefficient: number,
  vx: number,
  vy: number,
  vz: number,
  out: Float64Array,
  offset: number,
): void {
  const k = coefficient * Math.sqrt(vx * vx + vy * vy + vz * vz);
  out[offset] -= k * vx;
  out[offset + 1] -= k * vy;
  out[offset + 2] -= k * vz;
}

/** Drag coefficient by Mach number: linear between table rows, held constant outside them. */
export class DragCurve {
  private readonly mach: Float64Array;
  private readonly cd: Float64Array;
  private readonly last: number;

  constructor(table: DragTable) {
    this.mach = Float64Array.from(table.mach);
    this.cd = Float64Array.from(table.cd);
    this.last = this.mach.length - 1;
  }

  at(mach: number): number {
    const m = this.mach;
    const last = this.last;
    if (last === 0 || mach <= m[0]) return this.cd[0];
    if (mach >= m[last]) return this.cd[last];
    let i = 1;
    while (m[i] < mach) i++;
    const f = (mach - m[i - 1]) / (m[i] - m[i - 1]);
    return this.cd[i - 1] + f * (this.cd[i] - this.cd[i - 1]);
  }
}
