// Helpers for the storage, offline, file and report browser tests: a page that records every
// host it contacts and every CSP violation, the stored cases read straight from IndexedDB with the
// raw API (not through the app's code), and waits on the app's own visible state.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject } from 'vitest';
import { readFileSync } from 'node:fs';
import { launch, newPage, LANDSCAPE } from './browser';
import { parseCaseFile } from '../../src/case/io';

/** One Chromium for the test file: launched before its tests, closed after them. */
export function useBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error('browser not launched yet');
    return browser;
  };
}

/** The geographic demo case the tests open (an invented scenario, cases/README.md). */
export const DEMO_FILE = 'fuel-release-farm-well.json';
export const demoCase = () => JSON.parse(readFileSync(`cases/${DEMO_FILE}`, 'utf8'));

export interface Watched {
  context: BrowserContext;
  page: Page;
  base: string;
  origins: Set<string>;
  cspViolations: string[];
  pageErrors: string[];
}

export const TILE_ORIGIN = 'https://tile.openstreetmap.org';

export async function watchedPage(browser: Browser, viewport = LANDSCAPE, context?: BrowserContext): Promise<Watched> {
  const base = inject('baseUrl');
  const ctx = context ?? (await newPage(browser, viewport)).context;
  const page = context ? await ctx.newPage() : ctx.pages()[0];
  const origins = new Set<string>();
  const cspViolations: string[] = [];
  const pageErrors: string[] = [];
  page.on('request', (r) => {
    const u = new URL(r.url());
    if (u.protocol === 'http:' || u.protocol === 'https:') origins.add(u.origin);
  });
  page.on('console', (m) => {
    if (/Content Security Policy/i.test(m.text())) cspViolations.push(m.text());
  });
  page.on('pageerror', (e) => pageErrors.push(e.message));
  return { context: ctx, page, base, origins, cspViolations, pageErrors };
}

export async function waitSaved(page: Page): Promise<void> {
  await page.locator('[data-testid=save-state][data-state=saved]').waitFor({ timeout: 15_000 });
}

export interface StoredCase {
  id: string;
  name: string;
  revision: number;
  data: unknown;
}

/** The cases in IndexedDB, read with the raw API inside the page, sorted by id. */
export async function storedCases(page: Page): Promise<StoredCase[]> {
  return page.evaluate(
    () =>
      new Promise<StoredCase[]>((resolve, reject) => {
        const r = indexedDB.open('downgradient');
        r.onerror = () => reject(r.error);
        r.onsuccess = () => {
          const db = r.result;
          const q = db.transaction('cases').objectStore('cases').getAll();
          q.onsuccess = () => {
            db.close();
            const all = (q.result as StoredCase[]).map(({ id, name, revision, data }) => ({ id, name, revision, data }));
            resolve(all.sort((a, b) => a.id.localeCompare(b.id)));
          };
          q.onerror = () => reject(q.error);
        };
      }),
  );
}

/** Open a demo from the header's picker and wait until it is stored (read back from IndexedDB). */
export async function openDemo(page: Page, file: string = DEMO_FILE): Promise<void> {
  const name = JSON.parse(readFileSync(`cases/${file}`, 'utf8')).name as string;
  await page.selectOption('select.dg-demo', file);
  await expect.poll(async () => (await storedCases(page)).some((c) => (c.data as { name?: string }).name === name), { timeout: 15_000 }).toBe(true);
  await waitSaved(page);
}

/** The service worker has installed (app shell precached) and activated. */
export async function waitForServiceWorker(page: Page): Promise<void> {
  await expect
    .poll(() => page.evaluate(async () => (await navigator.serviceWorker.getRegistration())?.active?.state ?? 'none'), { timeout: 20_000 })
    .toBe('activated');
}

/** Results for the current inputs exist once the report says so (it checks the results' stamp). */
export async function waitForResults(page: Page): Promise<void> {
  await openFiles(page);
  await page.getByTestId('open-report').click();
  await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
  await page.locator('.dg-report-bar').getByRole('button', { name: 'Close' }).click();
}

