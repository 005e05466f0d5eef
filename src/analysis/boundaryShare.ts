/**
 * Share of the keep-out zone's area that lies outside the land the event may use (site.boundary).
 * A non-zero share means the zone reaches land the organiser does not control.
 *
 * @example
 *   keepOutOutsideBoundary(zone, site.boundary, frame)  // { area_m2: 1520, share: 0.04 }
 */
import { difference, feature, featureCollection } from '@turf/turf';
import type { PolygonGeometry } from '../scenario/types.js';
import type { LocalFrame } from './geodesy.js';
import { polygonsArea, polygonsToEastNorth } from './projectGeometry.js';
import type { KeepOutFeature } from './types.js';

export function keepOutOutsideBoundary(
  zone: KeepOutFeature,
  boundary: PolygonGeometry,
  frame: LocalFrame,
): { area_m2: number; share: number } {
  const outside = difference(featureCollection([zone, feature(boundary)]));
  const area = outside ? polygonsArea(polygonsToEastNorth(frame, outside.geometry)) : 0;
  return { area_m2: area, share: zone.properties.area_m2 > 0 ? area / zone.properties.area_m2 : 0 };
}
