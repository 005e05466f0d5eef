import {
  closeSync,
  existsSync,
  linkSync,
  lstatSync,
  mkdirSync,
  openSync,
  readdirSync,
  readFileSync,
  realpathSync,
  renameSync,
  rmSync,
  rmdirSync,
  statSync,
  writeFileSync,
  writeSync,
} from 'node:fs';
import type { Stats } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join, relative, resolve, isAbsolute } from 'node:path';
import { UsageError } from './errors.js';

/**
 * Where a command's results go, written so that nothing of the user's is ever lost or mixed up:
 * - results are written into a staging folder `.<name>.partial-XXXXXX` beside the destination and
 *   moved into place only at the end (old folder aside, new one in, old one removed);
 * - an existing folder is replaced only with `--force`, only when Strewn wrote it (the marker file
 *   below), and never when it holds an input of the command (the scenario, its thrust curve);
 * - a lock file `.<name>.lock` beside the destination, created exclusively, keeps two runs from
 *   writing the same folder at once;
 * - staging folders and locks left by a killed run are swept at the next run, which says so;
 * - parent folders created for the destination are removed again when the run fails;
 * - a symbolic link given as the destination is followed (the folder it points to is replaced and
 *   the link kept); a link that points nowhere is refused;
 * - folders get the umask's permissions (mkdir with mode 0777), not mkdtemp's fixed 0700;
 * - system errors become one sentence naming the path (exit 2 for a bad path, 1 for a full disk).
 */

/** Longest stretch of writing between two looks at the event loop (a signal waits at most this long). */
const WRITE_SLICE_MS = 50;

/**
 * Two turns of the event loop (one is not enough for a signal that arrived during synchronous
 * work to reach its handler).
 */
export async function eventLoopTurns(): Promise<void> {
  for (let turn = 0; turn < 2; turn++) await new Promise((resolve) => setImmediate(resolve));
}

/** Written into every folder Strewn makes; its presence is what lets `--force` replace a folder. */
export const MARKER_FILE = '.strewn-results';
const MARKER_TEXT = 'This folder was written by strewn; strewn run/analyze/envelope --force may replace it.\n';
/** Inside a staging folder: the process writing it, so a sweep can tell a live one from a leftover. */
const OWNER_FILE = '.strewn-owner';
/** A leftover staging folder older than this is swept even if its process number is in use again. */
export const STALE_AFTER_MS = 60 * 60 * 1000;

/** Exit 1 (not a usage mistake): the disk is full or over quota. */
export class DiskFullError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DiskFullError';
  }
}

export interface PrepareOptions {
  /** `--force`: replace an existing folder that Strewn wrote. */
  force: boolean;
  /** Input files of the command; a destination holding any of them is never replaced. */
  inputs?: string[];
  /** Where notes go (swept leftovers); default stderr. */
  say?: (line: string) => void;
}

/** One clear sentence for a system error on `path`; a full disk becomes DiskFullError (exit 1). */
export function fileSystemError(error: unknown, path: string, doing: string): Error {
  const code = (error as NodeJS.ErrnoException)?.code;
  switch (code) {
    case 'ENOSPC':
    case 'EDQUOT':
      return new DiskFullError(`the disk is full while ${doing} '${path}'; free some space (or write elsewhere) and run again`);
    case 'EACCES':
    case 'EPERM':
      return new UsageError(`no permission for ${doing} '${path}'; choose a folder you may write to with --out`);
    case 'EROFS':
      return new UsageError(`'${path}' is on a read-only file system; choose another folder with --out`);
    case 'ENOTDIR':
      return new UsageError(`a part of '${path}' is a file, not a folder; choose another path with --out`);
    case 'EEXIST':
      return new UsageError(`'${path}' already exists and was not expected to; remove it or choose another path with --out`);
    case 'ENAMETOOLONG':
      return new UsageError(`the path '${path}' is too long; choose a shorter one with --out`);
    case 'ELOOP':
      return new UsageError(`'${path}' is a loop of symbolic links; choose another path with --out`);
    case 'ENOENT':
      return new UsageError(`'${path}' does not exist (or vanished while ${doing} it); choose another path with --out`);
    default:
      return error instanceof Error ? error : new Error(String(error));
  }
}

function attempt<T>(path: string, doing: string, work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (error instanceof UsageError || error instanceof DiskFullError) throw error;
    throw fileSystemError(error, path, doing);
  }
}

