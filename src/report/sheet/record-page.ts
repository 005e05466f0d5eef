/**
 * The record pages of the sheet: what a safety officer reads and signs. Lays out the blocks from
 * record-content.ts top to bottom. If they do not fit on one page it tries a tighter type size
 * (never below 8 pt) and then shortens the notes and the warnings list (both stay whole in the
 * results files); a record that still does not fit (dozens of areas) continues on further pages
 * rather than running under the caution box.
 *
 * @example
 *   const pages = buildRecordPages(input, { paper: 'a4', units: 'metric', measure }, 2);
 */
import type { FontName, Page, Shape } from './display-list.js';
import { CAP_HEIGHT, wrapText, type TextMeasure } from './fonts.js';
import { cautionBox, cautionHeight, dateText, MARGIN, PAPER_SIZES, titleBlock, type SheetOptions } from './page-parts.js';
import { INK, INK_SOFT } from './palette.js';
import { recordBlocks, type Block, type Column, type RecordLimits } from './record-content.js';
import type { SheetInput } from './sheet-input.js';
import { grouped, unitFormatter } from '../format-number.js';
import { toWinAnsi } from './winansi.js';

interface Style {
  size: number;
  leading: number;
  headingGap: number;
  blockGap: number;
}

const STYLES: Style[] = [
  { size: 8.5, leading: 1.24, headingGap: 9, blockGap: 5 },
  { size: 8, leading: 1.18, headingGap: 7, blockGap: 4 },
  // Still 8 pt type, set closer: lets a full record (sensitivity bars and all) stay on one page of
  // US Letter, which is 50 pt shorter than A4.
  { size: 8, leading: 1.12, headingGap: 6, blockGap: 3 },
  // The closest setting, for a full record on US Letter in feet (longer unit texts wrap more).
  { size: 8, leading: 1.1, headingGap: 4, blockGap: 2 },
];

// Fewer sensitivity bars go first (summary.json and the web page have them all), the user's own
// notes and the warnings are shortened only after that.
const LIMITS: RecordLimits[] = [
  { noteLines: 6, warnings: 12, sensitivityInputs: 10 },
  { noteLines: 6, warnings: 12, sensitivityInputs: 6 },
  { noteLines: 6, warnings: 12, sensitivityInputs: 4 },
  { noteLines: 3, warnings: 6, sensitivityInputs: 4 },
  { noteLines: 1, warnings: 2, sensitivityInputs: 4 },
  { noteLines: 1, warnings: 2, sensitivityInputs: 2 },
];

/** Widest the label column of label/value rows gets; narrower when every label is short. */
const LABEL_WIDTH = 92;

/** The label column for these blocks' rows: the longest bold label and a gap, at most LABEL_WIDTH. */
function labelWidth(blocks: readonly Block[], size: number, measure: TextMeasure): number {
  let widest = 0;
  for (const b of blocks) if (b.kind === 'rows') for (const r of b.rows) widest = Math.max(widest, measure(toWinAnsi(r.label), size, 'bold'));
  return Math.min(LABEL_WIDTH, Math.ceil(widest + 8));
}

/** Writes blocks down the page, starting a new page when the next piece would pass `limit`. */
class Flow {
  readonly pages: Shape[][] = [[]];
  y: number;

  constructor(
    private readonly measure: TextMeasure,
    private readonly x: number,
    private readonly width: number,
    private readonly top: number,
    private readonly limit: number,
    private readonly style: Style,
    private readonly labels = LABEL_WIDTH,
  ) {
    this.y = top;
  }

  private get shapes(): Shape[] {
    return this.pages[this.pages.length - 1];
  }

  private get step(): number {
    return this.style.size * this.style.leading;
  }

  /** Starts a new page unless `height` still fits on this one (or this page is empty). */
  private fit(height: number): boolean {
    if (this.y + height <= this.limit || this.y === this.top) return false;
    this.pages.push([]);
    this.y = this.top;
    return true;
  }

  private text(text: string, x: number, font: FontName, color = INK, anchor: 'start' | 'end' = 'start', size = this.style.size): void {
    this.shapes.push({ kind: 'text', x, y: this.y, text, size, font, anchor, color });
  }

