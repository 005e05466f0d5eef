import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { mapIdle, runAndWait, setField, workspaceSession } from './harness.js';

/** The page with a scenario that breaks up (behaviour checks; the figures are the CLI's, test/dispersion). */
const session = workspaceSession('-fragments');

describe('workspace: fragments', () => {
  it('opens the burst demo, runs it and lists the parts and their impacts in Findings', async () => {
    const page = await session.open();
    await page.locator('#demo-select').selectOption('display-shell-burst');
    await page.getByRole('button', { name: 'Open demo', exact: true }).click();
    await expect.poll(() => page.evaluate(() => window.__strewn!.scenario().name)).toMatch(/burst/);
    await setField(page, 'run.samples', '300');
    expect(await runAndWait(page)).toBe('finished');
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'fragments-map.png') });
    await page.locator('[data-tab="findings"]').click();
    const parts = await page.locator('[data-finding="parts"]').innerText();
    expect(parts).toMatch(/casing shard/);
    expect(parts).toMatch(/9\.70/);
    expect(await page.locator('[data-finding="risk-parts"] tbody tr').count()).toBe(4);
    await page.screenshot({ path: join(session.shots, 'fragments-findings.png'), fullPage: true });
  }, 240_000);
});
