/**
 * The polar chart of the wind limits as display-list shapes: speed rings with labels, compass
 * spokes, the envelope (hatched fill under a heavy outline), the limit points and the forecast
 * wind. Built once here and drawn by every renderer: envelope.svg, the envelope page of the review
 * sheet and the web page.
 *
 * It must read in grey: the envelope is told apart by its hatching and heavy outline, limits that
 * reached the top of the grid by a triangle instead of a dot, and the forecast by a ringed dot.
 *
 * @example
 *   const chart = polarChart(result, { units: 'metric', measure, x: 40, y: 120, size: 300 });
 *   page.shapes.push(...chart.shapes);
 */
import type { PathCommand, Shape } from '../report/sheet/display-list.js';
import { ringPath } from '../report/sheet/display-list.js';
import { CAP_HEIGHT, type TextMeasure } from '../report/sheet/fonts.js';
import type { LegendEntry } from '../report/sheet/legend.js';
import { INK, INK_SOFT, LABEL_BACKING } from '../report/sheet/palette.js';
import type { UnitSystem } from '../report/sheet/units.js';
import type { EnvelopeResult } from './envelope.js';
import { hatchLines } from './hatch.js';
import { compassLabel, polarFrame, type PolarFrame } from './polar-frame.js';

/** The chart's colours; each also differs by line weight or shape (see above). */
export const ENVELOPE_STYLE = {
  fill: '#dce9f2',
  hatch: '#7ea6c4',
  outline: '#1f4e79',
  forecast: '#b3541e',
  inside: '#1f4e79',
  outside: '#8a2f0a',
  ring: '#9a9a9a',
  spoke: '#c8c8c8',
} as const;

const HATCH_SPACING = 5;
const LABEL_SIZE = 8;

export interface PolarChartOptions {
  units: UnitSystem;
  measure: TextMeasure;
  /** Top left of the square the chart fills, compass labels included. */
  x: number;
  y: number;
  size: number;
}

export interface PolarChart {
  shapes: Shape[];
  frame: PolarFrame;
  /** Height used from the top of the square: the rim, its labels and a little room. */
  height: number;
}

/** A number as a ring label shows it: whole numbers plain, others to one decimal. */
export function ringNumber(v: number): string {
  return Math.abs(v - Math.round(v)) < 1e-9 ? String(Math.round(v)) : v.toFixed(1);
}

/** Whether the directions go all the way round (then the envelope closes on itself). */
export function coversCompass(directions: readonly number[]): boolean {
  if (directions.length < 3) return false;
  const step = directions[1] - directions[0];
  return directions[directions.length - 1] - directions[0] + step >= 360 - 1e-9;
}

/** Directions that get a compass label: at most sixteen, evenly picked. */
function labelledDirections(directions: readonly number[]): number[] {
  const every = Math.max(1, Math.ceil(directions.length / 16));
  return directions.filter((_, i) => i % every === 0);
}

/** The corners of the envelope: one per direction, and the centre too when it is only a fan. */
export function envelopeOutline(e: EnvelopeResult, frame: PolarFrame): [number, number][] {
  const corners = e.limits.map((d) => frame.point(d.from, d.limit ?? 0));
  return coversCompass(e.directions) ? corners : [[frame.cx, frame.cy], ...corners];
}

/** The hatched, outlined envelope shape, also used (small) as its legend swatch. */
function envelopeShapes(corners: [number, number][], outlineWidth: number, tagged: boolean): Shape[] {
  const closed = ringPath(corners, true);
  return [
    { kind: 'path', className: tagged ? 'envelope-area' : undefined, d: closed, fill: { color: ENVELOPE_STYLE.fill } },
    { kind: 'path', className: tagged ? 'hatch' : undefined, d: hatchLines(corners, HATCH_SPACING), stroke: { color: ENVELOPE_STYLE.hatch, width: 0.8 } },
    { kind: 'path', id: tagged ? 'envelope' : undefined, className: tagged ? 'envelope' : undefined, d: closed, stroke: { color: ENVELOPE_STYLE.outline, width: outlineWidth, join: 'round' } },
  ];
}

