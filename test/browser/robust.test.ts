// Nothing a user imports or does can lock them out, and a hard kill loses at most the edit in
// flight (issue 14), in real Chromium. Each class of case file
// whose shape passes the schema but whose positions fail the site checks (a receptor about
// 1,400 km from the datum, a datum longitude of 500, a datum latitude of 95, a receptor at ±1e308,
// a water-level well at latitude 1e308) is refused at import with the field named, and nothing is
// stored; kept anyway "to repair", it is listed as needing repair. After a restart the app opens
// on a case it can draw, names the passed-over case, and the case list, the demo picker and the
// needing-repair case itself all open; switching from it to another case works.
// The accepted ranges are the app's own (WGS 84 longitude −180…180, latitude −90…90, and the
// 1,000 km site-scale limit of src/geo/projection.ts).
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { artifactPath, killBrowser, launchPersistent, LANDSCAPE } from './browser';
import { demoCase, journaledNames, openDemo, openFiles, renameInHeader, storedCases, useBrowser, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();
const demo = demoCase();
const [lon0, lat0] = demo.site.datum as [number, number];

type Variant = { name: string; edit: (c: typeof demo) => void; field: RegExp };
const VARIANTS: Variant[] = [
  { name: 'receptor far away', field: /Receptor|receptor/, edit: (c) => void (c.site.receptors[0].position = [lon0 + 20, lat0]) },
  { name: 'datum longitude 500', field: /datum/i, edit: (c) => void (c.site.datum = [500, lat0]) },
  { name: 'datum latitude 95', field: /datum/i, edit: (c) => void (c.site.datum = [lon0, 95]) },
  { name: 'receptor at 1e308', field: /Receptor|receptor/, edit: (c) => void (c.site.receptors[0].position = [1e308, -1e308]) },
  {
    name: 'water level at latitude 1e308',
    field: /[Ww]ater.level|reading/,
    edit: (c) =>
      void (c.site.flow = {
        method: 'heads',
        readings: [
          { id: 'h1', name: 'MW1', position: [lon0, lat0], head: { value: 10, unit: 'm' } },
          { id: 'h2', name: 'MW2', position: [lon0 + 0.001, lat0], head: { value: 9.9, unit: 'm' } },
          { id: 'h3', name: 'MW3', position: [lon0, 1e308], head: { value: 9.8, unit: 'm' } },
        ],
      }),
  },
];

async function importFile(page: Page, name: string, text: string): Promise<string> {
  await page.getByTestId('import-input').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(text) });
  const msg = page.getByTestId('files-message');
  await expect.poll(async () => (await msg.textContent()) ?? '').toContain(name);
  return (await msg.textContent()) ?? '';
}

describe('nothing imported can lock the user out', () => {
  it('refuses each class at import, keeps it for repair on request, and restarts on a safe screen', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    await openFiles(page);

    for (const [i, v] of VARIANTS.entries()) {
      const bad = structuredClone(demo);
      v.edit(bad);
      bad.id = `bad-${i}`;
      bad.name = `Needs repair: ${v.name}`;
      const before = await storedCases(page);
      const file = `bad-${i}.json`;
      const msg = await importFile(page, file, JSON.stringify(bad));
      // said at import time, naming the field, and nothing stored
      expect(msg, v.name).toMatch(v.field);
      expect(msg, v.name).toMatch(/Nothing was imported/);
      expect(await storedCases(page), v.name).toEqual(before);
      // kept anyway, to repair
      await page.getByTestId('keep-for-repair').click();
      await expect.poll(async () => (await storedCases(page)).some((s) => s.id === bad.id), { timeout: 10_000 }).toBe(true);
      await expect.poll(async () => (await page.getByTestId('files-message').textContent()) ?? '').toMatch(/needs repair/);
    }
    await page.getByRole('tab', { name: 'On this device' }).click();
    await expect.poll(() => page.getByTestId('needs-repair').count()).toBe(VARIANTS.length);
    await page.keyboard.press('Escape');

    // restart: the last case opened (a needing-repair one) is passed over, named, and listed
    await page.reload();
    await waitSaved(page);
    await expect.poll(async () => (await page.locator('.dg-notice').allTextContents()).join(' ')).toMatch(/was not opened at start/);
    expect(await page.getByLabel('Case name', { exact: true }).inputValue()).not.toMatch(/Needs repair/);
    await page.locator('.dg-map.leaflet-container').waitFor();
    expect(await page.getByTestId('map-problem').count()).toBe(0);
    await page.screenshot({ path: artifactPath('robust-restart.png') });
    await page.locator('.dg-notice').getByRole('button', { name: 'OK' }).click();

    // the case list opens and lists every case that needs repair; each opens and shows what is wrong
    await page.getByRole('button', { name: 'Cases and files' }).click();
    await expect.poll(() => page.getByTestId('needs-repair').count()).toBe(VARIANTS.length);
    for (const [i, v] of VARIANTS.entries()) {
      if (!(await page.locator('dialog.dg-lib-sheet[open]').count())) await page.getByRole('button', { name: 'Cases and files' }).click();
      await page.locator(`[data-case-id=bad-${i}] .dg-lib-name`).click();
      await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe(`Needs repair: ${v.name}`);
      await page.getByTestId('map-problem').waitFor();
      expect(await page.getByTestId('map-problem').textContent(), v.name).toMatch(v.field);
      await page.getByTestId('input-issue').waitFor();
    }
    await page.screenshot({ path: artifactPath('robust-needs-repair.png') });

    // switch away to another stored case, then to a demo
    await page.getByRole('button', { name: 'Cases and files' }).click();
    const demoId = (await storedCases(page)).find((s) => s.name === demo.name)?.id;
    await page.locator(`[data-case-id="${demoId}"] .dg-lib-name`).click();
    await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe(demo.name);
    await page.locator('.dg-map.leaflet-container').waitFor();
    await page.selectOption('select.dg-demo', { index: 1 });
    await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).not.toMatch(/Needs repair/);
    expect(await page.getByTestId('map-problem').count()).toBe(0);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});

