import { PDFDocument as StreamingPDFDocument } from '../../../node_modules/pdfkit/js/pdfkit.browser.mjs';

/**
 * pdfkit as the page bundles it (vite.config.ts points `pdfkit` here). The review sheet
 * (src/report/sheet/render-pdf.ts) collects the finished PDF synchronously with the paused-mode
 * `read()` of Node streams. pdfkit's browser build has its own small stream without `read()`;
 * until something attaches a 'data' listener it keeps every written chunk in its buffer, so
 * reading that buffer gives the same bytes, in order, just as synchronously.
 */
export class PDFDocument extends StreamingPDFDocument {
  /** The next chunk written so far, or null when there is none (as Node's paused read() does). */
  read(): Uint8Array | null {
    const buffer = (this as unknown as { _buffer: Uint8Array[] })._buffer;
    return buffer.length > 0 ? buffer.shift()! : null;
  }
}

export default PDFDocument;
export { LineWrapper, registerFile, registerStdFonts } from '../../../node_modules/pdfkit/js/pdfkit.browser.mjs';
