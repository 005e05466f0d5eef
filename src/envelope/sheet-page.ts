/**
 * The wind-limits page of the review sheet: envelope.pdf on its own, and the page `strewn sheet
 * --envelope` adds after the map and the record. Title block, the forecast verdict, the polar
 * chart with its legend, the limit and first failing test per direction, how the limits were
 * computed, and the caution box, in the sheet's type and rules.
 *
 * The table has one line per direction. When the directions are too many for one column they run
 * in two side by side, and past that onto further pages (each with title and caution), so nothing
 * runs under the caution box.
 *
 * @example
 *   const plan = planEnvelopePages(record, options);
 *   const pages = drawEnvelopePages(plan, 3, 3);   // page 3 of 3
 */
import type { Page, Shape } from '../report/sheet/display-list.js';
import { CAP_HEIGHT, wrapText, type TextMeasure } from '../report/sheet/fonts.js';
import { layoutLegend } from '../report/sheet/legend.js';
import { cautionBox, cautionHeight, dateText, MARGIN, PAPER_SIZES, titleBlock, type SheetOptions } from '../report/sheet/page-parts.js';
import { INK, INK_SOFT } from '../report/sheet/palette.js';
import { grouped } from '../report/format-number.js';
import { toWinAnsi } from '../report/sheet/winansi.js';
import { textLines, verdictShapes } from './chart.js';
import type { EnvelopeResult } from './envelope.js';
import { polarChart, polarChartLegend } from './polar-chart.js';
import { compassLabel } from './polar-frame.js';
import { aimWords, envelopeSubtitle, envelopeTitle, failureWords, forecastWords, gridWords, limitWords, methodWords } from './wording.js';

/** An envelope as envelope.json keeps it: the result and what ties it to a scenario and a program. */
export interface EnvelopeRecord {
  envelope: EnvelopeResult;
  scenarioHash: string;
  version: string;
  /** ISO 8601; null for a file written before the date was recorded. */
  computedAt: string | null;
}

const SIZE = 8.5;
const ROW = SIZE * 1.3;
const HEADING = 10.5;
const GROUP_GAP = 16;
const COLUMNS = [
  { title: 'Wind from', weight: 1.2 },
  { title: 'Limit (mean wind)', weight: 1.9 },
  { title: 'First test to fail above the limit', weight: 3.4 },
];

export interface EnvelopePlan {
  record: EnvelopeRecord;
  options: SheetOptions;
  /** Table rows on each page, page 1 first. */
  rowsPerPage: number[];
  /** Side-by-side column groups of the table on every page (1 or 2). */
  groups: number;
}

function particulars(record: EnvelopeRecord): string {
  const e = record.envelope;
  const computed = record.computedAt ? `computed ${dateText(record.computedAt)}` : 'date not recorded';
  return ['Wind limits', `${grouped(e.samples)} samples per grid point, seed ${e.seed}`, computed, `strewn ${record.version}`].join('  \u00b7  ');
}

/** The label/value rows under the table. */
function facts(record: EnvelopeRecord, options: SheetOptions): { label: string; value: string; font?: 'mono' }[] {
  const e = record.envelope;
  return [
    { label: 'Scenario', value: e.name },
    { label: 'Launcher', value: `${aimWords(e)}. Common practice (no source) calls launches off above about 9 m/s (20 mph) of surface wind; the chart marks it.` },
    { label: 'Method', value: `${methodWords(e)}. Each grid point flies the scenario with its spreads and failure modes; the same seed at every point keeps pass and fail in step with the wind speed.` },
    { label: 'Grid', value: gridWords(e, options.units) },
    { label: 'Samples and seed', value: `${grouped(e.samples)} samples per grid point, seed ${e.seed}` },
    { label: 'Scenario hash', value: record.scenarioHash, font: 'mono' },
    { label: 'Program', value: `strewn ${record.version}; ${record.computedAt ? `computed ${dateText(record.computedAt)}` : 'date not recorded'}` },
  ];
}

const LABEL_WIDTH = 92;

function factLines(record: EnvelopeRecord, options: SheetOptions, width: number): { label: string; lines: string[]; font: 'regular' | 'mono' }[] {
  return facts(record, options).map((f) => {
    const font = f.font ?? 'regular';
    return { label: f.label, font, lines: wrapText(options.measure, toWinAnsi(f.value), SIZE, font, width - LABEL_WIDTH) };
  });
}

