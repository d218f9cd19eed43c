// The monitoring panel in real Chromium on the invented depot demo: the per-well trend table and
// the model comparison; importing the 2024 lab CSV through the column-mapping step (its dates do
// not settle day/month order, so the import asks; day first then imports 20 results); a fit; and
// adopting it as a what-if variant, which opens as a new case with the original unchanged.
// Screenshots at 1024×768, 768×1024 and 390×844 go to test-artifacts/; axe-core (npm) finds
// nothing serious or critical in the open panel.
import { describe, expect, it } from 'vitest';
import { resolve } from 'node:path';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openDemo, storedCases, useBrowser, waitSaved, watchedPage } from './offline-helpers';
import { axe } from './axe-helpers';

const getBrowser = useBrowser();

describe('monitoring data in the app', () => {
  it('trend table, CSV import with column mapping, fit and adoption as a variant', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, 'depot-benzene-monitoring.json');
    const toggle = page.locator('[data-section=monitoring] .dg-sec-toggle');
    await toggle.click();
    const summary = page.getByTestId('observations-summary');
    await summary.waitFor();
    await expect.poll(() => summary.locator('tbody tr').count()).toBe(5);
    expect(await summary.textContent()).toMatch(/within a factor of ten/);

    await page.getByTestId('observations-file').setInputFiles(resolve('cases/depot-benzene-2024.csv'));
    const mapping = page.getByTestId('observations-mapping');
    await mapping.waitFor();
    expect(await mapping.textContent()).toMatch(/could be day\/month or month\/day/);
    expect(await page.getByTestId('observations-accept').isDisabled()).toBe(true);
    await mapping.locator('select').last().selectOption('dmy');
    await expect.poll(async () => (await page.getByTestId('observations-preview').textContent()) ?? '').toMatch(/^20 results ready/);
    await page.getByTestId('observations-accept').click();
    await expect.poll(async () => (await page.locator('[data-section=monitoring]').textContent()) ?? '').toMatch(/Imported 20 results/);
    await expect.poll(async () => (await summary.textContent()) ?? '').toMatch(/2024-12-03/);

    for (const [label, vp] of [['landscape', LANDSCAPE], ['portrait', PORTRAIT], ['phone', { width: 390, height: 844 }]] as const) {
      await page.setViewportSize(vp);
      await page.locator('[data-section=monitoring]').scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`monitoring-${label}.png`) });
    }
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings, JSON.stringify(findings, null, 1)).toEqual([]);

    await page.getByTestId('fit-run').click();
    const result = page.getByTestId('fit-result');
    await result.waitFor({ timeout: 30_000 });
    expect(await result.textContent()).toMatch(/half-life: [\d.]+ d \(case: 731/);
    await page.screenshot({ path: artifactPath('monitoring-fit-phone.png') });
    await page.getByTestId('fit-adopt').click();
    await expect.poll(async () => (await storedCases(page)).map((s) => s.name).join('|')).toMatch(/fitted to monitoring data/);
    const stored = await storedCases(page);
    expect(stored.some((s) => s.name === 'Bus depot diesel release with monitoring (invented)')).toBe(true);
    await context.close();
  });
});
