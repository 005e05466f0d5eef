import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { PROJECT, mapIdle, runAndWait, setField, workspaceSession } from './harness.js';

/**
 * One look on every screen: the workspace at 360, 800 and 1440 px wide. At each width every
 * table cell and panel keeps its content inside its box (scrollWidth against clientWidth, a
 * common practice check, no source), the page never scrolls sideways, and screenshots of each
 * view go to test/.artifacts/web/screenshots/look-*.png for a person to look at. Also: the legend
 * folds and keeps off the zone's label, there is one review-sheet button, Ctrl+Z in a field
 * clears its error at once, printing shows the map, contour labels thin out on a small cloud,
 * and the demo says what it shows.
 */

const session = workspaceSession('-look');
const TIMEOUT = 150_000;

/** Elements of the visible panel whose content is wider than their box, as 'tag.class "text"'. */
async function overflowing(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    const root = document.querySelector('.tab-panel:not([hidden])');
    const boxes = [document.querySelector('.run-panel'), root, ...(root ? Array.from(root.querySelectorAll('table, caption, th, td, .figure, .field, .row, figure, .warnings')) : [])];
    for (const node of boxes) {
      if (!(node instanceof HTMLElement) || node.offsetParent === null) continue;
      if (node.scrollWidth > node.clientWidth + 1) out.push(`${node.tagName.toLowerCase()}.${node.className} "${(node.textContent ?? '').slice(0, 40)}" ${node.scrollWidth} > ${node.clientWidth}`);
    }
    // A table wider than the panel that holds it overflows even when each cell fits.
    if (root) for (const t of Array.from(root.querySelectorAll('table'))) if (t.getBoundingClientRect().right > root.getBoundingClientRect().right + 1) out.push(`table "${t.caption?.textContent ?? ''}" sticks out of the panel`);
    if (document.documentElement.scrollWidth > document.documentElement.clientWidth + 1) out.push(`page scrolls sideways: ${document.documentElement.scrollWidth} > ${document.documentElement.clientWidth}`);
    return out;
  });
}

async function openAt(width: number): Promise<Page> {
  const page = await session.open();
  await page.setViewportSize({ width, height: 900 });
  await mapIdle(page);
  return page;
}

async function keepOutLabelPoint(page: Page): Promise<{ x: number; y: number }> {
  return page.evaluate(() => {
    const f = window.__strewn!.sourceData('keepout-label').features[0]!;
    const [lon, lat] = (f.geometry as { coordinates: number[] }).coordinates;
    return window.__strewn!.screenPoint(lon!, lat!)!;
  });
}

async function legendBox(page: Page): Promise<{ x: number; y: number; width: number; height: number; open: boolean; corner: string }> {
  return page.evaluate(() => {
    const legend = document.querySelector<HTMLDetailsElement>('[data-test="legend"]')!;
    const r = legend.getBoundingClientRect();
    return { x: r.x, y: r.y, width: r.width, height: r.height, open: legend.open, corner: legend.dataset.corner ?? '' };
  });
}

const inside = (p: { x: number; y: number }, r: { x: number; y: number; width: number; height: number }) => p.x >= r.x && p.x <= r.x + r.width && p.y >= r.y && p.y <= r.y + r.height;