/** Where the body of each page starts and ends, and the height the facts under the table need. */
function pageGeometry(record: EnvelopeRecord, options: SheetOptions) {
  const paper = PAPER_SIZES[options.paper];
  const width = paper.width - 2 * MARGIN;
  const head = titleBlock(envelopeTitle(record.envelope), particulars(record), 'Page 9 of 99', MARGIN, MARGIN, width, options.measure);
  const caution = cautionHeight(width, options.measure);
  const limit = paper.height - MARGIN - caution - 8;
  const factsHeight = HEADING + 10 + factLines(record, options, width).reduce((h, f) => h + f.lines.length * SIZE * 1.24 + 1, 0);
  return { paper, width, top: head.bottom + 6, limit, factsHeight };
}

/** Chart square: most of the width, but leaving room for the legend beside it. */
function chartSize(width: number): number {
  return Math.min(380, width * 0.66);
}

/** How many table rows go on which page. */
export function planEnvelopePages(record: EnvelopeRecord, options: SheetOptions): EnvelopePlan {
  const f = pageGeometry(record, options);
  const n = record.envelope.limits.length;
  const firstTop = drawFirstPageTop(record, options, f.top).bottom;
  const capacity = (from: number, reserve: number) => Math.max(1, Math.floor((f.limit - from - reserve - (HEADING + 10) - ROW - 4) / ROW));
  const first = capacity(firstTop, f.factsHeight + 8);
  const later = capacity(f.top, 0);
  const groups = n > first ? 2 : 1;
  const rowsPerPage = [Math.min(n, first * groups)];
  for (let left = n - rowsPerPage[0]; left > 0; left -= later * groups) rowsPerPage.push(Math.min(left, later * groups));
  return { record, options, rowsPerPage, groups };
}

/** Verdict, what the chart shows, the chart and the legend beside it. */
function drawFirstPageTop(record: EnvelopeRecord, options: SheetOptions, top: number): { shapes: Shape[]; bottom: number } {
  const { measure, units } = options;
  const e = record.envelope;
  const width = PAPER_SIZES[options.paper].width - 2 * MARGIN;
  const shapes: Shape[] = [];
  const verdict = verdictShapes(e, units, MARGIN, top, width, 10, measure);
  shapes.push(...verdict.shapes);
  const subtitle = textLines(envelopeSubtitle(units), MARGIN, verdict.bottom + 1, width, { size: SIZE, font: 'regular', color: INK_SOFT }, measure);
  shapes.push(...subtitle.shapes);
  const size = chartSize(width);
  const chart = polarChart(e, { units, measure, x: MARGIN, y: subtitle.bottom + 2, size });
  shapes.push(...chart.shapes);
  const legendX = MARGIN + size + 14;
  const legend = layoutLegend(polarChartLegend(e, forecastWords(e, units)), legendX, subtitle.bottom + 28, MARGIN + width - legendX, 1, measure);
  shapes.push({ kind: 'group', id: 'envelope-legend', shapes: legend.shapes });
  return { shapes, bottom: Math.max(subtitle.bottom + 2 + chart.height, subtitle.bottom + 28 + legend.height) };
}

function heading(text: string, y: number, width: number): { shapes: Shape[]; bottom: number } {
  const baseline = y + 8 + HEADING * CAP_HEIGHT;
  return {
    shapes: [
      { kind: 'text', x: MARGIN, y: baseline, text, size: HEADING, font: 'bold', anchor: 'start', color: INK },
      { kind: 'path', d: [['M', MARGIN, baseline + 2.5], ['L', MARGIN + width, baseline + 2.5]], stroke: { color: INK, width: 0.6 } },
    ],
    bottom: baseline + 4.5,
  };
}

/** Text cut with an ellipsis to fit one cell. */
function fit(measure: TextMeasure, text: string, width: number, font: 'regular' | 'bold' = 'regular'): string {
  const t = toWinAnsi(text);
  if (measure(t, SIZE, font) <= width) return t;
  let cut = t.length;
  while (cut > 1 && measure(`${t.slice(0, cut)}\u2026`, SIZE, font) > width) cut--;
  return `${t.slice(0, cut).trimEnd()}\u2026`;
}

