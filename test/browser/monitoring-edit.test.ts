// A sampling result changed in place from the monitoring panel, in real Chromium on the invented
// depot demo: Edit opens the result's fields filled in; a value that is not a number, a date that
// already has a result and a value above the accepted maximum are each refused with a message
// naming the field and what it accepts, and nothing is changed; a good change (value, unit,
// non-detect flag and date) is stored as one edit, the row and the well's chart follow it, and its
// Undo (the case's own undo step) brings the result back as it was. Screenshots at 1024×768,
// 768×1024 and 390×844 go to test-artifacts/; axe-core (npm) finds nothing serious with the form open.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openDemoPage, useBrowser } from './offline-helpers';
import { axe } from './axe-helpers';

const getBrowser = useBrowser();

interface Result {
  wellId: string;
  date: string;
  value: number;
  unit: string;
  nonDetect: boolean;
  analyte: string;
}
const results = (page: Page): Promise<Result[]> =>
  page.evaluate(() => (window as unknown as { __downgradient: { currentCase: () => { monitoring: { results: Result[] } } } }).__downgradient.currentCase().monitoring.results);

describe('a sampling result edited in place', () => {
  it('refuses bad values naming the field, stores a good change as one edit, and undoes it', async () => {
    const { page, errors, close } = await openDemoPage(getBrowser(), 'depot-benzene-monitoring.json', LANDSCAPE);
    await page.locator('[data-section=monitoring] .dg-sec-toggle').click();
    await page.locator('[data-testid=monitoring-wells] [data-mwell=mw-5]').click();
    const detail = page.getByTestId('monitoring-well');
    await detail.waitFor();
    const before = await results(page);
    const original = before.find((r) => r.wellId === 'mw-5' && r.date === '2023-06-11')!;
    expect(original).toMatchObject({ nonDetect: true, value: 1, unit: 'ug/L' });
    const others = before.filter((r) => r !== original);

    await detail.getByRole('button', { name: 'Edit the 2023-06-11 benzene result' }).click();
    const form = detail.getByTestId('result-edit');
    await form.waitFor();
    expect(await form.locator('legend').innerText()).toMatch(/Change the 2023-06-11 benzene result at MW-5/);
    expect(await form.locator('[data-entry=value]').inputValue()).toBe('1');
    expect(await form.locator('[data-entry=nonDetect]').isChecked()).toBe(true);
    expect(await form.locator('[data-entry=date]').inputValue()).toBe('2023-06-11');
    for (const [label, vp] of [['landscape', LANDSCAPE], ['portrait', PORTRAIT], ['phone', { width: 390, height: 844 }]] as const) {
      await page.setViewportSize(vp);
      await form.scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`monitoring-edit-${label}.png`) });
    }
    await page.setViewportSize(LANDSCAPE);
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings, JSON.stringify(findings, null, 1)).toEqual([]);

    // refusals name the field and what it accepts; nothing changes
    const error = form.getByTestId('result-edit-error');
    await form.locator('[data-entry=value]').fill('about two');
    await form.locator('[data-action=save-result]').click();
    await expect.poll(async () => (await error.textContent()) ?? '').toMatch(/^Reporting limit: enter a number ≥ 0.*Nothing was changed\.$/);
    expect(await form.locator('[data-entry=value]').getAttribute('aria-invalid')).toBe('true');
    await form.locator('[data-entry=nonDetect]').uncheck();
    await form.locator('[data-entry=value]').fill('3000');
    await form.locator('[data-entry=unit]').selectOption('g/L');
    await form.locator('[data-action=save-result]').click();
    await expect.poll(async () => (await error.textContent()) ?? '').toMatch(/^Measured value: at most 1000000 mg\/L .*Nothing was changed\./);
    await form.locator('[data-entry=unit]').selectOption('ug/L');
    await form.locator('[data-entry=value]').fill('2.5');
    await form.locator('[data-entry=date]').fill('2023-09-10'); // MW-5 has a benzene result on that day
    await form.locator('[data-action=save-result]').click();
    await expect.poll(async () => (await error.textContent()) ?? '').toMatch(/^Sampling date: 2023-09-10 already has a benzene result at this well .*Nothing was changed\./);
    expect(await results(page)).toEqual(before);

    // a good change: detected 2.5 µg/L on 2023-06-20, one edit in place
    await form.locator('[data-entry=date]').fill('2023-06-20');
    await form.locator('[data-action=save-result]').click();
    await expect.poll(async () => JSON.stringify((await results(page)).find((r) => r.wellId === 'mw-5' && r.date === '2023-06-20') ?? null)).toBe(
      JSON.stringify({ ...original, date: '2023-06-20', value: 2.5, nonDetect: false }),
    );
    const after = await results(page);
    expect(after).toHaveLength(before.length);
    expect(after.filter((r) => !(r.wellId === 'mw-5' && r.date === '2023-06-20'))).toEqual(others);
    expect(await form.count()).toBe(0);
    const changed = detail.getByTestId('changed-result');
    expect(await changed.innerText()).toMatch(/Changed the 2023-06-11 result: < 1 µg\/L → 2023-06-20, 2\.5 µg\/L\./);
    await expect.poll(() => detail.locator('[data-testid=monitoring-results] tbody tr', { hasText: '2023-06-20' }).innerText()).toMatch(/2023-06-20\s+benzene\s+2\.5 µg\/L/);
    expect(await detail.locator('[data-testid=monitoring-results] tbody tr', { hasText: '2023-06-11' }).count()).toBe(0);
    // the chart follows: one fewer non-detect triangle
    const nd = before.filter((r) => r.wellId === 'mw-5' && r.nonDetect).length;
    await expect.poll(() => detail.locator('[data-testid=well-chart-points] path').count()).toBe(nd - 1);
    await page.screenshot({ path: artifactPath('monitoring-edit-saved-landscape.png') });

    // Undo: the case's own undo step, the result back as it was
    await changed.getByRole('button', { name: 'Undo' }).click();
    await expect.poll(async () => JSON.stringify(await results(page))).toBe(JSON.stringify(before));
    await expect.poll(() => detail.locator('[data-testid=well-chart-points] path').count()).toBe(nd);
    expect(errors).toEqual([]);
    await close();
  });
});
