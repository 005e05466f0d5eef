import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '../..');
export const CLI = join(ROOT, 'dist/src/cli/main.js');

export interface Finished {
  status: number | null;
  stderr: string;
}

/** Runs the built command line to the end; `env` adds to (or, with undefined, removes from) this process's environment. */
export function strewnSync(args: string[], env: Record<string, string | undefined> = {}): Finished {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', env: environment(env), timeout: 120_000 });
  return { status: r.status, stderr: r.stderr };
}

export function startStrewn(args: string[], env: Record<string, string | undefined> = {}) {
  return spawn(process.execPath, [CLI, ...args], { cwd: ROOT, env: environment(env), stdio: ['ignore', 'ignore', 'pipe'] });
}

function environment(extra: Record<string, string | undefined>): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, STREWN_TEST_FAULT: undefined, ...extra };
  for (const key of Object.keys(env)) if (env[key] === undefined) delete env[key];
  return env;
}

const scratchFolders: string[] = [];

/** A fresh empty folder; runs write to `<folder>/out`, so anything else left in it is litter. */
export function scratch(): { folder: string; out: string } {
  const folder = mkdtempSync(join(tmpdir(), 'strewn-pool-'));
  scratchFolders.push(folder);
  return { folder, out: join(folder, 'out') };
}

/** Removes every folder `scratch` made (call after the tests that used them). */
export function removeScratch(): void {
  for (const folder of scratchFolders.splice(0)) rmSync(folder, { recursive: true, force: true });
}

export function landings(out: string): string {
  return readFileSync(join(out, 'landings.csv'), 'utf8');
}

/** Nothing at all was left behind: no results folder and no staging folder beside it. */
export function leftBehind(folder: string): string[] {
  return existsSync(folder) ? readdirSync(folder) : [];
}