/** A folder of a random name that did not exist, made with the umask's permissions. */
function freshFolder(parent: string, prefix: string): string {
  for (let tries = 0; ; tries++) {
    const path = join(parent, `${prefix}${randomBytes(4).toString('hex')}`);
    try {
      mkdirSync(path, { mode: 0o777 });
      return path;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST' || tries > 20) throw error;
    }
  }
}

function processAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else.
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function ownerOf(file: string): number | undefined {
  try {
    // A file another process is writing this instant may read empty: Number('') is 0, which must
    // not pass for a process that is gone (its live staging folder or lock would be swept).
    const text = readFileSync(file, 'utf8').trim().split(/\s+/)[0] ?? '';
    const pid = /^[1-9]\d*$/.test(text) ? Number(text) : NaN;
    return Number.isSafeInteger(pid) ? pid : undefined;
  } catch {
    return undefined;
  }
}

/** True when `inner` is `outer` or lies inside it (both absolute, symbolic links resolved). */
export function isInside(inner: string, outer: string): boolean {
  const rel = relative(outer, inner);
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}

function realOrResolved(path: string): string {
  try {
    return realpathSync(path);
  } catch {
    return resolve(path);
  }
}

/** Whether Strewn wrote this folder: its marker file is there. */
export function writtenByStrewn(folder: string): boolean {
  try {
    return lstatSync(join(folder, MARKER_FILE)).isFile();
  } catch {
    return false;
  }
}

/**
 * Removes staging folders (`.<any>.partial-*`, `.<any>.old-*`) and locks in `parent` that a killed
 * run left: their owner process is gone, or they are older than an hour. Returns what was removed.
 */
export function sweepLeftovers(parent: string, now = Date.now()): string[] {
  let names: string[];
  try {
    names = readdirSync(parent);
  } catch {
    return [];
  }
  const removed: string[] = [];
  // Processes holding a lock here are running a command now; their staging folders are kept
  // whatever their age (a long run may take more than an hour).
  const lockHolders = new Set<number>();
  for (const name of names) {
    if (!/^\..+\.lock$/.test(name)) continue;
    const owner = ownerOf(join(parent, name));
    if (owner !== undefined && processAlive(owner)) lockHolders.add(owner);
  }
  for (const name of names) {
    const path = join(parent, name);
    const staging = /^\..+\.(?:partial|old)-[A-Za-z0-9]+$/.test(name);
    const lock = /^\..+\.lock$/.test(name);
    if (!staging && !lock) continue;
    let stats;
    try {
      stats = lstatSync(path);
    } catch {
      continue;
    }
    if (staging && !stats.isDirectory()) continue;
    if (lock && !stats.isFile()) continue;
    const owner = ownerOf(staging ? join(path, OWNER_FILE) : path);
    const gone = owner !== undefined && !processAlive(owner);
    const old = now - stats.mtimeMs > STALE_AFTER_MS;
    // A lock goes only when its process is gone; a staging folder also when it is over an hour
    // old and no running strewn process here holds a lock (its process number was reused).
    const sweep = lock ? gone : gone || (old && (owner === undefined || !lockHolders.has(owner)));
    if (!sweep) continue;
    try {
      rmSync(path, { recursive: true, force: true });
      removed.push(`${path} (${gone ? `its process ${owner} is gone` : 'older than an hour'})`);
    } catch {
      // Not ours to fight over: leave it.
    }
  }
  return removed;
}

/**
 * Results are written into a staging folder beside the destination and moved into place at the
 * end, so a failed or cancelled run leaves nothing half-written behind.
 */
export class OutputFolder {
  readonly destination: string;
  readonly staging: string;
  private readonly lock: string;
  private readonly createdParents: string[];
  private committed = false;
  private released = false;

  private constructor(destination: string, staging: string, lock: string, createdParents: string[]) {
    this.destination = destination;
    this.staging = staging;
    this.lock = lock;
    this.createdParents = createdParents;
  }