/** Click the export button with this test id and read the file it downloads. */
export async function download(page: Page, testid: string): Promise<{ name: string; text: string }> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
  const path = await dl.path();
  return { name: dl.suggestedFilename(), text: readFileSync(path, 'utf8') };
}

export async function openFiles(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Cases and files' }).click();
  await page.getByRole('tab', { name: 'Files' }).click();
}

/** Rename the open case through the header field, as a user would. */
export async function renameInHeader(page: Page, name: string): Promise<void> {
  const field = page.getByLabel('Case name', { exact: true });
  await field.fill(name);
  await field.press('Enter');
  await field.blur();
}

export function expectOnlyAllowedOrigins(w: Watched): string[] {
  const own = new URL(w.base).origin;
  return [...w.origins].filter((o) => o !== own && o !== TILE_ORIGIN);
}

/** Names of the cases in the unsaved-edits journal store, read with the raw API inside the page. */
export async function journaledNames(page: Page): Promise<string[]> {
  return page.evaluate(
    () =>
      new Promise<string[]>((resolve, reject) => {
        const r = indexedDB.open('downgradient');
        r.onerror = () => reject(r.error);
        r.onsuccess = () => {
          const db = r.result;
          if (!db.objectStoreNames.contains('journal')) return (db.close(), resolve([]));
          const q = db.transaction('journal').objectStore('journal').getAll();
          q.onsuccess = () => {
            db.close();
            resolve((q.result as { data: { name: string } }[]).map((j) => j.data.name));
          };
          q.onerror = () => reject(q.error);
        };
      }),
  );
}

/** Results for the case on screen, not stale, and the plume drawn (bands, or the legend saying there are none). */
export async function settled(page: Page): Promise<void> {
  await page.waitForFunction(
    () =>
      document.querySelector('[data-testid=results]')?.getAttribute('data-stale') === 'false' &&
      (document.querySelectorAll('path.dg-band').length > 0 || !!document.querySelector('[data-testid=plume-key-none]')),
    undefined,
    { timeout: 30_000 },
  );
  await page.waitForTimeout(300);
}

/**
 * A fresh page (touch, service workers blocked, page errors collected) on a demo case picked in the
 * header, once the receptor table lists every receptor of the case: the start of the tests of one
 * panel (wells, uncertainty). `close` closes its context.
 */
export async function openDemoPage(browser: Browser, file: string, viewport = LANDSCAPE): Promise<{ page: Page; errors: string[]; close: () => Promise<void> }> {
  const parsed = parseCaseFile(readFileSync(`cases/${file}`, 'utf8'));
  if (!parsed.ok) throw new Error(`demo case ${file} unreadable`);
  const receptors = parsed.case.site.receptors.length;
  const context = await browser.newContext({ viewport, deviceScaleFactor: 1, hasTouch: true, serviceWorkers: 'block' });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(inject('baseUrl'));
  await page.waitForSelector('.dg-mark-source');
  const ok = page.locator('button', { hasText: /^OK$/ });
  if (await ok.isVisible().catch(() => false)) await ok.click();
  await page.selectOption('select.dg-demo', file);
  await page.waitForFunction((n) => document.querySelectorAll('[data-testid=receptor-table] tbody tr').length === n, receptors);
  return { page, errors, close: () => context.close() };
}

/** Type a number into the field with this label and leave it (Tab), as a user would. */
export async function setNumber(page: Page, label: string, value: number): Promise<void> {
  const input = page.getByLabel(label, { exact: true });
  await input.fill(String(value));
  await input.press('Tab');
}

/** A fresh page on the main screen (the first-visit notice dismissed), optionally on a demo case, with its results settled. */
export async function startScreen(browser: Browser, viewport = LANDSCAPE, file?: string): Promise<Watched> {
  const w = await watchedPage(browser, viewport);
  await w.page.goto(w.base);
  await w.page.waitForSelector('.dg-mark-source');
  const ok = w.page.locator('button', { hasText: /^OK$/ });
  if (await ok.isVisible().catch(() => false)) await ok.click();
  if (file) await openDemo(w.page, file);
  await settled(w.page);
  return w;
}
