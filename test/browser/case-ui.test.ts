// The case sheet and case-level editing in real Chromium (issue 13): Undo in a notice works while
// the case sheet (a modal dialog) is open; demo picks and re-imports do not duplicate stored
// cases; the case's own undo/redo history; the compare view reads base → what-if.
// Stored cases are read with the raw IndexedDB API (offline-helpers.ts), not through the app.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { demoCase, openDemo, openFiles, storedCases, useBrowser, waitForResults, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();
const demo = demoCase();

async function openLibrary(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Cases and files' }).click();
  await page.getByRole('tab', { name: 'On this device' }).click();
}

const storedNames = async (page: Page) => (await storedCases(page)).map((c) => (c.data as { name: string }).name).sort();

describe('case sheet', () => {
  it('Undo in the notice after deleting a case restores it while the sheet is open', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    const before = await storedCases(page);
    await openLibrary(page);
    const item = page.locator(`[data-testid=case-list] li`, { hasText: demo.name });
    await item.getByRole('button', { name: 'Delete' }).click();
    await expect.poll(async () => (await storedNames(page)).includes(demo.name)).toBe(false);
    const undo = page.locator('.dg-notice').getByRole('button', { name: 'Undo' });
    await undo.waitFor();
    await page.screenshot({ path: artifactPath('case-deleted-undo-portrait.png') });
    await undo.click({ timeout: 5000 }); // a real tap: fails if the dialog covers the notice
    await expect.poll(async () => (await storedCases(page)).map((c) => c.id)).toEqual(before.map((c) => c.id));
    await expect.poll(() => page.locator('[data-testid=case-list]').textContent()).toContain(demo.name);
    // the restored case was the open one: it is open again
    await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe(demo.name);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('numbers: a receptor on the centreline is 0 m off it, on screen and in the CSV; no round-off noise in files', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    await page.getByRole('button', { name: /What is at risk/ }).click();
    await page.getByRole('button', { name: /Receptor on the centreline/ }).click();
    await waitForResults(page);
    const rows = page.locator('[data-testid=receptor-table] tbody tr');
    await expect.poll(() => rows.count()).toBe(demo.site.receptors.length + 1);
    const added = (await rows.last().innerText()).replace(/\s+/g, ' ');
    expect(added).toMatch(/ 0 m off/);
    const table = (await page.locator('[data-testid=receptor-table]').innerText()).replace(/\s+/g, ' ');
    expect(table).not.toMatch(/\d\.\d{5,}|e-1\d/); // no long digit runs, no 1e-1x noise
    await openFiles(page);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-table').click()]);
    const csv = readFileSync((await dl.path())!, 'utf8').split('\r\n');
    const last = csv[csv.length - 3].split(',');
    expect(last[4]).toBe('0'); // across-flow y (m)
    for (const line of csv.slice(1, -2))
      for (const cell of line.split(',')) if (/^-?[\d.]+(e[-+]?\d+)?$/.test(cell)) expect(cell.replace(/^-|\.|e.*$/g, '').replace(/^0+/, '').length, cell).toBeLessThanOrEqual(10);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('Ctrl+Z and Ctrl+Shift+Z undo and redo whole case edits across fields; the buttons do the same', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    for (const title of [/What is at risk/, /Where is the release/]) {
      const t = page.getByRole('button', { name: title });
      if ((await t.getAttribute('aria-expanded')) === 'false') await t.click();
    }
    const limit = page.locator('[data-field="contaminant.limit"] input.dg-num');
    const conc = page.locator('[data-field="source.concentration"] input.dg-num');
    const limit0 = await limit.inputValue();
    const conc0 = await conc.inputValue();
    await limit.fill('5000');
    await page.waitForTimeout(1000); // a separate step
    await conc.fill('77');
    await expect.poll(() => page.evaluate(() => (window as any).__downgradient.currentCase().source.concentration.value)).toBe(77);
    // focus stays in the concentration field: the shortcut undoes the case edit, not the text
    await page.keyboard.press('Control+z');
    await expect.poll(() => conc.inputValue()).toBe(conc0);
    expect(await limit.inputValue()).toBe('5000');
    await page.keyboard.press('Control+z');
    await expect.poll(() => limit.inputValue()).toBe(limit0);
    await expect.poll(() => page.evaluate(() => (window as any).__downgradient.currentCase().contaminant.limit.value)).toBe(Number(limit0));
    expect(await page.getByRole('button', { name: 'Undo', exact: true }).isDisabled()).toBe(true);
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(() => limit.inputValue()).toBe('5000');
    await page.getByRole('button', { name: 'Redo', exact: true }).click();
    await expect.poll(() => conc.inputValue()).toBe('77');
    await page.getByRole('button', { name: 'Undo', exact: true }).click();
    await expect.poll(() => conc.inputValue()).toBe(conc0);
    // the undone state is what is stored
    await waitSaved(page);
    await expect.poll(async () => (await storedCases(page)).map((c) => (c.data as any).source.concentration.value)).toContain(Number(conc0));
    await page.screenshot({ path: artifactPath('case-undo-portrait.png') });
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('demo picks and re-imports do not duplicate cases; a clashing import offers replace or keep both', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    const count = async () => (await storedNames(page)).filter((n) => n.startsWith(demo.name)).length;
    expect(await count()).toBe(1);
    await page.selectOption('select.dg-demo', 'fuel-release-farm-well.json');
    await waitSaved(page);
    await page.waitForTimeout(500);
    expect(await count()).toBe(1); // the unchanged stored copy is opened again
    // an edited demo is kept; picking the demo again opens a fresh copy beside it, once
    await page.getByRole('button', { name: /Where is the release/ }).click();
    await page.locator('[data-field="source.concentration"] input.dg-num').fill('33');
    await waitSaved(page);
    await expect.poll(async () => (await storedCases(page)).some((c) => (c.data as any).source.concentration.value === 33)).toBe(true);
    await page.selectOption('select.dg-demo', 'fuel-release-farm-well.json');
    await expect.poll(() => storedNames(page)).toContain(`${demo.name} (2)`);
    await page.selectOption('select.dg-demo', 'fuel-release-farm-well.json');
    await waitSaved(page);
    await page.waitForTimeout(500);
    expect(await count()).toBe(2);

    // the open case exported and imported again: nothing added
    await openFiles(page);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-case').click()]);
    const text = readFileSync((await dl.path())!, 'utf8');
    const importFile = async (name: string, body: string) => {
      await page.getByTestId('import-input').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(body) });
    };
    await importFile('again.json', text);
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/already on the device/);
    expect(await count()).toBe(2);
    // the same case with other values: the user chooses
    const changed = JSON.parse(text);
    changed.source.concentration.value = 44;
    await importFile('changed.json', JSON.stringify(changed));
    const ask = page.getByTestId('import-choice');
    await ask.waitFor();
    await page.screenshot({ path: artifactPath('import-choice-landscape.png') });
    expect(await count()).toBe(2); // nothing stored before the choice
    await ask.getByRole('button', { name: /Keep both/ }).click();
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/as “.*\(3\)”/);
    expect(await count()).toBe(3);
    // importing that file once more finds the kept copy: nothing added
    await importFile('changed.json', JSON.stringify(changed));
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/already on the device/);
    expect(await count()).toBe(3);
    // replace: the stored case takes the file's values, no new entry
    changed.source.concentration.value = 55;
    await importFile('changed55.json', JSON.stringify(changed));
    await ask.waitFor();
    await ask.getByRole('button', { name: /Replace the stored case/ }).click();
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/Replaced/);
    expect(await count()).toBe(3);
    const byId = (await storedCases(page)).find((c) => c.id === changed.id);
    expect((byId?.data as any).source.concentration.value).toBe(55);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('GeoJSON of a case in local metres: the refusal leads to placing it on the basemap, then the export works', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, 'nitrate-field-supply.json');
    await openFiles(page);
    await page.getByTestId('export-geojson').click();
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/WGS 84/);
    await page.getByTestId('place-on-map').click();
    const lon = page.locator('#dg-datum-lon');
    await expect.poll(() => lon.evaluate((el) => el === document.activeElement)).toBe(true);
    await lon.fill('9.5');
    await page.getByLabel(/Datum latitude/).fill('47.2');
    await page.screenshot({ path: artifactPath('place-on-map-portrait.png') });
    await page.getByRole('button', { name: 'Put this case on the basemap' }).click();
    await page.getByRole('button', { name: 'Close' }).click();
    await openFiles(page);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-geojson').click()]);
    expect(dl.suggestedFilename()).toMatch(/\.geojson$/);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});
