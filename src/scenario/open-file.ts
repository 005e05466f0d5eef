import { closeSync, constants, fstatSync, openSync, readSync, realpathSync } from 'node:fs';
import { isAbsolute, relative, resolve } from 'node:path';
import { MAX_THRUST_ROWS } from './thrust.js';

/**
 * How Strewn opens the files it reads (scenario, thrust curve, recorded landings), in Node:
 * - only regular files: a FIFO would block for ever, a device such as /dev/zero never ends; the
 *   file is opened non-blocking and checked with fstat on the open descriptor (no race between a
 *   check and the open);
 * - a size cap per kind of file, and never more than the cap + 1 byte read;
 * - paths written inside a scenario (a thrust curve) stay in the scenario's folder or below it,
 *   unless the user allows otherwise, so a scenario sent by someone else cannot make the program
 *   read any file it likes.
 * Errors are plain Errors with one sentence; callers add the field or option they came from.
 */

/** The longest thrust-curve row worth reading, with generous room for comments and spacing. */
const BYTES_PER_THRUST_ROW = 160;

export const SIZE_LIMITS = {
  /** 100,000 rows (MAX_THRUST_ROWS) of a few numbers each, plus headers and comments. */
  thrustCsv: MAX_THRUST_ROWS * BYTES_PER_THRUST_ROW,
  /** A scenario with an inline curve of 100,000 rows, areas and a basemap. */
  scenario: 64 * 1024 * 1024,
  /** Recorded landings: about 4 million rows of a strewn landings.csv; Node strings end near 512 MB. */
  landingsCsv: 400 * 1024 * 1024,
  /** A GRIB2 forecast cut to a region (a global 0.25° file of every field is far larger). */
  forecast: 512 * 1024 * 1024,
  /** A GeoTIFF elevation model of a site and its surroundings. */
  terrain: 512 * 1024 * 1024,
} as const;

export class InputFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InputFileError';
  }
}

function mebibytes(bytes: number): string {
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}

/** Reads a regular file of at most `maxBytes` as UTF-8 text. */
export function readRegularFile(path: string, maxBytes: number): string {
  return Buffer.from(readRegularFileBytes(path, maxBytes)).toString('utf8');
}

/** Reads a regular file of at most `maxBytes` (FIFOs, devices and sockets refused) as bytes. */
export function readRegularFileBytes(path: string, maxBytes: number): Uint8Array {
  let fd: number;
  try {
    // O_NONBLOCK: opening a FIFO without a writer returns at once instead of waiting.
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' || code === 'EPERM' ? 'no permission to read it' : code === 'ENOTDIR' ? 'a part of the path is a file, not a folder' : code === 'ENXIO' ? 'it is not a regular file' : (error as Error).message;
    throw new InputFileError(reason);
  }
  try {
    const stats = fstatSync(fd);
    if (stats.isDirectory()) throw new InputFileError('it is a folder');
    if (!stats.isFile()) throw new InputFileError('it is not a regular file (a pipe, device or socket); give the path of an ordinary file');
    if (stats.size > maxBytes) throw new InputFileError(`it is ${mebibytes(stats.size)}, more than the ${mebibytes(maxBytes)} such a file may have`);
    // Read up to the cap + 1 byte: a file that grows while being read is still caught.
    const buffer = Buffer.alloc(Math.min(maxBytes + 1, Math.max(stats.size, 0) + 65536));
    let length = 0;
    for (;;) {
      if (length === buffer.length) break;
      let n: number;
      try {
        n = readSync(fd, buffer, length, buffer.length - length, null);
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'EAGAIN') continue;
        throw new InputFileError(`reading failed: ${(error as Error).message}`);
      }
      if (n === 0) break;
      length += n;
    }
    if (length > maxBytes) throw new InputFileError(`it is more than the ${mebibytes(maxBytes)} such a file may have`);
    return buffer.subarray(0, length);
  } finally {
    closeSync(fd);
  }
}

function isInside(inner: string, outer: string): boolean {
  const rel = relative(outer, inner);
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}

/**
 * Checks that a file named inside a scenario lies in the scenario's folder or below it (symbolic
 * links resolved), unless `allowOutside`. `file` is the path as resolved against `baseDir`.
 */
export function confineToFolder(baseDir: string, file: string, allowOutside: boolean): void {
  if (allowOutside) return;
  const base = resolve(baseDir);
  const outside = `it lies outside the scenario's folder (${base}); files named in a scenario must be in its folder or below it; move the file there, or add --allow-outside-files if you trust this scenario`;
  if (!isInside(resolve(base, file), base)) throw new InputFileError(outside);
  let realBase: string;
  let realFile: string;
  try {
    realBase = realpathSync(base);
    realFile = realpathSync(file);
  } catch {
    // A missing file is reported when it is opened.
    return;
  }
  if (!isInside(realFile, realBase)) throw new InputFileError(outside);
}

export { excerpt } from './safe-text.js';
