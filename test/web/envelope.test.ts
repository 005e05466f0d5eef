import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { inputWords } from '../../src/report/sheet/input-names.js';
import { runAndWait, setField, workspaceSession } from './harness.js';

/**
 * The "Wind limits" tab and the sensitivity bars of the Findings tab, in Debian's chromium: the
 * page built with Vite into its own folder (so it can run beside workspace.test.ts), served on
 * 127.0.0.1, nothing fetched from outside, no console errors. Screenshots go to
 * test/.artifacts/web/screenshots/.
 */

const TIMEOUT = 180_000;

const session = workspaceSession('-envelope');
const openWorkspace = () => session.open();

async function fill(page: Page, test: string, value: string): Promise<void> {
  const input = page.locator(`[data-test="${test}"]`);
  await input.fill(value);
}

describe('wind limits in the page', () => {
  it(
    'computes a tiny grid, draws the polar chart, and loads a clicked direction into the wind fields',
    async () => {
      const page = await openWorkspace();
      await page.locator('[data-tab="limits"]').click();
      await expect.poll(() => page.locator('[data-test="envelope-chart"]').innerText()).toContain('No wind limits yet');

      // A bad grid is named and blocks the button; nothing runs.
      await fill(page, 'envelope-directions', '0:400:90');
      expect(await page.locator('[data-test="envelope-directions"]').getAttribute('aria-invalid')).toBe('true');
      expect(await page.locator('.envelope-panel').innerText()).toContain("Directions: '0:400:90'");
      expect(await page.locator('[data-test="envelope-compute"]').isDisabled()).toBe(true);

      await fill(page, 'envelope-directions', '0:90:90');
      await fill(page, 'envelope-speeds', '0:4:2');
      await fill(page, 'envelope-samples', '60');
      expect(await page.locator('[data-test="envelope-plan"]').innerText()).toContain('2 directions × 3 speeds');
      const hashBefore = await page.evaluate(() => window.__strewn!.scenario().hash);
      await page.locator('[data-test="envelope-compute"]').click();
      await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes(window.__strewn!.envelope().phase), null, { timeout: 150_000 });
      const envelope = await page.evaluate(() => window.__strewn!.envelope());
      expect(envelope.phase).toBe('finished');
      expect(envelope.hash).toBe(hashBefore);
      expect(envelope.limits!.map((d) => d.from)).toEqual([0, 90]);
      for (const d of envelope.limits!) expect(d.limit === null || [0, 2, 4].includes(d.limit)).toBe(true);
      expect(await page.locator('[data-test="envelope-status"]').innerText()).toContain('Finished');

      // The chart is the command line's drawing: the envelope outline, one marker per direction,
      // the forecast marker and the verdict, inside an <svg> of this page.
      const chart = page.locator('[data-test="envelope-chart"] svg');
      await expect.poll(() => chart.count()).toBe(1);
      expect(await chart.locator('#envelope').count()).toBe(1);
      expect(await chart.locator('.limit, .above-grid').count()).toBe(2);
      expect(await chart.locator('#forecast').count()).toBe(1);
      // The demo's forecast (250°) lies outside this small fan of directions, and the chart says so.
      expect(await chart.locator('#verdict').textContent()).toContain('Forecast direction lies outside the grid of directions');
      expect(await page.locator('[data-test="envelope-limits"] tbody tr').count()).toBe(2);
      await page.locator('[data-test="envelope-chart"]').scrollIntoViewIfNeeded();
      await page.screenshot({ path: join(session.shots, 'envelope-01-chart.png') });

      // Click on the chart three quarters of the way out along the east spoke: wind from 90°, at
      // the grid speed nearest to three quarters of the outermost ring.
      const spoke = await chart.locator('path.spoke[data-from="90"]').boundingBox();
      expect(spoke).not.toBeNull();
      await page.mouse.click(spoke!.x + spoke!.width * 0.75, spoke!.y + spoke!.height / 2);
      await expect.poll(() => page.evaluate(() => window.__strewn!.wind().from)).toBe(90);
      const wind = await page.evaluate(() => window.__strewn!.wind());
      expect([0, 2, 4]).toContain(wind.speed);
      expect(await page.locator('[data-test="envelope-picked"]').innerText()).toContain('from 90°');
      // The limits still apply (only the wind changed): no stale note, and the marker moved there.
      expect(await page.locator('[data-test="envelope-stale"]').isHidden()).toBe(true);
      await expect.poll(() => page.locator('[data-test="envelope-chart"] svg #forecast').getAttribute('data-from')).toBe('90');
      expect(await page.locator('[data-test="envelope-chart"] svg #verdict').textContent()).toMatch(/Forecast .* from 90° is (inside|OUTSIDE) the limits/);
      await page.screenshot({ path: join(session.shots, 'envelope-02-picked.png') });

      // The Setup tab shows the loaded wind.
      await page.locator('[data-tab="setup"]').click();
      expect(await page.locator('input[data-path="weather.wind.from"]').inputValue()).toBe('90');
      expect(Number(await page.locator('input[data-path="weather.wind.speed"]').inputValue())).toBeCloseTo(wind.speed, 6);

      // A keyboard user loads a direction's limit from the table.
      await page.locator('[data-tab="limits"]').click();
      await page.locator('[data-test="envelope-limits"] button[data-load-from="0"]').click();
      await expect.poll(() => page.evaluate(() => window.__strewn!.wind().from)).toBe(0);

      // The Files tab offers the envelope's files; envelope.json carries the scenario's hash.
      await page.locator('[data-tab="files"]').click();
      expect(await page.locator('[data-test="envelope-exports"] button').allInnerTexts()).toEqual(['envelope.pdf', 'envelope.svg', 'envelope.json', 'envelope.csv']);
      const [file] = await Promise.all([page.waitForEvent('download'), page.locator('[data-export="envelope.json"]').click()]);
      const path = join(session.work, file.suggestedFilename());
      await file.saveAs(path);
      const saved = JSON.parse(readFileSync(path, 'utf8'));
      expect(saved.scenarioHash).toBe(hashBefore);
      expect(saved.limits.map((d: { limit: number | null }) => d.limit)).toEqual(envelope.limits!.map((d) => d.limit));
    },
    TIMEOUT,
  );

  it(
    'draws what drives the landing spread as bars in Findings, with plain input names',
    async () => {
      const page = await openWorkspace();
      await setField(page, 'run.samples', '400');
      expect(await runAndWait(page)).toBe('finished');
      const summary = await page.evaluate(() => JSON.parse(JSON.stringify(window.__strewn!.summary())));
      await page.locator('[data-tab="findings"]').click();
      const figure = page.locator('[data-finding="sensitivity-chart"]');
      await expect.poll(() => figure.locator('svg').count()).toBe(1);
      const rows = figure.locator('svg .bar-row');
      expect(await rows.count()).toBe(summary.sensitivity.inputs.length);
      // The top input first, under its plain name ("failure mode", "descent rate (drag area)", …).
      const first = summary.sensitivity.inputs[0].input as string;
      expect(await rows.first().getAttribute('data-input')).toBe(first);
      expect(await rows.first().locator('text').first().textContent()).toBe(inputWords(first));
      for (const label of await rows.locator('text:first-child').allTextContents()) expect(label).not.toMatch(/^(wind|launch|motor|vehicle|recovery)\./);
      await figure.scrollIntoViewIfNeeded();
      await page.screenshot({ path: join(session.shots, 'envelope-03-findings-bars.png') });
    },
    TIMEOUT,
  );
});
