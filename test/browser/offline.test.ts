// Offline first, in real Chromium: after one visit the service worker has the app shell, so with
// the network cut (context.setOffline, which also cuts the service worker's fetches) a reload
// still opens the app, computes results and saves. Also: closing the page in the middle of an
// edit and reopening loses nothing; the page contacts no host but its own origin and the tile
// server; the Content Security Policy reports no violation.
import { describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { artifactPath, PORTRAIT, LANDSCAPE } from './browser';
import { TILE_ORIGIN, expectOnlyAllowedOrigins, openDemo, renameInHeader, storedCases, useBrowser, waitForResults, waitForServiceWorker, waitSaved, watchedPage } from './offline-helpers';

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

describe('updates and tiles', () => {
  it('an update waits for the user, saves unsaved work first, then switches', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await waitForServiceWorker(page);
    await page.reload(); // now controlled by the first version
    await waitSaved(page);
    const swPath = 'dist/sw.js';
    const original = readFileSync(swPath, 'utf8');
    try {
      // a "new version": one revision hash changed, same length (the preview server caches sizes)
      const m = original.match(/"revision": ?"([0-9a-f])/);
      if (!m || m.index === undefined) throw new Error('no precache revision found in sw.js');
      const at = m.index + m[0].length - 1;
      writeFileSync(swPath, original.slice(0, at) + (m[1] === '0' ? '1' : '0') + original.slice(at + 1));
      await page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.update());
      const button = page.getByTestId('apply-update');
      await button.waitFor({ timeout: 20_000 });
      await page.screenshot({ path: artifactPath('update-ready.png') });
      // an edit not yet saved when the user accepts the update
      await renameInHeader(page, 'Edited right before updating');
      await Promise.all([page.waitForEvent('load', { timeout: 20_000 }), button.click()]);
      await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe('Edited right before updating');
      expect(await page.getByTestId('apply-update').count()).toBe(0);
    } finally {
      writeFileSync(swPath, original);
    }
    await context.close();
  });

  it('map tiles the user viewed are cached within bounds and shown again offline', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    const tile = readFileSync('public/icons/icon-192.png'); // any PNG stands in for a tile
    let served = 0;
    await context.route(`${TILE_ORIGIN}/**`, (route) => {
      served++;
      return route.fulfill({
        status: 200,
        headers: { 'content-type': 'image/png', 'access-control-allow-origin': '*', 'cache-control': 'max-age=604800' },
        body: tile,
      });
    });
    await page.goto(w.base);
    await waitSaved(page);
    await waitForServiceWorker(page);
    await page.reload(); // controlled: tile requests now pass through the service worker
    await openDemo(page);
    await expect.poll(() => page.locator('img.leaflet-tile-loaded').count(), { timeout: 20_000 }).toBeGreaterThan(0);
    const cached = await page.evaluate(async () => (await (await caches.open('downgradient-tiles')).keys()).map((r) => r.url));
    expect(served).toBeGreaterThan(0);
    expect(cached.length).toBeGreaterThan(0);
    expect(cached.every((u) => u.startsWith('https://tile.openstreetmap.org/'))).toBe(true);

    await context.unroute(`${TILE_ORIGIN}/**`);
    await context.setOffline(true);
    await page.reload();
    await expect.poll(() => page.locator('img.leaflet-tile-loaded').count(), { timeout: 20_000 }).toBeGreaterThan(0);
    await page.screenshot({ path: artifactPath('offline-cached-tiles.png') });
    await context.close();
  });
});

describe('storage full', () => {
  it('keeps the case on screen, says so, and saves once space is back', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    // the device runs out of space: every IndexedDB write fails as browsers report it
    await page.evaluate(() => {
      const proto = IDBObjectStore.prototype as unknown as { put: unknown; __put?: unknown };
      proto.__put = proto.put;
      proto.put = function () {
        throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
      };
    });
    await renameInHeader(page, 'Written while the device was full');
    const banner = page.getByTestId('storage-full');
    await banner.waitFor({ timeout: 15_000 });
    expect(await banner.textContent()).toMatch(/storage for this app is full.*kept on screen/);
    expect(await page.getByTestId('save-state').getAttribute('data-state')).toBe('storage-full');
    expect(await page.getByLabel('Case name', { exact: true }).inputValue()).toBe('Written while the device was full');
    await page.screenshot({ path: artifactPath('storage-full-portrait.png') });
    // space is freed: the next retry (or a flush on hiding the page) saves it
    await page.evaluate(() => {
      const proto = IDBObjectStore.prototype as unknown as { put: unknown; __put?: unknown };
      proto.put = proto.__put;
    });
    await page.evaluate(() => document.dispatchEvent(new Event('visibilitychange')));
    await page.evaluate(() => window.dispatchEvent(new PageTransitionEvent('pagehide')));
    await waitSaved(page);
    expect((await storedCases(page)).map((s) => s.name)).toContain('Written while the device was full');
    await context.close();
  });
});
