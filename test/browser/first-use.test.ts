// What a first-time user tripped over (issue 13 items 10 and 19), held in real Chromium: nothing
// clipped on a phone (390×844: every control wholly inside the viewport and at least 44 px tall,
// common practice for touch targets), a wide table that says it scrolls, the caution strip over
// nothing, the legend when there is no plume above the limit and its swatches in the dark theme,
// the material picker, a creek's fields, the new case's preset, a receptor tapped on the map.
// Screenshots at 1024×768, 768×1024 and 390×844 are kept in test-artifacts/.
import { describe, expect, it } from 'vitest';
import { inflateSync } from 'node:zlib';
import type { Locator, Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PORTRAIT, PHONE } from './browser';
import { startScreen, useBrowser } from './offline-helpers';

const getBrowser = useBrowser();
const NITRATE = 'nitrate-field-supply.json';

const start = (viewport = LANDSCAPE, file?: string) => startScreen(getBrowser(), viewport, file);

/** The control, scrolled into view, lies wholly inside the viewport and is at least 44 px tall. */
async function wholeInView(control: Locator, viewport: { width: number; height: number }, what: string): Promise<void> {
  await control.scrollIntoViewIfNeeded();
  const b = (await control.boundingBox())!;
  expect(b, what).not.toBeNull();
  const box = { left: b.x, top: b.y, right: b.x + b.width, bottom: b.y + b.height, height: b.height };
  expect(box.left, `${what}: left edge`).toBeGreaterThanOrEqual(0);
  expect(box.right, `${what}: right edge`).toBeLessThanOrEqual(viewport.width);
  expect(box.top, `${what}: top edge`).toBeGreaterThanOrEqual(0);
  expect(box.bottom, `${what}: bottom edge`).toBeLessThanOrEqual(viewport.height);
  expect(box.height, `${what}: height`).toBeGreaterThanOrEqual(44);
}

describe('phone (390×844): nothing clipped', () => {
  it('Steady state, the receptor table (with its cue to scroll sideways), the case sheet\'s Close and the Compare selectors', async () => {
    const w = await start(PHONE, NITRATE);
    const { page } = w;
    await wholeInView(page.locator('button.dg-steady'), PHONE, 'Steady state');
    await wholeInView(page.locator('button.dg-play'), PHONE, 'Play');

    // the receptor table is wider than the phone: a visible line says so, and its last column can be scrolled to
    const table = page.getByTestId('receptor-table');
    await table.scrollIntoViewIfNeeded();
    const outer = page.locator('.dg-scroll-x-outer', { has: table });
    expect(await outer.getAttribute('data-more')).toBe('right');
    const cue = outer.locator('.dg-scroll-cue');
    expect(await cue.isVisible()).toBe(true);
    expect(await cue.innerText()).toMatch(/swipe the table sideways/);
    await page.screenshot({ path: artifactPath('first-use-table-phone.png') });
    const lastHead = table.locator('thead th').last();
    expect(await lastHead.innerText()).toMatch(/^Peak/);
    await outer.locator('.dg-scroll-x').evaluate((el) => (el.scrollLeft = el.scrollWidth));
    await expect.poll(() => outer.getAttribute('data-more')).toBe('end');
    const head = (await lastHead.boundingBox())!;
    expect(head.x).toBeGreaterThanOrEqual(0);
    expect(head.x + head.width).toBeLessThanOrEqual(PHONE.width);
    // the receptor's name stays beside its figures while the table scrolls
    const name = (await table.locator('tbody th[scope=row]').first().boundingBox())!;
    expect(name.x).toBeGreaterThanOrEqual(0);
    expect(name.x + name.width).toBeLessThanOrEqual(head.x);
    await page.screenshot({ path: artifactPath('first-use-table-scrolled-phone.png') });

    // the case sheet: Close whole, and on the Compare tab both selectors inside the screen
    await page.getByRole('button', { name: 'Cases and files' }).click();
    const sheet = page.locator('dialog.dg-lib-sheet');
    await wholeInView(sheet.getByRole('button', { name: 'Close' }), PHONE, 'Close');
    await page.getByRole('tab', { name: 'Compare' }).click();
    await page.getByTestId('compare-view').waitFor();
    for (const label of ['First case', 'Second case']) await wholeInView(sheet.getByLabel(label), PHONE, label);
    await sheet.getByTestId('compare-receptors').waitFor({ timeout: 30_000 });
    // the sheet itself does not scroll sideways: its wide tables do, inside it
    expect(await sheet.evaluate((d) => d.scrollWidth - d.clientWidth)).toBeLessThanOrEqual(1);
    await wholeInView(sheet.getByRole('button', { name: 'Close' }), PHONE, 'Close (Compare tab)');
    await page.screenshot({ path: artifactPath('first-use-compare-phone.png') });
    expect(w.pageErrors).toEqual([]);
    await w.context.close();
  });
});

