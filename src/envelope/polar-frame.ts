/**
 * Where things go on the envelope's polar chart. Direction is where the wind blows from, north up
 * and clockwise as on a compass; the distance from the centre is the mean wind speed, in the
 * chart's display unit. The same frame places the drawing and reads a click on it back into a
 * grid point, so the two cannot disagree.
 *
 * @example
 *   const frame = polarFrame({ speeds: [0, 1, 2], forecast: { from: 250, speed: 4.9 } }, 'metric', 200, 200, 150);
 *   frame.point(90, 2)          // right of the centre, two fifths of the way to the rim
 *   frame.pick(x, y, dirs, sp)  // the grid direction and speed nearest (x, y)
 */
import { MPH_M_S, type UnitSystem } from '../report/format-number.js';

export interface SpeedUnit {
  name: 'm/s' | 'mph';
  /** Metres per second in one of this unit. */
  metresPerSecond: number;
}

export function speedUnit(units: UnitSystem): SpeedUnit {
  return units === 'imperial' ? { name: 'mph', metresPerSecond: MPH_M_S } : { name: 'm/s', metresPerSecond: 1 };
}

export interface PolarFrame {
  cx: number;
  cy: number;
  /** Radius of the outermost ring, points. */
  radius: number;
  unit: SpeedUnit;
  /** Speeds of the rings in the display unit, innermost first; the last is at `radius`. */
  rings: number[];
  /** A point at a direction (from, degrees) and a speed in m/s. */
  point(from: number, metresPerSecond: number): [number, number];
  /** A point at a direction and a distance from the centre in points. */
  at(from: number, r: number): [number, number];
  /**
   * The grid point nearest to (x, y): the nearest direction of `directions` and the nearest speed
   * of `speeds` (m/s); null when (x, y) lies well outside the chart.
   */
  pick(x: number, y: number, directions: readonly number[], speeds: readonly number[]): { from: number; speed: number } | null;
}

/** 1, 2, 2.5 or 5 times a power of ten: ring steps people read at a glance. */
export function niceStep(x: number): number {
  if (!(x > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 2.5 ? 2.5 : m <= 5 ? 5 : 10) * p;
}

/** Smallest difference between two compass directions, degrees (0 to 180). */
export function angleBetween(a: number, b: number): number {
  const d = (((a - b) % 360) + 360) % 360;
  return Math.min(d, 360 - d);
}

export function polarFrame(
  e: { speeds: readonly number[]; forecast: { speed: number } },
  units: UnitSystem,
  cx: number,
  cy: number,
  radius: number,
): PolarFrame {
  const unit = speedUnit(units);
  const toUnit = (v: number) => v / unit.metresPerSecond;
  // The rings reach past the top of the grid and the forecast, so both are on the chart.
  const top = Math.max(toUnit(e.speeds[e.speeds.length - 1] ?? 0), toUnit(e.forecast.speed), 1);
  const step = niceStep(top / 5);
  const outer = Math.ceil(top / step - 1e-9) * step;
  const rings: number[] = [];
  for (let k = 1; k * step <= outer + 1e-9; k++) rings.push(Math.round(k * step * 1e9) / 1e9);
  const at = (from: number, r: number): [number, number] => {
    const a = (from * Math.PI) / 180;
    return [cx + r * Math.sin(a), cy - r * Math.cos(a)];
  };
  return {
    cx,
    cy,
    radius,
    unit,
    rings,
    at,
    point: (from, v) => at(from, (toUnit(v) / outer) * radius),
    pick: (x, y, directions, speeds) => {
      const dx = x - cx;
      const dy = cy - y;
      const r = Math.hypot(dx, dy);
      if (r > radius * 1.12 || directions.length === 0 || speeds.length === 0) return null;
      const angle = ((Math.atan2(dx, dy) * 180) / Math.PI + 360) % 360;
      const from = directions.reduce((best, d) => (angleBetween(d, angle) < angleBetween(best, angle) ? d : best), directions[0]);
      const wanted = (r / radius) * outer * unit.metresPerSecond;
      const speed = speeds.reduce((best, s) => (Math.abs(s - wanted) < Math.abs(best - wanted) ? s : best), speeds[0]);
      return { from, speed };
    },
  };
}

const NAMES = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'];

/** "NE 45°" on the sixteen points of the compass, "20°" between them. */
export function compassLabel(deg: number): string {
  const d = ((deg % 360) + 360) % 360;
  const k = d / 22.5;
  const rounded = Math.round(d * 10) / 10;
  return Math.abs(k - Math.round(k)) < 1e-9 ? `${NAMES[Math.round(k) % 16]} ${rounded}\u00b0` : `${rounded}\u00b0`;
}
