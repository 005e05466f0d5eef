/**
 * envelope.svg: the polar chart of the wind limits on a page of its own, with its title, the
 * forecast verdict, a legend, how it was computed and the caution. Built as a display list and
 * drawn by the review sheet's SVG renderer, like every other drawing of the project.
 *
 * @example
 *   writeFileSync('envelope.svg', envelopeChart(result, { units: 'metric' }));
 */
import type { Page, Shape } from '../report/sheet/display-list.js';
import { CAP_HEIGHT, defaultMeasure, wrapText, type TextMeasure } from '../report/sheet/fonts.js';
import { layoutLegend } from '../report/sheet/legend.js';
import { cautionBox } from '../report/sheet/page-parts.js';
import { INK_SOFT } from '../report/sheet/palette.js';
import { renderSvg } from '../report/sheet/render-svg.js';
import type { UnitSystem } from '../report/format-number.js';
import { toWinAnsi } from '../report/sheet/winansi.js';
import type { EnvelopeResult } from './envelope.js';
import { polarChart, polarChartLegend, verdictColor } from './polar-chart.js';
import type { PolarFrame } from './polar-frame.js';
import { envelopeSubtitle, envelopeTitle, forecastWords, samplesWords, speedWords } from './wording.js';

export interface ChartOptions {
  units: UnitSystem;
  /** Text widths; made on first use when not given. */
  measure?: TextMeasure;
}

const WIDTH = 480;
const MARGIN = 24;

/** Lines of text from `y` down (y is the top of the first line); returns the shapes and the y below. */
export function textLines(
  text: string,
  x: number,
  y: number,
  width: number,
  style: { size: number; font: 'regular' | 'bold' | 'italic'; color: string; anchor?: 'start' | 'middle' },
  measure: TextMeasure,
): { shapes: Shape[]; bottom: number } {
  const lines = wrapText(measure, toWinAnsi(text), style.size, style.font, width);
  const step = style.size * 1.25;
  const anchor = style.anchor ?? 'start';
  const shapes: Shape[] = lines.map((line, i) => ({
    kind: 'text',
    x: anchor === 'middle' ? x + width / 2 : x,
    y: y + style.size * CAP_HEIGHT + i * step,
    text: line,
    size: style.size,
    font: style.font,
    anchor,
    color: style.color,
  }));
  return { shapes, bottom: y + lines.length * step };
}

/** The verdict on the forecast as a named group (id "verdict"), wrapped to `width`. */
export function verdictShapes(e: EnvelopeResult, units: UnitSystem, x: number, y: number, width: number, size: number, measure: TextMeasure, anchor: 'start' | 'middle' = 'start'): { shapes: Shape[]; bottom: number } {
  const verdict = forecastVerdict(e, speedWords(units));
  const lines = textLines(verdict.text, x, y, width, { size, font: 'bold', color: verdictColor(verdict.inside), anchor }, measure);
  return { shapes: [{ kind: 'group', id: 'verdict', className: verdict.inside ? 'verdict inside' : 'verdict outside', shapes: lines.shapes }], bottom: lines.bottom };
}

/** envelope.svg's page: title, what it shows, the verdict, the chart, its legend, the method, the caution. */
export function envelopeChartPage(e: EnvelopeResult, options: ChartOptions): Page {
  const measure = options.measure ?? defaultMeasure();
  const { units } = options;
  const width = WIDTH - 2 * MARGIN;
  const shapes: Shape[] = [];
  let y = MARGIN;
  const title = textLines(envelopeTitle(e), MARGIN, y, width, { size: 14, font: 'bold', color: '#141414', anchor: 'middle' }, measure);
  shapes.push({ kind: 'group', className: 'title', shapes: title.shapes });
  y = title.bottom + 2;
  const subtitle = textLines(envelopeSubtitle(units), MARGIN, y, width, { size: 8.5, font: 'regular', color: INK_SOFT, anchor: 'middle' }, measure);
  shapes.push(...subtitle.shapes);
  y = subtitle.bottom + 6;
  const verdict = verdictShapes(e, units, MARGIN, y, width, 10, measure, 'middle');
  shapes.push(...verdict.shapes);
  y = verdict.bottom + 4;
  const chart = polarChart(e, { units, measure, x: MARGIN, y, size: width });
  shapes.push(...chart.shapes);
  y += chart.height + 4;
  const legend = layoutLegend(polarChartLegend(e, forecastWords(e, units)), MARGIN, y, width, 2, measure);
  shapes.push({ kind: 'group', id: 'envelope-legend', shapes: legend.shapes });
  y += legend.height + 4;
  const method = textLines(samplesWords(e), MARGIN, y, width, { size: 8.5, font: 'regular', color: INK_SOFT }, measure);
  shapes.push({ kind: 'group', className: 'method', shapes: method.shapes });
  y = method.bottom + 6;
  const caution = cautionBox(MARGIN, y, width, measure);
  shapes.push(...caution.shapes);
  return { width: WIDTH, height: y + caution.height + MARGIN, shapes };
}

