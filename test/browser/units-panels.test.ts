// The case-wide unit system in the panels that still read metric in a US customary case (issue 13
// item 4): the probabilistic panel's distributions (offered, shown and edited in ft/d; a value
// typed in ft/d stays exactly as typed through SI and back), the wells panel's pumping rate
// (US gal/min) and water levels (ft), the monitoring panel's coordinates and screen depths (ft),
// and the report's uncertain inputs and rates. Conversion factors: NIST SP 811 (2008) Appendix B
// (ft = 0.3048 m, US gallon = 3.785411784 L, both exact). Demos: the invented riverside and
// depot cases. Screenshots of each panel at 1024×768, 768×1024 and 390×844; axe-core clean.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PHONE, PORTRAIT } from './browser';
import { openDemoPage, openFiles, setNumber, settled, useBrowser } from './offline-helpers';
import { axe } from './axe-helpers';

const getBrowser = useBrowser();

type Shown = { uncertainty: { inputs: Record<string, Record<string, unknown> | undefined> }; monitoring: { wells: { position: number[] | null }[] } };
const current = (page: Page): Promise<Shown> => page.evaluate(() => (window as unknown as { __downgradient: { currentCase: () => Shown } }).__downgradient.currentCase());

async function units(page: Page, system: 'SI' | 'US'): Promise<void> {
  const button = page.locator(`[role=radiogroup][aria-label=Units] button[data-value=${system}]`);
  await button.scrollIntoViewIfNeeded();
  await button.click();
  await expect.poll(() => button.getAttribute('aria-checked')).toBe('true');
}

async function openSection(page: Page, id: string): Promise<void> {
  const toggle = page.locator(`[data-section=${id}] button.dg-sec-toggle`);
  await toggle.scrollIntoViewIfNeeded();
  if ((await toggle.getAttribute('aria-expanded')) !== 'true') await toggle.click();
}

/** A monitoring well's mark chosen from the keyboard (another mark may lie over part of it at some sizes, so not a tap). */
async function pickWell(page: Page, name: string): Promise<void> {
  const mark = page.locator('.dg-mark-monitor').filter({ hasText: name });
  await mark.focus();
  await page.keyboard.press('Enter');
  await page.getByTestId('monitoring-well').waitFor();
}

/** Grid labels that lie under one of the map's controls at its left edge (zoom buttons, scale bar): none expected. */
const gridLabelsClear = (page: Page): Promise<string[]> =>
  page.evaluate(() => {
    const controls = Array.from(document.querySelectorAll('.dg-map .leaflet-left .leaflet-control'), (c) => c.getBoundingClientRect());
    return Array.from(document.querySelectorAll('.dg-grid-label'))
      .filter((t) => {
        const r = t.getBoundingClientRect();
        return controls.some((c) => r.left < c.right && c.left < r.right && r.top < c.bottom && c.top < r.bottom);
      })
      .map((t) => t.textContent ?? '');
  });

const serious = (found: Awaited<ReturnType<typeof axe>>) => found.filter((f) => f.impact === 'serious' || f.impact === 'critical');

