/**
 * The keep-out zone: the union of
 *  - the highest-density region at the keep-out level,
 *  - the convex hull of every landed sample of each mode at least as likely as 1 − level (a mode
 *    that common cannot be left to the density's tail, however far it lands),
 *  - the circle of the site's required minimum distance around the pad, if given,
 * grown by the keep-out margin. The union is done with turf (polyclip) and the margin with turf's
 * buffer, both on lon/lat; area and distances are then measured in east/north metres.
 *
 * @example
 *   const zone = keepOutZone({ regionMetres, hullsMetres, minimumDistance: 150, level: 0.99, margin: 25, frame });
 *   zone.properties.area_m2; zone.properties.octants_m.NE
 */
import { buffer, featureCollection, polygon, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import type { LocalFrame } from './geodesy.js';
import { octantReach } from './octants.js';
import { padCircle } from './padCircle.js';
import { farthestVertex, polygonsArea, polygonsOf, polygonsToEastNorth, polygonsToLonLat } from './projectGeometry.js';
import { windPolygon, type Ring } from './rings.js';
import type { KeepOutFeature } from './types.js';

/** Half-width given to a hull that is a single point or a line (all its samples on one line), m. */
const DEGENERATE_HALF_WIDTH_M = 0.05;
/** Buffer arc steps per quarter circle: the chord sags r (1 − cos(π/128)) ≈ 0.03 % of the margin. */
const BUFFER_STEPS = 32;

export interface KeepOutInput {
  /** The keep-out level's density region, east/north metres. */
  regionMetres: Ring[][];
  /** Convex hulls (east/north metres) of the modes that must be covered, with their names. */
  hulls: { mode: string; ring: Ring }[];
  /** Required minimum distance around the pad, m. */
  minimumDistance?: number;
  level: number;
  margin: number;
  frame: LocalFrame;
}

/** A hull as a proper polygon ring: points and lines get a thin rectangle around them. */
export function hullPolygon(ring: Ring): Ring {
  if (ring.length >= 4) return ring;
  const [a, b] = [ring[0], ring[ring.length - 1]];
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const length = Math.hypot(dx, dy);
  const ux = length > 0 ? dx / length : 1;
  const uy = length > 0 ? dy / length : 0;
  const w = DEGENERATE_HALF_WIDTH_M;
  // Along-axis and across-axis offsets, counter-clockwise.
  const corner = (p: number[], along: number, across: number) => [
    p[0] + along * ux - across * uy,
    p[1] + along * uy + across * ux,
  ];
  const box = [corner(a, -w, -w), corner(b, w, -w), corner(b, w, w), corner(a, -w, w)];
  return [...box, [...box[0]]];
}

export function keepOutZone(input: KeepOutInput): KeepOutFeature {
  const { frame } = input;
  const parts: string[] = [];
  const pieces: Ring[][] = [];
  if (input.regionMetres.length > 0) {
    pieces.push(...input.regionMetres);
    parts.push(`${input.level} density region`);
  }
  for (const hull of input.hulls) {
    if (hull.ring.length === 0) continue;
    pieces.push([hullPolygon(hull.ring)]);
    parts.push(`convex hull of mode "${hull.mode}"`);
  }
  if (input.minimumDistance && input.minimumDistance > 0) {
    pieces.push([padCircle(input.minimumDistance)]);
    parts.push(`minimum distance ${input.minimumDistance} m`);
  }
  if (pieces.length === 0) throw new Error('nothing to build a keep-out zone from');
  const features = polygonsToLonLat(frame, pieces).map((rings) => polygon(windPolygon(rings)));
  // turf's union needs two inputs; a union with itself just normalises a lone polygon.
  const merged = union(featureCollection(features.length > 1 ? features : [features[0], features[0]]));
  if (!merged) throw new Error('keep-out union came out empty');
  let zone: Feature<Polygon | MultiPolygon> = merged;
  if (input.margin > 0) {
    const grown = buffer(merged, input.margin, { units: 'meters', steps: BUFFER_STEPS });
    if (!grown) throw new Error('keep-out buffer came out empty');
    zone = grown;
  }
  // turf's buffer wraps longitudes into ±180°; keep them continuous around the pad like the rest.
  const padLon = frame.origin.lon;
  const continuous = (lon: number) => (lon - padLon > 180 ? lon - 360 : lon - padLon < -180 ? lon + 360 : lon);
  const lonLat = polygonsOf(zone.geometry)
    .map((rings) => rings.map((ring) => ring.map((p) => [continuous(p[0]), p[1]])))
    .map(windPolygon);
  const geometry: Polygon | MultiPolygon =
    lonLat.length === 1 ? { type: 'Polygon', coordinates: lonLat[0] } : { type: 'MultiPolygon', coordinates: lonLat };
  const metres = polygonsToEastNorth(frame, geometry);
  if (input.margin > 0) parts.push(`grown by ${input.margin} m`);
  return {
    type: 'Feature',
    geometry,
    properties: {
      level: input.level,
      margin_m: input.margin,
      area_m2: polygonsArea(metres),
      maxDistance_m: farthestVertex(metres),
      octants_m: octantReach(metres),
      parts,
    },
  };
}
