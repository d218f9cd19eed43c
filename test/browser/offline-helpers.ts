// Helpers for the storage, offline, file and report browser tests: a page that records every
// host it contacts and every CSP violation, the stored cases read straight from IndexedDB with the
// raw API (not through the app's code), and waits on the app's own visible state.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { inject } from 'vitest';
import { newPage, LANDSCAPE } from './browser';

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

export async function openDemo(page: Page, file: string): Promise<void> {
  await page.selectOption('select.dg-demo', file);
  await waitSaved(page);
}

/** Results for the current inputs exist once the report says so (it checks the results' stamp). */
export async function waitForResults(page: Page): Promise<void> {
  await openFiles(page);
  await page.getByTestId('open-report').click();
  await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
  await page.locator('.dg-report-bar').getByRole('button', { name: 'Close' }).click();
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
