/**
 * Display-list pages as a PDF (pdfkit, standard fonts only, nothing embedded or fetched). The
 * creation date is given by the caller, and pdfkit derives the file identifier from the document
 * information, so the same pages and date give the same bytes.
 *
 * @example
 *   const bytes = renderPdf([mapPage, recordPage], { title: 'Harrowmere', date: new Date(0), creator: 'strewn 0.1.0' });
 */
import PDFDocument from 'pdfkit';
import type { Fill, PathCommand, Page, Shape, Stroke } from './display-list.js';
import { markerOutline } from './display-list.js';
import { PDF_FONTS } from './fonts.js';

export interface PdfInfo {
  title: string;
  subject?: string;
  creator: string;
  date: Date;
}

type Doc = InstanceType<typeof PDFDocument>;

function tracePath(doc: Doc, d: PathCommand[]): void {
  for (const c of d) {
    if (c[0] === 'M') doc.moveTo(c[1], c[2]);
    else if (c[0] === 'L') doc.lineTo(c[1], c[2]);
    else doc.closePath();
  }
}

function applyStroke(doc: Doc, stroke: Stroke): void {
  doc.lineWidth(stroke.width).strokeColor(stroke.color, stroke.opacity ?? 1);
  // pdfkit takes a dash array at run time although its type declarations only admit a number.
  if (stroke.dash && stroke.dash.length > 0) doc.dash(stroke.dash as unknown as number, {});
  else doc.undash();
  doc.lineCap(stroke.cap ?? 'butt').lineJoin(stroke.join ?? 'miter');
}

/** Fills and/or strokes the current path. */
function paint(doc: Doc, stroke: Stroke | undefined, fill: Fill | undefined, evenOdd = false): void {
  const rule = evenOdd ? 'even-odd' : 'non-zero';
  if (stroke) applyStroke(doc, stroke);
  if (fill) doc.fillColor(fill.color, fill.opacity ?? 1);
  // Colours and opacities are set above; passing only the rule keeps pdfkit from resetting them.
  if (fill && stroke) doc.fillAndStroke(rule);
  else if (fill) doc.fill(rule);
  else if (stroke) doc.stroke();
}

function drawShape(doc: Doc, shape: Shape): void {
  switch (shape.kind) {
    case 'path':
      doc.save();
      tracePath(doc, shape.d);
      paint(doc, shape.stroke, shape.fill, shape.evenOdd);
      doc.restore();
      return;
    case 'circle':
      doc.save();
      doc.circle(shape.cx, shape.cy, shape.r);
      paint(doc, shape.stroke, shape.fill);
      doc.restore();
      return;
    case 'rect':
      doc.save();
      doc.rect(shape.x, shape.y, shape.width, shape.height);
      paint(doc, shape.stroke, shape.fill);
      doc.restore();
      return;
    case 'text': {
      doc.font(PDF_FONTS[shape.font]).fontSize(shape.size);
      const width = shape.anchor === 'start' ? 0 : doc.widthOfString(shape.text);
      const x = shape.anchor === 'start' ? shape.x : shape.anchor === 'middle' ? shape.x - width / 2 : shape.x - width;
      doc.fillColor(shape.color, 1);
      doc.text(shape.text, x, shape.y, { lineBreak: false, baseline: 'alphabetic' });
      return;
    }
    case 'markers': {
      doc.save();
      const s = shape.size;
      for (let i = 0; i < shape.points.length; i += 2) {
        const x = shape.points[i];
        const y = shape.points[i + 1];
        if (shape.symbol === 'dot') doc.circle(x, y, s);
        else tracePath(doc, markerOutline(shape.symbol, x, y, s));
      }
      if (shape.symbol === 'cross') {
        applyStroke(doc, { color: shape.color, width: Math.max(0.5, s * 0.45), opacity: shape.opacity });
        doc.stroke();
      } else {
        doc.fillColor(shape.color, shape.opacity ?? 1);
        doc.fill('non-zero');
      }
      doc.restore();
      return;
    }
    case 'clip':
      doc.save();
      doc.rect(shape.x, shape.y, shape.width, shape.height).clip();
      for (const s of shape.shapes) drawShape(doc, s);
      doc.restore();
      return;
    case 'group':
      for (const s of shape.shapes) drawShape(doc, s);
      return;
  }
}

/** The pages as PDF bytes, made synchronously. */
export function renderPdf(pages: Page[], info: PdfInfo): Uint8Array {
  if (pages.length === 0) throw new Error('a PDF needs at least one page');
  const doc = new PDFDocument({
    autoFirstPage: false,
    compress: true,
    info: {
      Title: info.title,
      ...(info.subject ? { Subject: info.subject } : {}),
      Creator: info.creator,
      Producer: info.creator,
      CreationDate: info.date,
      ModDate: info.date,
    },
  });
  for (const page of pages) {
    doc.addPage({ size: [page.width, page.height], margin: 0 });
    for (const shape of page.shapes) drawShape(doc, shape);
  }
  doc.end();
  // pdfkit pushes every chunk into its stream buffer as it writes; reading in paused mode takes
  // them synchronously, so no event loop turn (and no callback API) is needed.
  const chunks: Uint8Array[] = [];
  for (let chunk = doc.read() as Uint8Array | null; chunk !== null; chunk = doc.read() as Uint8Array | null) chunks.push(chunk);
  let length = 0;
  for (const c of chunks) length += c.length;
  const bytes = new Uint8Array(length);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.length;
  }
  return bytes;
}