  private rule(color: string, width: number): void {
    this.shapes.push({ kind: 'path', d: [['M', this.x, this.y], ['L', this.x + this.width, this.y]], stroke: { color, width } });
  }

  gap(height: number): void {
    if (this.y > this.top) this.y += height;
  }

  /** A heading, kept with at least two lines of what follows; `aside` goes at the line's right end. */
  heading(text: string, aside?: Extract<Block, { kind: 'heading' }>['aside']): void {
    const size = this.style.size + 2;
    this.fit(this.style.headingGap + size + 4.5 + 3 * this.step);
    this.gap(this.style.headingGap);
    this.y += size * CAP_HEIGHT;
    this.text(text, this.x, 'bold', INK, 'start', size);
    if (aside) this.shapes.push(...aside.draw(this.x + this.width - aside.width(this.style.size, this.measure), this.y, this.style.size, this.measure));
    this.y += 2.5;
    this.rule(INK, 0.6);
    this.y += 2;
  }

  paragraph(text: string, font: FontName = 'regular', indent = 0, color = INK): void {
    const lines = wrapText(this.measure, toWinAnsi(text), this.style.size, font, this.width - indent);
    this.fit(lines.length * this.step);
    this.y += this.style.size * CAP_HEIGHT;
    lines.forEach((l, i) => {
      if (i > 0) this.y += this.step;
      this.text(l, this.x + indent, font, color);
    });
    this.y += this.step - this.style.size * CAP_HEIGHT;
  }

  rows(rows: { label: string; value: string; font?: FontName }[]): void {
    for (const r of rows) {
      const lines = wrapText(this.measure, toWinAnsi(r.value), this.style.size, r.font ?? 'regular', this.width - this.labels);
      this.fit(lines.length * this.step + 1);
      this.y += this.style.size * CAP_HEIGHT + 1;
      this.text(toWinAnsi(r.label), this.x, 'bold', INK_SOFT);
      lines.forEach((l, i) => {
        if (i > 0) this.y += this.step;
        this.text(l, this.x + this.labels, r.font ?? 'regular');
      });
      this.y += this.step - this.style.size * CAP_HEIGHT;
    }
  }

  /** A table with wrapped cells; the header is repeated on a continuation page. */
  table(id: string, columns: Column[], rows: string[][]): void {
    const total = columns.reduce((s, c) => s + c.weight, 0);
    const widths = columns.map((c) => (c.weight / total) * this.width);
    const lefts = widths.map((_, i) => this.x + widths.slice(0, i).reduce((s, w) => s + w, 0));
    const gap = 4;
    const wrapRow = (texts: string[], font: FontName) => texts.map((t, i) => wrapText(this.measure, toWinAnsi(t), this.style.size, font, widths[i] - gap));
    const rowHeight = (wrapped: string[][]) => Math.max(...wrapped.map((w) => w.length)) * this.step + 1;
    const drawRow = (wrapped: string[][], font: FontName, color: string) => {
      const top = this.y;
      wrapped.forEach((lines, i) => {
        lines.forEach((l, j) => {
          this.y = top + this.style.size * CAP_HEIGHT + 1 + j * this.step;
          const right = columns[i].align === 'right';
          this.text(l, right ? lefts[i] + widths[i] - gap / 2 : lefts[i] + (i === 0 ? 0 : gap / 2), font, color, right ? 'end' : 'start');
        });
      });
      this.y = top + rowHeight(wrapped);
    };
    const header = wrapRow(columns.map((c) => c.title), 'bold');
    const bodies = rows.map((r) => wrapRow(r, 'regular'));
    let start = this.shapes.length;
    let part = 0;
    const close = () => {
      const drawn = this.shapes.splice(start);
      this.shapes.push({ kind: 'group', id: part++ === 0 ? `table-${id}` : `table-${id}-${part}`, className: 'table', shapes: drawn });
    };
    const drawHeader = () => {
      this.y += 2;
      drawRow(header, 'bold', INK_SOFT);
      this.rule(INK_SOFT, 0.5);
      this.y += 1;
    };
    this.fit(2 + rowHeight(header) + 1 + (bodies.length > 0 ? rowHeight(bodies[0]) : 0));
    start = this.shapes.length;
    drawHeader();
    bodies.forEach((body, i) => {
      if (this.y + rowHeight(body) > this.limit) {
        close();
        this.fit(Infinity);
        start = this.shapes.length;
        drawHeader();
      } else if (i > 0) {
        this.rule('#d0d0d0', 0.4);
      }
      drawRow(body, 'regular', INK);
    });
    close();
  }

