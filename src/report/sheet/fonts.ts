/**
 * The sheet uses only the standard PDF fonts, which every PDF reader has built in: nothing is
 * embedded and nothing is fetched. Widths come from their Adobe font metrics (shipped with
 * pdfkit), so the layout made for the PDF holds in the SVG, where the same families are named.
 *
 * @example
 *   const measure = createTextMeasure();
 *   measure('Duck pond', 8, 'bold')  // width in points
 */
import PDFDocument from 'pdfkit';
import type { FontName } from './display-list.js';

/** The standard PDF font behind each font of the display list. */
export const PDF_FONTS: Record<FontName, string> = {
  regular: 'Helvetica',
  bold: 'Helvetica-Bold',
  italic: 'Helvetica-Oblique',
  mono: 'Courier',
};

/** CSS families with the same metrics (Arial and Liberation Sans are metric twins of Helvetica). */
export const SVG_FONTS: Record<FontName, { family: string; weight?: string; style?: string }> = {
  regular: { family: 'Helvetica, Arial, \'Liberation Sans\', sans-serif' },
  bold: { family: 'Helvetica, Arial, \'Liberation Sans\', sans-serif', weight: 'bold' },
  italic: { family: 'Helvetica, Arial, \'Liberation Sans\', sans-serif', style: 'italic' },
  mono: { family: 'Courier, \'Courier New\', \'Liberation Mono\', monospace' },
};

/** Width in points of a text at a font size. */
export type TextMeasure = (text: string, size: number, font: FontName) => number;

/** Fraction of the font size above the baseline taken by capitals (Helvetica's cap height). */
export const CAP_HEIGHT = 0.718;
/** Fraction of the font size below the baseline taken by descenders. */
export const DESCENT = 0.21;

export function createTextMeasure(): TextMeasure {
  const doc = new PDFDocument({ autoFirstPage: false });
  const cache = new Map<string, number>();
  return (text, size, font) => {
    const key = `${font}\u0000${text}`;
    let perPoint = cache.get(key);
    if (perPoint === undefined) {
      perPoint = doc.font(PDF_FONTS[font]).fontSize(1).widthOfString(text);
      cache.set(key, perPoint);
    }
    return perPoint * size;
  };
}

let shared: TextMeasure | null = null;

/** One measure for the whole process (or page): its cache of widths then serves every drawing. */
export function defaultMeasure(): TextMeasure {
  shared ??= createTextMeasure();
  return shared;
}

/**
 * Splits text into lines no wider than `width` at word boundaries (a word longer than the line is
 * cut, so nothing runs off the page).
 */
export function wrapText(measure: TextMeasure, text: string, size: number, font: FontName, width: number): string[] {
  const lines: string[] = [];
  for (const paragraph of text.split('\n')) {
    let line = '';
    for (const word of paragraph.split(/ +/)) {
      const candidate = line === '' ? word : `${line} ${word}`;
      if (measure(candidate, size, font) <= width) {
        line = candidate;
        continue;
      }
      if (line !== '') lines.push(line);
      line = word;
      while (measure(line, size, font) > width && line.length > 1) {
        let cut = line.length - 1;
        while (cut > 1 && measure(line.slice(0, cut), size, font) > width) cut--;
        lines.push(line.slice(0, cut));
        line = line.slice(cut);
      }
    }
    lines.push(line);
  }
  return lines;
}
