/**
 * envelope.pdf: the wind-limits page of the review sheet on its own, dated by the envelope's
 * computation so the same envelope gives the same bytes.
 */
import type { Paper } from '../report/sheet/page-parts.js';
import { renderPdf } from '../report/sheet/render-pdf.js';
import type { UnitSystem } from '../report/format-number.js';
import { toWinAnsi } from '../report/sheet/winansi.js';
import { defaultMeasure } from '../report/sheet/fonts.js';
import { envelopeSheetPages, type EnvelopeRecord } from './sheet-page.js';
import { envelopeTitle } from './wording.js';

export function envelopePdf(record: EnvelopeRecord, choices: { paper: Paper; units: UnitSystem }): Uint8Array {
  const pages = envelopeSheetPages(record, { ...choices, measure: defaultMeasure() });
  const date = record.computedAt ? new Date(record.computedAt) : new Date(0);
  return renderPdf(pages, {
    title: toWinAnsi(envelopeTitle(record.envelope)),
    subject: `Wind limits; scenario hash ${record.scenarioHash}`,
    creator: `strewn ${record.version}`,
    date: Number.isNaN(date.getTime()) ? new Date(0) : date,
  });
}
