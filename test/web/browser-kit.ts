import { existsSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { build } from 'vite';

/**
 * The browser pieces the tests and the bench share, free of vitest so the bench (compiled to
 * dist/) can use them too: building the page with Vite, a tiny static server on 127.0.0.1, and
 * Debian's chromium through playwright-core.
 */

const twoUp = resolve(fileURLToPath(new URL('../..', import.meta.url)));
/** The project folder, whether this file runs from test/web (vitest) or dist/test/web (the bench). */
export const PROJECT = existsSync(join(twoUp, 'package.json')) ? twoUp : resolve(twoUp, '..');
export const ARTIFACTS = join(PROJECT, 'test', '.artifacts', 'web');

/** Builds the page into `outDir` with the project's vite.config.ts (the same as npm run build:web). */
export async function buildWebApp(outDir: string): Promise<void> {
  await build({ configFile: join(PROJECT, 'vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true } });
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript',
  '.mjs': 'text/javascript',
  '.css': 'text/css',
  '.json': 'application/json',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
};

export interface StaticServer {
  url: string;
  close(): Promise<void>;
}

/** Serves a folder on 127.0.0.1 at a free port; `prefix` puts it in a sub-folder (tests relative paths). */
export async function serveStatic(root: string, prefix = '/'): Promise<StaticServer> {
  const base = resolve(root);
  const server: Server = createServer(async (request, response) => {
    const path = decodeURIComponent(new URL(request.url ?? '/', 'http://x').pathname);
    if (!path.startsWith(prefix)) {
      response.writeHead(404).end();
      return;
    }
    let file = normalize(join(base, path.slice(prefix.length)));
    if (file !== base && !file.startsWith(base + sep)) {
      response.writeHead(403).end();
      return;
    }
    try {
      if ((await stat(file)).isDirectory()) file = join(file, 'index.html');
      const body = await readFile(file);
      response.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' }).end(body);
    } catch {
      response.writeHead(404).end();
    }
  });
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const address = server.address();
  if (address === null || typeof address === 'string') throw new Error('server has no port');
  return {
    url: `http://127.0.0.1:${address.port}${prefix}`,
    close: () => new Promise<void>((done) => server.close(() => done())),
  };
}

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}
