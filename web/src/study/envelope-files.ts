import { writeEnvelopeCsv, writeEnvelopeJson } from '../../../src/envelope/writers.js';
import { CAUTION } from '../../../src/report/caution.js';
import { VERSION } from '../../../src/version.js';
import type { FileContent } from '../../../src/report/result-files.js';
import type { UnitSystem } from '../units/systems.js';
import type { EnvelopeOutcome } from './envelope.js';

/**
 * The files of `strewn envelope`'s folder, made in the page by the same writers: envelope.json
 * and envelope.csv as the command line writes them, envelope.svg and envelope.pdf in the page's
 * units (the command line's default is metric).
 */
export const ENVELOPE_FILES = ['envelope.pdf', 'envelope.svg', 'envelope.json', 'envelope.csv'] as const;
export type EnvelopeFileName = (typeof ENVELOPE_FILES)[number];

/** The drawing modules measure text with pdfkit: loaded on demand, after its font metrics (see compose.ts). */
export async function envelopeDrawing() {
  await import('../exports/pdf-fonts.js');
  const [chart, pdf] = await Promise.all([import('../../../src/envelope/chart.js'), import('../../../src/envelope/envelope-pdf.js')]);
  return { ...chart, ...pdf };
}

export async function envelopeFile(name: EnvelopeFileName, outcome: EnvelopeOutcome, units: UnitSystem): Promise<FileContent> {
  const e = outcome.envelope;
  switch (name) {
    case 'envelope.json':
      return writeEnvelopeJson(e, { version: VERSION, scenarioHash: outcome.hash, computedAt: outcome.computedAt, caution: CAUTION });
    case 'envelope.csv':
      return writeEnvelopeCsv(e);
    case 'envelope.svg':
      return (await envelopeDrawing()).envelopeChart(e, { units });
    case 'envelope.pdf':
      return (await envelopeDrawing()).envelopePdf({ envelope: e, scenarioHash: outcome.hash, version: VERSION, computedAt: outcome.computedAt }, { paper: 'a4', units });
  }
}
