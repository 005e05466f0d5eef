/**
 * "What drives the landing spread" as horizontal bars: per input, a thick bar for its share of
 * the landing scatter (what the keep-out area grows with) and a thin one for its share of the
 * distance from the pad, both to one scale, with the numbers beside them. Drawn on the record
 * page of the review sheet and, from the same shapes, in the web page's findings.
 *
 * The two bars differ by thickness and darkness, so the chart reads in grey.
 *
 * @example
 *   const { shapes, height } = sensitivityBars(summary.sensitivity.inputs, 28, 400, 539, { columns: 2, size: 8.5 }, measure);
 */
import type { Page, Shape } from './display-list.js';
import { CAP_HEIGHT, type TextMeasure } from './fonts.js';
import { inputWords } from './input-names.js';
import { INK, INK_SOFT } from './palette.js';
import { percent } from '../format-number.js';
import { toWinAnsi } from './winansi.js';

export interface BarInput {
  input: string;
  scatter: number;
  distance: number;
}

export interface BarsLayout {
  /** Side-by-side columns of bars (filled top to bottom, then left to right). */
  columns: number;
  /** Type size, points. */
  size: number;
  /** Most inputs shown (the largest by scatter come first in the summary). */
  maxRows?: number;
  /** Draw the key above the bars, on one line or one entry under the other (the record page puts it beside its heading instead). */
  key?: 'line' | 'stacked';
}

export const BAR_STYLE = {
  scatter: '#2e4a66',
  distance: '#8ea7bd',
  grid: '#d9d9d9',
} as const;

const THICK = 5.5;
const THIN = 2.2;

/** Bars run to the next tenth above the largest share: small shares still show, one scale for all. */
function scaleTop(inputs: readonly BarInput[]): number {
  const largest = Math.max(0, ...inputs.flatMap((x) => [x.scatter, x.distance]));
  return Math.max(0.1, Math.ceil(largest * 10 - 1e-9) / 10);
}

const KEY = ['share of landing scatter', 'share of distance from the pad'] as const;
const SWATCH = 14;

/** Width of the key on one line. */
export function sensitivityKeyWidth(size: number, measure: TextMeasure): number {
  return 2 * (SWATCH + 4) + measure(KEY[0], size, 'regular') + 12 + measure(KEY[1], size, 'regular');
}

/** Height the key takes above the bars. */
function keyHeight(key: BarsLayout['key'], size: number): number {
  return key === 'line' ? size * 1.3 + 3 : key === 'stacked' ? 2 * size * 1.3 + 3 : 0;
}

/** The key to the two bars from x, the first entry's text on `baseline`; the second follows on the line or below it. */
export function sensitivityKey(x: number, baseline: number, size: number, measure: TextMeasure, stacked = false): Shape[] {
  const mid = baseline - (size * CAP_HEIGHT) / 2;
  const second = stacked ? x : x + SWATCH + 4 + measure(KEY[0], size, 'regular') + 12;
  const down = stacked ? size * 1.3 : 0;
  return [
    {
      kind: 'group',
      className: 'sensitivity-key',
      shapes: [
        { kind: 'rect', x, y: mid - THICK / 2, width: SWATCH, height: THICK, fill: { color: BAR_STYLE.scatter } },
        { kind: 'text', x: x + SWATCH + 4, y: baseline, text: KEY[0], size, font: 'regular', anchor: 'start', color: INK },
        { kind: 'rect', x: second, y: mid + down - THIN / 2, width: SWATCH, height: THIN, fill: { color: BAR_STYLE.distance } },
        { kind: 'text', x: second + SWATCH + 4, y: baseline + down, text: KEY[1], size, font: 'regular', anchor: 'start', color: INK },
      ],
    },
  ];
}

