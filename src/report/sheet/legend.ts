/**
 * The map legend: one entry per kind of thing actually drawn, in columns under the map. Each entry
 * shows the same stroke, fill or marker as the map, so it reads in grey as well as in colour.
 */
import type { Fill, MarkerSymbol, Shape, Stroke } from './display-list.js';
import type { TextMeasure } from './fonts.js';
import { CAP_HEIGHT, wrapText } from './fonts.js';
import { INK } from './palette.js';
import { SYMBOLS } from '../symbols.js';
import { toWinAnsi } from './winansi.js';

export type Swatch =
  | { kind: 'line'; stroke: Stroke }
  | { kind: 'area'; fill?: Fill; stroke?: Stroke }
  | { kind: 'marker'; symbol: MarkerSymbol; color: string; size: number; opacity?: number }
  | { kind: 'pad' }
  | { kind: 'release' }
  /** Anything else: shapes drawn in a swatch `width` wide, centred on the line at `yMid`. */
  | { kind: 'custom'; draw: (x: number, yMid: number, width: number) => Shape[] };

export interface LegendEntry {
  swatch: Swatch;
  text: string;
}

const SWATCH_W = 24;
const SWATCH_GAP = 5;
const TEXT_SIZE = 8;
const ROW_GAP = 3.5;

function swatchShapes(s: Swatch, x: number, yMid: number): Shape[] {
  switch (s.kind) {
    case 'line':
      return [{ kind: 'path', d: [['M', x, yMid], ['L', x + SWATCH_W, yMid]], stroke: s.stroke }];
    case 'area':
      return [{ kind: 'rect', x: x + 1, y: yMid - 4, width: SWATCH_W - 2, height: 8, fill: s.fill, stroke: s.stroke }];
    case 'marker': {
      const points: number[] = [];
      for (const [dx, dy] of [[5, -1.5], [12, 2], [19, -1]]) points.push(x + dx, yMid + dy);
      return [{ kind: 'markers', symbol: s.symbol, size: s.size * 1.15, color: s.color, opacity: s.opacity, points }];
    }
    case 'pad':
      return padSymbol(x + SWATCH_W / 2, yMid);
    case 'release':
      return releaseSymbol(x + SWATCH_W / 2, yMid);
    case 'custom':
      return s.draw(x, yMid, SWATCH_W);
  }
}

/** The pad: a ringed dot. */
export function padSymbol(cx: number, cy: number): Shape[] {
  const p = SYMBOLS.pad;
  return [
    { kind: 'circle', cx, cy, r: p.radius, fill: { color: '#ffffff' }, stroke: { color: p.ring, width: p.ringWidth } },
    { kind: 'circle', cx, cy, r: p.centre, fill: { color: p.ring } },
  ];
}

/** Where a released object starts (off the pad): an open diamond. */
export function releaseSymbol(cx: number, cy: number): Shape[] {
  return [{ kind: 'path', d: [['M', cx, cy - 4.5], ['L', cx + 4.5, cy], ['L', cx, cy + 4.5], ['L', cx - 4.5, cy], ['Z']], fill: { color: '#ffffff' }, stroke: { color: INK, width: 1.2 } }];
}

/**
 * Lays the entries out in `columns` columns (filled column by column) from (x, y) within `width`.
 * Returns the shapes and the height used.
 */
export function layoutLegend(entries: LegendEntry[], x: number, y: number, width: number, columns: number, measure: TextMeasure): { shapes: Shape[]; height: number } {
  const columnWidth = width / columns;
  const textWidth = columnWidth - SWATCH_W - SWATCH_GAP - 6;
  const blocks = entries.map((e) => ({ entry: e, lines: wrapText(measure, toWinAnsi(e.text), TEXT_SIZE, 'regular', textWidth) }));
  const heightOf = (lines: string[]) => lines.length * TEXT_SIZE * 1.2 + ROW_GAP;
  const total = blocks.reduce((h, b) => h + heightOf(b.lines), 0);
  // Fill columns to about the same height, keeping the order top to bottom, left to right.
  const target = total / columns;
  const shapes: Shape[] = [];
  let column = 0;
  let cy = y;
  let tallest = 0;
  for (const b of blocks) {
    const h = heightOf(b.lines);
    if (cy > y && cy - y + h / 2 > target && column < columns - 1) {
      column++;
      cy = y;
    }
    const cx = x + column * columnWidth;
    const firstBaseline = cy + TEXT_SIZE * CAP_HEIGHT + 1;
    const yMid = firstBaseline - (TEXT_SIZE * CAP_HEIGHT) / 2;
    shapes.push(...swatchShapes(b.entry.swatch, cx, yMid));
    b.lines.forEach((line, i) => {
      shapes.push({ kind: 'text', x: cx + SWATCH_W + SWATCH_GAP, y: firstBaseline + i * TEXT_SIZE * 1.2, text: line, size: TEXT_SIZE, font: 'regular', anchor: 'start', color: INK });
    });
    cy += h;
    tallest = Math.max(tallest, cy - y);
  }
  return { shapes: [{ kind: 'group', id: 'legend', shapes }], height: tallest };
}
