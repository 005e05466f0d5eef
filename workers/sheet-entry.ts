import { parentPort } from 'node:worker_threads';
import { buildSheet } from '../src/report/sheet/index.js';
import type { SheetJob } from '../src/report/result-data-files.js';

/**
 * Entry of the Node worker thread that draws the review sheet (started by src/cli/sheet-thread.ts
 * from the compiled dist/workers/). The sheet code (pdfkit, the fonts) loads here as soon as the
 * thread starts, while the main thread waits for the flights; drawing here keeps the main thread
 * free to write the other files and to answer Ctrl-C or SIGTERM at once (it simply ends this
 * thread). Same code, same input: the same bytes as drawing in the main thread.
 */
if (!parentPort) throw new Error('sheet-entry.js runs only as a worker thread');
const port = parentPort;

port.on('message', (job: SheetJob) => {
  try {
    const { svg, pdf } = buildSheet(job.input, job.choices);
    // The bytes move without a copy when they fill their buffer alone (a pooled one is copied).
    const whole = pdf.byteOffset === 0 && pdf.byteLength === pdf.buffer.byteLength;
    port.postMessage({ svg, pdf }, whole ? [pdf.buffer as ArrayBuffer] : []);
  } catch (error) {
    port.postMessage({ error: error instanceof Error ? error.message : String(error) });
  }
});
