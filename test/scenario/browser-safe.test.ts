import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = resolve(dirname(fileURLToPath(import.meta.url)), '../../src/scenario');

/** Every module specifier a source file imports (static `from '…'` and dynamic `import('…')`). */
function importsOf(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  return [...text.matchAll(/\bfrom\s+'([^']+)'|\bimport\(\s*'([^']+)'\s*\)/g)].map((m) => (m[1] ?? m[2])!);
}

/** All files reachable from `entry` through relative imports, and the packages they import. */
function closure(entry: string): { files: string[]; packages: string[] } {
  const files = new Set<string>();
  const packages = new Set<string>();
  const visit = (file: string): void => {
    if (files.has(file)) return;
    files.add(file);
    for (const spec of importsOf(file)) {
      if (spec.startsWith('.')) visit(join(dirname(file), spec.replace(/\.js$/, '.ts')));
      else packages.add(spec);
    }
  };
  visit(entry);
  return { files: [...files], packages: [...packages] };
}

describe('browser use', () => {
  it('parseScenario and the hash import nothing from Node', () => {
    for (const entry of ['load.ts', 'hash.ts', 'json-text.ts']) {
      const { files, packages } = closure(join(SRC, entry));
      expect(files.length).toBeGreaterThan(0);
      expect(packages.filter((p) => p.startsWith('node:') || ['fs', 'path', 'crypto', 'os'].includes(p))).toEqual([]);
    }
  });

  it('the scan does see Node imports where they are (file.ts)', () => {
    expect(closure(join(SRC, 'file.ts')).packages).toContain('node:fs');
  });
});
