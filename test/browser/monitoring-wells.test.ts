// Monitoring wells on the map and entered by hand, in real Chromium on the invented depot demo:
// the five wells are vial marks labelled with their latest result; tapping one opens its results,
// trend and measured series on the modelled curve (non-detects drawn as open triangles); the
// measured-against-modelled scatter with its named figures; a result typed by hand (bad text is
// refused naming the field, nothing stored; a "<" non-detect is kept as such; a second result on
// the same date is refused); a well placed with the map tool and moved by typed coordinates.
// Screenshots at 1024×768, 768×1024 and 390×844 go to test-artifacts/; axe-core (npm) finds
// nothing serious or critical with the panel open.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openDemo, storedCases, useBrowser, waitSaved, watchedPage } from './offline-helpers';
import { axe } from './axe-helpers';

const getBrowser = useBrowser();
const DEMO = 'depot-benzene-monitoring.json';
const demo = JSON.parse(readFileSync(`cases/${DEMO}`, 'utf8'));

interface Mon {
  wells: { id: string; name: string; position: [number, number] | null }[];
  results: { wellId: string; date: string; value: number; unit: string; nonDetect: boolean; analyte: string }[];
}
const monitoring = (page: Page): Promise<Mon> =>
  page.evaluate(() => (window as unknown as { __downgradient: { currentCase: () => { monitoring: Mon } } }).__downgradient.currentCase().monitoring);

describe('monitoring wells in the app', () => {
  it('marks on the map, a tap shows the well with its curve, the scatter, hand entry and a placed well', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, DEMO);

    // five vial marks, labelled with the latest result
    const marks = page.locator('.dg-mark-monitor');
    await expect.poll(() => marks.count()).toBe(5);
    const labels = await page.locator('.dg-mark-monitor .dg-mark-label').allTextContents();
    expect(labels.join('|')).toMatch(/MW-1: [<\d]/);
    await page.screenshot({ path: artifactPath('monitoring-wells-map-landscape.png') });

    // a tap on MW-3 opens the panel at its results, trend and curve
    await marks.filter({ hasText: 'MW-3' }).click();
    const detail = page.getByTestId('monitoring-well');
    await detail.waitFor();
    expect(await detail.getAttribute('data-mwell')).toBe('mw-3');
    const mw3 = demo.monitoring.results.filter((r: { wellId: string }) => r.wellId === 'mw-3');
    const nd3 = mw3.filter((r: { nonDetect: boolean }) => r.nonDetect).length;
    expect(await detail.locator('[data-testid=monitoring-results] tbody tr').count()).toBe(mw3.length);
    expect(await detail.getByTestId('monitoring-well-trend').textContent()).toMatch(/Trend over \d+ rounds: (increasing|probably increasing|stable|probably decreasing|decreasing|no trend)/);
    const chart = detail.getByTestId('well-chart');
    await chart.waitFor();
    expect(await chart.locator('[data-testid=well-chart-points] circle').count()).toBe(mw3.length - nd3);
    expect(await chart.locator('[data-testid=well-chart-points] path').count()).toBe(nd3);
    expect(await chart.locator('.dg-chart-line').getAttribute('d')).toMatch(/^M[\d.]+ [\d.]+L/);

    // the scatter with its named figures
    const scatter = page.getByTestId('model-scatter');
    await scatter.waitFor();
    expect(await scatter.locator('.dg-chart-oneone').count()).toBe(1);
    expect(await scatter.locator('.dg-chart-tenfold').count()).toBe(2);
    const figures = (await scatter.getByTestId('scatter-figures').textContent()) ?? '';
    expect(figures).toMatch(/within a factor of ten of the model\d+ \(\d+ %\)/);
    expect(figures).toMatch(/root-mean-square log₁₀ misfit/);
    expect(await scatter.locator('[data-testid=scatter-points] > *').count()).toBeGreaterThan(50);

    for (const [label, vp] of [['landscape', LANDSCAPE], ['portrait', PORTRAIT], ['phone', { width: 390, height: 844 }]] as const) {
      await page.setViewportSize(vp);
      await detail.scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`monitoring-well-${label}.png`) });
      await scatter.scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`monitoring-scatter-${label}.png`) });
    }
    await page.setViewportSize(LANDSCAPE);
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings, JSON.stringify(findings, null, 1)).toEqual([]);

    // hand entry: text in the value is refused naming the field, and nothing is stored
    const before = (await monitoring(page)).results.length;
    const entry = detail.getByTestId('result-entry');
    await entry.locator('[data-entry=date]').fill('2023-11-20');
    await entry.locator('[data-entry=value]').fill('twelve');
    await entry.locator('[data-action=add-result]').click();
    expect(await entry.getByTestId('result-entry-error').textContent()).toMatch(/^Measured value: enter a number ≥ 0.*Nothing was stored\.$/);
    expect((await monitoring(page)).results.length).toBe(before);
    // a non-detect typed with "<" is kept as such
    await entry.locator('[data-entry=value]').fill('<0.5');
    await entry.locator('[data-entry=unit]').selectOption('ug/L');
    await entry.locator('[data-action=add-result]').click();
    await expect.poll(async () => (await monitoring(page)).results.length).toBe(before + 1);
    const added = (await monitoring(page)).results.find((r) => r.wellId === 'mw-3' && r.date === '2023-11-20')!;
    expect(added).toMatchObject({ value: 0.5, unit: 'ug/L', nonDetect: true, analyte: 'benzene' });
    expect(await detail.locator('[data-testid=monitoring-results] tbody tr', { hasText: '2023-11-20' }).textContent()).toMatch(/2023-11-20benzene< 0.5 µg\/L \(not detected\)/);
    // the same date again is refused
    await entry.locator('[data-entry=date]').fill('2023-11-20');
    await entry.locator('[data-entry=value]').fill('3');
    await entry.locator('[data-action=add-result]').click();
    expect(await entry.getByTestId('result-entry-error').textContent()).toMatch(/already has a benzene result at this well \(< 0.5 µg\/L\)/);
    expect((await monitoring(page)).results.length).toBe(before + 1);
    // delete it, and undo the deletion
    await detail.getByRole('button', { name: 'Delete the 2023-11-20 benzene result' }).click();
    await expect.poll(async () => (await monitoring(page)).results.length).toBe(before);
    await detail.getByTestId('undo-result').getByRole('button', { name: 'Undo' }).click();
    await expect.poll(async () => (await monitoring(page)).results.length).toBe(before + 1);

    // a new well with the map tool, then moved by typed coordinates (a bad one is refused, naming the field)
    await page.locator('[data-action=add-monitoring]').click();
    expect(await page.getByTestId('tool-hint').textContent()).toMatch(/Tap the map where the monitoring well is/);
    const box = (await page.locator('.dg-map').boundingBox())!;
    await page.mouse.click(box.x + box.width * 0.3, box.y + box.height * 0.8);
    await expect.poll(() => marks.count()).toBe(6);
    await expect.poll(async () => (await monitoring(page)).wells.map((x) => x.name).join(',')).toBe('MW-1,MW-2,MW-3,MW-4,MW-5,MW-6');
    const coords = page.getByTestId('monitoring-well-coords');
    await coords.getByLabel('East (m)').fill('east of the fence');
    await coords.locator('[data-action=place-monitoring]').click();
    expect(await coords.locator('.dg-field-error').textContent()).toMatch(/^East \(m\): enter a number; accepted: .*Nothing was changed\./);
    await coords.getByLabel('East (m)').fill('60');
    await coords.getByLabel('North (m)').fill('-12.5');
    await coords.locator('[data-action=place-monitoring]').click();
    await expect.poll(async () => JSON.stringify((await monitoring(page)).wells[5].position)).toBe('[60,-12.5]');
    expect(await coords.textContent()).toMatch(/60 m downgradient of the release, -12.5 m across the flow/);
    await page.screenshot({ path: artifactPath('monitoring-new-well-landscape.png') });

    // the biodegradation rate adopted as the half-life of a what-if variant (the case stays as it is)
    const adopt = page.getByTestId('adopt-rate');
    expect(await adopt.textContent()).toMatch(/not a\s+biodegradation rate/);
    await adopt.getByTestId('adopt-rate-button').click();
    await expect.poll(async () => (await storedCases(page)).map((s) => s.name).join('|')).toMatch(/biodegradation rate from monitoring data/);
    const variant = (await storedCases(page)).find((s) => /biodegradation rate from monitoring data/.test(s.name))!.data as {
      contaminant: { halfLife: { value: number; unit: string } };
      uncertainty: { inputs: { halfLife?: { kind: string } } };
    };
    expect(variant.contaminant.halfLife.unit).toBe(demo.contaminant.halfLife.unit);
    expect(variant.contaminant.halfLife.value).not.toBe(demo.contaminant.halfLife.value);
    expect(variant.uncertainty.inputs.halfLife?.kind).toBe('lognormal-range');
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});

