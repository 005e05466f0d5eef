/**
 * A digital elevation model read from a GeoTIFF with the `geotiff` package: heights above sea level
 * on a latitude/longitude grid (WGS 84, EPSG:4326). Projected models (UTM and the like) are refused
 * with a message: reproject them to EPSG:4326 first (no projection library is bundled).
 *
 * @example
 *   const dem = await readDem(bytes);
 *   demHeight(dem, 47.31, 8.02); // metres above sea level, bilinear between pixel centres
 */
export interface Dem {
  width: number;
  height: number;
  /** Longitude and latitude of the centre of pixel (0, 0), degrees. */
  lon0: number;
  lat0: number;
  /** Degrees per pixel along a row (east, positive) and down a column (negative when north-up). */
  dLon: number;
  dLat: number;
  /** Row-major heights, m; NaN where the file says no data. */
  values: Float64Array;
}

export class DemError extends Error {}

export async function readDem(bytes: Uint8Array): Promise<Dem> {
  // Loaded here, not with the module: only a scenario with terrain needs the GeoTIFF reader, and
  // loading it costs every `strewn check` and `strewn run` about 20 ms.
  const { fromArrayBuffer } = await import('geotiff');
  let image;
  try {
    const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    image = await (await fromArrayBuffer(buffer)).getImage();
  } catch (error) {
    throw new DemError(`not a readable GeoTIFF (${error instanceof Error ? error.message : String(error)})`);
  }
  const keys = (image.getGeoKeys() ?? {}) as Record<string, unknown>;
  if (keys.ProjectedCSTypeGeoKey !== undefined || keys.GTModelTypeGeoKey === 1) {
    throw new DemError(`the elevation model is in a projected coordinate system (EPSG:${String(keys.ProjectedCSTypeGeoKey ?? '?')}); reproject it to latitude/longitude (EPSG:4326) first`);
  }
  const crs = keys.GeographicTypeGeoKey;
  if (crs !== undefined && crs !== 4326) throw new DemError(`the elevation model uses geographic system EPSG:${String(crs)}; expected WGS 84 (EPSG:4326)`);
  let origin: number[], resolution: number[];
  try {
    origin = image.getOrigin();
    resolution = image.getResolution();
  } catch {
    throw new DemError('the GeoTIFF has no georeferencing (ModelTiepoint and ModelPixelScale, or ModelTransformation)');
  }
  const width = image.getWidth(), height = image.getHeight();
  const raster = (await image.readRasters({ samples: [0], interleave: true })) as unknown as ArrayLike<number>;
  const noData = image.getGDALNoData();
  const values = new Float64Array(width * height);
  for (let k = 0; k < values.length; k++) {
    const v = raster[k];
    values[k] = (noData !== null && v === noData) || !Number.isFinite(v) ? NaN : v;
  }
  // GeoTIFF raster type 2 (PixelIsPoint): the tie point is a pixel's centre; otherwise its corner.
  const isPoint = keys.GTRasterTypeGeoKey === 2;
  const half = isPoint ? 0 : 0.5;
  return { width, height, lon0: origin[0] + half * resolution[0], lat0: origin[1] + half * resolution[1], dLon: resolution[0], dLat: resolution[1], values };
}

/**
 * Height (m) at (lat, lon), bilinear between pixel centres, held at the edge value outside the
 * model; NaN where a pixel around the point has no data. Written as a + f (b − a), so a flat model
 * gives its value exactly.
 */
export function demHeight(dem: Dem, lat: number, lon: number): number {
  const x = Math.min(Math.max((lon - dem.lon0) / dem.dLon, 0), dem.width - 1);
  const y = Math.min(Math.max((lat - dem.lat0) / dem.dLat, 0), dem.height - 1);
  const i = Math.min(Math.floor(x), Math.max(dem.width - 2, 0));
  const j = Math.min(Math.floor(y), Math.max(dem.height - 2, 0));
  const fx = x - i, fy = y - j;
  const at = (ii: number, jj: number) => dem.values[Math.min(jj, dem.height - 1) * dem.width + Math.min(ii, dem.width - 1)];
  const a = at(i, j), b = at(i + 1, j), c = at(i, j + 1), d = at(i + 1, j + 1);
  const top = fx === 0 ? a : a + fx * (b - a);
  const bottom = fx === 0 ? c : c + fx * (d - c);
  return fy === 0 ? top : top + fy * (bottom - top);
}
