import { execFileSync } from 'node:child_process';
import { cpSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { Comparison } from '../../src/compare/compare.js';
import type { EventSummary } from '../../src/event/event-files.js';
import type { RunSummary } from '../../src/report/run-summary.js';
import { PROJECT, mapIdle, runAndWait, setField, workspaceSession } from './harness.js';

/**
 * The page's Event and Compare tabs and the drone route on its map, in Debian's chromium. The
 * figures are checked against the command line on the same files (`strewn event`, `strewn run`),
 * whose own checks against closed forms live in test/event and test/report; here the page must
 * show the same, draw it where it belongs, and say it in a panel that fits a phone.
 */
const session = workspaceSession('-event');
const SCEN = join(PROJECT, 'scenarios');

type Totals = { flights: number; items: EventSummary['items']; areas: EventSummary['areas']; total: EventSummary['total']; unionArea_m2: number | null; unionReach_m: number | null; riskMax: number; riskLines: { level: number; area_m2: number }[] };

/** The club-day plan with fewer samples per item, and its scenario and motor files, in a folder of its own. */
function smallPlan(samples: number): { dir: string; file: string; files: string[] } {
  const dir = join(session.work, `plan-${samples}`);
  mkdirSync(join(dir, 'motors'), { recursive: true });
  const plan = JSON.parse(readFileSync(join(SCEN, 'club-day.event.json'), 'utf8'));
  for (const item of plan.items) item.samples = samples;
  const file = join(dir, 'small.event.json');
  writeFileSync(file, JSON.stringify(plan, null, 2));
  for (const name of ['club-rocket.json', 'drone-route.json']) cpSync(join(SCEN, name), join(dir, name));
  for (const name of readdirSync(join(SCEN, 'motors'))) cpSync(join(SCEN, 'motors', name), join(dir, 'motors', name));
  return { dir, file, files: [file, join(dir, 'club-rocket.json'), join(dir, 'drone-route.json'), ...readdirSync(join(dir, 'motors')).map((n) => join(dir, 'motors', n))] };
}

function cli(args: string[]): string {
  return execFileSync(process.execPath, [join(PROJECT, 'dist/src/cli/main.js'), ...args], { cwd: PROJECT, encoding: 'utf8', env: { ...process.env, SOURCE_DATE_EPOCH: '1717243200' } });
}

async function download(page: Page, selector: string, name: string): Promise<string> {
  const [file] = await Promise.all([page.waitForEvent('download'), page.locator(selector).click()]);
  const path = join(session.work, name);
  await file.saveAs(path);
  return path;
}

const close = (a: number | null | undefined, b: number | null | undefined, rel = 1e-6) => {
  expect(a).not.toBeNull();
  expect(b).not.toBeNull();
  expect(Math.abs(a! - b!)).toBeLessThanOrEqual(rel * Math.max(Math.abs(a!), Math.abs(b!), 1e-12));
};

/** The side panel never scrolls sideways: everything fits its width (tables scroll in their own box). */
async function panelFits(page: Page): Promise<void> {
  const widths = await page.evaluate(() => {
    const side = document.getElementById('side')!;
    return { scroll: side.scrollWidth, client: side.clientWidth, body: document.documentElement.scrollWidth, view: window.innerWidth };
  });
  expect(widths.scroll, 'side panel width').toBeLessThanOrEqual(widths.client + 1);
  expect(widths.body, 'page width').toBeLessThanOrEqual(widths.view + 1);
}

async function shotsAtWidths(page: Page, name: string, refit?: () => Promise<void>): Promise<void> {
  for (const width of [360, 800, 1440]) {
    await page.setViewportSize({ width, height: 900 });
    await refit?.();
    await mapIdle(page);
    await panelFits(page);
    await page.screenshot({ path: join(session.shots, `${name}-${width}.png`), fullPage: width === 360 });
  }
  await page.setViewportSize({ width: 1400, height: 900 });
}

describe('workspace: the whole event', () => {
  it('opens an event plan with its files, flies every item on the workers with one progress bar and shows what strewn event shows', async () => {
    const plan = smallPlan(300);
    const cliOut = join(session.work, 'cli-event');
    const summary = JSON.parse(cli(['event', plan.file, '--out', cliOut, '--force', '--json', '--workers', '1'])) as EventSummary;

    const page = await session.open();
    await page.locator('[data-tab="event"]').click();
    await page.locator('[data-test="event-file"]').setInputFiles(plan.files);
    await expect.poll(() => page.locator('[data-test="event-name"]').innerText()).toBe(summary.name);
    await page.locator('[data-test="event-run"]').click();
    await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes(window.__strewnEvent!.phase()), null, { timeout: 240_000 });
    expect(await page.locator('[data-test="event-status"]').innerText()).toMatch(/^Finished: 900 samples/);
    // One progress bar for the whole event, full at the end: 3 items × 300 samples.
    expect(await page.locator('.event-panel progress').count()).toBe(1);
    expect(await page.evaluate(() => window.__strewnEvent!.progress())).toEqual({ done: 900, total: 900 });

    const t = (await page.evaluate(() => window.__strewnEvent!.totals())) as Totals;
    // The page and `strewn event` on the same files give the same figures (the two V8s differ
    // in the last bits of sin/exp, see DEVELOPERS.md, hence a relative 1e-6 and not equality).
    expect(t.flights).toBe(summary.flights);
    expect(t.items.map((r) => [r.name, r.flights, r.samples])).toEqual(summary.items.map((r) => [r.name, r.flights, r.samples]));
    t.items.forEach((r, i) => {
      close(r.keepOut_m2, summary.items[i]!.keepOut_m2);
      close(r.expectedCasualties ?? 0, summary.items[i]!.expectedCasualties ?? 0);
    });
    t.areas.forEach((a, i) => {
      expect(a.name).toBe(summary.areas[i]!.name);
      close(a.expectedLandings + 1, summary.areas[i]!.expectedLandings + 1);
      close(a.chanceOfAnyLanding + 1, summary.areas[i]!.chanceOfAnyLanding + 1);
    });
    close(t.total.expectedCasualties + 1, summary.total.expectedCasualties + 1);
    close(t.unionArea_m2, summary.zone.area_m2, 1e-4);
    close(t.riskMax, summary.individualRisk.max, 1e-4);
    // The drone item comes down with a failure rate λ = 0.005 per hour over T = 25 min: chance
    // 1 − e^(−λT) per operation (Poisson process, closed form).
    const drone = t.items.find((r) => r.name === 'Drone filming runs')!;
    expect(drone.chancePerFlight).toBeCloseTo(1 - Math.exp((-0.005 * 25) / 60), 12);

    // The tables and totals as the page prints them.
    expect(await page.locator('[data-event="items"] tbody tr').count()).toBe(3);
    expect(await page.locator('[data-event="areas"] tbody tr').count()).toBe(summary.areas.length);
    expect(await page.locator('[data-event="areas"] tbody tr').first().innerText()).toContain('Spectator line');
    expect(await page.locator('[data-event="casualties"]').innerText()).toMatch(/Expected casualties, whole event/);
    expect(await page.locator('[data-event="warnings"]').innerText()).toMatch(/Warnings \(\d+\)/);

    // On the map: the union and each item's zone, the risk lines, the event's areas with their
    // figures; the scenario's own results and pad step aside meanwhile.
    const zones = await page.evaluate(() => window.__strewnEvent!.sourceData('event-zones').features.map((f) => f.properties!.kind as string));
    expect(zones.filter((k) => k === 'union')).toHaveLength(1);
    expect(zones.filter((k) => k === 'item')).toHaveLength(3);
    expect(await page.evaluate(() => window.__strewnEvent!.sourceData('event-risk').features.length)).toBe(t.riskLines.length);
    expect(await page.evaluate(() => window.__strewnEvent!.visibility('landings'))).toBe('none');
    // The plan's own basemap replaces the scenario's (a plan may be for another place).
    const planJson = JSON.parse(readFileSync(plan.file, 'utf8'));
    expect(await page.evaluate(() => window.__strewnEvent!.sourceData('event-basemap').features.length)).toBe(planJson.site.basemap.features.length);
    expect(await page.evaluate(() => window.__strewnEvent!.visibility('basemap-field'))).toBe('none');
    await mapIdle(page);
    expect(await page.evaluate(() => window.__strewnEvent!.rendered('event-basemap-field'))).toBeGreaterThan(0);
    expect(await page.evaluate(() => window.__strewnEvent!.rendered('event-union-line'))).toBeGreaterThan(0);
    expect(await page.evaluate(() => window.__strewnEvent!.rendered('event-route-path'))).toBeGreaterThan(0);
    expect(await page.locator('[data-test="overlay-key"]').innerText()).toContain('Event keep-out zone (all items)');
    expect(await page.locator('[data-test="pad-marker"]').isVisible()).toBe(false);
    const labels = await page.evaluate(() => window.__strewnEvent!.sourceData('event-area-labels').features.map((f) => f.properties!.label as string));
    expect(labels.find((l) => l.startsWith('Duck pond'))).toMatch(/landings expected · any \d/);
    // Framed again at each width, as opening the plan at that width would frame it.
    await shotsAtWidths(page, 'event', async () => {
      await page.locator('[data-test="event-on-map"]').uncheck();
      await page.locator('[data-test="event-on-map"]').check();
    });

    // The event sheet: two pages, the plan's name and the sign-off.
    const pdf = await download(page, '[data-test="event-sheet"]', 'page-event-sheet.pdf');
    expect(readFileSync(pdf).subarray(0, 5).toString()).toBe('%PDF-');
    expect(execFileSync('pdfinfo', [pdf], { encoding: 'utf8' })).toMatch(/Pages:\s+2/);
    const text = execFileSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
    expect(text).toContain('Harrowmere club launch day');
    expect(text).toContain('Sign-off');
    const json = JSON.parse(readFileSync(await download(page, '[data-test="event-json"]', 'page-event.json'), 'utf8')) as EventSummary;
    expect(json.items.map((r) => r.scenarioHash)).toEqual(summary.items.map((r) => r.scenarioHash));

    // Back to the scenario: its layers return as they were.
    await page.locator('[data-test="event-on-map"]').uncheck();
    await expect.poll(() => page.evaluate(() => window.__strewnEvent!.visibility('landings'))).toBe('visible');
    expect(await page.evaluate(() => window.__strewnEvent!.visibility('basemap-field'))).toBe('visible');
    expect(await page.evaluate(() => window.__strewnEvent!.visibility('event-union-line'))).toBe('none');
    expect(await page.locator('[data-test="pad-marker"]').isVisible()).toBe(true);
  }, 300_000);

  it('refuses a plan whose scenario was not opened with it, naming the item and the file', async () => {
    const plan = smallPlan(300);
    const page = await session.open();
    await page.locator('[data-tab="event"]').click();
    await page.locator('[data-test="event-file"]').setInputFiles([plan.file, join(plan.dir, 'club-rocket.json')]);
    await expect.poll(() => page.locator('[data-test="event-refused"]').innerText()).toContain('small.event.json was not opened');
    const alert = await page.locator('[data-test="event-refused"]').innerText();
    expect(alert).toContain('items[2].scenario');
    expect(alert).toContain('drone-route.json');

    // Dropped on the page with all its files, the plan opens in the Event tab (not as a scenario).
    const scenarioBefore = await page.evaluate(() => window.__strewn!.scenario().hash);
    await page.locator('[data-tab="setup"]').click();
    const files = plan.files.map((f) => ({ name: f.split('/').pop()!, text: readFileSync(f, 'utf8') }));
    const dropped = await page.evaluateHandle((list) => {
      const d = new DataTransfer();
      for (const f of list) d.items.add(new File([f.text], f.name, { type: f.name.endsWith('.csv') ? 'text/csv' : 'application/json' }));
      return d;
    }, files);
    await page.dispatchEvent('body', 'dragenter', { dataTransfer: dropped });
    await page.dispatchEvent('body', 'drop', { dataTransfer: dropped });
    await expect.poll(() => page.locator('[data-test="event-name"]').innerText()).toBe('Harrowmere club launch day (invented)');
    expect(await page.locator('[data-tab="event"]').getAttribute('aria-selected')).toBe('true');
    expect(await page.locator('[data-test="event-refused"]').isHidden()).toBe(true);
    expect(await page.evaluate(() => window.__strewn!.scenario().hash)).toBe(scenarioBefore);
  }, 120_000);
});

