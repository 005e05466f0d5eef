import { contours } from 'd3-contour';
import type { TerrainGrid } from '../scenario/types.js';

/**
 * Contour lines of the terrain grid (heights above the pad), in metres east/north of the pad, for
 * the map and the sheet: d3-contour's marching squares on the grid, with the segments that only
 * run along the grid's edge left out (they are where the model ends, not a height).
 *
 * The interval is a "nice" step giving about `target` lines over the grid's relief.
 *
 * @example
 *   const { interval, lines } = terrainContours(scenario.site.terrain!);
 */
export function terrainContours(grid: TerrainGrid, target = 12): { interval: number; lines: { level: number; points: [number, number][] }[] } {
  let lo = Infinity, hi = -Infinity;
  for (const h of grid.heights) {
    if (h < lo) lo = h;
    if (h > hi) hi = h;
  }
  const relief = hi - lo;
  if (!(relief > 0)) return { interval: 0, lines: [] };
  const raw = relief / target;
  const p = 10 ** Math.floor(Math.log10(raw));
  const interval = [1, 2, 5, 10].map((k) => k * p).find((s) => s >= raw) ?? 10 * p;
  const levels: number[] = [];
  for (let v = Math.ceil(lo / interval) * interval; v <= hi; v += interval) levels.push(Math.round(v * 1e6) / 1e6);
  const generator = contours().size([grid.nx, grid.ny]).thresholds(levels).smooth(true);
  const lines: { level: number; points: [number, number][] }[] = [];
  // d3-contour puts grid value k at (k mod nx + 0.5, floor(k / nx) + 0.5).
  const toMetres = (x: number, y: number): [number, number] => [grid.east0 + (x - 0.5) * grid.step, grid.north0 + (y - 0.5) * grid.step];
  const onEdge = (x: number, y: number) => x <= 0.5 + 1e-9 || y <= 0.5 + 1e-9 || x >= grid.nx - 0.5 - 1e-9 || y >= grid.ny - 0.5 - 1e-9;
  for (const c of generator(grid.heights)) {
    for (const polygon of c.coordinates) {
      for (const ring of polygon) {
        let run: [number, number][] = [];
        for (const [x, y] of ring) {
          const cx = Math.min(Math.max(x, 0.5), grid.nx - 0.5), cy = Math.min(Math.max(y, 0.5), grid.ny - 0.5);
          if (onEdge(cx, cy)) {
            if (run.length > 1) lines.push({ level: c.value, points: run });
            run = [];
          } else run.push(toMetres(cx, cy));
        }
        if (run.length > 1) lines.push({ level: c.value, points: run });
      }
    }
  }
  return { interval, lines };
}
