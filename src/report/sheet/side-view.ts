/**
 * The rocket's side view on the record page, drawn to scale from the shared geometry
 * (src/report/rocket-outline.ts) with the balance point and the centre of pressure marked in
 * Strewn's own style (SYMBOLS.sideView): CG a stem rising above the rocket ending in a short
 * crossbar, CP a stem hanging below it ending in an open square, the burnout CG a shorter dashed
 * stem. Stems reach past the fins, so a mark never hides behind a fin; the nose points left.
 * Under the drawing: a scale bar in the reader's unit and the caption.
 *
 * @example
 *   const { shapes, height } = sideView({ shape, diameter, cg: 0.77, cp: 0.851, cgBurnout: 0.749, marginCal: 1.51 },
 *     x, y, 240, { maxHeight: 80, size: 8, units: 'metric' }, measure);
 */
import type { RocketShape } from '../../scenario/types.js';
import { bodyRadius, rocketOutline } from '../rocket-outline.js';
import { SYMBOLS, WORDS } from '../symbols.js';
import { ringPath, type Shape } from './display-list.js';
import { CAP_HEIGHT, wrapText, type TextMeasure } from './fonts.js';
import { INK, INK_SOFT } from './palette.js';
import { roundLengthAtMost } from './nice-length.js';
import { significant, type UnitSystem } from '../format-number.js';

export interface SideViewRocket {
  shape: RocketShape;
  /** Body diameter, m. */
  diameter: number;
  /** Balance point at lift-off and at burnout, and the centre of pressure, m from the nose tip. */
  cg: number;
  cgBurnout: number;
  cp: number;
  marginCal: number;
}

export interface SideViewLayout {
  /** Tallest the whole figure (marks, scale bar, caption) may be, points. */
  maxHeight: number;
  /** Type size of labels and caption, points. */
  size: number;
  units: UnitSystem;
}

/**
 * How far the drawn rocket (body and fins) reaches from the axis at station x, m, upward
 * (`side` 1) or downward (-1): the polygons' edges crossing x.
 */
function extentAt(polygons: ReadonlyArray<ReadonlyArray<[number, number]>>, x: number, side: 1 | -1): number {
  let best = 0;
  for (const poly of polygons) {
    for (let i = 0; i < poly.length; i++) {
      const [x1, y1] = poly[i]!;
      const [x2, y2] = poly[(i + 1) % poly.length]!;
      if (x < Math.min(x1, x2) || x > Math.max(x1, x2)) continue;
      const y = x2 === x1 ? side * Math.max(side * y1, side * y2) : y1 + ((x - x1) / (x2 - x1)) * (y2 - y1);
      best = Math.max(best, side * y);
    }
  }
  return best;
}