describe('workspace: a saved run beside the current one', () => {
  it('compares a saved results folder with the current run, as strewn compare does, and draws both zones', async () => {
    // One scenario file, run by the command line and opened in the page.
    const dir = smallPlan(400).dir;
    const scenario = JSON.parse(readFileSync(join(dir, 'club-rocket.json'), 'utf8'));
    scenario.run = { ...scenario.run, samples: 400, seed: 'cmp-a' };
    const file = join(dir, 'club-cmp.json');
    writeFileSync(file, JSON.stringify(scenario, null, 2));
    const saved = join(session.work, 'saved-run');
    const savedSummary = JSON.parse(cli(['run', file, '--out', saved, '--force', '--json', '--workers', '1'])) as RunSummary;
    const page = await session.open();
    await page.locator('#scenario-file-input').setInputFiles([file, ...readdirSync(join(dir, 'motors')).map((n) => join(dir, 'motors', n))]);
    await expect.poll(() => page.evaluate(() => window.__strewn!.scenario().hash)).toBe(savedSummary.scenarioHash);
    expect(await runAndWait(page)).toBe('finished');
    await page.locator('[data-tab="compare"]').click();
    await page.locator('[data-test="compare-files"]').setInputFiles(readdirSync(saved).map((n) => join(saved, n)));
    await page.waitForFunction(() => window.__strewnEvent!.comparison() !== null);
    let c = (await page.evaluate(() => window.__strewnEvent!.comparison())) as Comparison;
    // The same scenario, seed and count: the page's run agrees with the saved one.
    expect(c.a.scenarioHash).toBe(c.b.scenarioHash);
    expect(c.zone.area_m2.a).toBe(savedSummary.keepOut.area_m2);
    close(c.zone.area_m2.b, savedSummary.keepOut.area_m2);
    expect(await page.locator('[data-test="compare-body"]').innerText()).toContain('the two runs should agree exactly');

    // Another seed: the comparison follows the current run; change = B − A.
    await setField(page, 'run.seed', 'cmp-b');
    expect(await runAndWait(page)).toBe('finished');
    await page.locator('[data-tab="compare"]').click();
    await page.waitForFunction(() => (window.__strewnEvent!.comparison() as { b: { seed: string } } | null)?.b.seed === 'cmp-b');
    c = (await page.evaluate(() => window.__strewnEvent!.comparison())) as Comparison;
    const current = (await page.evaluate(() => JSON.parse(JSON.stringify(window.__strewn!.summary())))) as RunSummary;
    expect(c.zone.area_m2.a).toBe(savedSummary.keepOut.area_m2);
    expect(c.zone.area_m2.b).toBe(current.keepOut.area_m2);
    expect(c.zone.area_m2.change).toBe(current.keepOut.area_m2 - savedSummary.keepOut.area_m2);
    expect(c.areas.map((a) => a.name)).toEqual(savedSummary.areas.map((a) => a.name));
    c.areas.forEach((a, i) => {
      expect(a.probability.a).toBe(savedSummary.areas[i]!.probability);
      expect(a.probability.b).toBe(current.areas[i]!.probability);
    });
    const zoneRow = await page.locator('[data-test="compare-table"] tbody tr').first().innerText();
    expect(zoneRow).toMatch(/^Keep-out zone area\s/);
    expect(zoneRow).toMatch(/[+\u2212]\d|no change/);
    expect(await page.locator('[data-test="compare-table"] tbody tr').count()).toBe(2 + c.contours.length + c.areas.length + c.areas.filter((a) => a.expectedCasualties.a !== null || a.expectedCasualties.b !== null).length + 1);
    const sides = await page.evaluate(() => window.__strewnEvent!.sourceData('compare-zones').features.map((f) => f.properties!.side as string));
    expect(sides).toEqual(['a', 'b']);
    await mapIdle(page);
    expect(await page.evaluate(() => window.__strewnEvent!.rendered('compare-a'))).toBeGreaterThan(0);
    expect(await page.evaluate(() => window.__strewnEvent!.rendered('compare-b'))).toBeGreaterThan(0);
    await shotsAtWidths(page, 'compare');
    const pdf = await download(page, '[data-test="compare-pdf"]', 'page-compare.pdf');
    expect(execFileSync('pdftotext', [pdf, '-'], { encoding: 'utf8' })).toContain('Keep-out zone area');

    // summary.json alone: the figures are compared, only the current zone can be drawn.
    await page.locator('[data-test="compare-files"]').setInputFiles([join(saved, 'summary.json')]);
    await page.waitForFunction(() => (window.__strewnEvent!.comparison() as { samePad: boolean | null } | null)?.samePad === null);
    c = (await page.evaluate(() => window.__strewnEvent!.comparison())) as Comparison;
    expect(c.zone.area_m2.a).toBe(savedSummary.keepOut.area_m2);
    expect(await page.evaluate(() => window.__strewnEvent!.sourceData('compare-zones').features.map((f) => f.properties!.side))).toEqual(['b']);

    // A damaged summary is refused with the file and the field named; the comparison stays.
    const broken = { ...savedSummary, samples: 'many' };
    await page.locator('[data-test="compare-files"]').setInputFiles({ name: 'summary.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
    await expect.poll(() => page.locator('[data-test="compare-problem"]').innerText()).toMatch(/summary\.json: samples should be/);
  }, 300_000);
});

describe('workspace: a drone operation on the map', () => {
  it('draws the route flown and an area flown over where their coordinates lie, with their key', async () => {
    const page = await session.open();
    // Event plans in scenarios/ are offered on the Event tab, not as scenario demos.
    const demos = await page.locator('#demo-select option').evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value));
    expect(demos.length).toBeGreaterThan(0);
    expect(demos.filter((id) => id.includes('event'))).toEqual([]);
    expect(await page.locator('[data-test="event-demo"] option').count()).toBe(2);
    const scenario = JSON.parse(readFileSync(join(SCEN, 'drone-route.json'), 'utf8'));
    await page.locator('#scenario-file-input').setInputFiles({ name: 'drone-route.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(scenario)) });
    await expect.poll(() => page.evaluate(() => window.__strewn!.scenario().name)).toBe(scenario.name);
    const route = await page.evaluate(() => window.__strewnEvent!.sourceData('release-route').features);
    expect(route).toHaveLength(1);
    expect(route[0]!.geometry).toEqual(scenario.launch.path);
    await mapIdle(page);
    // Drawn at every vertex of the path, and between them (the midpoint of the first leg).
    const path = scenario.launch.path.coordinates as [number, number][];
    const mid: [number, number] = [(path[0]![0] + path[1]![0]) / 2, (path[0]![1] + path[1]![1]) / 2];
    for (const at of [...path, mid]) expect(await page.evaluate((p) => window.__strewnEvent!.rendered('route-path', p), at), `drawn at ${at}`).toBeGreaterThan(0);
    // … and not off it: 150 m north of the middle of the first leg (about 0.00135° of latitude).
    expect(await page.evaluate((p) => window.__strewnEvent!.rendered('route-path', p), [mid[0], mid[1] + 0.00135] as [number, number])).toBe(0);
    expect(await page.locator('[data-test="overlay-key"]').innerText()).toContain('Route flown (failure anywhere along it)');
    await setField(page, 'run.samples', '400');
    expect(await runAndWait(page)).toBe('finished');
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'drone-route.png') });

    const withArea = structuredClone(scenario);
    const [w, s, e, n] = [8.0155, 47.3105, 8.0235, 47.3125];
    withArea.launch.area = { type: 'Polygon', coordinates: [[[w, s], [e, s], [e, n], [w, n], [w, s]]] };
    delete withArea.launch.path;
    withArea.launch.duration = '20 min';
    withArea.name = 'Drone over an area';
    await page.locator('#scenario-file-input').setInputFiles({ name: 'drone-area.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(withArea)) });
    await expect.poll(() => page.evaluate(() => window.__strewn!.scenario().name)).toBe('Drone over an area');
    const area = await page.evaluate(() => window.__strewnEvent!.sourceData('release-route').features);
    expect(area.map((f) => f.geometry.type)).toEqual(['Polygon']);
    await mapIdle(page);
    expect(await page.evaluate((p) => window.__strewnEvent!.rendered('route-area-fill', p), [(w + e) / 2, (s + n) / 2] as [number, number])).toBeGreaterThan(0);
    expect(await page.evaluate((p) => window.__strewnEvent!.rendered('route-area-fill', p), [e + 0.003, n] as [number, number])).toBe(0);
    expect(await page.locator('[data-test="overlay-key"]').innerText()).toContain('Area flown over (failure anywhere inside)');
    await page.screenshot({ path: join(session.shots, 'drone-area.png') });
  }, 240_000);
});
