import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, type Server } from 'node:http';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { extname, join, normalize } from 'node:path';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser, type Page } from 'playwright-core';
import { build } from 'vite';
import { executeInThread } from '../../src/dispersion/execute.js';
import { loadScenarioFile } from '../../src/scenario/file.js';
import { ROOT } from './cli-helpers.js';

/**
 * The browser adapter for real: test/pool/browser/ is bundled by Vite (as the web page will be)
 * and run in headless Chromium, with the pool on module Web Workers.
 */

const CHROMIUM = '/usr/bin/chromium';
const KEYS = ['east', 'north', 'apogee', 'flightTime', 'impactSpeed', 'impactAngle', 'impactMass', 'mode', 'status', 'steps'] as const;
const TYPES: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.mjs': 'text/javascript', '.map': 'application/json' };

/** The bytes the page sent, in an ArrayBuffer of their own. */
function bytes(base64: string): ArrayBuffer {
  const b = Buffer.from(base64, 'base64');
  return b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer;
}

const { scenario } = loadScenarioFile(join(ROOT, 'scenarios/club-rocket.json'));

describe.skipIf(!existsSync(CHROMIUM))('the pool on Web Workers in Chromium (needs /usr/bin/chromium)', () => {
  let bundle: string;
  let server: Server;
  let browser: Browser;
  let page: Page;

  beforeAll(async () => {
    bundle = mkdtempSync(join(tmpdir(), 'strewn-pool-page-'));
    await build({ root: join(ROOT, 'test/pool/browser'), configFile: false, logLevel: 'error', worker: { format: 'es' }, build: { outDir: bundle, emptyOutDir: true } });
    server = createServer((request, response) => {
      const path = normalize(join(bundle, decodeURIComponent(new URL(request.url ?? '/', 'http://x').pathname)));
      const file = path.endsWith('/') ? join(path, 'index.html') : path;
      if (!file.startsWith(bundle) || !existsSync(file)) return void response.writeHead(404).end();
      response.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' }).end(readFileSync(file));
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: ['--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'] });
    page = await browser.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`);
    await page.waitForFunction(() => 'strewnPool' in window, null, { timeout: 20_000 }).catch(() => {
      throw new Error(`the test page did not start: ${errors.join('; ')}`);
    });
  });

  afterAll(async () => {
    await browser?.close();
    server?.close();
    if (bundle) rmSync(bundle, { recursive: true, force: true });
  });

  it('reports the browser’s core count as the default', async () => {
    const cores = await page.evaluate(() => (window as any).strewnPool.cores);
    expect(cores).toBe(await page.evaluate(() => navigator.hardwareConcurrency));
  });

  it('flies the same samples on 1 and 3 workers, bit for bit, and agrees with Node', async () => {
    const samples = 300;
    const runs = [];
    for (const workers of [1, 3]) {
      const got = await page.evaluate(([sc, n, w]) => (window as any).strewnPool.run(sc, n, 'web', w), [scenario, samples, workers] as const);
      expect(got.progress.at(-1)).toBe(samples);
      expect(got.progress.length).toBe(6);
      runs.push(got.arrays as Record<(typeof KEYS)[number], string>);
    }
    for (const key of KEYS) expect(runs[1][key] === runs[0][key], `${key}: 3 workers vs 1`).toBe(true);

    // Chromium's V8 is another build than Node's, so its Math functions may round differently in
    // the last bit: the same flights to well under a millimetre, not bit-identical.
    const reference = await executeInThread(scenario, { samples, seed: 'web' });
    const east = new Float64Array(bytes(runs[0].east));
    const north = new Float64Array(bytes(runs[0].north));
    const status = new Uint8Array(bytes(runs[0].status));
    let worst = 0;
    for (let i = 0; i < samples; i++) worst = Math.max(worst, Math.hypot(east[i] - reference.east[i], north[i] - reference.north[i]));
    console.log(`browser vs Node: largest landing difference ${worst.toExponential(2)} m over ${samples} samples`);
    expect(worst).toBeLessThan(1e-3);
    expect(Array.from(status)).toEqual(Array.from(reference.status));
  });

  it('a cancel call stops the workers within a second', async () => {
    const outcome = await page.evaluate((sc) => (window as any).strewnPool.cancelAfter(sc, 500), scenario);
    expect(outcome.ended).toBe('AbortError');
    expect(outcome.stopMs).toBeLessThan(1000);
  });
});
