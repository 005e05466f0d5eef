import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { distance } from '@turf/distance';
import type { Issue, PolygonGeometry, Site } from './types.js';

/**
 * Geometry that passes the format's checks but is almost certainly not what was meant: a
 * boundary or area written as [lat, lon] instead of GeoJSON's [lon, lat] (RFC 7946, section
 * 3.1.1), and a pad outside its own boundary. Warnings only: the scenario runs as written.
 *
 * Distances are great-circle distances (turf's haversine); a warning threshold needs no more.
 */

/** Farther than this from the pad, a site polygon is not part of the same event (common practice, no source). */
export const FAR_FROM_PAD_KM = 50;

interface Named {
  path: string;
  what: string;
  geometry: PolygonGeometry;
}

export function geometryWarnings(site: Site): Issue[] {
  const pad: [number, number] = [site.pad.lon, site.pad.lat];
  const polygons: Named[] = [];
  if (site.boundary !== undefined) polygons.push({ path: 'site.boundary', what: 'the boundary', geometry: site.boundary });
  site.areas.forEach((a, i) => polygons.push({ path: `site.areas[${i}].geometry`, what: `area '${a.name}'`, geometry: a.geometry }));
  const issues: Issue[] = [];
  const swapped = new Set<string>();
  for (const p of polygons) {
    const swap = swapWarning(p, pad);
    if (swap !== undefined) {
      issues.push(swap);
      swapped.add(p.path);
    }
  }
  if (site.boundary !== undefined && !swapped.has('site.boundary')) {
    if (!booleanPointInPolygon(pad, site.boundary)) {
      const km = distanceToPolygon(pad, site.boundary);
      issues.push({
        path: 'site.boundary',
        message: `the pad (lat ${site.pad.lat}, lon ${site.pad.lon}) lies outside the boundary, about ${roundKm(km)} from its nearest corner; check the pad's position and the boundary's corners (GeoJSON writes [lon, lat])`,
      });
    }
  }
  return issues;
}

/** The polygon far from the pad as written, but near it with each position's two numbers swapped. */
function swapWarning(p: Named, pad: [number, number]): Issue | undefined {
  const asWritten = distanceToPolygon(pad, p.geometry);
  if (asWritten <= FAR_FROM_PAD_KM) return undefined;
  const flipped: PolygonGeometry = { type: 'Polygon', coordinates: p.geometry.coordinates.map((ring) => ring.map(([a, b]) => [b!, a!])) };
  const valid = flipped.coordinates.every((ring) => ring.every(([lon, lat]) => Math.abs(lat!) <= 90 && Math.abs(lon!) <= 180));
  const first = p.geometry.coordinates[0]?.[0] ?? [];
  if (valid && distanceToPolygon(pad, flipped) <= FAR_FROM_PAD_KM) {
    return {
      path: p.path,
      message: `${p.what} lies ${roundKm(asWritten)} from the pad as written, but right beside it with each position's numbers swapped: its positions look like [lat, lon] (first ${JSON.stringify(first)}); GeoJSON writes [lon, lat], so write [${first[1]}, ${first[0]}]`,
    };
  }
  return { path: p.path, message: `${p.what} lies ${roundKm(asWritten)} from the pad; check its positions (GeoJSON writes [lon, lat]) and the pad's` };
}

/** km from the point to the polygon's nearest position, 0 inside. */
function distanceToPolygon(point: [number, number], polygon: PolygonGeometry): number {
  if (booleanPointInPolygon(point, polygon)) return 0;
  let best = Infinity;
  for (const ring of polygon.coordinates) for (const position of ring) best = Math.min(best, distance(point, [position[0]!, position[1]!], { units: 'kilometers' }));
  return best;
}

function roundKm(km: number): string {
  return km >= 10 ? `${Math.round(km).toLocaleString('en')} km` : km >= 1 ? `${km.toFixed(1)} km` : `${Math.round(km * 1000)} m`;
}
