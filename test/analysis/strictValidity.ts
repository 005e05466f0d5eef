/**
 * Polygon validity stricter than turf's booleanValid (which does not look for a ring crossing
 * itself): OGC simple-features rules checked with turf's own operations —
 * booleanValid, no ring with kinks (turf kinks), no two rings crossing (turf lineIntersect),
 * every hole inside its exterior, and no part of a MultiPolygon inside another part's area.
 */
import { booleanPointInPolygon, booleanValid, kinks, lineIntersect, lineString, polygon } from '@turf/turf';
import type { MultiPolygon, Polygon } from 'geojson';

export function strictlyValid(geometry: Polygon | MultiPolygon): string | null {
  if (!booleanValid(geometry)) return 'turf booleanValid rejects it';
  const parts = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates;
  const rings = parts.flat();
  for (const ring of rings) {
    if (kinks(polygon([ring])).features.length > 0) return 'a ring crosses itself';
  }
  for (let a = 0; a < rings.length; a++) {
    for (let b = a + 1; b < rings.length; b++) {
      if (lineIntersect(lineString(rings[a]), lineString(rings[b])).features.length > 0) return 'two rings meet';
    }
  }
  for (const part of parts) {
    for (const hole of part.slice(1)) {
      if (!booleanPointInPolygon(hole[0], polygon([part[0]]))) return 'a hole lies outside its exterior';
    }
  }
  for (let i = 0; i < parts.length; i++) {
    for (let j = 0; j < parts.length; j++) {
      if (i !== j && booleanPointInPolygon(parts[j][0][0], polygon(parts[i]))) return 'one part lies inside another';
    }
  }
  return null;
}