describe('one look at 360, 800 and 1440 px', () => {
  for (const width of [360, 800, 1440]) {
    it(
      `fits every panel at ${width} px, and keeps the legend off the zone's label`,
      async () => {
        const page = await openAt(width);
        // The demo says what it shows, before anything runs.
        expect(await page.locator('[data-test="demo-intro"]').innerText()).toMatch(/on purpose.*spectators.*wind limits/s);
        await page.screenshot({ path: join(session.shots, `look-${width}-opened.png`), fullPage: true });
        await setField(page, 'run.samples', '400');
        expect(await runAndWait(page)).toBe('finished');
        await mapIdle(page);
        // Warnings first: in the run's summary line and at the top of Findings.
        expect(await page.locator('[data-test="run-warnings"]').innerText()).toMatch(/\d+ warnings?/);
        const first = await page.locator('[data-test="findings"] > *').first().getAttribute('data-finding');
        expect(first).toBe('warnings');

        // The legend: folded on a narrow map, and never over the zone's label when open.
        const legend = await legendBox(page);
        const mapWidth = await page.evaluate(() => document.getElementById('map')!.clientWidth);
        expect(legend.open).toBe(mapWidth >= 640);
        if (!legend.open) {
          await page.locator('[data-test="legend"] summary').click();
          await mapIdle(page);
        }
        const opened = await legendBox(page);
        expect(opened.open).toBe(true);
        // Open, it stays inside the map (its list scrolls), so its fold control is never under the top bar.
        const mapBox = (await page.locator('#map').boundingBox())!;
        expect(opened.y >= mapBox.y - 1 && opened.y + opened.height <= mapBox.y + mapBox.height + 1, `legend ${JSON.stringify(opened)} within the map ${JSON.stringify(mapBox)}`).toBe(true);
        if (width >= 800) expect(inside(await keepOutLabelPoint(page), opened), `legend (${opened.corner}) over the zone label`).toBe(false);
        await page.screenshot({ path: join(session.shots, `look-${width}-legend-open.png`), fullPage: width < 720 });
        await page.locator('[data-test="legend"] summary').click();

        for (const tab of ['findings', 'setup', 'files', 'map']) {
          await page.locator(`[data-tab="${tab}"]`).click();
          expect(await overflowing(page), `${tab} at ${width} px`).toEqual([]);
          await page.locator('.side').screenshot({ path: join(session.shots, `look-${width}-${tab}.png`) });
        }
        for (const units of ['imperial', 'metric']) {
          await page.locator(`label[for="units-${units}"]`).click();
          await page.locator('[data-tab="findings"]').click();
          expect(await overflowing(page), `findings in ${units} at ${width} px`).toEqual([]);
        }
        await page.locator('label[for="units-imperial"]').click();
        await page.locator('[data-tab="findings"]').click();
        await page.locator('.side').screenshot({ path: join(session.shots, `look-${width}-findings-imperial.png`) });
        await page.locator('label[for="units-metric"]').click();

        // Wind limits on a tiny grid: the table and the chart fit too.
        await page.locator('[data-tab="limits"]').click();
        await page.locator('[data-test="envelope-directions"]').fill('240:270:30');
        await page.locator('[data-test="envelope-speeds"]').fill('0:6:2');
        await page.locator('[data-test="envelope-samples"]').fill('60');
        await page.locator('[data-test="envelope-compute"]').click();
        await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes(window.__strewn!.envelope().phase), null, { timeout: 120_000 });
        expect(await page.evaluate(() => window.__strewn!.envelope().phase)).toBe('finished');
        await expect.poll(() => page.locator('[data-test="envelope-chart"] svg').count()).toBe(1);
        expect(await overflowing(page), `wind limits at ${width} px`).toEqual([]);
        // A limit and its unit stay on one line: the unit is in the column's head.
        expect(await page.locator('table.envelope-table thead').innerText()).toContain('Limit (m/s)');
        await page.locator('.side').screenshot({ path: join(session.shots, `look-${width}-limits.png`) });
        await page.screenshot({ path: join(session.shots, `look-${width}-page.png`), fullPage: width < 720 });
      },
      TIMEOUT,
    );
  }
});

/** Opens a scenario file through the page's file picker, as a user would. */
async function openScenario(page: Page, name: string, scenario: unknown): Promise<void> {
  await page.locator('[data-tab="setup"]').click();
  await page.locator('#scenario-file-input').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(scenario)) });
  await expect.poll(() => page.evaluate(() => window.__strewn!.scenario().name)).toBe((scenario as { name: string }).name);
}

const pageUnits = (page: Page) => page.evaluate(() => (document.querySelector<HTMLInputElement>('#units-imperial')!.checked ? 'imperial' : 'metric'));

/** The texts of an SVG drawing, one per element, in document order. */
const svgTexts = (svg: string) => [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);