/** The forecast marker: a ringed dot, unlike any limit point. */
export function forecastMarker(x: number, y: number): Shape[] {
  return [
    { kind: 'circle', cx: x, cy: y, r: 5.5, fill: { color: '#ffffff' }, stroke: { color: ENVELOPE_STYLE.forecast, width: 2.4 } },
    { kind: 'circle', cx: x, cy: y, r: 1.9, fill: { color: ENVELOPE_STYLE.forecast } },
  ];
}

/** A limit at the top of the grid (the real one may be higher): an upward triangle, unlike the dot of a found limit. */
function topOfGridMarker(x: number, y: number): PathCommand[] {
  return ringPath([[x, y - 4.6], [x + 4, y + 2.4], [x - 4, y + 2.4]], true);
}

export function polarChart(e: EnvelopeResult, options: PolarChartOptions): PolarChart {
  const { measure, x, y, size } = options;
  const labelled = labelledDirections(e.directions);
  const widest = Math.max(0, ...labelled.map((d) => measure(compassLabel(d), LABEL_SIZE, 'regular')));
  const above = LABEL_SIZE + 10;
  const radius = Math.max(20, Math.min(size / 2 - widest - 8, size / 2 - above));
  // Labels left and right need more room than those above and below: the chart keeps the square's
  // width but only the height it needs.
  const frame = polarFrame(e, options.units, x + size / 2, y + above + radius, radius);
  const { cx, cy } = frame;
  const outer = frame.rings[frame.rings.length - 1];
  const shapes: Shape[] = [];

  shapes.push({
    kind: 'group',
    className: 'rings',
    shapes: frame.rings.map((v) => ({ kind: 'circle', className: 'ring', cx, cy, r: (v / outer) * radius, stroke: { color: ENVELOPE_STYLE.ring, width: 0.6, dash: [2, 2.5] } })),
  });
  shapes.push({
    kind: 'group',
    className: 'spokes',
    shapes: e.directions.map((d) => {
      const [sx, sy] = frame.at(d, radius);
      return { kind: 'path', className: 'spoke', data: { from: String(d) }, d: [['M', cx, cy], ['L', sx, sy]], stroke: { color: ENVELOPE_STYLE.spoke, width: 0.5 } };
    }),
  });
  /** Boxes of the compass labels: ring labels keep clear of them. */
  const compassBoxes: { minX: number; minY: number; maxX: number; maxY: number }[] = [];
  shapes.push({
    kind: 'group',
    className: 'compass',
    shapes: labelled.map((d) => {
      const a = (d * Math.PI) / 180;
      const [lx, ly] = frame.at(d, radius + 6);
      const anchor = Math.sin(a) > 0.25 ? 'start' : Math.sin(a) < -0.25 ? 'end' : 'middle';
      // Labels above the centre sit on their point, those below hang from it.
      const baseline = ly + (LABEL_SIZE * CAP_HEIGHT * (1 - Math.cos(a))) / 2;
      const text = compassLabel(d);
      const w = measure(text, LABEL_SIZE, 'regular');
      const left = anchor === 'start' ? lx : anchor === 'end' ? lx - w : lx - w / 2;
      compassBoxes.push({ minX: left - 1, minY: baseline - LABEL_SIZE * CAP_HEIGHT - 1, maxX: left + w + 1, maxY: baseline + 1.5 });
      return { kind: 'text', x: lx, y: baseline, text, size: LABEL_SIZE, font: 'regular', anchor, color: INK };
    }),
  });

  const corners = envelopeOutline(e, frame);
  shapes.push({ kind: 'group', className: 'envelope-shape', shapes: envelopeShapes(corners, 2.2, true) });

  shapes.push({
    kind: 'group',
    className: 'limits',
    shapes: e.limits.map((d): Shape => {
      const [px, py] = frame.point(d.from, d.limit ?? 0);
      const data = { from: String(d.from), speed: d.limit === null ? 'none' : String(d.limit) };
      return d.aboveGrid
        ? { kind: 'path', className: 'above-grid', data, d: topOfGridMarker(px, py), fill: { color: ENVELOPE_STYLE.outline } }
        : { kind: 'circle', className: 'limit', data, cx: px, cy: py, r: 2.4, fill: { color: ENVELOPE_STYLE.outline } };
    }),
  });

  // Ring labels along a line between the first two labelled spokes (clear of the compass labels),
  // over the envelope, each on a white backing so it reads on the hatching.
  const bearing = labelled.length > 1 ? (labelled[0] + labelled[1]) / 2 : labelled[0] ?? 0;
  shapes.push({
    kind: 'group',
    className: 'ring-labels',
    shapes: frame.rings.flatMap((v): Shape[] => {
      const r = (v / outer) * radius;
      const text = v === outer ? `${ringNumber(v)} ${frame.unit.name}` : ringNumber(v);
      const width = measure(text, LABEL_SIZE, 'regular');
      // The outer ring's label (with the unit) is the widest and sits next to the compass labels:
      // it moves inwards along its line until its box clears every compass label.
      let at = r;
      let [lx, ly] = frame.at(bearing, at);
      const boxAt = (x: number, y: number) => ({ minX: x - 1, minY: y + (LABEL_SIZE * CAP_HEIGHT) / 2 - LABEL_SIZE * CAP_HEIGHT - 1, maxX: x + width + 1, maxY: y + (LABEL_SIZE * CAP_HEIGHT) / 2 + 1.5 });
      const clash = (x: number, y: number) => compassBoxes.some((c) => { const b = boxAt(x, y); return b.minX < c.maxX && c.minX < b.maxX && b.minY < c.maxY && c.minY < b.maxY; });
      while (at > r * 0.5 && clash(lx, ly)) {
        at -= 1;
        [lx, ly] = frame.at(bearing, at);
      }
      const baseline = ly + (LABEL_SIZE * CAP_HEIGHT) / 2;
      return [
        { kind: 'rect', x: lx - 1, y: baseline - LABEL_SIZE * CAP_HEIGHT - 1, width: width + 2, height: LABEL_SIZE * CAP_HEIGHT + 2.5, fill: LABEL_BACKING },
        { kind: 'text', className: 'ring-label', x: lx, y: baseline, text, size: LABEL_SIZE, font: 'regular', anchor: 'start', color: INK_SOFT },
      ];
    }),
  });

  const [fx, fy] = frame.point(e.forecast.from, e.forecast.speed);
  shapes.push({ kind: 'group', id: 'forecast', className: 'forecast', data: { from: String(e.forecast.from), speed: String(e.forecast.speed) }, shapes: forecastMarker(fx, fy) });

  return { shapes: [{ kind: 'group', id: 'polar-chart', className: 'polar-chart', shapes }], frame, height: 2 * (above + radius) };
}

