import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '../..');
export const CLI = join(ROOT, 'dist/src/cli/main.js');
export const SCENARIOS = join(ROOT, 'scenarios');

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Runs the built command line (npm test builds first). */
export function strewn(args: string[], options: { env?: Record<string, string>; cwd?: string } = {}): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], {
    encoding: 'utf8',
    cwd: options.cwd ?? ROOT,
    env: { ...process.env, ...options.env },
    timeout: 120_000,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

export function tempDir(prefix = 'strewn-test-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

/** A copy of a demo scenario (and its motor folder) in a temp dir, changed by `edit`. */
export function editedScenario(name: string, edit: (json: Record<string, any>) => void): string {
  const dir = tempDir();
  cpSync(join(SCENARIOS, 'motors'), join(dir, 'motors'), { recursive: true });
  const json = JSON.parse(readFileSync(join(SCENARIOS, name), 'utf8'));
  edit(json);
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(json, null, 2));
  return path;
}
