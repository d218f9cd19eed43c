// Offline first, in real Chromium: after one visit the service worker has the app shell, so with
// the network cut (context.setOffline, which also cuts the service worker's fetches) a reload
// still opens the app, computes results and saves. Also: closing the page in the middle of an
// edit and reopening loses nothing; the page contacts no host but its own origin and the tile
// server; the Content Security Policy reports no violation.
import { describe, expect, it } from 'vitest';
import { artifactPath, PORTRAIT, LANDSCAPE } from './browser';
import { expectOnlyAllowedOrigins, openDemo, renameInHeader, storedCases, useBrowser, waitForResults, waitForServiceWorker, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();

describe('offline', () => {
  it('first visit, then an offline reload that still opens, computes and saves', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    // the service worker installed and precached the shell
    await waitForServiceWorker(page);
    const manifest = await page.evaluate(async () => (await fetch('./manifest.webmanifest')).json());
    expect(manifest.icons.map((i: { sizes: string; purpose: string }) => `${i.sizes} ${i.purpose}`).sort()).toEqual(
      ['192x192 any', '192x192 maskable', '512x512 any', '512x512 maskable'],
    );
    await openDemo(page);
    await waitForResults(page);

    await context.setOffline(true);
    await page.reload();
    await page.locator('[data-testid=net-state][data-state=offline]').waitFor();
    expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
    // the demo opened before going offline is back, and computes again after an edit
    await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toMatch(/Fuel tank leak/);
    await renameInHeader(page, 'Offline edit at the site');
    await waitSaved(page);
    await waitForResults(page);
    await page.screenshot({ path: artifactPath('offline-landscape.png') });
    await page.setViewportSize(PORTRAIT);
    await page.screenshot({ path: artifactPath('offline-portrait.png') });
    const stored = await storedCases(page);
    expect(stored.map((s) => s.name)).toContain('Offline edit at the site');

    // and a second offline reload shows the saved edit
    await page.reload();
    await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe('Offline edit at the site');

    expect(expectOnlyAllowedOrigins(w)).toEqual([]);
    expect(w.cspViolations).toEqual([]);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('closing the page in the middle of an edit and reopening loses nothing', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await renameInHeader(page, 'Edited just before the tab closed');
    // close at once: the debounced save has not run yet; pagehide must keep the edit
    await page.close({ runBeforeUnload: true });

    const again = await context.newPage();
    await again.goto(w.base);
    await waitSaved(again);
    await expect.poll(() => again.getByLabel('Case name', { exact: true }).inputValue()).toBe('Edited just before the tab closed');
    const stored = await storedCases(again);
    expect(stored.filter((s) => s.name === 'Edited just before the tab closed')).toHaveLength(1);
    await context.close();
  });

  it('a second tab editing the same case gets the choice instead of a silent overwrite', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page: a, context } = w;
    await a.goto(w.base);
    await waitSaved(a);
    const b = await context.newPage();
    await b.goto(w.base); // opens the same last-open case
    await waitSaved(b);
    // tab B loses contact with the channel (as when it is frozen in the background) and edits
    await b.evaluate(() => {
      (BroadcastChannel.prototype as unknown as { postMessage: () => void }).postMessage = () => {};
    });
    await renameInHeader(a, 'Name from tab A');
    await waitSaved(a);
    // B had no unsaved edits: it follows A
    await expect.poll(() => b.getByLabel('Case name', { exact: true }).inputValue()).toBe('Name from tab A');
    // now both edit before either saves: B's save is refused by compare-and-set
    await a.evaluate(() => {
      (BroadcastChannel.prototype as unknown as { postMessage: () => void }).postMessage = () => {};
    });
    await renameInHeader(a, 'A again');
    await renameInHeader(b, 'B meanwhile');
    await waitSaved(a);
    const dialog = b.getByTestId('conflict-dialog');
    await dialog.waitFor({ timeout: 15_000 });
    await b.screenshot({ path: artifactPath('two-tabs-conflict.png') });
    await dialog.getByRole('button', { name: /Save mine as a copy/ }).click();
    await waitSaved(b);
    const names = (await storedCases(b)).map((s) => s.name).sort();
    expect(names).toEqual(['A again', 'B meanwhile (my copy)']);
    await context.close();
  });
});