/** The chart's legend entries, with the forecast written in the chart's unit. */
export function polarChartLegend(e: EnvelopeResult, forecastText: string): LegendEntry[] {
  const entries: LegendEntry[] = [
    {
      swatch: { kind: 'custom', draw: (x, yMid, width) => envelopeShapes([[x + 1, yMid - 4.5], [x + width - 1, yMid - 4.5], [x + width - 1, yMid + 4.5], [x + 1, yMid + 4.5]], 1.6, false) },
      text: 'winds at which every test passes',
    },
    {
      swatch: { kind: 'custom', draw: (x, yMid, width) => [{ kind: 'circle', cx: x + width / 2, cy: yMid, r: 2.4, fill: { color: ENVELOPE_STYLE.outline } }] },
      text: 'limit: highest grid speed that passes',
    },
  ];
  if (e.limits.some((d) => d.aboveGrid)) {
    entries.push({
      swatch: { kind: 'custom', draw: (x, yMid, width) => [{ kind: 'path', d: topOfGridMarker(x + width / 2, yMid + 1), fill: { color: ENVELOPE_STYLE.outline } }] },
      text: 'passes up to the top of the grid (the limit may be higher)',
    });
  }
  entries.push({ swatch: { kind: 'custom', draw: (x, yMid, width) => forecastMarker(x + width / 2, yMid) }, text: forecastText });
  entries.push({
    swatch: { kind: 'custom', draw: (x, yMid, width) => [{ kind: 'path', d: [['M', x, yMid], ['L', x + width, yMid]], stroke: { color: ENVELOPE_STYLE.ring, width: 0.6, dash: [2, 2.5] } }] },
    text: 'mean wind speed at the reference height',
  });
  return entries;
}

/** Plain colour for the verdict line: inside reads calm, outside reads as a warning. */
export function verdictColor(inside: boolean): string {
  return inside ? ENVELOPE_STYLE.inside : ENVELOPE_STYLE.outside;
}
