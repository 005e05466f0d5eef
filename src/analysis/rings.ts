/**
 * Planar ring arithmetic on [x, y] positions (east/north metres or lon/lat degrees).
 *
 * RFC 7946 §3.1.6: a polygon's exterior ring is counter-clockwise and its holes clockwise. With
 * x pointing east and y north (true of both lon/lat and east/north), counter-clockwise means a
 * positive shoelace area.
 *
 * @example
 *   signedArea([[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]])  // 1 (counter-clockwise)
 *   windPolygon([[[0, 0], [0, 1], [1, 1], [1, 0], [0, 0]]]) // exterior reversed to counter-clockwise
 */
export type Position = number[];
export type Ring = Position[];

/** Shoelace area; positive when the ring runs counter-clockwise. Works for open or closed rings. */
export function signedArea(ring: Ring): number {
  let twice = 0;
  const count = ring.length;
  for (let k = 0; k < count; k++) {
    const a = ring[k];
    const b = ring[(k + 1) % count];
    twice += a[0] * b[1] - b[0] * a[1];
  }
  return twice / 2;
}

/** Drop repeated consecutive positions and close the ring (first position repeated at the end). */
export function closeRing(ring: Ring): Ring {
  const out: Ring = [];
  for (const p of ring) {
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push(p);
  }
  while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  if (out.length > 0) out.push([...out[0]]);
  return out;
}

/** Exterior ring counter-clockwise, holes clockwise (RFC 7946 right-hand rule). */
export function windPolygon(rings: Ring[]): Ring[] {
  return rings.map((ring, index) => {
    const area = signedArea(ring);
    const wantPositive = index === 0;
    return (area > 0) === wantPositive ? ring : [...ring].reverse();
  });
}

/** True when every polygon's exterior is counter-clockwise and every hole clockwise. */
export function hasRfc7946Winding(polygons: Ring[][]): boolean {
  return polygons.every((rings) => rings.every((ring, index) => (signedArea(ring) > 0) === (index === 0)));
}
