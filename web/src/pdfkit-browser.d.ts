// pdfkit's browser build (what the bundler picks) exports registerStdFonts and ships the metrics
// of the standard fonts as modules; @types/pdfkit describes only the Node build.
declare module 'pdfkit' {
  export function registerStdFonts(...fonts: unknown[]): void;
}
declare module 'pdfkit/standard-fonts/*' {
  const metrics: unknown;
  export default metrics;
}
// The browser build itself, imported by path by exports/pdfkit-browser.ts.
declare module '*/pdfkit/js/pdfkit.browser.mjs' {
  export class PDFDocument {
    constructor(options?: unknown);
  }
  export const LineWrapper: unknown;
  export function registerFile(...args: unknown[]): void;
  export function registerStdFonts(...fonts: unknown[]): void;
}
