import { bodyRadius, rocketOutline } from '../../../src/report/rocket-outline.js';
import { SCREEN_PX_PER_PT, SYMBOLS, WORDS } from '../../../src/report/symbols.js';
import type { UnitFormatter } from '../../../src/report/format-number.js';
import type { RocketShape } from '../../../src/scenario/types.js';

/**
 * The rocket's side view on the Setup tab, drawn to scale from the same outline the review sheet
 * draws (src/report/rocket-outline.ts), with the balance point and the centre of pressure marked
 * in Strewn's own way (SYMBOLS.sideView): the CG a stem rising above the body to a short
 * crossbar, the CP a stem hanging below it to an open square, the CG at burnout a shorter dashed
 * stem. A scale bar under the nose says how long a round length is.
 *
 * Drawn at the pixel width it is shown at (not scaled as a picture), so marks and labels keep
 * their size on a phone and on a wide screen.
 */

const SVG_NS = 'http://www.w3.org/2000/svg';
const PX = SCREEN_PX_PER_PT;
/** Label text size, px. */
const FONT = 12;
/** The body is never drawn taller than this, px: a stubby rocket on a wide panel stays modest. */
const MAX_BODY_HEIGHT = 120;
const SIDE_PAD = 10;

export interface SideViewMarks {
  cg: number;
  cp: number;
  cgBurnout?: number;
}

function node<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Record<string, string | number>): SVGElementTagNameMap[K] {
  const n = document.createElementNS(SVG_NS, tag);
  for (const [k, v] of Object.entries(attrs)) n.setAttribute(k, String(v));
  return n;
}

function stroke(line: { color: string; width: number; dash?: readonly number[] }): Record<string, string | number> {
  const a: Record<string, string | number> = { stroke: line.color, 'stroke-width': line.width * PX, fill: 'none' };
  if (line.dash) a['stroke-dasharray'] = line.dash.map((d) => d * PX).join(' ');
  return a;
}

function text(x: number, y: number, content: string, anchor: 'start' | 'middle' | 'end', color: string): SVGTextElement {
  const t = node('text', { x, y, 'text-anchor': anchor, fill: color, 'font-size': FONT, 'font-family': 'inherit' });
  t.textContent = content;
  return t;
}

/** A round length for the scale bar, about a fifth of the rocket: 1, 2 or 5 × 10ⁿ in the unit shown. */
function scaleBar(length: number, u: UnitFormatter): { metres: number; label: string } {
  const unit = u.system === 'metric' ? 0.001 : 0.0254;
  const target = length / 5 / unit;
  const p = 10 ** Math.floor(Math.log10(target));
  const n = [1, 2, 5, 10].map((k) => k * p).filter((k) => k <= target).pop() ?? p;
  return { metres: n * unit, label: u.diameter(n * unit) };
}

/**
 * Draws the view into a new <svg> of `width` px.
 * @example
 *   container.replaceChildren(sideViewSvg(shape, 0.054, { cg: 0.77, cp: 0.851, cgBurnout: 0.749 }, 360, unitFormatter('metric')));
 */