describe('polish (item 19)', () => {
  for (const [name, viewport] of [['landscape', LANDSCAPE], ['portrait', PORTRAIT], ['phone', PHONE]] as const) {
    it(`the caution strip lies under the map and panel, over nothing; the page has one h1 (${name})`, async () => {
      const w = await start(viewport, NITRATE);
      const { page } = w;
      const strip = (await page.getByTestId('caution-strip').boundingBox())!;
      const main = (await page.locator('main.dg-main').boundingBox())!;
      expect(strip.y).toBeGreaterThanOrEqual(main.y + main.height - 0.5);
      expect(strip.y + strip.height).toBeLessThanOrEqual(viewport.height + 0.5);
      // the heading is the app's name (shown beside the mark where there is room)
      expect(await page.locator('h1').count()).toBe(1);
      expect(await page.locator('h1').innerText()).toMatch(/Downgradient/);
      await page.screenshot({ path: artifactPath(`first-use-demo-${name}.png`) });
      await w.context.close();
    });
  }

  it('with the limit at or above C₀ the legend says the plume is everywhere below the limit', async () => {
    const w = await start(LANDSCAPE);
    const { page } = w;
    await page.click('[data-section=risk] .dg-sec-toggle');
    const limit = page.locator('[data-field="contaminant.limit"] input.dg-num');
    await limit.fill('20'); // mg/L, above the new case's C₀ of 10 mg/L
    await limit.press('Tab');
    await page.getByTestId('plume-key-none').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('plume-key').innerText()).toMatch(/no band: the limit is at or above the source concentration C₀, so the plume is everywhere below the limit/);
    expect(await page.locator('.dg-swatch').count()).toBe(0);
    await w.context.close();
  });

  it('dark theme: each legend swatch shows the colour its band has on the map', async () => {
    const w = await start(LANDSCAPE);
    const { page } = w;
    await page.getByRole('button', { name: 'Dark theme' }).click();
    await page.waitForTimeout(500);
    const n = await page.locator('.dg-swatch').count();
    expect(n).toBeGreaterThanOrEqual(2);
    for (let k = 0; k < 2; k++) {
      const onMap = (await bandColour(page, k))!;
      expect(onMap, `a patch of band ${k} alone on the map`).not.toBeNull();
      const sw = (await page.locator('.dg-swatch').nth(k).boundingBox())!;
      const inKey = await pixel(page, sw.x + sw.width / 2, sw.y + sw.height / 2);
      // same colour to within 6 of 255 per channel (anti-aliasing and rounding of the blend)
      for (let ch = 0; ch < 3; ch++) expect(Math.abs(onMap[ch] - inKey[ch]), `band ${k} channel ${ch}: map ${onMap} key ${inKey}`).toBeLessThanOrEqual(6);
    }
    await page.screenshot({ path: artifactPath('first-use-dark-legend.png') });
    await w.context.close();
  });

  it('a material keeps its name in the picker after filling in K; a creek has no screen or pumping fields; a new case says it holds the benzene preset', async () => {
    const w = await start(LANDSCAPE);
    const { page } = w;
    const preset = page.locator('[data-group=contaminant] select.dg-select');
    await preset.scrollIntoViewIfNeeded();
    expect(await preset.inputValue()).toBe('benzene');
    expect(await page.locator('[data-group=contaminant] input.dg-text').first().inputValue()).toBe('benzene');

    await page.click('[data-section=aquifer] .dg-sec-toggle');
    const material = page.locator('[data-group=aquifer] select.dg-select').first();
    await material.selectOption('medium-sand');
    const k = page.locator('[data-field="aquifer.hydraulicConductivity"] input.dg-num');
    await expect.poll(() => k.inputValue()).toBe('10');
    expect(await material.inputValue()).toBe('medium-sand');
    // typing another K: the picker no longer claims the material
    await k.fill('13');
    await k.press('Tab');
    await expect.poll(() => material.inputValue()).toBe('');

    await page.click('[data-section=risk] .dg-sec-toggle');
    await page.click('button[data-action=add-receptor-downgradient]');
    const item = page.locator('[data-testid=receptor-list] > li[data-receptor]').first();
    await item.waitFor();
    expect(await item.getByText('Pumps').count()).toBe(1);
    expect(await item.getByText('Screen top below water table').count()).toBe(1);
    await item.locator('select.dg-select').first().selectOption('surface-water');
    await expect.poll(() => item.getByText('Pumps').count()).toBe(0);
    expect(await item.getByText(/Screen/).count()).toBe(0);
    expect(await item.getByText('Depth below water table: from').count()).toBe(1);
    await item.screenshot({ path: artifactPath('first-use-creek-receptor.png') });
    expect(w.pageErrors).toEqual([]);
    await w.context.close();
  });

  for (const [name, viewport] of [['landscape', LANDSCAPE], ['phone', PHONE]] as const) {
    it(`tapping a receptor on the map brings its row of the results table into view (${name})`, async () => {
      const w = await start(viewport, NITRATE);
      const { page } = w;
      // the inputs opened above the results, and the panel (or, on a phone, the page) scrolled to its top
      await page.click('[data-section=release] .dg-sec-toggle');
      await page.evaluate(() => {
        for (const el of document.querySelectorAll('.dg-panel, .dg-main')) el.scrollTop = 0;
      });
      const row = page.locator('[data-testid=receptor-table] tbody tr', { hasText: 'Village supply well' });
      const inView = async () => {
        const b = await row.boundingBox();
        return !!b && b.y >= 0 && b.y + Math.min(b.height, 60) <= viewport.height;
      };
      expect(await inView()).toBe(false);
      await page.locator('.dg-mark-receptor[title="Village supply well"]').click();
      await expect.poll(inView, { timeout: 5_000 }).toBe(true);
      expect(await row.getAttribute('class')).toMatch(/dg-selected/);
      await w.context.close();
    });
  }
});

