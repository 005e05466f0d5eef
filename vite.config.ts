import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

/**
 * The browser workspace (web/). `npm start` serves it on 127.0.0.1; `npm run build:web` writes
 * static files to dist-web/ with relative paths, so the folder works from any static host or
 * sub-folder. The page imports the engine straight from src/ and the demos from scenarios/.
 */
const projectRoot = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  root: fileURLToPath(new URL('./web', import.meta.url)),
  base: './',
  publicDir: false,
  resolve: {
    // The review sheet reads pdfkit's output with Node's stream read(); the page gives pdfkit's
    // browser build that one method (web/src/exports/pdfkit-browser.ts).
    alias: [{ find: /^pdfkit$/, replacement: fileURLToPath(new URL('./web/src/exports/pdfkit-browser.ts', import.meta.url)) }],
  },
  // maplibre's worker and the engine workers are ES modules.
  worker: { format: 'es' },
  build: {
    outDir: fileURLToPath(new URL('./dist-web', import.meta.url)),
    emptyOutDir: true,
    target: 'es2022',
    // maplibre alone is about a megabyte; one large chunk is expected, not a mistake.
    chunkSizeWarningLimit: 2500,
  },
  server: {
    host: '127.0.0.1',
    // The page imports ../src and ../scenarios, outside the web/ root.
    fs: { allow: [projectRoot] },
  },
  preview: { host: '127.0.0.1' },
});