describe('the fit runs off the main thread', () => {
  it('shows its progress, can be cancelled with nothing changed, and its values adopted with their intervals', async () => {
    const w = await watchedPage(getBrowser(), LANDSCAPE);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, DEMO);
    await page.getByRole('radio', { name: 'Exact rectangular source' }).click();
    await page.locator('[data-section=monitoring] .dg-sec-toggle').click();
    const fit = page.getByTestId('fit');
    await fit.getByLabel('longitudinal dispersivity').check();
    await fit.getByLabel('flow direction').check();
    await fit.getByTestId('fit-run').click();
    await fit.getByTestId('fit-progress').waitFor();
    await page.screenshot({ path: artifactPath('monitoring-fit-progress-landscape.png') });
    await fit.getByTestId('fit-cancel').click();
    await expect.poll(async () => (await fit.textContent()) ?? '').toMatch(/Fit cancelled; nothing was changed\./);
    expect(await fit.getByTestId('fit-result').count()).toBe(0);
    // while a fit runs the page keeps responding (the worker does the work)
    await fit.getByTestId('fit-run').click();
    const t0 = Date.now();
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
    expect(Date.now() - t0).toBeLessThan(1000); // a frame, not the fit's seconds (generous: shared machine)
    await fit.getByTestId('fit-result').waitFor({ timeout: 60_000 });
    expect(await fit.getByTestId('fit-with-intervals').isChecked()).toBe(true);
    await fit.getByTestId('fit-adopt').click();
    await expect.poll(async () => (await storedCases(page)).map((s) => s.name).join('|')).toMatch(/fitted to monitoring data/);
    const v = (await storedCases(page)).find((s) => /fitted to monitoring data/.test(s.name))!.data as { uncertainty: { inputs: Record<string, unknown> } };
    expect(Object.keys(v.uncertainty.inputs).sort()).toEqual(expect.arrayContaining(['dispersivityFactor', 'flowDirection', 'halfLife', 'sourceConcentration']));
    expect(w.pageErrors).toEqual([]);
    await context.close();
  });
});
