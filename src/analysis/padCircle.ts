/**
 * A circle around the pad as a polygon in east/north metres that contains the whole true circle:
 * the vertices sit on radius r / cos(π / n), so even the middle of each chord is at r or beyond.
 * A required minimum distance must never come out smaller for having been drawn as a polygon.
 *
 * @example
 *   padCircle(150)  // closed counter-clockwise ring of 129 positions around (0, 0)
 */
import type { Ring } from './rings.js';

export function padCircle(radius: number, vertices = 128): Ring {
  const outer = radius / Math.cos(Math.PI / vertices);
  const ring: Ring = [];
  for (let k = 0; k < vertices; k++) {
    const angle = (2 * Math.PI * k) / vertices;
    ring.push([outer * Math.cos(angle), outer * Math.sin(angle)]);
  }
  ring.push([...ring[0]]);
  return ring;
}
