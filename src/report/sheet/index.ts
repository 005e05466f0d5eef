/**
 * The review sheet: page 1 the map (also written alone as map.svg), page 2 the record a safety
 * officer signs, and, when an envelope of the same scenario is given, the wind-limits page last.
 * Every page is built once as a display list and rendered to SVG and PDF.
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
import type { UnitSystem } from '../format-number.js';
import { toWinAnsi } from './winansi.js';
import type { Page } from './display-list.js';
import { drawEnvelopePages, planEnvelopePages, type EnvelopeRecord } from '../../envelope/sheet-page.js';

export interface SheetChoices {
  paper?: Paper;
  units?: UnitSystem;
  /** Wind limits of the same scenario (the caller checks the hash), drawn after the record. */
  envelope?: EnvelopeRecord;
}

export interface Sheet {
  /** The map, then the record (one page, more only for a very long record), then the wind limits. */
  pages: Page[];
  svg: string;
  pdf: Uint8Array;
}

let sharedMeasure: TextMeasure | null = null;

export function buildSheet(input: SheetInput, choices: SheetChoices = {}): Sheet {
  sharedMeasure ??= createTextMeasure();
  const options = { paper: choices.paper ?? 'a4', units: choices.units ?? 'metric', measure: sharedMeasure };
  const plan = choices.envelope ? planEnvelopePages(choices.envelope, options) : null;
  const after = plan?.rowsPerPage.length ?? 0;
  const record = buildRecordPages(input, options, 2, 1, after);
  const total = 1 + record.length + after;
  const map = buildMapPage(input, options, total);
  const envelope = plan ? drawEnvelopePages(plan, 2 + record.length, total) : [];
  const title = toWinAnsi(`${input.summary.name}: review sheet`);
  const computed = new Date(input.review.computedAt);
  const pdf = renderPdf([map, ...record, ...envelope], {
    title,
    subject: `Landing-zone map and review record; scenario hash ${input.summary.scenarioHash}`,
    creator: `strewn ${VERSION}`,
    date: Number.isNaN(computed.getTime()) ? new Date(0) : computed,
  });
  return { pages: [map, ...record, ...envelope], svg: renderSvg(map, `${input.summary.name}: landing-zone map`), pdf };
}

export type { SheetInput } from './sheet-input.js';
export type { Paper } from './page-parts.js';
export type { UnitSystem } from '../format-number.js';