/**
 * The chart for a narrow panel (the web page): the verdict, the chart and its legend, without the
 * title and caution the page around it already shows. `frame` reads clicks back into grid points.
 */
export function envelopeFigure(e: EnvelopeResult, options: ChartOptions & { width?: number }): { page: Page; frame: PolarFrame } {
  const measure = options.measure ?? defaultMeasure();
  const { units } = options;
  const pageWidth = options.width ?? 300;
  const margin = 4;
  const width = pageWidth - 2 * margin;
  const shapes: Shape[] = [];
  const verdict = verdictShapes(e, units, margin, margin, width, 9, measure);
  shapes.push(...verdict.shapes);
  const chart = polarChart(e, { units, measure, x: margin, y: verdict.bottom + 2, size: width });
  shapes.push(...chart.shapes);
  let y = verdict.bottom + 2 + chart.height + 4;
  const legend = layoutLegend(polarChartLegend(e, forecastWords(e, units)), margin, y, width, 1, measure);
  shapes.push({ kind: 'group', id: 'envelope-legend', shapes: legend.shapes });
  y += legend.height + 2;
  const method = textLines(samplesWords(e), margin, y, width, { size: 8, font: 'regular', color: INK_SOFT }, measure);
  shapes.push({ kind: 'group', className: 'method', shapes: method.shapes });
  return { page: { width: pageWidth, height: method.bottom + margin, shapes }, frame: chart.frame };
}

/** envelope.svg as text. */
export function envelopeChart(e: EnvelopeResult, options: ChartOptions): string {
  return renderSvg(envelopeChartPage(e, options), envelopeTitle(e));
}

/**
 * Whether the forecast wind lies inside the envelope, with the limit read at the forecast direction
 * by linear interpolation between the two nearest grid directions.
 */
export function forecastVerdict(
  e: EnvelopeResult,
  speedText: (metresPerSecond: number) => string = (v) => `${v.toFixed(1)} m/s`,
): { inside: boolean; limit: number | null; text: string } {
  const limit = limitAt(e, e.forecast.from);
  if (limit === null) return { inside: false, limit, text: 'Forecast direction lies outside the grid of directions' };
  const inside = e.forecast.speed <= limit + 1e-9;
  const text = inside
    ? `Forecast ${speedText(e.forecast.speed)} from ${Math.round(e.forecast.from)}° is inside the limits (about ${speedText(limit)} from there)`
    : `Forecast ${speedText(e.forecast.speed)} from ${Math.round(e.forecast.from)}° is OUTSIDE the limits (about ${speedText(limit)} from there)`;
  return { inside, limit, text };
}

/** Each hour's forecast wind judged against the limits, as in forecastVerdict. */
export function judgeWindow(e: EnvelopeResult, hours: readonly { time: string; speed: number; from: number }[]): NonNullable<EnvelopeResult['window']> {
  return hours.map((h) => {
    const limit = limitAt(e, h.from);
    return { ...h, limit: limit === null ? null : Math.round(limit * 100) / 100, inside: limit !== null && h.speed <= limit + 1e-9 };
  });
}

/** Limit speed at any direction, interpolated between grid directions (wrapping round the compass). */
export function limitAt(e: EnvelopeResult, from: number): number | null {
  const ds = e.limits.map((d) => ({ from: d.from, limit: d.limit ?? 0 }));
  if (ds.length === 0) return null;
  if (ds.length === 1) return ds[0].limit;
  const x = ((from % 360) + 360) % 360;
  const full = ds[ds.length - 1].from - ds[0].from + (ds[1].from - ds[0].from) >= 360 - 1e-9;
  for (let i = 0; i < ds.length; i++) {
    const a = ds[i];
    const b = ds[(i + 1) % ds.length];
    const span = i + 1 < ds.length ? b.from - a.from : full ? b.from + 360 - a.from : NaN;
    if (!(span > 0)) continue;
    const t = (((x - a.from) % 360) + 360) % 360;
    if (t <= span + 1e-9) return a.limit + (t / span) * (b.limit - a.limit);
  }
  return null;
}