/** Rows `from`..`to` of the table in `groups` side-by-side columns from y down. */
function drawTable(plan: EnvelopePlan, from: number, to: number, y: number, width: number): { shapes: Shape[]; bottom: number } {
  const { measure, units } = plan.options;
  const e = plan.record.envelope;
  const perGroup = Math.ceil((to - from) / plan.groups);
  const groupWidth = (width - (plan.groups - 1) * GROUP_GAP) / plan.groups;
  const total = COLUMNS.reduce((s, c) => s + c.weight, 0);
  const widths = COLUMNS.map((c) => (c.weight / total) * groupWidth);
  const shapes: Shape[] = [];
  let bottom = y;
  for (let g = 0; g < plan.groups; g++) {
    const rows = e.limits.slice(from + g * perGroup, Math.min(to, from + (g + 1) * perGroup));
    if (rows.length === 0) continue;
    const x0 = MARGIN + g * (groupWidth + GROUP_GAP);
    const lefts = widths.map((_, i) => x0 + widths.slice(0, i).reduce((s, w) => s + w, 0));
    let baseline = y + 2 + SIZE * CAP_HEIGHT + 1;
    COLUMNS.forEach((c, i) => shapes.push({ kind: 'text', x: lefts[i] + (i === 0 ? 0 : 2), y: baseline, text: fit(measure, c.title, widths[i] - 4, 'bold'), size: SIZE, font: 'bold', anchor: 'start', color: INK_SOFT }));
    let lineY = y + 2 + ROW + 1;
    shapes.push({ kind: 'path', d: [['M', x0, lineY], ['L', x0 + groupWidth, lineY]], stroke: { color: INK_SOFT, width: 0.5 } });
    rows.forEach((d, k) => {
      if (k > 0) shapes.push({ kind: 'path', d: [['M', x0, lineY], ['L', x0 + groupWidth, lineY]], stroke: { color: '#d0d0d0', width: 0.4 } });
      // Capitals centred between the rules (the row's text has few descenders).
      baseline = lineY + (ROW + SIZE * CAP_HEIGHT) / 2 + 0.4;
      const cells = [d.rail ? `${compassLabel(d.from)}, rail ${Math.round(d.rail.azimuth)}\u00b0` : compassLabel(d.from), limitWords(d, e, units), failureWords(d)];
      cells.forEach((text, i) =>
        shapes.push({ kind: 'text', x: lefts[i] + (i === 0 ? 0 : 2), y: baseline, text: fit(measure, text, widths[i] - 4), size: SIZE, font: i === 1 ? 'bold' : 'regular', anchor: 'start', color: INK }),
      );
      lineY += ROW;
    });
    bottom = Math.max(bottom, lineY + 2);
  }
  return { shapes: [{ kind: 'group', id: from === 0 ? 'table-limits' : `table-limits-${from}`, className: 'table', shapes }], bottom };
}

function drawFacts(plan: EnvelopePlan, y: number, width: number): { shapes: Shape[]; bottom: number } {
  const head = heading('How the limits were found', y, width);
  const shapes: Shape[] = [...head.shapes];
  let top = head.bottom + 2;
  for (const f of factLines(plan.record, plan.options, width)) {
    const baseline = top + SIZE * CAP_HEIGHT + 1;
    shapes.push({ kind: 'text', x: MARGIN, y: baseline, text: f.label, size: SIZE, font: 'bold', anchor: 'start', color: INK_SOFT });
    f.lines.forEach((line, i) => shapes.push({ kind: 'text', x: MARGIN + LABEL_WIDTH, y: baseline + i * SIZE * 1.24, text: line, size: SIZE, font: f.font, anchor: 'start', color: INK }));
    top += f.lines.length * SIZE * 1.24 + 1;
  }
  return { shapes: [{ kind: 'group', id: 'envelope-facts', shapes }], bottom: top };
}

/** The planned pages, numbered from `firstPage` of `totalPages`. */
export function drawEnvelopePages(plan: EnvelopePlan, firstPage: number, totalPages: number): Page[] {
  const { record, options } = plan;
  const f = pageGeometry(record, options);
  const pages: Page[] = [];
  let from = 0;
  plan.rowsPerPage.forEach((count, index) => {
    const title = titleBlock(envelopeTitle(record.envelope), particulars(record), `Page ${firstPage + index} of ${totalPages}`, MARGIN, MARGIN, f.width, options.measure);
    const shapes: Shape[] = [...title.shapes];
    let y = f.top;
    if (index === 0) {
      const top = drawFirstPageTop(record, options, y);
      shapes.push(...top.shapes);
      y = top.bottom;
    }
    const head = heading(index === 0 ? 'Limits by direction' : 'Limits by direction (continued)', y, f.width);
    shapes.push(...head.shapes);
    const table = drawTable(plan, from, from + count, head.bottom, f.width);
    shapes.push(...table.shapes);
    from += count;
    if (index === 0) shapes.push(...drawFacts(plan, table.bottom + 2, f.width).shapes);
    shapes.push(...cautionBox(MARGIN, f.paper.height - MARGIN - cautionHeight(f.width, options.measure), f.width, options.measure).shapes);
    pages.push({ width: f.paper.width, height: f.paper.height, shapes });
  });
  return pages;
}

/** envelope.pdf's pages on their own. */
export function envelopeSheetPages(record: EnvelopeRecord, options: SheetOptions): Page[] {
  const plan = planEnvelopePages(record, options);
  return drawEnvelopePages(plan, 1, plan.rowsPerPage.length);
}