export function sideViewSvg(shape: RocketShape, diameter: number, marks: SideViewMarks, width: number, u: UnitFormatter): SVGSVGElement {
  const o = rocketOutline(shape, diameter);
  const sv = SYMBOLS.sideView;
  const cgStem = sv.cg.stem * PX;
  const cpStem = sv.cp.stem * PX;
  const box = sv.cp.box * PX;
  const top = FONT + 4 + cgStem;
  const scale = Math.min((width - 2 * SIDE_PAD) / o.length, MAX_BODY_HEIGHT / (2 * o.halfHeight));
  const left = (width - o.length * scale) / 2;
  const axis = top + o.halfHeight * scale;
  const bottomOfBody = axis + o.halfHeight * scale;
  const height = bottomOfBody + cpStem + 2 * box + FONT + 4 + FONT + 10;
  const X = (x: number) => left + x * scale;
  const Y = (y: number) => axis - y * scale;
  const points = (ring: Array<[number, number]>) => ring.map(([x, y]) => `${X(x).toFixed(2)},${Y(y).toFixed(2)}`).join(' ');

  const svg = node('svg', { viewBox: `0 0 ${width} ${height.toFixed(1)}`, width, height: height.toFixed(1), class: 'side-view-svg' });
  svg.dataset.noseX = X(0).toFixed(2);
  svg.dataset.tailX = X(o.length).toFixed(2);
  svg.dataset.pxPerMetre = scale.toFixed(4);

  const body = node('g', { 'data-part': 'outline' });
  for (const fin of o.fins) body.appendChild(node('polygon', { points: points(fin), ...stroke(sv.fins), fill: sv.finFill.color }));
  body.appendChild(node('polygon', { points: points(o.body), ...stroke(sv.body), fill: sv.bodyFill.color, 'stroke-linejoin': 'round' }));
  svg.appendChild(body);

  const topY = Y(o.halfHeight);
  const bottomY = Y(-o.halfHeight);

  /** Where a stem meets the body at x (it starts at the body's skin, not at the fins' tips). */
  const skin = (x: number) => bodyRadius(shape, diameter, Math.min(o.length, Math.max(0, x)));

  // CG: stem from the body's top up past the whole outline to a crossbar, label above it.
  const cgMark = (x: number, style: { color: string; width: number; dash?: readonly number[]; stem: number; bar: number }, label: string, kind: string, labelSide: 'above' | 'start' | 'end') => {
    const g = node('g', { 'data-mark': kind, 'data-x': X(x).toFixed(2) });
    const y1 = topY - style.stem * PX;
    g.appendChild(node('line', { x1: X(x), y1: Y(skin(x)), x2: X(x), y2: y1, ...stroke(style) }));
    g.appendChild(node('line', { x1: X(x) - (style.bar * PX) / 2, y1, x2: X(x) + (style.bar * PX) / 2, y2: y1, ...stroke({ ...style, dash: undefined }) }));
    if (labelSide === 'above') g.appendChild(text(clampLabel(X(x), label, width), y1 - 4, label, 'middle', style.color));
    else g.appendChild(text(labelSide === 'end' ? X(x) - (style.bar * PX) / 2 - 3 : X(x) + (style.bar * PX) / 2 + 3, y1 + FONT / 2 - 1, label, labelSide, style.color));
    svg.appendChild(g);
  };
  cgMark(marks.cg, sv.cg, WORDS.sideViewCg, 'cg', 'above');
  if (marks.cgBurnout !== undefined && Math.abs(marks.cgBurnout - marks.cg) * scale > 0.5) {
    // Its label goes on the side away from the lift-off CG, level with its own crossbar.
    cgMark(marks.cgBurnout, sv.cgBurnout, WORDS.sideViewCgBurnout, 'cg-burnout', marks.cgBurnout < marks.cg ? 'end' : 'start');
  }

  // CP: stem hanging from the bottom of the outline to an open square, label under it.
  const cp = node('g', { 'data-mark': 'cp', 'data-x': X(marks.cp).toFixed(2) });
  const cpEnd = bottomY + cpStem;
  cp.appendChild(node('line', { x1: X(marks.cp), y1: Y(-skin(marks.cp)), x2: X(marks.cp), y2: cpEnd, ...stroke(sv.cp) }));
  cp.appendChild(node('rect', { x: X(marks.cp) - box, y: cpEnd, width: 2 * box, height: 2 * box, ...stroke(sv.cp), fill: '#ffffff' }));
  cp.appendChild(text(clampLabel(X(marks.cp), WORDS.sideViewCp, width), cpEnd + 2 * box + FONT + 1, WORDS.sideViewCp, 'middle', sv.cp.color));
  svg.appendChild(cp);

  // Scale bar under the nose: a round length with end ticks.
  const bar = scaleBar(o.length, u);
  const by = height - 6;
  const g = node('g', { 'data-part': 'scale-bar', 'data-metres': bar.metres });
  const line = { color: '#4d4d4d', width: 0.8 };
  g.appendChild(node('line', { x1: X(0), y1: by, x2: X(bar.metres), y2: by, ...stroke(line) }));
  for (const x of [0, bar.metres]) g.appendChild(node('line', { x1: X(x), y1: by - 4, x2: X(x), y2: by, ...stroke(line) }));
  g.appendChild(text(X(bar.metres) + 5, by, bar.label, 'start', '#4d4d4d'));
  svg.appendChild(g);
  return svg;
}

/** Keeps a centred label inside the drawing (a CG near the nose on a narrow screen). */
function clampLabel(x: number, label: string, width: number): number {
  const half = (label.length * FONT * 0.6) / 2;
  return Math.min(width - half - 2, Math.max(half + 2, x));
}
