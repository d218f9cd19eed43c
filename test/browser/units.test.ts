// The case-wide unit system (issue 13 item 4), in real Chromium: switching to US customary shows
// input lengths in ft and the receptor table's distances in ft; switching back shows every stored
// value exactly as typed (nothing is converted and written back). Screenshots at three sizes.
import { describe, expect, it } from 'vitest';
import { artifactPath, LANDSCAPE, PORTRAIT, PHONE } from './browser';
import { readFileSync } from 'node:fs';
import { openDemo, openFiles, storedCases, useBrowser, waitForResults, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();

describe('unit system', () => {
  it('SI → US → SI: fields and tables follow; the stored values read exactly as typed', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    await waitForResults(page);
    await page.click('[data-section=release] .dg-sec-toggle');
    const thickness = page.locator('[data-field="source.thickness"] input.dg-num');
    const unit = page.locator('[data-field="source.thickness"] select.dg-unit');
    const typed = await thickness.inputValue();
    expect(await unit.inputValue()).toBe('m');
    const units = (v: string) => page.click(`[role=radiogroup][aria-label=Units] button[data-value=${v}]`);
    await units('US');
    await expect.poll(() => unit.inputValue()).toBe('ft');
    // 0.3048 m per foot exactly (NIST SP 811)
    expect(Number(await thickness.inputValue())).toBeCloseTo(Number(typed) / 0.3048, 3);
    await expect.poll(async () => (await page.locator('[data-testid=receptor-table]').textContent()) ?? '').toMatch(/\d ft down/);
    await page.screenshot({ path: artifactPath('units-us-landscape.png') });
    await units('SI');
    await expect.poll(() => unit.inputValue()).toBe('m');
    await expect.poll(() => thickness.inputValue()).toBe(typed);
    // a field's own unit: m → ft → m through its selector, back exactly as typed (the field
    // re-renders after the case edit: wait for it rather than read at once)
    await unit.selectOption('ft');
    await expect.poll(() => thickness.inputValue()).not.toBe(typed);
    await unit.selectOption('m');
    await expect.poll(() => thickness.inputValue()).toBe(typed);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it.each([
    ['portrait', PORTRAIT],
    ['phone', PHONE],
  ])('the Units control in %s — screenshot kept', async (name, viewport) => {
    const w = await watchedPage(getBrowser(), viewport);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    await waitForResults(page);
    const control = page.locator('[role=radiogroup][aria-label=Units]');
    await control.scrollIntoViewIfNeeded();
    await control.locator('button[data-value=US]').click();
    const box = await control.locator('button[data-value=US]').boundingBox();
    expect(box!.height).toBeGreaterThanOrEqual(44);
    expect(box!.x + box!.width).toBeLessThanOrEqual(viewport.width);
    await page.screenshot({ path: artifactPath(`units-us-${name}.png`) });
    await context.close();
  });

  it('a US customary local case: the site grid, the release position, the centreline chart, the report and the material picker in ft (issue 13 item 4)', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    // the nitrate demo is drawn on a local site grid (metres from a datum)
    await openDemo(page, 'nitrate-field-supply.json');
    const demoName = JSON.parse(readFileSync('cases/nitrate-field-supply.json', 'utf8')).name as string;
    await waitForResults(page);
    await page.click('[role=radiogroup][aria-label=Units] button[data-value=US]');
    // the site grid's labels and the centreline chart's distance axis
    await expect.poll(async () => (await page.locator('.dg-grid-label').allTextContents()).join(' | '), { timeout: 15_000 }).toMatch(/^[^m]*\d ft\b[^m]*$/);
    await expect.poll(async () => (await page.locator('[data-testid=profile-chart]').textContent()) ?? '').toMatch(/distance downgradient of the source \(ft\)/);
    // the water levels' labels on the map (50.71 m / 0.3048 = 166.37 ft)
    await expect.poll(async () => (await page.locator('.dg-mark-head').allTextContents()).join(' | ')).toMatch(/MW-1[^|]*: 166\.37 ft/);
    // the release's position on the site grid: typed and shown in ft, stored in metres
    await page.click('[data-section=release] .dg-sec-toggle');
    const east = page.locator('[data-field="site.source.position"]').first();
    await expect.poll(async () => (await east.locator('.dg-unit-fixed').textContent()) ?? '').toBe('ft');
    await east.locator('input').fill('100');
    await east.locator('input').press('Enter');
    // 100 ft = 30.48 m (0.3048 m per foot exactly, NIST SP 811)
    const stored = async () => (await storedCases(page)).map((x) => x.data as { name: string; site: { source: { position: number[] } } }).find((x) => x.name === demoName)?.site.source.position[0];
    await expect.poll(stored, { timeout: 15_000 }).toBeCloseTo(30.48, 9);
    // the material picker lists its published ranges in ft/d (Bouwer 1978: medium sand 5 – 20 m/d = 16 – 66 ft/d)
    await page.click('[data-section=aquifer] .dg-sec-toggle');
    await expect.poll(async () => (await page.locator('[data-group=aquifer] select.dg-select option').allTextContents()).join(' | ')).toContain('medium sand: 16 – 66 ft/d');
    await page.screenshot({ path: artifactPath('units-us-local-landscape.png') });
    // the report: inputs in ft and ft/d, the site plan's scale bar in ft or mi
    await openFiles(page);
    await page.getByTestId('open-report').click();
    await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
    const report = (await page.locator('.dg-report').textContent()) ?? '';
    const inputs = (await page.locator('.dg-report .dg-report-inputs').textContent()) ?? '';
    expect(inputs).toMatch(/Hydraulic conductivity K\d[\d.]* ft\/d/);
    expect(inputs).toMatch(/Source thickness below the water table[\d.]+ ft/);
    expect(inputs).not.toMatch(/\d m(\/d)?\b/);
    expect(report).toMatch(/seepage velocity v = K·i\/nₑ = [\d.]+ ft\/d/);
    // the receptor table's distances
    expect(await page.locator('[data-testid=report-receptors]').textContent()).toMatch(/\d ft/);
    expect(await page.locator('[data-testid=site-plan] .dg-plan-scale text').textContent()).toMatch(/^\d+ (ft|mi)$/);
    await page.screenshot({ path: artifactPath('units-us-report.png') });
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});
