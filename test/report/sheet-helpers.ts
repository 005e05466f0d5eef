import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { strewn, tempDir } from '../cli/helpers.js';

/** Runs a demo scenario with few samples into a fresh folder and returns the folder. */
export function runDemo(scenario: string, samples = 400, extra: string[] = []): string {
  const out = join(tempDir('strewn-sheet-'), 'out');
  const r = strewn(['run', `scenarios/${scenario}`, '--out', out, '--samples', String(samples), '--quiet', '--workers', '1', ...extra], { env: { SOURCE_DATE_EPOCH: '1717243200' } });
  if (r.status !== 0) throw new Error(`strewn run ${scenario} failed (${r.status}): ${r.stderr}`);
  return out;
}

/** Runs a poppler tool; CI installs poppler-utils (see .ci/run). */
export function poppler(tool: 'pdftotext' | 'pdfinfo', args: string[]): string {
  const r = spawnSync(tool, args, { encoding: 'utf8' });
  if (r.error) throw new Error(`${tool} is needed for this test (Debian package poppler-utils): ${r.error.message}`);
  if (r.status !== 0) throw new Error(`${tool} failed: ${r.stderr}`);
  return r.stdout;
}

/** Text of one page (or all), with runs of white space made single spaces. */
export function pdfText(file: string, page?: number): string {
  const range = page === undefined ? [] : ['-f', String(page), '-l', String(page)];
  return poppler('pdftotext', [...range, file, '-']).replace(/\s+/g, ' ');
}

export function pdfPages(file: string): number {
  const m = /^Pages:\s+(\d+)/m.exec(poppler('pdfinfo', [file]));
  return m ? Number(m[1]) : NaN;
}

export function pdfPageSize(file: string): [number, number] {
  const m = /^Page size:\s+([\d.]+) x ([\d.]+) pts/m.exec(poppler('pdfinfo', [file]));
  return m ? [Number(m[1]), Number(m[2])] : [NaN, NaN];
}