  /**
   * Checks the destination before any work starts and takes its lock. Refuses a file, a dangling
   * link, a non-empty folder without `force`, and with `force` a folder Strewn did not write or one
   * that holds an input of the command.
   */
  static prepare(destination: string, options: PrepareOptions | boolean): OutputFolder {
    const opts: PrepareOptions = typeof options === 'boolean' ? { force: options } : options;
    const say = opts.say ?? ((line: string) => process.stderr.write(`${line}\n`));
    if (destination.trim() === '') throw new UsageError('--out: expected a folder path, got an empty text');
    let dest = resolve(destination);
    let link: Stats | undefined;
    try {
      link = lstatSync(dest);
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      if (code !== 'ENOENT') throw fileSystemError(error, destination, 'looking at');
    }
    if (link?.isSymbolicLink()) {
      // Followed: the folder the link points to is the destination; the link itself stays.
      let target: string;
      try {
        target = realpathSync(dest);
      } catch {
        throw new UsageError(`--out: '${destination}' is a symbolic link that points to nothing; remove it or give a folder`);
      }
      dest = target;
    }
    const exists = existsSync(dest);
    if (exists) {
      if (!statSync(dest).isDirectory()) throw new UsageError(`--out: '${destination}' is a file; expected a folder`);
      const entries = attempt(destination, 'reading', () => readdirSync(dest));
      if (entries.length > 0) {
        if (!opts.force) throw new UsageError(`--out: '${destination}' is not empty; choose another folder or add --force to replace it`);
        const real = realOrResolved(dest);
        for (const input of opts.inputs ?? []) {
          if (isInside(realOrResolved(input), real)) {
            throw new UsageError(`--out: '${destination}' holds ${input}, an input of this run; --force never replaces a folder holding its inputs; choose another folder`);
          }
        }
        if (isInside(realOrResolved(process.cwd()), real)) {
          throw new UsageError(`--out: '${destination}' is the current folder or holds it; --force does not replace it; choose another folder`);
        }
        if (!writtenByStrewn(dest)) {
          throw new UsageError(`--out: '${destination}' was not written by strewn (it has no ${MARKER_FILE} file); --force only replaces a results folder strewn wrote; choose another folder`);
        }
      }
    }
    // Parent folders that do not exist yet are made now and removed again if the run fails.
    const parent = dirname(dest);
    const createdParents: string[] = [];
    for (let p = parent; !existsSync(p); p = dirname(p)) {
      createdParents.unshift(p);
      if (dirname(p) === p) break;
    }
    // Another process may make the same parent at the same moment (shards started at once into
    // one folder): a folder that appears meanwhile is not ours, so it is kept, never removed.
    for (const p of [...createdParents]) {
      const made = attempt(p, 'creating the folder', () => {
        try {
          mkdirSync(p, { mode: 0o777 });
          return true;
        } catch (error) {
          if ((error as NodeJS.ErrnoException).code === 'EEXIST' && lstatSync(p).isDirectory()) return false;
          throw error;
        }
      });
      if (!made) createdParents.splice(createdParents.indexOf(p), 1);
    }
    const undoParents = () => {
      for (const p of [...createdParents].reverse()) {
        try {
          rmdirSync(p);
        } catch {
          break;
        }
      }
    };
    try {
      for (const line of sweepLeftovers(parent)) say(`note: removed ${line}, left by an interrupted run`);
      const lock = join(parent, `.${basename(dest)}.lock`);
      try {
        writeFileSync(lock, `${process.pid} ${new Date().toISOString()}\n`, { flag: 'wx', mode: 0o666 });
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'EEXIST') {
          const owner = ownerOf(lock);
          throw new UsageError(
            `--out: another strewn process${owner === undefined ? '' : ` (${owner})`} is writing '${destination}' right now (lock file ${lock}); wait for it or choose another folder`,
          );
        }
        // Created but not written (a full disk): it is ours, and goes.
        rmSync(lock, { force: true });
        throw fileSystemError(error, parent, 'writing into');
      }
      let staging: string | undefined;
      try {
        staging = attempt(parent, 'writing into', () => freshFolder(parent, `.${basename(dest)}.partial-`));
        const made = staging;
        attempt(made, 'writing into', () => {
          writeFileSync(join(made, OWNER_FILE), `${process.pid}\n`);
          writeFileSync(join(made, MARKER_FILE), MARKER_TEXT);
        });
      } catch (error) {
        // A full disk can refuse the staging folder's first files: the folder goes too.
        if (staging !== undefined) rmSync(staging, { recursive: true, force: true });
        rmSync(lock, { force: true });
        throw error;
      }
      return new OutputFolder(dest, staging, lock, createdParents);
    } catch (error) {
      undoParents();
      throw error;
    }
  }

  /** Writes a file; content given in pieces is streamed so no single huge string is built. */
  write(name: string, content: string | Uint8Array | Iterable<string | Uint8Array>): void {
    const file = join(this.staging, name);
    // Names may hold a sub-folder (an event writes each item's results under items/).
    if (name.includes('/')) mkdirSync(dirname(file), { recursive: true });
    attempt(join(this.destination, name), 'writing', () => {
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
    });
  }

  /**
   * Like `write`, but content given in pieces is written in slices of about 50 ms with a turn of
   * the event loop between them, so Ctrl-C or SIGTERM is answered at once even while a file of
   * millions of lines is written; stops with the signal's reason when it aborts.
   */
  async writeAsync(name: string, content: string | Uint8Array | Iterable<string | Uint8Array>, signal?: AbortSignal): Promise<void> {
    if (signal) {
      await eventLoopTurns();
      signal.throwIfAborted();
    }
    if (typeof content === 'string' || content instanceof Uint8Array) {
      this.write(name, content);
      return;
    }
    const file = join(this.staging, name);
    if (name.includes('/')) mkdirSync(dirname(file), { recursive: true });
    const shown = join(this.destination, name);
    const fd = attempt(shown, 'writing', () => openSync(file, 'w'));
    try {
      let slice = performance.now();
      for (const piece of content) {
        const bytes = typeof piece === 'string' ? Buffer.from(piece) : piece;
        attempt(shown, 'writing', () => {
          for (let at = 0; at < bytes.length; ) at += writeSync(fd, bytes, at, bytes.length - at);
        });
        if (performance.now() - slice > WRITE_SLICE_MS) {
          await eventLoopTurns();
          signal?.throwIfAborted();
          slice = performance.now();
        }
      }
    } finally {
      closeSync(fd);
    }
  }

  /**
   * Moves the finished results into place: the old folder (if any) is renamed aside, the new one
   * renamed in, and only then the old one removed; if the second step fails the old one goes back.
   */
  commit(): void {
    rmSync(join(this.staging, OWNER_FILE), { force: true });
    const parent = dirname(this.destination);
    let aside: string | undefined;
    if (existsSync(this.destination)) {
      const isEmpty = readdirSync(this.destination).length === 0;
      if (isEmpty) rmdirSync(this.destination);
      else {
        aside = join(parent, `.${basename(this.destination)}.old-${randomBytes(4).toString('hex')}`);
        attempt(this.destination, 'moving aside', () => renameSync(this.destination, aside!));
      }
    }
    try {
      attempt(this.destination, 'moving the results into', () => renameSync(this.staging, this.destination));
    } catch (error) {
      if (aside !== undefined) renameSync(aside, this.destination);
      throw error;
    }
    this.committed = true;
    if (aside !== undefined) rmSync(aside, { recursive: true, force: true });
    this.release();
  }

  /** Removes the staging folder, the lock and parents made for it; safe to call more than once, and after commit. */
  discard(): void {
    if (!this.committed) {
      rmSync(this.staging, { recursive: true, force: true });
      this.release();
      for (const p of [...this.createdParents].reverse()) {
        try {
          rmdirSync(p);
        } catch {
          break;
        }
      }
    }
    this.release();
  }

  private release(): void {
    if (this.released) return;
    this.released = true;
    rmSync(this.lock, { force: true });
  }
}

