/**
 * Where the map looks and how metres become points on the page. The map is north-up in the pad's
 * local east/north frame with one scale on both axes (createLocalFrame is equidistant from the
 * pad, so distances from the pad read true).
 *
 * @example
 *   const extent = chooseExtent({ core, areas, reach: 950 });
 *   const view = fitView(extent, { x: 28, y: 80, width: 540, height: 560 });
 *   view.toPage(0, 0)  // the pad on the page
 */

/** An axis-aligned box; in metres (east, north) or points (x, y) depending on use. */
export interface Bounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export const EMPTY_BOUNDS: Bounds = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };

export function isEmpty(b: Bounds): boolean {
  return !(b.minX <= b.maxX && b.minY <= b.maxY);
}

export function union(a: Bounds, b: Bounds): Bounds {
  return { minX: Math.min(a.minX, b.minX), minY: Math.min(a.minY, b.minY), maxX: Math.max(a.maxX, b.maxX), maxY: Math.max(a.maxY, b.maxY) };
}

export function intersection(a: Bounds, b: Bounds): Bounds {
  return { minX: Math.max(a.minX, b.minX), minY: Math.max(a.minY, b.minY), maxX: Math.min(a.maxX, b.maxX), maxY: Math.min(a.maxY, b.maxY) };
}

export function boundsOfPoints(points: Iterable<readonly [number, number]>): Bounds {
  let b = { ...EMPTY_BOUNDS };
  for (const [x, y] of points) b = { minX: Math.min(b.minX, x), minY: Math.min(b.minY, y), maxX: Math.max(b.maxX, x), maxY: Math.max(b.maxY, y) };
  return b;
}

export function overlaps(a: Bounds, b: Bounds): boolean {
  return a.minX < b.maxX && b.minX < a.maxX && a.minY < b.maxY && b.minY < a.maxY;
}

export function overlapArea(a: Bounds, b: Bounds): number {
  const w = Math.min(a.maxX, b.maxX) - Math.max(a.minX, b.minX);
  const h = Math.min(a.maxY, b.maxY) - Math.max(a.minY, b.minY);
  return w > 0 && h > 0 ? w * h : 0;
}

export function contains(outer: Bounds, inner: Bounds): boolean {
  return inner.minX >= outer.minX && inner.maxX <= outer.maxX && inner.minY >= outer.minY && inner.maxY <= outer.maxY;
}

export interface ExtentInput {
  /** What the map must show whole: the zones, the pad, the launch point, the minimum distance. */
  core: Bounds;
  /** Places that matter (spectators, roads, ...), shown where they lie near the zone. */
  areas: Bounds[];
  /** How far the zone reaches from the pad, m. */
  reach: number;
}

/** Smallest width of the map, m: a few metres of zone should not fill a page. */
export const MIN_EXTENT_M = 120;

/**
 * The region to show: everything in `core`, plus the parts of the areas that lie within a context
 * radius of the pad (twice the zone's reach, and at least 150 m beyond it), plus a margin. A
 * far-away road does not shrink the zone to a dot; a crowd beside the zone is always in view.
 */
export function chooseExtent(input: ExtentInput): Bounds {
  const reach = Math.max(input.reach, MIN_EXTENT_M / 2);
  const context = Math.max(2 * reach, reach + 150);
  const contextBox: Bounds = { minX: -context, minY: -context, maxX: context, maxY: context };
  let extent = isEmpty(input.core) ? { minX: 0, minY: 0, maxX: 0, maxY: 0 } : input.core;
  for (const area of input.areas) {
    const near = intersection(area, contextBox);
    if (!isEmpty(near)) extent = union(extent, near);
  }
  const width = Math.max(extent.maxX - extent.minX, MIN_EXTENT_M);
  const height = Math.max(extent.maxY - extent.minY, MIN_EXTENT_M);
  const cx = (extent.minX + extent.maxX) / 2;
  const cy = (extent.minY + extent.maxY) / 2;
  const margin = 0.07;
  return {
    minX: cx - (width / 2) * (1 + 2 * margin),
    maxX: cx + (width / 2) * (1 + 2 * margin),
    minY: cy - (height / 2) * (1 + 2 * margin),
    maxY: cy + (height / 2) * (1 + 2 * margin),
  };
}

export interface MapView {
  /** The map frame on the page. */
  frame: Rect;
  /** Points per metre on the ground. */
  scale: number;
  /** What the frame shows, in metres east/north of the pad (wider than the extent asked for). */
  shown: Bounds;
  toPage(east: number, north: number): [number, number];
}

/** Fits the extent into the frame at one scale for both axes, centred; north is up. */
export function fitView(extent: Bounds, frame: Rect): MapView {
  const scale = Math.min(frame.width / (extent.maxX - extent.minX), frame.height / (extent.maxY - extent.minY));
  const cx = (extent.minX + extent.maxX) / 2;
  const cy = (extent.minY + extent.maxY) / 2;
  const halfW = frame.width / scale / 2;
  const halfH = frame.height / scale / 2;
  const shown = { minX: cx - halfW, maxX: cx + halfW, minY: cy - halfH, maxY: cy + halfH };
  return {
    frame,
    scale,
    shown,
    toPage: (east, north) => [frame.x + (east - shown.minX) * scale, frame.y + (shown.maxY - north) * scale],
  };
}
