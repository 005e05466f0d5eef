import { markerOutline } from '../../../src/report/sheet/display-list.js';
import { modeSymbolIndex } from '../../../src/report/symbols.js';
import { modeStyle } from './palette.js';

/**
 * Landing markers as map images, one per mode: the same shapes the sheet draws (markerOutline of
 * the sheet's display list), in the same colours, scaled to screen pixels. maplibre's circle layer
 * draws only discs, so the triangles, squares, diamonds and crosses are made here as pixels.
 */

/** Image ids by mode index (`landing-mode-0` …). */
export function markerImageId(mode: number): string {
  return `landing-mode-${modeSymbolIndex(mode)}`;
}

/** Drawn at twice the pixel size so markers stay crisp on dense screens. */
const RATIO = 2;

export function markerImage(mode: number): { width: number; height: number; data: Uint8Array } {
  const m = modeStyle(mode);
  const s = m.px * RATIO;
  const half = Math.ceil(s * 1.3 + 2);
  const size = 2 * half;
  const canvas = document.createElement('canvas');
  canvas.width = canvas.height = size;
  const g = canvas.getContext('2d');
  if (!g) throw new Error('no 2D canvas for the landing markers');
  g.fillStyle = g.strokeStyle = m.color;
  g.beginPath();
  if (m.shape === 'dot') g.arc(half, half, s, 0, 2 * Math.PI);
  else {
    for (const c of markerOutline(m.shape, half, half, s)) {
      if (c[0] === 'M') g.moveTo(c[1], c[2]);
      else if (c[0] === 'L') g.lineTo(c[1], c[2]);
      else g.closePath();
    }
  }
  if (m.shape === 'cross') {
    // As the sheet strokes it: a line 0.45 of the half-width.
    g.lineWidth = Math.max(RATIO * 0.7, s * 0.45);
    g.stroke();
  } else g.fill();
  const pixels = g.getImageData(0, 0, size, size).data;
  return { width: size, height: size, data: new Uint8Array(pixels.buffer, pixels.byteOffset, pixels.byteLength) };
}

export const MARKER_PIXEL_RATIO = RATIO;