export function sideView(rocket: SideViewRocket, x: number, y: number, width: number, layout: SideViewLayout, measure: TextMeasure): { shapes: Shape[]; height: number } {
  const sv = SYMBOLS.sideView;
  const { size } = layout;
  const outline = rocketOutline(rocket.shape, rocket.diameter);
  const polygons = [outline.body, ...outline.fins];
  const half = (size * CAP_HEIGHT) / 2;
  const up = Math.max(...polygons.flat().map((p) => p[1]));
  const down = Math.max(...polygons.flat().map((p) => -p[1]));
  // A stem leaves the body's surface and ends `stem` points past whatever the view draws at its
  // station (body, or a fin the mark falls on), so no mark is hidden under a fin.
  const stemEnd = (at: number, side: 1 | -1, stem: number, s: number) => extentAt(polygons, at, side) * s + stem;

  // The scale bar and the caption share one line band under the drawing.
  const bar = roundLengthAtMost(outline.length / 4, layout.units);
  const barLabelWidth = measure(bar.label, size, 'regular');
  const captionX = 4 + barLabelWidth + 8;
  const caption = (s: number) => wrapText(measure, WORDS.sideViewCaption(significant(rocket.marginCal, 3)), size, 'italic', width - Math.max(captionX + bar.metres * s, 0));
  const footer = (s: number) => caption(s).length * size * 1.15 + 3;
  const above = (s: number) => Math.max(up * s, stemEnd(rocket.cg, 1, sv.cg.stem, s) + half, stemEnd(rocket.cgBurnout, 1, sv.cgBurnout.stem, s) + half) + 1;
  const below = (s: number) => Math.max(down * s, stemEnd(rocket.cp, -1, sv.cp.stem, s) + 2 * sv.cp.box) + 1;
  const height = (s: number) => above(s) + below(s) + footer(s);
  // As large as the width allows, then smaller (bisection) until the whole figure fits its height,
  // but never under a quarter of the width's scale: a view too small to read is no view.
  let scale = (width - 8) / outline.length;
  if (height(scale) > layout.maxHeight) {
    let lo = scale / 4;
    let hi = scale;
    for (let k = 0; k < 40; k++) {
      const mid = (lo + hi) / 2;
      if (height(mid) <= layout.maxHeight) lo = mid;
      else hi = mid;
    }
    scale = lo;
  }

  const length = outline.length * scale;
  const x0 = x + (width - length) / 2;
  const axis = y + above(scale);
  const X = (m: number) => x0 + m * scale;
  const Y = (m: number) => axis - m * scale;
  const toPage = (ring: ReadonlyArray<[number, number]>) => ringPath(ring.map(([px, py]) => [X(px), Y(py)] as [number, number]), true);

  const shapes: Shape[] = [];
  for (const fin of outline.fins) shapes.push({ kind: 'path', className: 'side-view-fin', d: toPage(fin), fill: sv.finFill, stroke: sv.fins });
  shapes.push({
    kind: 'path',
    id: 'side-view-body',
    className: 'side-view-body',
    d: toPage(outline.body),
    fill: sv.bodyFill,
    stroke: sv.body,
    // For readers of the SVG (and tests): the scale the view is drawn at and the length it stands for.
    data: { length_m: String(outline.length), points_per_m: String(scale) },
  });

  const labels: Shape[] = [];
  /** A mark's label beside it at `offset` from the mark's line, on `side` unless that runs out of the box. */
  const label = (text: string, mx: number, offset: number, baseline: number, side: 'left' | 'right', color: string) => {
    const w = measure(text, size, 'bold');
    let sd = side;
    if (sd === 'right' && mx + offset + w > x + width) sd = 'left';
    else if (sd === 'left' && mx - offset - w < x) sd = 'right';
    labels.push({ kind: 'text', className: 'side-view-label', x: sd === 'right' ? mx + offset : mx - offset, y: baseline, text, size, font: 'bold', anchor: sd === 'right' ? 'start' : 'end', color });
  };
  const surface = (m: number, side: 1 | -1) => axis - side * bodyRadius(rocket.shape, rocket.diameter, m) * scale;

  // CG at lift-off and at burnout: whichever lies forward takes its label to the left, the other to the right.
  const cgX = X(rocket.cg);
  const cgTop = axis - stemEnd(rocket.cg, 1, sv.cg.stem, scale);
  const cgSide: 'left' | 'right' = rocket.cgBurnout <= rocket.cg ? 'right' : 'left';
  shapes.push({
    kind: 'group',
    id: 'side-view-cg',
    className: 'side-view-mark cg',
    data: { at_m: String(rocket.cg) },
    shapes: [{ kind: 'path', d: [['M', cgX, surface(rocket.cg, 1)], ['L', cgX, cgTop], ['M', cgX - sv.cg.bar, cgTop], ['L', cgX + sv.cg.bar, cgTop]], stroke: { color: sv.cg.color, width: sv.cg.width, cap: 'butt' } }],
  });
  label(WORDS.sideViewCg, cgX, sv.cg.bar + 2, cgTop + half, cgSide, sv.cg.color);
  // A burnout CG the drawing cannot tell from the lift-off one (under half a point) is not drawn twice.
  if (Math.abs(rocket.cgBurnout - rocket.cg) * scale >= 0.5) {
    const bx = X(rocket.cgBurnout);
    const bTop = axis - stemEnd(rocket.cgBurnout, 1, sv.cgBurnout.stem, scale);
    shapes.push({
      kind: 'group',
      id: 'side-view-cg-burnout',
      className: 'side-view-mark cg-burnout',
      data: { at_m: String(rocket.cgBurnout) },
      shapes: [{ kind: 'path', d: [['M', bx, surface(rocket.cgBurnout, 1)], ['L', bx, bTop], ['M', bx - sv.cgBurnout.bar, bTop], ['L', bx + sv.cgBurnout.bar, bTop]], stroke: { color: sv.cgBurnout.color, width: sv.cgBurnout.width, dash: [...sv.cgBurnout.dash], cap: 'butt' } }],
    });
    label(WORDS.sideViewCgBurnout, bx, sv.cgBurnout.bar + 2, bTop + half, cgSide === 'right' ? 'left' : 'right', sv.cgBurnout.color);
  }

  // CP: a stem hanging below, ending in an open square, its label to the right.
  const cpX = X(rocket.cp);
  const cpEnd = axis + stemEnd(rocket.cp, -1, sv.cp.stem, scale);
  const b = sv.cp.box;
  shapes.push({
    kind: 'group',
    id: 'side-view-cp',
    className: 'side-view-mark cp',
    data: { at_m: String(rocket.cp) },
    shapes: [
      { kind: 'path', d: [['M', cpX, surface(rocket.cp, -1)], ['L', cpX, cpEnd]], stroke: { color: sv.cp.color, width: sv.cp.width, cap: 'butt' } },
      { kind: 'path', d: ringPath([[cpX - b, cpEnd], [cpX + b, cpEnd], [cpX + b, cpEnd + 2 * b], [cpX - b, cpEnd + 2 * b]], true), fill: { color: '#ffffff' }, stroke: { color: sv.cp.color, width: sv.cp.width } },
    ],
  });
  label(WORDS.sideViewCp, cpX, b + 2, cpEnd + b + half, 'right', sv.cp.color);
  shapes.push(...labels);

  // Scale bar (a round length, about a quarter of the rocket, in the reader's unit), caption beside it.
  const band = axis + below(scale) + 2;
  const barLength = bar.metres * scale;
  const baseline = band + size * CAP_HEIGHT;
  shapes.push({
    kind: 'group',
    id: 'side-view-scale',
    className: 'side-view-scale',
    data: { metres: String(bar.metres) },
    shapes: [
      { kind: 'path', d: [['M', x, baseline - 4], ['L', x, baseline], ['L', x + barLength, baseline], ['L', x + barLength, baseline - 4]], stroke: { color: INK, width: 0.8 } },
      { kind: 'text', x: x + barLength + 4, y: baseline, text: bar.label, size, font: 'regular', anchor: 'start', color: INK },
    ],
  });
  caption(scale).forEach((line, i) => {
    shapes.push({ kind: 'text', x: x + barLength + captionX, y: baseline + i * size * 1.15, text: line, size, font: 'italic', anchor: 'start', color: INK_SOFT });
  });
  return { shapes: [{ kind: 'group', id: 'side-view', className: 'side-view', shapes }], height: height(scale) + 2 };
}
