/** Parts both pages share: paper sizes, the title block and the caution box. */
import { CAUTION } from '../caution.js';
import type { Shape } from './display-list.js';
import type { TextMeasure } from './fonts.js';
import { CAP_HEIGHT, wrapText } from './fonts.js';
import { INK, INK_SOFT } from './palette.js';
import { toWinAnsi } from './winansi.js';
import type { UnitSystem } from './units.js';

export type Paper = 'a4' | 'letter';

export interface SheetOptions {
  paper: Paper;
  units: UnitSystem;
  measure: TextMeasure;
}

/** A computed-at date as 'YYYY-MM-DD HH:MM UTC'. */
export function dateText(iso: string): string {
  const m = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})/.exec(iso);
  return m ? `${m[1]} ${m[2]} UTC` : iso;
}

/** Page sizes in points: ISO 216 A4 is 210 × 297 mm, US Letter 8.5 × 11 in. */
export const PAPER_SIZES: Record<Paper, { width: number; height: number }> = {
  a4: { width: (210 / 25.4) * 72, height: (297 / 25.4) * 72 },
  letter: { width: 8.5 * 72, height: 11 * 72 },
};

export const MARGIN = 28;

/**
 * The title (up to two lines, cut with an ellipsis after that) and one line of particulars, with
 * the page number at the right. Returns the shapes and the y below them.
 */
export function titleBlock(title: string, particulars: string, pageLabel: string, x: number, y: number, width: number, measure: TextMeasure): { shapes: Shape[]; bottom: number } {
  const size = 13;
  const pageWidth = measure(pageLabel, 8, 'regular');
  let lines = wrapText(measure, toWinAnsi(title), size, 'bold', width - pageWidth - 12);
  if (lines.length > 2) {
    let second = lines[1];
    while (second.length > 1 && measure(`${second}\u2026`, size, 'bold') > width - pageWidth - 12) second = second.slice(0, -1);
    lines = [lines[0], `${second}\u2026`];
  }
  const shapes: Shape[] = [];
  let baseline = y + size * CAP_HEIGHT;
  shapes.push({ kind: 'text', x: x + width, y: baseline, text: pageLabel, size: 8, font: 'regular', anchor: 'end', color: INK_SOFT });
  for (const line of lines) {
    shapes.push({ kind: 'text', className: 'title', x, y: baseline, text: line, size, font: 'bold', anchor: 'start', color: INK });
    baseline += size * 1.2;
  }
  const small = 8.5;
  const detail = wrapText(measure, toWinAnsi(particulars), small, 'regular', width);
  baseline += small * 0.15;
  for (const line of detail) {
    shapes.push({ kind: 'text', x, y: baseline, text: line, size: small, font: 'regular', anchor: 'start', color: INK_SOFT });
    baseline += small * 1.25;
  }
  return { shapes, bottom: baseline - small * 0.6 };
}

/** Height of the caution box for a width. */
export function cautionHeight(width: number, measure: TextMeasure, size = 8.5): number {
  return cautionLines(width, measure, size).length * size * 1.25 + 10;
}

function cautionLines(width: number, measure: TextMeasure, size: number): string[] {
  return wrapText(measure, toWinAnsi(`CAUTION  ${CAUTION}`), size, 'regular', width - 14);
}

/**
 * The caution text in a ruled box. The word CAUTION leads in bold; the rest is the project's
 * caution text unchanged.
 */
export function cautionBox(x: number, y: number, width: number, measure: TextMeasure, size = 8.5): { shapes: Shape[]; height: number } {
  const lines = cautionLines(width, measure, size);
  const height = lines.length * size * 1.25 + 10;
  const shapes: Shape[] = [{ kind: 'rect', x, y, width, height, fill: { color: '#fff6e0' }, stroke: { color: INK, width: 1 } }];
  let baseline = y + 5 + size * CAP_HEIGHT + 1;
  lines.forEach((line, i) => {
    if (i === 0 && line.startsWith('CAUTION')) {
      const lead = 'CAUTION';
      shapes.push({ kind: 'text', x: x + 7, y: baseline, text: lead, size, font: 'bold', anchor: 'start', color: INK });
      // The rest of the first line starts after the bold word, measured in the regular font.
      const offset = measure(lead, size, 'bold') + measure('  ', size, 'regular');
      shapes.push({ kind: 'text', x: x + 7 + offset, y: baseline, text: line.slice(lead.length).trimStart(), size, font: 'regular', anchor: 'start', color: INK });
    } else {
      shapes.push({ kind: 'text', x: x + 7, y: baseline, text: line, size, font: 'regular', anchor: 'start', color: INK });
    }
    baseline += size * 1.25;
  });
  return { shapes: [{ kind: 'group', id: 'caution', className: 'caution', shapes }], height };
}

/** Lines of the first page's warnings box, and how many warnings it had to leave to page 2. */
function warningLines(warnings: readonly string[], width: number, measure: TextMeasure, size: number, maxLines: number): string[] {
  const out: string[] = [];
  let shown = 0;
  for (const w of warnings) {
    const lines = wrapText(measure, toWinAnsi(`\u2022 ${w}`), size, 'regular', width - 14);
    // Keep one line for "n more" when warnings remain.
    const room = maxLines - out.length - (shown + 1 < warnings.length ? 1 : 0);
    if (lines.length > room) break;
    out.push(...lines);
    shown++;
  }
  if (shown < warnings.length) out.push(`${shown === 0 ? '' : 'and '}${warnings.length - shown} more on page 2`);
  return out;
}

/**
 * The run's warnings, first thing under the title on page 1: a map read without them can mislead.
 * At most `maxLines` lines of text; the rest is named as "n more on page 2" (the record lists them).
 * Nothing (height 0) when there are no warnings.
 */
export function warningsBox(warnings: readonly string[], x: number, y: number, width: number, measure: TextMeasure, maxLines = 5, size = 8): { shapes: Shape[]; height: number } {
  if (warnings.length === 0) return { shapes: [], height: 0 };
  const heading = `Warnings (${warnings.length}): read them before using this map`;
  const lines = warningLines(warnings, width, measure, size, maxLines);
  const height = 6 + size * 1.25 * (lines.length + 1) + 3;
  const shapes: Shape[] = [{ kind: 'rect', x, y, width, height, fill: { color: '#fff6e0' }, stroke: { color: INK, width: 1.4 } }];
  let baseline = y + 4 + size * CAP_HEIGHT + 1;
  shapes.push({ kind: 'text', x: x + 7, y: baseline, text: heading, size, font: 'bold', anchor: 'start', color: INK });
  for (const line of lines) {
    baseline += size * 1.25;
    shapes.push({ kind: 'text', x: x + 7, y: baseline, text: line, size, font: 'regular', anchor: 'start', color: INK });
  }
  return { shapes: [{ kind: 'group', id: 'warnings', className: 'warnings', shapes }], height };
}
