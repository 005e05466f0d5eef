import { rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

/**
 * The command line and its worker entries, each bundled into few files (`npm run build` runs
 * this after tsc). Why: on Node 20 a start-up spends most of its time finding, reading and
 * linking modules one by one (zod alone is 95 files; jstat, being CommonJS, is first scanned for
 * its exports), and Node 20 has no module compile cache. The same code as a bundle loads in
 * about half the CPU time: `strewn check` of a demo took 0.46 CPU-seconds, 0.29 bundled.
 * Not a V8 code cache: Node 20 offers none for ES modules, and the packages that add one for
 * CommonJS write their cache into a temporary folder at run time, a file nobody asked for.
 * Chunks are rolldown's own split; grouping them by hand saved nothing measurable.
 *
 * The bundles are written over the files tsc made for the same entries (dist/src/cli/main.js,
 * dist/workers/node-entry.js, sheet-entry.js, study-entry.js: threads are started by path), with
 * their shared chunks in dist/bundle/. So `npx tsc` alone still leaves a runnable, if slower,
 * command line (tsc rewrites those entry files and the chunks go unused), never a stale one. Commands
 * still load their code only when called: each dynamic import becomes a chunk of its own.
 *
 * pdfkit stays outside: it reads its font metrics from files beside its own code.
 */
const root = fileURLToPath(new URL('.', import.meta.url));
const external = ['pdfkit'];
const chunkFolder = 'bundle';

export default defineConfig({
  root,
  publicDir: false,
  configFile: false,
  logLevel: 'warn',
  // Chunk names carry a content hash: the chunks of an earlier build are removed first.
  plugins: [{ name: 'strewn-clear-chunks', buildStart: () => rmSync(fileURLToPath(new URL(`./dist/${chunkFolder}`, import.meta.url)), { recursive: true, force: true }) }],
  build: {
    ssr: true,
    target: 'node20',
    outDir: 'dist',
    emptyOutDir: false,
    copyPublicDir: false,
    reportCompressedSize: false,
    sourcemap: true,
    minify: false,
    rolldownOptions: {
      input: {
        'src/cli/main': 'src/cli/main.ts',
        'workers/node-entry': 'workers/node-entry.ts',
        'workers/sheet-entry': 'workers/sheet-entry.ts',
        'workers/study-entry': 'workers/study-entry.ts',
      },
      external,
      output: {
        format: 'esm',
        entryFileNames: '[name].js',
        chunkFileNames: `${chunkFolder}/[name]-[hash].js`,
      },
    },
  },
  ssr: { target: 'node', noExternal: true, external },
});