describe('export, print, undo and labels', () => {
  it(
    'takes its units and paper from the scenario\'s run.units and run.paper, and draws map.svg in the page\'s units',
    async () => {
      const page = await openAt(1440);
      expect(await pageUnits(page)).toBe('metric');
      const shell = JSON.parse(readFileSync(join(PROJECT, 'scenarios', 'display-shell.json'), 'utf8'));
      // A scenario that names imperial units is shown in them, on Letter (the paper follows the
      // units when the scenario names none; common practice, no source).
      await openScenario(page, 'imperial.json', { ...shell, name: 'Shell, imperial', run: { ...shell.run, samples: 200, units: 'imperial' } });
      expect(await pageUnits(page)).toBe('imperial');
      expect(await runAndWait(page)).toBe('finished');
      await page.locator('[data-tab="findings"]').click();
      expect(await page.locator('[data-finding="farthest"]').innerText()).toMatch(/\d ft/);
      await page.locator('[data-tab="files"]').click();
      expect(await page.locator('[data-export="sheet"]').innerText()).toContain('imperial, US Letter');
      // map.svg is the sheet's map page redrawn in the page's units and paper (612 × 792 pt is
      // US Letter, 595.28 × 841.89 pt is A4: ISO 216 and ANSI/ASME Y14.1).
      const mapSvg = async () => {
        const [file] = await Promise.all([page.waitForEvent('download'), page.locator('[data-export="map.svg"]').click()]);
        const path = join(session.work, file.suggestedFilename());
        await file.saveAs(path);
        return { name: file.suggestedFilename(), svg: readFileSync(path, 'utf8') };
      };
      const imperial = await mapSvg();
      expect(imperial.name).toBe('map-imperial-letter.svg');
      expect(imperial.svg).toMatch(/<svg[^>]* width="612pt" height="792pt"/);
      const imperialTexts = svgTexts(imperial.svg);
      expect(imperialTexts.some((t) => /region \+ [\d,]+ ft/.test(t)), 'zone label in feet').toBe(true);
      expect(imperialTexts.filter((t) => /\d m$/.test(t)), 'labels in metres on an imperial map').toEqual([]);
      // The switch at the top still decides; the paper follows it.
      await page.locator('label[for="units-metric"]').click();
      const metric = await mapSvg();
      expect(metric.name).toBe('map-metric-a4.svg');
      expect(metric.svg).toMatch(/<svg[^>]* width="595.2\d*pt" height="841.8\d*pt"/);
      expect(svgTexts(metric.svg).some((t) => /region \+ [\d,]+ m$/.test(t)), 'zone label in metres').toBe(true);
      expect(svgTexts(metric.svg).filter((t) => /\d ft$/.test(t)), 'labels in feet on a metric map').toEqual([]);

      // A scenario's own paper wins over the one the units suggest.
      await openScenario(page, 'letter.json', { ...shell, name: 'Shell, metric on Letter', run: { ...shell.run, units: 'metric', paper: 'letter' } });
      expect(await pageUnits(page)).toBe('metric');
      await page.locator('[data-tab="files"]').click();
      // (No run yet: the sheet's row is hidden, its words already follow.)
      expect(await page.locator('[data-export="sheet"]').textContent()).toContain('metric, US Letter');
      expect(await page.locator('#sheet-paper option[value="auto"]').textContent()).toContain('US Letter');
      // A scenario that names no units leaves the page's choice alone.
      await page.locator('label[for="units-imperial"]').click();
      await openScenario(page, 'plain.json', { ...shell, name: 'Shell, no units named' });
      expect(await pageUnits(page)).toBe('imperial');
      expect(await page.locator('[data-export="sheet"]').textContent()).toContain('imperial, US Letter');
    },
    TIMEOUT,
  );

  it(
    'offers one review-sheet button in the page units and paper, and prints the map',
    async () => {
      const page = await openAt(1440);
      await setField(page, 'run.samples', '300');
      expect(await runAndWait(page)).toBe('finished');
      await page.locator('[data-tab="files"]').click();
      const sheetButtons = page.locator('#panel-files button').filter({ hasText: /sheet/i });
      expect(await sheetButtons.count()).toBe(1);
      expect(await page.locator('[data-export="sheet.pdf"]').count()).toBe(0);
      const button = page.locator('[data-export="sheet"]');
      expect(await button.innerText()).toContain('metric, A4');
      // A4 or Letter follows the units unless a paper is chosen (common practice, no source).
      await page.locator('label[for="units-imperial"]').click();
      expect(await button.innerText()).toContain('imperial, US Letter');
      await page.locator('#sheet-paper').selectOption('a4');
      expect(await button.innerText()).toContain('imperial, A4');
      const [file] = await Promise.all([page.waitForEvent('download'), button.click()]);
      expect(file.suggestedFilename()).toBe('sheet-imperial-a4.pdf');

      // The browser's print: the map as drawn, captured before printing (not a blank canvas), with
      // the legend open in print even when the reader had folded it on the screen.
      await page.locator('[data-test="legend"] summary').click();
      expect((await legendBox(page)).open).toBe(false);
      await page.evaluate(() => window.dispatchEvent(new Event('beforeprint')));
      await page.emulateMedia({ media: 'print' });
      const picture = await page.evaluate(async () => {
        const img = document.querySelector<HTMLImageElement>('[data-test="print-map"]')!;
        await img.decode();
        const c = document.createElement('canvas');
        c.width = img.naturalWidth;
        c.height = img.naturalHeight;
        const g = c.getContext('2d')!;
        g.drawImage(img, 0, 0);
        const d = g.getImageData(0, 0, c.width, c.height).data;
        const colours = new Set<number>();
        for (let i = 0; i < d.length; i += 4 * 97) colours.add((d[i]! << 16) | (d[i + 1]! << 8) | d[i + 2]!);
        const r = img.getBoundingClientRect();
        return { width: img.naturalWidth, colours: colours.size, shown: r.width > 100 && r.height > 100, note: getComputedStyle(document.querySelector('[data-test="print-note"]')!).display };
      });
      expect(picture.width).toBeGreaterThan(100);
      // A blank or transparent capture has one colour; the map has the basemap, zone and landings.
      expect(picture.colours).toBeGreaterThan(20);
      expect(picture.shown).toBe(true);
      expect(picture.note).not.toBe('none');
      // The legend is printed open, whole, inside the map's frame and clear of the wind card.
      const printedLegend = await legendBox(page);
      expect(printedLegend.open).toBe(true);
      const frames = await page.evaluate(() => {
        const box = (selector: string) => {
          const r = document.querySelector(selector)!.getBoundingClientRect();
          return { x: r.x, y: r.y, width: r.width, height: r.height };
        };
        const legend = document.querySelector<HTMLElement>('[data-test="legend"]')!;
        return { map: box('.map-area'), wind: box('.wind-card'), legendCut: legend.scrollHeight > legend.clientHeight + 1 };
      });
      const corners = [[printedLegend.x, printedLegend.y], [printedLegend.x + printedLegend.width, printedLegend.y + printedLegend.height]] as const;
      for (const [x, y] of corners) expect(inside({ x, y }, { ...frames.map, x: frames.map.x - 1, y: frames.map.y - 1, width: frames.map.width + 2, height: frames.map.height + 2 }), `printed legend (${printedLegend.corner}) within the map`).toBe(true);
      const apart = printedLegend.y >= frames.wind.y + frames.wind.height || printedLegend.y + printedLegend.height <= frames.wind.y || printedLegend.x >= frames.wind.x + frames.wind.width || printedLegend.x + printedLegend.width <= frames.wind.x;
      expect(apart, 'printed legend clear of the wind card').toBe(true);
      expect(frames.legendCut, 'printed legend cut short').toBe(false);
      await page.screenshot({ path: join(session.shots, 'look-print.png') });
      await page.pdf({ path: join(session.work, 'printed-page.pdf'), format: 'A4' });
      await page.emulateMedia({ media: 'screen' });
      await page.evaluate(() => window.dispatchEvent(new Event('afterprint')));
      expect((await legendBox(page)).open, 'the reader\'s fold comes back after printing').toBe(false);
    },
    TIMEOUT,
  );

  it(
    'validates on every input: Ctrl+Z in a field restores a valid value and Run at once',
    async () => {
      const page = await openAt(1440);
      await page.locator('[data-tab="setup"]').click();
      const input = page.locator('input[data-path="weather.wind.speed"]');
      const before = await input.inputValue();
      await input.click();
      await page.keyboard.press('End');
      await page.keyboard.type('x');
      const message = page.locator('[data-message-for="weather.wind.speed"]');
      await expect.poll(() => message.innerText()).not.toBe('');
      expect(await page.locator('[data-test="run"]').isDisabled()).toBe(true);
      await page.keyboard.press('Control+z');
      // Still in the box (no blur), and already valid again.
      expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.dataset.path)).toBe('weather.wind.speed');
      expect(await input.inputValue()).toBe(before);
      await expect.poll(() => message.innerText()).toBe('');
      expect(await input.getAttribute('aria-invalid')).toBe('false');
      expect(await page.locator('[data-test="run"]').isDisabled()).toBe(false);
    },
    TIMEOUT,
  );

  it(
    'thins the contour labels when the cloud is small on the screen',
    async () => {
      const page = await openAt(1440);
      await setField(page, 'run.samples', '300');
      expect(await runAndWait(page)).toBe('finished');
      await page.evaluate(() => window.__strewn!.zoomTo(12.5));
      await mapIdle(page);
      const labels = await page.evaluate(() => window.__strewn!.placedLabels('contour-label'));
      expect(labels.length).toBeGreaterThan(0);
      // No two placed labels on top of each other (13 px text, about 30 px wide).
      for (let i = 0; i < labels.length; i++) for (let j = i + 1; j < labels.length; j++) {
        const a = labels[i]!;
        const b = labels[j]!;
        expect(Math.abs(a.x - b.x) > 30 || Math.abs(a.y - b.y) > 14, `${a.label} and ${b.label} overlap`).toBe(true);
      }
      await page.screenshot({ path: join(session.shots, 'look-small-cloud.png') });
    },
    TIMEOUT,
  );
});
