// The probabilistic run's band on a monitoring well's chart, in real Chromium on the invented depot
// demo: hydraulic conductivity made uncertain (its default distribution), 200 realisations run in
// the worker pool; the chart of MW-5 (the well with non-detects) then shows the 5–95 % and 25–75 % bands and the median behind
// the modelled curve with its measured series and non-detects, and the key names the realisations.
// Moving the well afterwards leaves the run valid for the case (monitoring data are not what it
// screened) but not for the well: the band goes and a note says to run again. Screenshots at
// 1024×768, 768×1024 and 390×844 go to test-artifacts/; axe-core (npm) finds nothing serious.
import { describe, expect, it } from 'vitest';
import { artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openDemoPage, useBrowser } from './offline-helpers';
import { axe } from './axe-helpers';

const getBrowser = useBrowser();

describe('the band of a probabilistic run on a monitoring well chart', () => {
  it('is drawn at the well after a run, with its key, and goes when the well moves', async () => {
    const { page, errors, close } = await openDemoPage(getBrowser(), 'depot-benzene-monitoring.json', LANDSCAPE);

    await page.locator('#sec-uncertainty button').click();
    await page.locator('[data-input=hydraulicConductivity] input[type=checkbox]').check();
    const runs = page.getByLabel('Realisations', { exact: true });
    await runs.fill('200');
    await runs.press('Tab');
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });

    await page.locator('[data-section=monitoring] .dg-sec-toggle').click();
    await page.locator('[data-testid=monitoring-wells] [data-mwell=mw-5]').click();
    const chart = page.getByTestId('monitoring-well').getByTestId('well-chart');
    await chart.waitFor();
    const bands = chart.getByTestId('well-chart-bands');
    await bands.locator('.dg-band-outer').waitFor({ timeout: 30_000 });
    expect(await bands.locator('.dg-band-outer').getAttribute('d')).toMatch(/^M[\d.]+ [\d.]+(L[\d.]+ [\d.]+){90,}Z$/);
    expect(await bands.locator('.dg-band-median').getAttribute('d')).toMatch(/^M[\d.]+ [\d.]+L/);
    expect(await chart.locator('.dg-chart-key').innerText()).toMatch(/5–95\s%.*25–75\s%.*median of 200 Monte Carlo realisations.*measured.*below the reporting limit/s);
    // the measured series and the non-detects stay on top of the band
    expect(await chart.locator('[data-testid=well-chart-points] > *').count()).toBeGreaterThan(10);
    expect(await chart.locator('[data-testid=well-chart-points] path').count()).toBeGreaterThan(0);

    for (const [label, vp] of [['landscape', LANDSCAPE], ['portrait', PORTRAIT], ['phone', { width: 390, height: 844 }]] as const) {
      await page.setViewportSize(vp);
      await chart.scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`monitoring-well-band-${label}.png`) });
    }
    await page.setViewportSize(LANDSCAPE);
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings, JSON.stringify(findings, null, 1)).toEqual([]);

    // the well moved: the run still belongs to the case, not to the well where it is now
    const coords = page.getByTestId('monitoring-well-coords');
    await coords.getByLabel('East (m)').fill('95');
    await coords.locator('[data-action=place-monitoring]').click();
    await chart.getByTestId('well-band-stale').waitFor();
    expect(await chart.getByTestId('well-chart-bands').count()).toBe(0);
    expect(await chart.getByTestId('well-band-stale').innerText()).toMatch(/run it again to draw its band here/);
    expect(errors).toEqual([]);
    await close();
  });
});
