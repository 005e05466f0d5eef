/**
 * The map's fixed furniture: north arrow, wind indicator and scale bar, each on a white panel in a
 * corner of the frame. Each returns its shapes and the box it covers (labels keep clear of it).
 */
import type { Shape } from './display-list.js';
import type { TextMeasure } from './fonts.js';
import { CAP_HEIGHT } from './fonts.js';
import { bearingText } from './compass.js';
import { roundLengthAtMost } from './nice-length.js';
import { INK, INK_SOFT, PAPER } from './palette.js';
import type { UnitFormatter } from '../format-number.js';
import type { Bounds, MapView, Rect } from './map-view.js';
import type { Wind } from '../../scenario/types.js';
import { toWinAnsi } from './winansi.js';

export interface Furniture {
  shapes: Shape[];
  box: Bounds;
}

const INSET = 6;
const PANEL = { color: PAPER, opacity: 0.92 };
const PANEL_EDGE = { color: '#9a9a9a', width: 0.5 };

function panel(box: Bounds): Shape {
  return { kind: 'rect', x: box.minX, y: box.minY, width: box.maxX - box.minX, height: box.maxY - box.minY, fill: PANEL, stroke: PANEL_EDGE };
}

/** North arrow in the top-right corner: the map is drawn north-up. */
export function northArrow(frame: Rect): Furniture {
  const w = 24;
  const h = 36;
  const box = { minX: frame.x + frame.width - INSET - w, minY: frame.y + INSET, maxX: frame.x + frame.width - INSET, maxY: frame.y + INSET + h };
  const cx = (box.minX + box.maxX) / 2;
  const top = box.minY + 14;
  const bottom = box.maxY - 4;
  return {
    box,
    shapes: [
      {
        kind: 'group',
        id: 'north-arrow',
        shapes: [
          panel(box),
          { kind: 'text', x: cx, y: box.minY + 11, text: 'N', size: 9, font: 'bold', anchor: 'middle', color: INK },
          { kind: 'path', d: [['M', cx, top], ['L', cx + 5, bottom], ['L', cx, bottom - 5], ['Z']], fill: { color: INK } },
          { kind: 'path', d: [['M', cx, top], ['L', cx - 5, bottom], ['L', cx, bottom - 5], ['Z']], fill: { color: PAPER }, stroke: { color: INK, width: 0.8, join: 'miter' } },
        ],
      },
    ],
  };
}

/**
 * Wind indicator in the top-left corner: an arrow flying downwind, and the from-direction and
 * speed written out (the arrow alone is easy to read the wrong way round).
 */
export function windIndicator(frame: Rect, wind: Wind, units: UnitFormatter, measure: TextMeasure): Furniture {
  const size = 8;
  const calm = !(wind.speed > 0);
  const lines = calm
    ? ['Wind: calm']
    : [
        `Wind from ${bearingText(wind.from)}`,
        `${units.speed(wind.speed)} at ${units.length(wind.height)}${wind.gust !== undefined ? `, gusts ${units.speed(wind.gust)}` : ''}`,
      ].map(toWinAnsi);
  if (!calm && wind.profile && wind.profile.length > 0) lines.push('varies with height (page 2)');
  const arrowSpace = calm ? 0 : 34;
  const textWidth = Math.max(...lines.map((l, i) => measure(l, size, i === 0 ? 'bold' : 'regular')));
  const w = arrowSpace + textWidth + 10;
  const h = 8 + lines.length * size * 1.25 + 2;
  const box = { minX: frame.x + INSET, minY: frame.y + INSET, maxX: frame.x + INSET + w, maxY: frame.y + INSET + Math.max(h, 34) };
  const shapes: Shape[] = [panel(box)];
  if (!calm) {
    // Downwind direction in page coordinates (y grows downwards).
    const towards = ((wind.from + 180) * Math.PI) / 180;
    const dx = Math.sin(towards);
    const dy = -Math.cos(towards);
    const cx = box.minX + 4 + 13;
    const cy = (box.minY + box.maxY) / 2;
    const half = 12;
    const tipX = cx + dx * half;
    const tipY = cy + dy * half;
    const head = 5;
    const side = (sign: number): [number, number] => [tipX - dx * head + sign * -dy * head * 0.6, tipY - dy * head + sign * dx * head * 0.6];
    shapes.push(
      { kind: 'path', d: [['M', cx - dx * half, cy - dy * half], ['L', tipX - dx * head * 0.8, tipY - dy * head * 0.8]], stroke: { color: INK, width: 1.8, cap: 'butt' } },
      { kind: 'path', d: [['M', tipX, tipY], ['L', ...side(1)], ['L', ...side(-1)], ['Z']], fill: { color: INK } },
    );
  }
  let y = box.minY + 4 + size * CAP_HEIGHT + 1;
  lines.forEach((text, i) => {
    shapes.push({ kind: 'text', x: box.minX + 5 + arrowSpace, y, text, size, font: i === 0 ? 'bold' : 'regular', anchor: 'start', color: i === 0 ? INK : INK_SOFT });
    y += size * 1.25;
  });
  return { box, shapes: [{ kind: 'group', id: 'wind', shapes }] };
}

/**
 * Scale bar in the bottom-left corner: a round length near a quarter of the map's width, in four
 * alternating segments.
 */
export function scaleBar(view: MapView, units: UnitFormatter, measure: TextMeasure): Furniture {
  const length = roundLengthAtMost(0.25 * (view.shown.maxX - view.shown.minX), units.system);
  const barWidth = length.metres * view.scale;
  const size = 8;
  const labelWidth = measure(length.label, size, 'regular');
  const w = barWidth + labelWidth / 2 + 16;
  const h = 24;
  const f = view.frame;
  const box = { minX: f.x + INSET, minY: f.y + f.height - INSET - h, maxX: f.x + INSET + w, maxY: f.y + f.height - INSET };
  const x0 = box.minX + 7;
  const barTop = box.minY + 5;
  const barHeight = 4.5;
  const shapes: Shape[] = [panel(box)];
  for (let k = 0; k < 4; k++) {
    shapes.push({ kind: 'rect', x: x0 + (k * barWidth) / 4, y: barTop, width: barWidth / 4, height: barHeight, fill: { color: k % 2 === 0 ? INK : PAPER } });
  }
  shapes.push(
    { kind: 'rect', id: 'scale-bar-outline', x: x0, y: barTop, width: barWidth, height: barHeight, stroke: { color: INK, width: 0.7 } },
    { kind: 'text', x: x0, y: barTop + barHeight + 10, text: '0', size, font: 'regular', anchor: 'middle', color: INK },
    { kind: 'text', id: 'scale-bar-label', x: x0 + barWidth, y: barTop + barHeight + 10, text: length.label, size, font: 'regular', anchor: 'middle', color: INK },
  );
  return { box, shapes: [{ kind: 'group', id: 'scale-bar', data: { metres: String(length.metres) }, shapes }] };
}
