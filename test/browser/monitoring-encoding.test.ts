// The monitoring CSV import reads its bytes through the one text decoder (src/case/text.ts: UTF-8
// with or without its mark, UTF-16 with its mark, everything else refused), in real Chromium on the
// invented depot demo with the invented 2024 lab table (cases/depot-benzene-2024.csv, its units
// written "µg/L" and its dates as YYYY-MM-DD here). The table saved as Windows-1252 (µ is the byte
// 0xB5, not UTF-8) is refused with the decoder's message and the case is unchanged; the same table
// saved as UTF-16 (little-endian, with its byte-order mark) imports its 20 results, µg/L read as such.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { LANDSCAPE } from './browser';
import { openDemoPage, useBrowser } from './offline-helpers';

const getBrowser = useBrowser();

/** the lab table with "µg/L" units and ISO dates (its dd/mm/yyyy dates turned round) */
const table = readFileSync('cases/depot-benzene-2024.csv', 'utf8')
  .replace(/ug\/l/g, 'µg/L')
  .replace(/(\d{2})\/(\d{2})\/(\d{4})/g, '$3-$2-$1');

const monitoring = (page: Page): Promise<{ results: { unit: string; date: string }[] }> =>
  page.evaluate(() => (window as unknown as { __downgradient: { currentCase: () => { monitoring: { results: { unit: string; date: string }[] } } } }).__downgradient.currentCase().monitoring);

describe('monitoring CSV import through the one decoder', () => {
  it('refuses Windows-1252 with the message and nothing changed; reads UTF-16 with its mark', async () => {
    expect(table).toMatch(/µg\/L/);
    const { page, errors, close } = await openDemoPage(getBrowser(), 'depot-benzene-monitoring.json', LANDSCAPE);
    await page.locator('[data-section=monitoring] .dg-sec-toggle').click();
    const section = page.locator('[data-section=monitoring]');
    const file = page.getByTestId('observations-file');
    await file.waitFor();
    const before = JSON.stringify(await monitoring(page));

    // Windows-1252: µ is 0xB5, which UTF-8 cannot read
    const cp1252 = Buffer.from(table, 'latin1');
    expect(cp1252.includes(0xb5)).toBe(true);
    await file.setInputFiles({ name: 'lab-2024-cp1252.csv', mimeType: 'text/csv', buffer: cp1252 });
    const alert = section.locator('.dg-monitoring-import [role=alert]');
    await expect
      .poll(async () => (await alert.textContent()) ?? '')
      .toMatch(/^Not imported: the file is not UTF-8 text \(byte \d+ cannot be read as UTF-8; it may be in a Windows or Latin-1 encoding\); save it as UTF-8/);
    expect(await page.getByTestId('observations-mapping').count()).toBe(0);
    expect(JSON.stringify(await monitoring(page))).toBe(before);

    // UTF-16 little-endian with its byte-order mark: read, 20 results ready and imported
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(table, 'utf16le')]);
    await file.setInputFiles({ name: 'lab-2024-utf16.csv', mimeType: 'text/csv', buffer: utf16 });
    await page.getByTestId('observations-mapping').waitFor();
    await expect.poll(async () => (await page.getByTestId('observations-preview').textContent()) ?? '').toMatch(/^20 results ready/);
    expect(await alert.count()).toBe(0);
    await page.getByTestId('observations-accept').click();
    await expect.poll(async () => (await section.textContent()) ?? '').toMatch(/Imported 20 results/);
    const after = await monitoring(page);
    const n = JSON.parse(before).results.length;
    expect(after.results).toHaveLength(n + 20);
    expect(after.results.slice(n).every((r) => r.unit === 'ug/L' && /^2024-/.test(r.date))).toBe(true);
    expect(errors).toEqual([]);
    await close();
  });
});