  bullets(items: string[]): void {
    for (const item of items) {
      const lines = wrapText(this.measure, toWinAnsi(item), this.style.size, 'regular', this.width - 10);
      this.fit(lines.length * this.step);
      this.y += this.style.size * CAP_HEIGHT;
      this.text('\u2022', this.x + 2, 'regular');
      this.y -= this.style.size * CAP_HEIGHT;
      this.paragraph(item, 'regular', 10);
    }
  }

  /** A drawing that reports its own height, kept whole on one page. */
  figure(draw: (x: number, y: number, width: number, size: number, measure: TextMeasure) => { shapes: Shape[]; height: number }): void {
    // Drawn once to learn its height, then again where it lands.
    const height = draw(this.x, 0, this.width, this.style.size, this.measure).height;
    this.gap(this.style.blockGap / 2);
    this.fit(height);
    this.shapes.push(...draw(this.x, this.y, this.width, this.style.size, this.measure).shapes);
    this.y += height;
  }

  /**
   * Blocks side by side, kept whole on one page: each column is laid out in a flow of its own
   * (once to learn the heights, then where it lands), and the page flow continues below the
   * tallest.
   */
  columns(columns: { weight: number; blocks: Block[] }[], put: (flow: Flow, block: Block) => void): void {
    const gutter = 14;
    const total = columns.reduce((sum, c) => sum + c.weight, 0);
    const free = this.width - gutter * (columns.length - 1);
    const widths = columns.map((c) => (c.weight / total) * free);
    const run = (top: number) => {
      let left = this.x;
      return columns.map((c, i) => {
        // A wide column keeps the page's label column, so its values line up with the rows above.
        const own = labelWidth(c.blocks, this.style.size, this.measure);
        const sub = new Flow(this.measure, left, widths[i]!, top, Infinity, this.style, own <= this.labels && widths[i]! > 0.6 * this.width ? this.labels : own);
        left += widths[i]! + gutter;
        for (const b of c.blocks) put(sub, b);
        return sub;
      });
    };
    const height = Math.max(...run(0).map((f) => f.y));
    this.gap(this.style.blockGap / 2);
    this.fit(height);
    const placed = run(this.y);
    for (const f of placed) this.shapes.push(...f.pages[0]!);
    this.y = Math.max(...placed.map((f) => f.y));
  }

  /**
   * Blank lines to write on: who prepared and reviewed the assessment, their signatures, the date
   * and the decision, three to a row, then a line for conditions.
   */
  signOff(): void {
    // Full width: three fields a row; in a column the decision goes with the conditions line.
    const wide = this.width > 400;
    // 22 points (nearly 8 mm) to write on per line.
    const rowHeight = 22;
    const gap = 14;
    const fields: [string, number][][] = wide
      ? [
          [['Prepared by', 1], ['Signature', 0.8], ['Date', 1.2]],
          [['Reviewed by (safety officer)', 1], ['Signature', 0.8], ['Decision (go / go with conditions / no go)', 1.2]],
        ]
      : [
          [['Prepared by', 1.1], ['Signature', 1], ['Date', 0.75]],
          [['Reviewed by (safety officer)', 1.1], ['Signature', 1.75]],
        ];
    this.fit(fields.length * rowHeight + 6 + 22 + 4);
    const shapes: Shape[] = [];
    for (const row of fields) {
      this.y += rowHeight - 8;
      const total = row.reduce((s, f) => s + f[1], 0);
      const free = this.width - gap * (row.length - 1);
      let x = this.x;
      for (const [label, weight] of row) {
        const w = (weight / total) * free;
        shapes.push({ kind: 'path', className: 'signoff-line', d: [['M', x, this.y], ['L', x + w, this.y]], stroke: { color: INK, width: 0.7 } });
        shapes.push({ kind: 'text', x, y: this.y + 8.5, text: label, size: 8, font: 'regular', anchor: 'start', color: INK_SOFT });
        x += w + gap;
      }
      this.y += 8;
    }
    this.y += 6;
    const last = wide ? 'Conditions and notes:' : 'Decision (go / go with conditions / no go), conditions and notes:';
    shapes.push({ kind: 'text', x: this.x, y: this.y + 8 * CAP_HEIGHT, text: last, size: 8, font: 'regular', anchor: 'start', color: INK_SOFT });
    this.y += 8 + 14;
    shapes.push({ kind: 'path', className: 'signoff-line', d: [['M', this.x, this.y], ['L', this.x + this.width, this.y]], stroke: { color: INK, width: 0.7 } });
    this.y += 4;
    this.shapes.push({ kind: 'group', id: 'sign-off', shapes });
  }
}