/** The bars from (x, y) down within `width`; returns the shapes, the height used and how many inputs were drawn. */
export function sensitivityBars(inputs: readonly BarInput[], x: number, y: number, width: number, layout: BarsLayout, measure: TextMeasure): { shapes: Shape[]; height: number; shown: number } {
  const { size } = layout;
  const shown = inputs.slice(0, layout.maxRows ?? inputs.length).map((i) => ({ ...i, scatter: Math.max(0, i.scatter), distance: Math.max(0, i.distance) }));
  const keyTall = keyHeight(layout.key, size);
  const shapes: Shape[] = layout.key ? sensitivityKey(x, y + size * CAP_HEIGHT, size, measure, layout.key === 'stacked') : [];
  const top = scaleTop(shown);
  const columns = Math.max(1, Math.min(layout.columns, shown.length));
  const gap = 16;
  const columnWidth = (width - (columns - 1) * gap) / columns;
  const labels = shown.map((i) => toWinAnsi(inputWords(i.input)));
  const labelWidth = Math.min(columnWidth * 0.42, Math.max(0, ...labels.map((l) => measure(l, size, 'regular'))) + 6);
  const numberWidth = measure('100 %', size, 'bold') + 5;
  const barWidth = Math.max(20, columnWidth - labelWidth - 2 * numberWidth - 6);
  const rowHeight = Math.max(size * 1.3, THICK + THIN + 3);
  const perColumn = Math.ceil(shown.length / columns);
  const rowsTop = y + keyTall;
  const step = top <= 0.6 ? 0.1 : 0.2;

  for (let c = 0; c < columns; c++) {
    const x0 = x + c * (columnWidth + gap);
    const barX = x0 + labelWidth;
    const rows = shown.slice(c * perColumn, (c + 1) * perColumn);
    if (rows.length === 0) continue;
    const bottom = rowsTop + rows.length * rowHeight;
    // Light grid lines at each tenth (or fifth) of the scale, under the bars.
    for (let g = 0; g <= top + 1e-9; g += step) {
      const gx = barX + (g / top) * barWidth;
      shapes.push({ kind: 'path', className: 'bar-grid', d: [['M', gx, rowsTop], ['L', gx, bottom - 1]], stroke: { color: BAR_STYLE.grid, width: g === 0 ? 0.8 : 0.4 } });
    }
    rows.forEach((row, k) => {
      const i = c * perColumn + k;
      const rowTop = rowsTop + k * rowHeight;
      const baseline = rowTop + (rowHeight + size * CAP_HEIGHT) / 2 - 0.5;
      const thickY = rowTop + (rowHeight - THICK - THIN - 1) / 2;
      shapes.push({
        kind: 'group',
        className: 'bar-row',
        data: { input: row.input },
        shapes: [
          { kind: 'text', x: x0, y: baseline, text: labels[i], size, font: 'regular', anchor: 'start', color: INK },
          { kind: 'rect', className: 'bar-scatter', x: barX, y: thickY, width: Math.max(0.6, (row.scatter / top) * barWidth), height: THICK, fill: { color: BAR_STYLE.scatter } },
          { kind: 'rect', className: 'bar-distance', x: barX, y: thickY + THICK + 1, width: Math.max(0.6, (row.distance / top) * barWidth), height: THIN, fill: { color: BAR_STYLE.distance } },
          { kind: 'text', x: barX + barWidth + 3 + numberWidth, y: baseline, text: percent(row.scatter), size, font: 'bold', anchor: 'end', color: INK },
          { kind: 'text', x: barX + barWidth + 3 + 2 * numberWidth, y: baseline, text: percent(row.distance), size, font: 'regular', anchor: 'end', color: INK_SOFT },
        ],
      });
    });
  }
  const height = keyTall + perColumn * rowHeight + 2;
  return { shapes: [{ kind: 'group', id: 'sensitivity', className: 'sensitivity-bars', shapes }], height, shown: shown.length };
}

/** The method's name without its references (summary.json keeps them). */
export function methodName(method: string): string {
  const cut = method.indexOf(' (');
  return cut > 0 ? method.slice(0, cut) : method;
}

/** The small note under the bars (one line on the record page): what the shares are and how they were computed. */
export function sensitivityNote(method: string, hidden: number): string {
  const rest = hidden > 0 ? `; ${hidden} more in summary.json` : '';
  return `Each input alone; the rest is turbulence and interactions${rest}. Method: ${methodName(method)}.`;
}

/** The bars with their key on a page of their own, `width` points wide (the web page's findings). */
export function sensitivityFigure(inputs: readonly BarInput[], width: number, measure: TextMeasure): Page {
  const margin = 4;
  const size = 9;
  const key = sensitivityKeyWidth(size, measure) <= width - 2 * margin ? 'line' : 'stacked';
  const bars = sensitivityBars(inputs, margin, margin, width - 2 * margin, { columns: 1, size, key }, measure);
  return { width, height: bars.height + 2 * margin, shapes: bars.shapes };
}