describe('a hard kill loses at most the edit in flight', () => {
  it('SIGKILL of the browser right after an edit: the edit is there on restart, no copy made', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dg-kill-'));
    try {
      const base = inject('baseUrl');
      let ctx = await launchPersistent(dir);
      let page = ctx.pages()[0] ?? (await ctx.newPage());
      await page.goto(base);
      await waitSaved(page);
      await openDemo(page);
      await renameInHeader(page, 'Edited a moment before the kill');
      // the edit's copy is in IndexedDB at once (no quiet time), well before the debounced save; on a
      // loaded machine the save may already have run (and cleared the copy) by the time we look
      const durable = async () => [...(await journaledNames(page)), ...(await storedCases(page)).map((s) => s.name)];
      await expect.poll(durable, { timeout: 5_000, interval: 20 }).toContain('Edited a moment before the kill');
      const stateAtKill = await page.getByTestId('save-state').getAttribute('data-state');
      killBrowser(dir);
      await ctx.close().catch(() => {});

      ctx = await launchPersistent(dir);
      page = ctx.pages()[0] ?? (await ctx.newPage());
      await page.goto(base);
      await waitSaved(page);
      await expect.poll(() => page.getByLabel('Case name', { exact: true }).inputValue()).toBe('Edited a moment before the kill');
      const names = (await storedCases(page)).map((s) => s.name);
      expect(names, `saved state at the kill: ${stateAtKill}`).toContain('Edited a moment before the kill');
      expect(names.some((n) => /recovered edits/.test(n))).toBe(false);
      await ctx.close();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a clean start', () => {
  it('reports no Content Security Policy violation, requests no default marker image and no request of its own origin fails', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    // violations as the page itself sees them (the schema library's eval probe was one). Seen to
    // fail without the fix: with src/case/zodConfig.ts's z.config({ jitless: true }) commented out,
    // this test received ['script-src eval'] (checked 2026-12-03); with it, none.
    await page.addInitScript(() => {
      const seen: string[] = ((window as unknown as { __csp: string[] }).__csp = []);
      document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} ${e.blockedURI}`));
    });
    const failed: string[] = [];
    const requested: string[] = [];
    page.on('request', (r) => requested.push(r.url()));
    // a chunk still loading when the page reloads is aborted by the reload, not failed
    page.on('requestfailed', (r) => void (r.failure()?.errorText !== 'net::ERR_ABORTED' && failed.push(r.url())));
    page.on('response', (r) => void (r.status() >= 400 && failed.push(`${r.status()} ${r.url()}`)));
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page); // receptors and water-level marks drawn
    await page.reload();
    await waitSaved(page);
    await page.locator('.dg-map.leaflet-container').waitFor();
    const own = new URL(w.base).origin;
    expect(failed.filter((u) => u.includes(own))).toEqual([]);
    expect(requested.filter((u) => /marker-(icon|shadow)/.test(u))).toEqual([]);
    expect(await page.evaluate(() => (window as unknown as { __csp: string[] }).__csp)).toEqual([]);
    expect(w.cspViolations).toEqual([]);
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it('the map attribution typed in Settings is shown as text; only plain links become links', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page); // a case on the basemap, so the tile layer and its attribution are shown
    const hostile = '<img src=x onerror="window.__pwned=1">Tiles <b>bold</b> © <a href="https://example.org/credits">Example maps</a> <a href="javascript:alert(1)">x</a>';
    await page.evaluate((a) => {
      const s = JSON.parse(localStorage.getItem('downgradient.settings.v1') ?? '{}');
      localStorage.setItem('downgradient.settings.v1', JSON.stringify({ ...s, tileAttribution: a }));
    }, hostile);
    await page.reload();
    await waitSaved(page);
    const box = page.locator('.leaflet-control-attribution');
    await expect.poll(async () => (await box.textContent()) ?? '').toContain('<img src=x');
    expect(await box.locator('img, b, script').count()).toBe(0);
    const links = await box.locator('a').evaluateAll((as) => as.map((a) => [a.getAttribute('href'), a.textContent]));
    expect(links).toEqual([['https://example.org/credits', 'Example maps']]);
    expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
    await context.close();
  });
});
