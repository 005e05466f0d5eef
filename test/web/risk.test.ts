import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { mapIdle, runAndWait, setField, workspaceSession } from './harness.js';

/** The page's Risk layer and findings (behaviour checks; the figures are the CLI's, test/risk). */
const session = workspaceSession('-risk');

describe('workspace: risk to people', () => {
  it('draws the individual-risk lines and the standing ring, lists the risk findings and offers risk.geojson', async () => {
    const page = await session.open();
    await setField(page, 'run.samples', '600');
    expect(await runAndWait(page)).toBe('finished');
    const kinds = await page.evaluate(() => window.__strewn!.sourceData('risk').features.map((f) => f.properties!.kind as string));
    expect(kinds.filter((k) => k === 'individual-risk')).toHaveLength(3);
    expect(kinds).toContain('standing-distance');
    expect(await page.locator('[data-test="legend"]').innerText()).toMatch(/Individual risk \S+ per flight or more/);
    await mapIdle(page);
    await page.screenshot({ path: join(session.shots, 'risk-map.png') });
    await page.locator('[data-tab="findings"]').click();
    expect(await page.locator('[data-finding="risk-lines"] tbody tr').count()).toBe(3);
    expect(await page.locator('[data-finding="standing"]').innerText()).toMatch(/NE/);
    expect(await page.locator('[data-finding="risk-total"]').innerText()).toMatch(/95 % upper bound/);
    await page.screenshot({ path: join(session.shots, 'risk-findings.png'), fullPage: true });
    await page.locator('[data-tab="files"]').click();
    expect(await page.locator('[data-export="risk.geojson"]').count()).toBe(1);
  }, 180_000);
});
