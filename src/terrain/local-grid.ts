import type { LocalFrame } from '../analysis/geodesy.js';
import type { TerrainGrid } from '../scenario/types.js';
import { demHeight, DemError, type Dem } from './dem.js';

/**
 * The elevation model resampled once onto the flight's own east/north grid around the pad, as
 * heights above the pad's elevation. The flight then finds the ground under an object with one
 * bilinear lookup on a regular grid, without a geodesic per step.
 *
 * The grid spacing follows the model's pixel size (never finer than 1 m), it covers the model's
 * extent up to `reach` metres from the pad, and it holds at most `maxNodes` nodes a side (coarser
 * spacing beyond that). Heights are rounded to the millimetre.
 */
export function localTerrainGrid(dem: Dem, padElevation: number, frame: LocalFrame, file: string, reach = 20_000, maxNodes = 1024): TerrainGrid {
  const lat = frame.origin.lat;
  const mPerDegLat = 111_320;
  const mPerDegLon = 111_320 * Math.cos((lat * Math.PI) / 180);
  const pixel = Math.max(1, Math.min(Math.abs(dem.dLon) * mPerDegLon, Math.abs(dem.dLat) * mPerDegLat));
  const lons = [dem.lon0, dem.lon0 + (dem.width - 1) * dem.dLon];
  const lats = [dem.lat0, dem.lat0 + (dem.height - 1) * dem.dLat];
  const [west, east] = [Math.min(...lons), Math.max(...lons)];
  const [south, north] = [Math.min(...lats), Math.max(...lats)];
  const [e0] = frame.toEastNorth(west, frame.origin.lat);
  const [e1] = frame.toEastNorth(east, frame.origin.lat);
  const [, n0] = frame.toEastNorth(frame.origin.lon, south);
  const [, n1] = frame.toEastNorth(frame.origin.lon, north);
  const eastMin = Math.max(e0, -reach), eastMax = Math.min(e1, reach);
  const northMin = Math.max(n0, -reach), northMax = Math.min(n1, reach);
  if (!(eastMax > eastMin && northMax > northMin)) throw new DemError(`the elevation model (${south}..${north} N, ${west}..${east} E) does not cover the ground within ${reach / 1000} km of the pad`);
  const step = Math.max(pixel, (eastMax - eastMin) / (maxNodes - 1), (northMax - northMin) / (maxNodes - 1));
  const nx = Math.floor((eastMax - eastMin) / step) + 1;
  const ny = Math.floor((northMax - northMin) / step) + 1;
  const heights: number[] = new Array(nx * ny);
  let missing = 0;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const [lon, la] = frame.toLonLat(eastMin + i * step, northMin + j * step);
      const h = demHeight(dem, la, lon);
      if (Number.isNaN(h)) missing++;
      heights[j * nx + i] = Math.round((h - padElevation) * 1000) / 1000;
    }
  }
  if (missing > 0) throw new DemError(`the elevation model has no data at ${missing} of ${nx * ny} points around the pad; fill the gaps first`);
  return { file, east0: eastMin, north0: northMin, step, nx, ny, heights };
}
