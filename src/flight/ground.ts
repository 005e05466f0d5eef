import type { TerrainGrid } from '../scenario/types.js';

/**
 * Ground height above the pad (m) under a point (east, north metres from the pad): level (0)
 * without terrain, else bilinear on the terrain grid, held at the edge value outside it. Written as
 * a + f (b − a) so that a grid of zeros gives exactly 0 and a flight over it is bit for bit the
 * flight over level ground.
 *
 * @example
 *   const g = new GroundHeight(scenario.site.terrain);
 *   g.at(120, -40); // m above (or below, negative) the pad's elevation
 */
export class GroundHeight {
  private readonly grid: TerrainGrid | undefined;
  private readonly heights: Float64Array;
  private readonly invStep: number;

  constructor(grid?: TerrainGrid) {
    this.grid = grid;
    this.heights = Float64Array.from(grid?.heights ?? []);
    this.invStep = grid ? 1 / grid.step : 0;
  }

  /** Whether there is terrain at all (false: level ground at the pad's elevation). */
  get isLevel(): boolean {
    return this.grid === undefined;
  }

  at(east: number, north: number): number {
    const g = this.grid;
    if (g === undefined) return 0;
    const nx = g.nx, ny = g.ny;
    let x = (east - g.east0) * this.invStep;
    let y = (north - g.north0) * this.invStep;
    x = x < 0 ? 0 : x > nx - 1 ? nx - 1 : x;
    y = y < 0 ? 0 : y > ny - 1 ? ny - 1 : y;
    let i = Math.floor(x), j = Math.floor(y);
    if (i > nx - 2) i = nx > 1 ? nx - 2 : 0;
    if (j > ny - 2) j = ny > 1 ? ny - 2 : 0;
    const fx = x - i, fy = y - j;
    const h = this.heights;
    const k = j * nx + i;
    const i1 = nx > 1 ? 1 : 0;
    const j1 = ny > 1 ? nx : 0;
    const a = h[k], b = h[k + i1], c = h[k + j1], d = h[k + j1 + i1];
    const top = a + fx * (b - a);
    const bottom = c + fx * (d - c);
    return top + fy * (bottom - top);
  }
}
