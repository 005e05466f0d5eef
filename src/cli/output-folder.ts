import { mkdtempSync, readdirSync, renameSync, rmSync, statSync, writeFileSync, writeSync, openSync, closeSync, existsSync, mkdirSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { UsageError } from './errors.js';

/**
 * Results are written into a temporary folder beside the destination and renamed into place at the
 * end, so a failed or cancelled run leaves nothing half-written behind.
 */
export class OutputFolder {
  readonly destination: string;
  readonly staging: string;
  private committed = false;

  private constructor(destination: string, staging: string) {
    this.destination = destination;
    this.staging = staging;
  }

  /**
   * Checks the destination before any work starts: refuses a non-empty folder unless `force`, and a
   * path that is a file.
   */
  static prepare(destination: string, force: boolean): OutputFolder {
    const dest = resolve(destination);
    if (existsSync(dest)) {
      if (!statSync(dest).isDirectory()) throw new UsageError(`--out: '${destination}' is a file; expected a folder`);
      if (readdirSync(dest).length > 0 && !force)
        throw new UsageError(`--out: '${destination}' is not empty; choose another folder or add --force to replace it`);
    }
    mkdirSync(dirname(dest), { recursive: true });
    const staging = mkdtempSync(join(dirname(dest), `.${basename(dest)}.partial-`));
    return new OutputFolder(dest, staging);
  }

  /** Writes a file; content given in pieces is streamed so no single huge string is built. */
  write(name: string, content: string | Uint8Array | Iterable<string | Uint8Array>): void {
    const file = join(this.staging, name);
    if (typeof content === 'string' || content instanceof Uint8Array) {
      writeFileSync(file, content);
      return;
    }
    const fd = openSync(file, 'w');
    try {
      for (const piece of content) {
        const bytes = typeof piece === 'string' ? Buffer.from(piece) : piece;
        for (let at = 0; at < bytes.length; ) at += writeSync(fd, bytes, at, bytes.length - at);
      }
    } finally {
      closeSync(fd);
    }
  }

  /** Moves the finished results into place (replacing an old folder only now, at the very end). */
  commit(): void {
    if (existsSync(this.destination)) rmSync(this.destination, { recursive: true, force: true });
    renameSync(this.staging, this.destination);
    this.committed = true;
  }

  /** Removes the staging folder; safe to call more than once, and after commit. */
  discard(): void {
    if (!this.committed) rmSync(this.staging, { recursive: true, force: true });
  }
}