/**
 * Writes one file the user named (not a results folder) without ever leaving it half-written: a
 * regular file (or none yet) is written beside under a temporary name and renamed over the old
 * one, so a full disk leaves the old file as it was; a device or pipe (/dev/stdout, /dev/full) is
 * written directly. A full disk becomes one sentence naming the path (DiskFullError: exit 1);
 * other system errors are passed on for the command to word (EEXIST, ENOENT, EISDIR…).
 * `exclusive`: refuse (EEXIST) a file that exists.
 */
export function writeSingleFile(path: string, content: string | Uint8Array, exclusive = false): void {
  let stats: Stats | undefined;
  try {
    stats = statSync(path);
  } catch {
    stats = undefined;
  }
  if (stats && exclusive) throw Object.assign(new Error(`${path} exists`), { code: 'EEXIST' });
  if (stats && !stats.isFile()) {
    if (stats.isDirectory()) throw Object.assign(new Error(`${path} is a folder`), { code: 'EISDIR' });
    diskFull(path, () => writeFileSync(path, content));
    return;
  }
  const temp = join(dirname(path), `.${basename(path)}.partial-${process.pid}-${randomBytes(3).toString('hex')}`);
  try {
    diskFull(path, () => writeFileSync(temp, content, { flag: 'wx', mode: stats ? stats.mode & 0o7777 : 0o666 }));
    diskFull(path, () => {
      if (exclusive) {
        // Only the rename decides: linking refuses a name that appeared meanwhile.
        linkSync(temp, path);
      } else renameSync(temp, path);
    });
  } finally {
    rmSync(temp, { force: true });
  }
}

function diskFull<T>(path: string, work: () => T): T {
  try {
    return work();
  } catch (error) {
    const code = (error as NodeJS.ErrnoException)?.code;
    if (code === 'ENOSPC' || code === 'EDQUOT') throw fileSystemError(error, path, 'writing');
    throw error;
  }
}