function particulars(input: SheetInput): string {
  const s = input.summary;
  return ['Review record', `${grouped(s.samples)} samples, seed ${s.seed}`, `computed ${dateText(input.review.computedAt)}`, `strewn ${s.version}`].join('  \u00b7  ');
}

/** Puts one block into a flow. */
function place(flow: Flow, block: Block, style: Style): void {
  switch (block.kind) {
    case 'heading':
      flow.heading(block.text, block.aside);
      break;
    case 'text':
      flow.gap(style.blockGap / 2);
      flow.paragraph(block.text, block.font ?? 'regular', 0, block.font === 'italic' ? INK_SOFT : INK);
      break;
    case 'rows':
      flow.rows(block.rows);
      break;
    case 'table':
      flow.gap(style.blockGap / 2);
      flow.table(block.id, block.columns, block.rows);
      break;
    case 'bullets':
      flow.bullets(block.items);
      break;
    case 'figure':
      flow.figure(block.draw);
      break;
    case 'columns':
      flow.columns(block.columns, (sub, b) => place(sub, b, style));
      break;
    case 'signoff':
      flow.signOff();
      break;
  }
}

/** Lays the record out; returns the body shapes of each page. */
function layout(input: SheetInput, options: SheetOptions, style: Style, limits: RecordLimits, top: number, limit: number): Shape[][] {
  const width = PAPER_SIZES[options.paper].width - 2 * MARGIN;
  const blocks = recordBlocks(input, unitFormatter(options.units), limits);
  const flow = new Flow(options.measure, MARGIN, width, top, limit, style, labelWidth(blocks, style.size, options.measure));
  for (const block of blocks) place(flow, block, style);
  return flow.pages;
}

/**
 * The record as one page when it fits in any of the tighter settings, else as several pages at the
 * compact size. `firstPage` is the record's first page number; the page labels count
 * `pagesBefore` pages ahead of it and `pagesAfter` behind it (the wind-limits page).
 */
export function buildRecordPages(input: SheetInput, options: SheetOptions, firstPage: number, pagesBefore = firstPage - 1, pagesAfter = 0): Page[] {
  const paper = PAPER_SIZES[options.paper];
  const width = paper.width - 2 * MARGIN;
  const probe = titleBlock(input.summary.name, particulars(input), 'Page 9 of 9', MARGIN, MARGIN, width, options.measure);
  const top = probe.bottom + 4;
  const caution = cautionHeight(width, options.measure);
  const limit = paper.height - MARGIN - caution - 6;
  let bodies: Shape[][] | null = null;
  search: for (const limits of LIMITS) {
    for (const style of STYLES) {
      const pages = layout(input, options, style, limits, top, limit);
      if (pages.length === 1) {
        bodies = pages;
        break search;
      }
    }
  }
  bodies ??= layout(input, options, STYLES[STYLES.length - 1], LIMITS[0], top, limit);
  const total = pagesBefore + bodies.length + pagesAfter;
  return bodies.map((body, i) => {
    const title = titleBlock(input.summary.name, particulars(input), `Page ${firstPage + i} of ${total}`, MARGIN, MARGIN, width, options.measure);
    return { width: paper.width, height: paper.height, shapes: [...title.shapes, ...body, ...cautionBox(MARGIN, paper.height - MARGIN - caution, width, options.measure).shapes] };
  });
}