describe('a US customary case in the panels', () => {
  it('the probabilistic and wells panels and the report: ft/d, gal/min, ft; a typed ft/d value stays as typed', async () => {
    const { page, errors, close } = await openDemoPage(getBrowser(), 'riverside-supply-well.json');
    await units(page, 'US');

    // wells: the town well's 800 m³/d = 146.76 US gal/min, written to 3 digits; water levels in ft
    await openSection(page, 'wells');
    const wells = page.getByTestId('wells-table');
    await expect.poll(async () => (await wells.textContent()) ?? '', { timeout: 20_000 }).toMatch(/Town supply well147 gal\/min/);
    expect(await wells.textContent()).not.toMatch(/m³\/d|\d m\b/);
    await expect.poll(async () => (await page.getByTestId('water-levels').textContent()) ?? '').toMatch(/\d ft/);
    expect(await page.getByTestId('water-levels').textContent()).not.toMatch(/\d m\b/);

    // the probabilistic panel: K offered over Bouwer's coarse-sand range 20–100 m/d = 65.62–328.1 ft/d
    await openSection(page, 'uncertainty');
    const row = page.locator('[data-input=hydraulicConductivity]');
    await row.locator('input[type=checkbox]').check();
    const low = page.getByLabel('Hydraulic conductivity K: low', { exact: true });
    await expect.poll(() => low.inputValue()).toBe('65.62');
    await expect.poll(async () => (await row.locator('.dg-unit-fixed').allTextContents()).join(' ')).toMatch(/^ft\/d( ft\/d)*$/);
    expect(await page.getByLabel('Hydraulic conductivity K: high', { exact: true }).inputValue()).toBe('328.1');
    // typed in ft/d: stored in ft/d exactly, the other end as it was shown
    await low.fill('50');
    await low.press('Tab');
    await expect.poll(async () => (await current(page)).uncertainty.inputs.hydraulicConductivity).toMatchObject({ low: 50, high: 328.1, unit: 'K:ft/d' });
    // SI: shown in m/d (50 ft/d = 15.24 m/d exactly); back to US: exactly as typed
    await units(page, 'SI');
    await expect.poll(() => low.inputValue()).toBe('15.24');
    await expect.poll(async () => (await row.locator('.dg-unit-fixed').first().textContent()) ?? '').toBe('m/d');
    await units(page, 'US');
    await expect.poll(() => low.inputValue()).toBe('50');
    expect((await current(page)).uncertainty.inputs.hydraulicConductivity).toMatchObject({ low: 50, unit: 'K:ft/d' });
    // a run: its results (percentiles of arrival and concentration, drivers) carry no metric unit
    await setNumber(page, 'Realisations', 200);
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });
    await expect.poll(async () => (await page.locator('.dg-mc-results').textContent()) ?? '').toMatch(/if hydraulic conductivity K is in its low third/);
    expect(await page.locator('.dg-mc-results').textContent()).not.toMatch(/\d m\b|m\/d|m³/);
    await settled(page);
    expect(serious(await axe(page))).toEqual([]);

    // the report: the distribution and the rate in the case's units
    await openFiles(page);
    await page.getByTestId('open-report').click();
    await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
    await expect.poll(async () => (await page.getByTestId('report-uncertainty').textContent()) ?? '').toMatch(/Hydraulic conductivity K: log-uniform from 50 to 328\.1 ft\/d/);
    await expect.poll(async () => (await page.getByTestId('report-wells').textContent()) ?? '').toMatch(/Town supply well147 gal\/min/);
    expect(await page.getByTestId('report-uncertainty').textContent()).toMatch(/200 realisations, seed 1/);
    expect(await page.getByTestId('report-uncertainty').textContent()).not.toMatch(/\d m\b|m\/d/);
    expect(await page.getByTestId('report-wells').textContent()).not.toMatch(/m³\/d/);
    expect(errors).toEqual([]);
    await close();
  });

  it('the monitoring panel: a well’s east and north and its screen in ft; typed feet are stored as metres', async () => {
    const { page, errors, close } = await openDemoPage(getBrowser(), 'depot-benzene-monitoring.json');
    await units(page, 'US');
    await pickWell(page, 'MW-3');
    const coords = page.getByTestId('monitoring-well-coords');
    // MW-3 at (80, 3) m = (262.47, 9.84) ft
    await expect.poll(() => coords.getByLabel('East (ft)').inputValue()).toBe('262.47');
    expect(await coords.getByLabel('North (ft)').inputValue()).toBe('9.84');
    await expect.poll(async () => (await coords.textContent()) ?? '').toMatch(/[\d.]+ ft downgradient of the release, -?[\d.]+ ft across the flow/);
    // screen 1.5–4.5 m = 4.921–14.76 ft (4 significant digits for a converted value)
    const detail = page.getByTestId('monitoring-well');
    await expect.poll(() => detail.locator('[data-field="monitoring.wells[2].screenTop"] select.dg-unit').inputValue()).toBe('ft');
    expect(await detail.locator('[data-field="monitoring.wells[2].screenTop"] input.dg-num').inputValue()).toBe('4.921');
    expect(await detail.locator('[data-field="monitoring.wells[2].screenBottom"] input.dg-num').inputValue()).toBe('14.76');
    // 100 ft east = 30.48 m
    await coords.getByLabel('East (ft)').fill('100');
    await coords.locator('[data-action=place-monitoring]').click();
    await expect.poll(async () => (await current(page)).monitoring.wells[2].position?.[0]).toBeCloseTo(30.48, 9);
    await expect.poll(() => coords.getByLabel('East (ft)').inputValue()).toBe('100');
    await settled(page);
    expect(serious(await axe(page))).toEqual([]);
    expect(errors).toEqual([]);
    await close();
  });

  it.each([
    ['landscape', LANDSCAPE],
    ['portrait', PORTRAIT],
    ['phone', PHONE],
  ])('screenshots of the three panels in US units, %s', async (name, viewport) => {
    const river = await openDemoPage(getBrowser(), 'riverside-supply-well.json', viewport);
    const page = river.page;
    await units(page, 'US');
    await openSection(page, 'wells');
    await expect.poll(async () => (await page.getByTestId('wells-table').textContent()) ?? '', { timeout: 20_000 }).toMatch(/gal\/min/);
    await page.getByTestId('wells-table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`units-us-wells-${name}.png`) });
    await openSection(page, 'uncertainty');
    await page.locator('[data-input=hydraulicConductivity] input[type=checkbox]').check();
    const low = page.getByLabel('Hydraulic conductivity K: low', { exact: true });
    await expect.poll(() => low.inputValue()).toBe('65.62');
    await low.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`units-us-uncertainty-${name}.png`) });
    expect(river.errors).toEqual([]);
    await river.close();

    const depot = await openDemoPage(getBrowser(), 'depot-benzene-monitoring.json', viewport);
    await units(depot.page, 'US');
    await depot.page.locator('.dg-map').scrollIntoViewIfNeeded();
    await expect.poll(async () => (await depot.page.locator('.dg-grid-label').allTextContents()).join(' ')).toMatch(/\d ft/);
    await expect.poll(() => gridLabelsClear(depot.page)).toEqual([]);
    // both receptors keep their names on the map at every size (the supply well sits near the phone map's right edge)
    for (const receptor of ['Depot supply well', 'Property line (east fence)'])
      await expect.poll(() => depot.page.locator('.dg-mark-label', { hasText: receptor }).isVisible(), { timeout: 15_000 }).toBe(true);
    await depot.page.screenshot({ path: artifactPath(`units-us-depot-map-${name}.png`) });
    await pickWell(depot.page, 'MW-3');
    const coords = depot.page.getByTestId('monitoring-well-coords');
    await expect.poll(() => coords.getByLabel('East (ft)').inputValue()).toBe('262.47');
    await coords.scrollIntoViewIfNeeded();
    await depot.page.screenshot({ path: artifactPath(`units-us-monitoring-${name}.png`) });
    expect(depot.errors).toEqual([]);
    await depot.close();
  });
});