/**
 * Screen points inside band k's fill but not band k+1's, away from its edge and from marks and
 * controls (grid lines are ruled out by the caller, which wants a patch of one colour).
 */
async function onlyBand(page: Page, k: number): Promise<{ x: number; y: number }[]> {
  return page.evaluate((k) => {
    const band = document.querySelector<SVGPathElement>(`path.dg-band-${k}`);
    const next = document.querySelector<SVGPathElement>(`path.dg-band-${k + 1}`);
    const map = document.querySelector('.dg-map')!.getBoundingClientRect();
    if (!band) return [];
    const local = (p: SVGPathElement, x: number, y: number) => new DOMPoint(x, y).matrixTransform(p.getScreenCTM()!.inverse());
    const inside = (p: SVGPathElement | null, x: number, y: number) => !!p && p.isPointInFill(local(p, x, y));
    const clean = (x: number, y: number) => {
      for (const [dx, dy] of [[0, 0], [-8, 0], [8, 0], [0, -8], [0, 8]]) {
        const X = x + dx, Y = y + dy;
        if (!inside(band, X, Y) || inside(next, X, Y)) return false;
        const top = document.elementFromPoint(X, Y);
        if (!top || top.closest('.leaflet-marker-icon, .leaflet-control, .dg-map-foot, .dg-tool-hint')) return false;
      }
      return true;
    };
    const out: { x: number; y: number }[] = [];
    for (let y = map.top + 20; y < map.bottom - 20 && out.length < 40; y += 4)
      for (let x = map.left + 20; x < map.right - 20 && out.length < 40; x += 4) if (clean(x, y)) out.push({ x, y });
    return out;
  }, k);
}

/** A point of band k alone where the map shows one colour over a few pixels (no grid line, no edge), and that colour. */
async function bandColour(page: Page, k: number): Promise<[number, number, number] | null> {
  for (const p of await onlyBand(page, k)) {
    const c = await pixel(page, p.x, p.y);
    const around = [await pixel(page, p.x - 3, p.y), await pixel(page, p.x + 3, p.y), await pixel(page, p.x, p.y - 3), await pixel(page, p.x, p.y + 3)];
    if (around.every((a) => a.every((v, ch) => Math.abs(v - c[ch]) <= 1))) return c;
  }
  return null;
}

/** The colour of one screen pixel [r, g, b], read from a 1×1 screenshot (a PNG with one row: any filter leaves the bytes as they are). */
async function pixel(page: Page, x: number, y: number): Promise<[number, number, number]> {
  const png = await page.screenshot({ clip: { x: Math.round(x), y: Math.round(y), width: 1, height: 1 } });
  let at = 8;
  const idat: Buffer[] = [];
  let colourType = 2;
  while (at < png.length) {
    const len = png.readUInt32BE(at);
    const type = png.toString('ascii', at + 4, at + 8);
    if (type === 'IHDR') colourType = png[at + 8 + 9];
    if (type === 'IDAT') idat.push(png.subarray(at + 8, at + 8 + len));
    at += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  if (colourType !== 2 && colourType !== 6) throw new Error(`unexpected PNG colour type ${colourType}`);
  return [raw[1], raw[2], raw[3]];
}
