// What a first-time user tripped over on a phone (issue 13, noticed in the field trial): notices
// covered the header; map labels of receptors, water levels and monitoring wells overprinted each
// other in the demo cases. In real Chromium at 390×844, screenshots kept in test-artifacts/.
import { describe, expect, it } from 'vitest';
import { artifactPath, PHONE } from './browser';
import { settled, startScreen, useBrowser, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();

describe('on a phone', () => {
  it('a notice sits over the top of the map, below the header and the map tools, never over them', async () => {
    const w = await watchedPage(getBrowser(), PHONE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    const notice = page.locator('.dg-notices .dg-notice').first();
    await notice.waitFor({ state: 'visible', timeout: 30_000 });
    await page.waitForTimeout(300);
    const header = (await page.locator('.dg-header').boundingBox())!;
    const map = (await page.locator('.dg-map').boundingBox())!;
    const box = (await notice.boundingBox())!;
    expect(box.y).toBeGreaterThanOrEqual(header.y + header.height);
    expect(box.y).toBeGreaterThanOrEqual(map.y);
    expect(box.y + box.height).toBeLessThanOrEqual(PHONE.height);
    await page.screenshot({ path: artifactPath('field-trial-notice-phone.png') });
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });

  it.each(['nitrate-field-supply.json', 'depot-benzene-monitoring.json', 'riverside-supply-well.json'])('map labels of %s: none overprints another or leaves the map (declutter.ts)', async (file) => {
    const w = await startScreen(getBrowser(), PHONE, file);
    const { page, context } = w;
    await settled(page);
    const boxes = async () => {
      const map = (await page.locator('.dg-map').boundingBox())!;
      const labels = await page.locator('.dg-mark-label').evaluateAll((els) =>
        els
          .filter((e) => getComputedStyle(e).display !== 'none')
          .map((e) => {
            const r = e.getBoundingClientRect();
            return { text: e.textContent ?? '', x: r.x, y: r.y, w: r.width, h: r.height };
          }),
      );
      return { map, labels };
    };
    const clash = async () => {
      const { map, labels } = await boxes();
      const problems: string[] = [];
      for (const a of labels) {
        if (a.x < map.x - 0.5 || a.y < map.y - 0.5 || a.x + a.w > map.x + map.width + 0.5 || a.y + a.h > map.y + map.height + 0.5) problems.push(`${a.text} leaves the map`);
        for (const b of labels) if (a !== b && a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h) problems.push(`${a.text} / ${b.text}`);
      }
      return { problems, shown: labels.length };
    };
    await expect.poll(async () => (await clash()).problems, { timeout: 15_000 }).toEqual([]);
    expect((await clash()).shown).toBeGreaterThan(0);
    await page.screenshot({ path: artifactPath(`field-trial-labels-${file.replace('.json', '')}-phone.png`) });
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});
