import type { FileContent } from '../../../src/report/result-files.js';

/** Offers content as a file download, built in the page (nothing leaves the machine). */

const TYPES: Record<string, string> = {
  csv: 'text/csv',
  json: 'application/json',
  geojson: 'application/geo+json',
  fgb: 'application/flatgeobuf',
  kml: 'application/vnd.google-earth.kml+xml',
  pdf: 'application/pdf',
  svg: 'image/svg+xml',
};

export function mimeType(name: string): string {
  return TYPES[name.split('.').pop()?.toLowerCase() ?? ''] ?? 'application/octet-stream';
}

/** The parts of a Blob for a result file: strings and bytes as they are, generators read out. */
export function blobParts(content: FileContent): BlobPart[] {
  if (typeof content === 'string') return [content];
  if (content instanceof Uint8Array) return [content as Uint8Array<ArrayBuffer>];
  return Array.from(content, (piece) => (typeof piece === 'string' ? piece : (piece as Uint8Array<ArrayBuffer>)));
}

export function download(name: string, content: FileContent | Blob): void {
  const blob = content instanceof Blob ? content : new Blob(blobParts(content), { type: mimeType(name) });
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // The download has its own reference by now; revoke later so slow browsers still get it.
  setTimeout(() => URL.revokeObjectURL(url), 60_000);
}
