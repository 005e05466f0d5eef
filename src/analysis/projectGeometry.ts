/**
 * Move polygon coordinates between the pad's east/north frame and lon/lat, and measure polygons in
 * the east/north frame (areas in m², distances from the pad in m).
 *
 * @example
 *   const metres = polygonsToEastNorth(frame, feature.geometry); // Ring[][] in m
 *   polygonsArea(metres)         // m², holes subtracted
 *   farthestVertex(metres)       // m from the pad
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { LocalFrame } from './geodesy.js';
import type { Ring } from './rings.js';

/** A Polygon or MultiPolygon as a list of polygons (each a list of rings). */
export function polygonsOf(geometry: Polygon | MultiPolygon): Ring[][] {
  return geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
}

export function polygonsToEastNorth(frame: LocalFrame, geometry: Polygon | MultiPolygon): Ring[][] {
  return polygonsOf(geometry).map((rings) => rings.map((ring) => ring.map((p) => frame.toEastNorth(p[0], p[1]))));
}

/**
 * East/north polygons to lon/lat. Longitudes are kept continuous around the pad (a pad at 179.9°
 * gives 180.1° rather than −179.9° for a point just east), so polygons near the antimeridian stay
 * whole; they are not cut at ±180° as RFC 7946 §3.1.9 suggests.
 */
export function polygonsToLonLat(frame: LocalFrame, polygons: Ring[][]): Ring[][] {
  const padLon = frame.origin.lon;
  return polygons.map((rings) =>
    rings.map((ring) =>
      ring.map((p) => {
        const [lon, lat] = frame.toLonLat(p[0], p[1]);
        // Only shift longitudes that wrapped, so all others stay exactly as computed.
        const continuous = lon - padLon > 180 ? lon - 360 : lon - padLon < -180 ? lon + 360 : lon;
        return [continuous, lat];
      }),
    ),
  );
}

function absArea(ring: Ring): number {
  let twice = 0;
  for (let k = 0; k + 1 < ring.length; k++) twice += ring[k][0] * ring[k + 1][1] - ring[k + 1][0] * ring[k][1];
  const last = ring[ring.length - 1];
  twice += last[0] * ring[0][1] - ring[0][0] * last[1];
  return Math.abs(twice / 2);
}

/** Area of polygons in the plane: each exterior minus its holes. */
export function polygonsArea(polygons: Ring[][]): number {
  let area = 0;
  for (const rings of polygons) {
    rings.forEach((ring, index) => {
      area += index === 0 ? absArea(ring) : -absArea(ring);
    });
  }
  return area;
}

/**
 * Largest distance of a vertex from the origin (the pad). Distance along a straight edge is convex,
 * so the farthest point of a polygon is always one of its vertices.
 */
export function farthestVertex(polygons: Ring[][]): number {
  let best = 0;
  for (const rings of polygons) {
    for (const p of rings[0] ?? []) best = Math.max(best, Math.hypot(p[0], p[1]));
  }
  return best;
}
