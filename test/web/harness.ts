import { mkdirSync, rmSync } from 'node:fs';
import { afterAll, afterEach, beforeAll, expect } from 'vitest';
import { join } from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { ARTIFACTS, buildWebApp, launchChromium, serveStatic, type StaticServer } from './browser-kit.js';

export { ARTIFACTS, PROJECT, buildWebApp, launchChromium, serveStatic, type StaticServer } from './browser-kit.js';

/**
 * What the browser tests share: building the page with Vite, a tiny static server on 127.0.0.1,
 * and Debian's chromium driven through playwright-core (test/web/browser-kit.ts), with every
 * request that leaves the machine blocked and every console error recorded.
 */

/** Console noise of the browser itself, not of the page (see /work/shared/browser.md). */
const HARMLESS = [/GPU stall due to ReadPixels/i, /unexpected operator/i, /dbus/i];

export interface WatchedPage {
  context: BrowserContext;
  page: Page;
  /** Console errors and uncaught page errors so far. */
  errors: string[];
  /** Requests to anything but 127.0.0.1 (all blocked). */
  offsite: string[];
}

/** A fresh context and page that may talk only to 127.0.0.1, with its errors collected. */
export async function watchedPage(browser: Browser, viewport = { width: 1400, height: 900 }): Promise<WatchedPage> {
  const context = await browser.newContext({ viewport, acceptDownloads: true });
  const page = await context.newPage();
  const errors: string[] = [];
  const offsite: string[] = [];
  await context.route('**/*', (route) => {
    const url = new URL(route.request().url());
    if (url.protocol === 'data:' || url.protocol === 'blob:' || url.hostname === '127.0.0.1') return route.continue();
    offsite.push(url.href);
    return route.abort('blockedbyclient');
  });
  page.on('console', (message) => {
    if (message.type() === 'error' && !HARMLESS.some((h) => h.test(message.text()))) errors.push(message.text());
  });
  page.on('pageerror', (error) => errors.push(`page error: ${error.message}`));
  return { context, page, errors, offsite };
}

/** Waits until the map has drawn everything it was given (the page's test hook). */
export async function mapIdle(page: Page): Promise<void> {
  await page.waitForFunction(() => window.__strewn !== undefined);
  await page.evaluate(() => window.__strewn!.idle());
}

/** Presses Run and waits until the run has finished (or failed, which the caller checks). */
export async function runAndWait(page: Page, timeout = 120_000): Promise<string> {
  await page.locator('[data-test="run"]').click();
  await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes(window.__strewn!.run().phase), null, { timeout });
  return page.evaluate(() => window.__strewn!.run().phase);
}

/** Sets a field on the Setup tab by its scenario path and commits it (as leaving the box does). */
export async function setField(page: Page, path: string, value: string): Promise<void> {
  await page.locator('[data-tab="setup"]').click();
  const input = page.locator(`input[data-path="${path}"]`);
  await input.fill(value);
  await input.press('Enter');
}

/**
 * The set-up every workspace test file shares: build the page into `dist<suffix>`, serve it from a
 * sub-folder, one chromium for the file, and after each test a check that nothing left the machine
 * and nothing was logged as an error. `suffix` keeps files that run side by side apart.
 */
export function workspaceSession(suffix: string): { shots: string; work: string; open(): Promise<Page> } {
  const dist = join(ARTIFACTS, `dist${suffix}`);
  const shots = join(ARTIFACTS, 'screenshots');
  const work = join(ARTIFACTS, `work${suffix}`);
  let server: StaticServer;
  let browser: Browser;
  let current: WatchedPage | null = null;

  beforeAll(async () => {
    rmSync(work, { recursive: true, force: true });
    mkdirSync(shots, { recursive: true });
    mkdirSync(work, { recursive: true });
    await buildWebApp(dist);
    server = await serveStatic(dist, '/strewn/');
    browser = await launchChromium();
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  afterEach(async () => {
    const watched = current;
    current = null;
    if (!watched) return;
    await watched.context.close();
    expect(watched.offsite, 'requests that left the machine').toEqual([]);
    expect(watched.errors, 'console errors').toEqual([]);
  });

  return {
    shots,
    work,
    async open() {
      current = await watchedPage(browser);
      await current.page.goto(server.url);
      await mapIdle(current.page);
      return current.page;
    },
  };
}
