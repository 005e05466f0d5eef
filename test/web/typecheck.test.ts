import { execFileSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect, it } from 'vitest';

/**
 * The bundler strips types without checking them, so the browser tests alone would pass a page
 * with type errors; `npm run build:web` checks them, and so does this, as part of `npm test`.
 */
it('the page type-checks in strict mode', () => {
  const project = resolve(fileURLToPath(new URL('../..', import.meta.url)));
  const tsc = createRequire(import.meta.url).resolve('typescript/bin/tsc');
  let output = '';
  try {
    execFileSync(process.execPath, [tsc, '-p', 'web/tsconfig.json'], { cwd: project, encoding: 'utf8', stdio: 'pipe' });
  } catch (error) {
    output = String((error as { stdout?: string }).stdout ?? error);
  }
  expect(output).toBe('');
}, 120_000);
