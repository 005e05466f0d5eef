/**
 * The review sheet: page 1 the map (also written alone as map.svg), page 2 the record a safety
 * officer signs. Both pages are built once as display lists and rendered to SVG and PDF.
 *
 * @example
 *   const { svg, pdf } = buildSheet(input, { paper: 'a4', units: 'metric' });
 *   writeFileSync('map.svg', svg);
 *   writeFileSync('sheet.pdf', pdf);
 */
import { VERSION } from '../../version.js';
import { createTextMeasure, type TextMeasure } from './fonts.js';
import { buildMapPage } from './map-page.js';
import type { Paper } from './page-parts.js';
import { buildRecordPages } from './record-page.js';
import { renderPdf } from './render-pdf.js';
import { renderSvg } from './render-svg.js';
import type { SheetInput } from './sheet-input.js';
import type { UnitSystem } from './units.js';
import { toWinAnsi } from './winansi.js';
import type { Page } from './display-list.js';

export interface SheetChoices {
  paper?: Paper;
  units?: UnitSystem;
}

export interface Sheet {
  /** The map, then the record (one page, more only for a very long record). */
  pages: Page[];
  svg: string;
  pdf: Uint8Array;
}

let sharedMeasure: TextMeasure | null = null;

export function buildSheet(input: SheetInput, choices: SheetChoices = {}): Sheet {
  sharedMeasure ??= createTextMeasure();
  const options = { paper: choices.paper ?? 'a4', units: choices.units ?? 'metric', measure: sharedMeasure };
  const record = buildRecordPages(input, options, 2);
  const map = buildMapPage(input, options, 1 + record.length);
  const title = toWinAnsi(`${input.summary.name}: review sheet`);
  const computed = new Date(input.review.computedAt);
  const pdf = renderPdf([map, ...record], {
    title,
    subject: `Landing-zone map and review record; scenario hash ${input.summary.scenarioHash}`,
    creator: `strewn ${VERSION}`,
    date: Number.isNaN(computed.getTime()) ? new Date(0) : computed,
  });
  return { pages: [map, ...record], svg: renderSvg(map, `${input.summary.name}: landing-zone map`), pdf };
}

export type { SheetInput } from './sheet-input.js';
export type { Paper } from './page-parts.js';
export type { UnitSystem } from './units.js';
