/**
 * Trace highest-density regions on the density grid and return them as RFC 7946 GeoJSON.
 *
 * d3-contour's marching squares traces { f ≥ t } on the node grid with linear interpolation along
 * cell edges. In d3's grid coordinates node (i, j) sits at (i + 0.5, j + 0.5); that is undone here
 * before the rings are moved to east/north metres and then to lon/lat.
 *
 * @example
 *   const features = traceContours(grid, [t50, t90], [0.5, 0.9], frame);
 *   features[0].properties  // { level: 0.5, area_m2: ..., maxDistance_m: ... }
 */
import { contours as d3Contours } from 'd3-contour';
import type { DensityGrid } from './density.js';
import type { LocalFrame } from './geodesy.js';
import { farthestVertex, polygonsArea, polygonsToLonLat } from './projectGeometry.js';
import { closeRing, signedArea, windPolygon, type Ring } from './rings.js';
import type { ContourFeature } from './types.js';

/** The region { f ≥ threshold } as polygons in east/north metres, wound per RFC 7946. */
export function traceRegion(grid: DensityGrid, threshold: number): Ring[][] {
  const { nx, ny, x0, y0, dx, dy } = grid;
  const generator = d3Contours().size([nx, ny]);
  // d3 only indexes the array, so a typed array is fine despite the declared number[].
  const multi = generator.contour(grid.values as unknown as number[], threshold);
  // Rings smaller than a hundredth of a cell are rounding debris of a saddle, not regions.
  const minArea = 0.01 * dx * dy;
  const polygons: Ring[][] = [];
  for (const polygon of multi.coordinates) {
    const rings: Ring[] = [];
    for (const ring of polygon) {
      const metres = closeRing(ring.map(([gx, gy]) => [x0 + (gx - 0.5) * dx, y0 + (gy - 0.5) * dy]));
      if (metres.length < 4 || Math.abs(signedArea(metres)) < minArea) {
        if (rings.length === 0) break; // exterior too small: drop the whole polygon
        continue;
      }
      rings.push(metres);
    }
    if (rings.length > 0) polygons.push(windPolygon(rings));
  }
  return polygons;
}

/** One MultiPolygon feature per level, lon/lat, with area and farthest distance in metres. */
export function traceContours(
  grid: DensityGrid,
  thresholds: number[],
  levels: number[],
  frame: LocalFrame,
): ContourFeature[] {
  return levels.map((level, k) => {
    const metres = traceRegion(grid, thresholds[k]);
    const lonLat = polygonsToLonLat(frame, metres).map(windPolygon);
    return {
      type: 'Feature',
      geometry: { type: 'MultiPolygon', coordinates: lonLat },
      properties: {
        level,
        area_m2: polygonsArea(metres),
        maxDistance_m: farthestVertex(metres),
      },
    };
  });
}
