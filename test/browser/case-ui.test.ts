// The case sheet and case-level editing in real Chromium (issue 13): Undo in a notice works while
// the case sheet (a modal dialog) is open; demo picks and re-imports do not duplicate stored
// cases; the case's own undo/redo history; the compare view reads base → what-if.
// Stored cases are read with the raw IndexedDB API (offline-helpers.ts), not through the app.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { demoCase, openDemo, storedCases, useBrowser, waitSaved, watchedPage } from './offline-helpers';

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
});
