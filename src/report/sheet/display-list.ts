/**
 * The drawing description of the sheet: a short list of shapes in page coordinates (points, 1/72
 * inch, origin at the top left, y downwards). The map and the record are built once as such lists;
 * `renderSvg` and `renderPdf` only translate them, so map.svg and page 1 of sheet.pdf cannot drift
 * apart.
 *
 * @example
 *   const page: Page = { width: 595, height: 842, shapes: [
 *     { kind: 'path', d: [['M', 10, 10], ['L', 100, 10]], stroke: { color: '#000', width: 1 } },
 *     { kind: 'text', x: 10, y: 30, text: 'Pad', size: 9, font: 'bold', anchor: 'start', color: '#000' },
 *   ] };
 */

export type PathCommand = ['M', number, number] | ['L', number, number] | ['Z'];

export interface Stroke {
  color: string;
  width: number;
  /** Dash and gap lengths in points; absent means a solid line. */
  dash?: number[];
  opacity?: number;
  cap?: 'butt' | 'round' | 'square';
  join?: 'miter' | 'round' | 'bevel';
}

export interface Fill {
  color: string;
  opacity?: number;
}

/** Names a shape carries into the SVG, so readers (and tests) can find a contour or the zone. */
export interface Tagged {
  id?: string;
  className?: string;
  /** Extra attributes for the SVG (`data-level` and the like); the PDF ignores them. */
  data?: Record<string, string>;
}

export interface PathShape extends Tagged {
  kind: 'path';
  d: PathCommand[];
  stroke?: Stroke;
  fill?: Fill;
  /** Holes in polygons need even-odd filling. */
  evenOdd?: boolean;
}

export interface CircleShape extends Tagged {
  kind: 'circle';
  cx: number;
  cy: number;
  r: number;
  stroke?: Stroke;
  fill?: Fill;
}

export interface RectShape extends Tagged {
  kind: 'rect';
  x: number;
  y: number;
  width: number;
  height: number;
  stroke?: Stroke;
  fill?: Fill;
}

export type FontName = 'regular' | 'bold' | 'italic' | 'mono';

export interface TextShape extends Tagged {
  kind: 'text';
  /** Anchor point; y is the baseline. */
  x: number;
  y: number;
  text: string;
  size: number;
  font: FontName;
  anchor: 'start' | 'middle' | 'end';
  color: string;
}

export type MarkerSymbol = 'dot' | 'square' | 'triangle' | 'diamond' | 'cross';

/** Many small identical symbols (landing points): one shape, so files stay small. */
export interface MarkersShape extends Tagged {
  kind: 'markers';
  symbol: MarkerSymbol;
  /** Half the symbol's width, points. */
  size: number;
  /** x0, y0, x1, y1, ... */
  points: number[];
  color: string;
  opacity?: number;
}

/** Shapes drawn only inside a rectangle (the map frame). */
export interface ClipGroup extends Tagged {
  kind: 'clip';
  x: number;
  y: number;
  width: number;
  height: number;
  shapes: Shape[];
}

/** Shapes grouped under one name (the scale bar, the legend). */
export interface Group extends Tagged {
  kind: 'group';
  shapes: Shape[];
}

export type Shape = PathShape | CircleShape | RectShape | TextShape | MarkersShape | ClipGroup | Group;

export interface Page {
  width: number;
  height: number;
  shapes: Shape[];
}

/** A polyline or polygon ring as path commands. */
export function ringPath(points: readonly (readonly [number, number])[], close: boolean): PathCommand[] {
  const d: PathCommand[] = [];
  points.forEach(([x, y], i) => d.push(i === 0 ? ['M', x, y] : ['L', x, y]));
  if (close && points.length > 0) d.push(['Z']);
  return d;
}

/** The corner points of one marker symbol centred at (x, y), for path-based renderers. */
export function markerOutline(symbol: Exclude<MarkerSymbol, 'dot'>, x: number, y: number, s: number): PathCommand[] {
  switch (symbol) {
    case 'square':
      return ringPath([[x - s, y - s], [x + s, y - s], [x + s, y + s], [x - s, y + s]], true);
    case 'triangle':
      return ringPath([[x, y - s * 1.15], [x + s, y + s * 0.75], [x - s, y + s * 0.75]], true);
    case 'diamond':
      return ringPath([[x, y - s * 1.2], [x + s, y], [x, y + s * 1.2], [x - s, y]], true);
    case 'cross':
      return [['M', x - s, y - s], ['L', x + s, y + s], ['M', x - s, y + s], ['L', x + s, y - s]];
  }
}
