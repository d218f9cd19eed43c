// The case-wide unit system (issue 13 item 4), in real Chromium: switching to US customary shows
// input lengths in ft and the receptor table's distances in ft; switching back shows every stored
// value exactly as typed (nothing is converted and written back). Screenshots at three sizes.
import { describe, expect, it } from 'vitest';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openDemo, useBrowser, waitForResults, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();
const PHONE = { width: 390, height: 844 };

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
});
