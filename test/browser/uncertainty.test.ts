// The probabilistic screening in the app: a demo case with distributions runs in a pool of web
// workers with progress, gives per-receptor probabilities ± SE and drivers in words, marks its
// results out of date after an edit, can be cancelled keeping partial results (the map and the
// receptor table following an edit meanwhile), shows percentile bands on the breakthrough chart and
// probability contours on the map, and gives the same
// figures as the command line's code (src/case/uncertainty.ts) for the same case, seed and runs.
// Screenshots at the three sizes go to test-artifacts/.
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { readFileSync } from 'node:fs';
import { artifactPath, LANDSCAPE, PORTRAIT, PHONE } from './browser';
import { openDemoPage, openFiles, setNumber, useBrowser } from './offline-helpers';
import { axe } from './axe-helpers';
import { parseCaseFile } from '../../src/case/io';
import { runUncertainty } from '../../src/case/uncertainty';

const getBrowser = useBrowser();

async function openFuelDemo(viewport: { width: number; height: number }): Promise<{ page: Page; errors: string[]; close: () => Promise<void> }> {
  const opened = await openDemoPage(getBrowser(), 'fuel-release-farm-well.json', viewport);
  await opened.page.locator('#sec-uncertainty button').click();
  return opened;
}

describe('How sure is it? (Monte Carlo in web workers)', () => {
  it('runs the fuel demo, shows P ± SE and drivers equal to the shared code, marks results out of date after an edit', async () => {
    const { page, errors, close } = await openFuelDemo(LANDSCAPE);
    await setNumber(page, 'Realisations', 300);
    await setNumber(page, 'Seed', 42);
    await page.getByRole('button', { name: 'Run', exact: true }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });
    const rows = await page.$$eval('.dg-mc-results tbody tr', (rs) => rs.map((r) => (r as HTMLElement).innerText));
    expect(rows).toHaveLength(2);
    // the same case, seed and runs through the command line's code (the demo file is what the app opened)
    const parsed = parseCaseFile(readFileSync('cases/fuel-release-farm-well.json', 'utf8'));
    if (!parsed.ok) throw new Error('demo case unreadable');
    const expected = runUncertainty(parsed.case, { runs: 300, seed: 42 });
    const pc = (p: number) => `${(100 * p).toFixed(p > 0 && p < 0.1 ? 1 : 0)}\u00a0%`;
    expected.receptors.forEach((r, j) => expect(rows[j]).toContain(`${pc(r.pExceed)} ± ${pc(r.pExceedSE)}`));
    expect(await page.locator('.dg-mc-driver').count()).toBeGreaterThan(0);
    await expect(page.locator('.dg-mc-driver').first().innerText()).resolves.toMatch(/in its low third, .*; in its high third, .*To narrow it: /);
    await expect(page.locator('.dg-uncertainty').innerText()).resolves.toContain('conditional on the chosen distributions');
    await page.locator('.dg-mc-results table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-1024x768.png') });
    // the breakthrough chart shows the run's percentile bands behind the deterministic curve, with their key
    await page.waitForSelector('[data-testid=breakthrough-bands] .dg-band-outer');
    await expect(page.locator('[data-testid=breakthrough-chart] .dg-chart-key').innerText()).resolves.toMatch(/5–95\s%.*25–75\s%.*median of 300 Monte Carlo realisations/s);
    await page.locator('[data-testid=breakthrough-chart]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-bands-1024x768.png') });
    // the map shows the contours of P(C > limit) at the map's time, with a key naming them and their error
    await page.waitForSelector('.leaflet-overlay-pane path.dg-pexceed');
    await expect(page.getByTestId('exceedance-key').innerText()).resolves.toMatch(/Probability the limit is exceeded after [\s\S]*5 %[\s\S]*50 %[\s\S]*95 %[\s\S]*from 300 realisations; each probability ± up to 2\.9 % \(one standard error\)/);
    await page.screenshot({ path: artifactPath('uncertainty-map-1024x768.png') });
    await page.locator('.dg-mc-driver').first().scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-drivers-1024x768.png') });
    // an edit marks the probabilistic results out of date
    await setNumber(page, 'Seed', 43);
    await page.waitForSelector('.dg-stale-note');
    expect(errors).toEqual([]);
    await close();
  });

  it('the CSV export and the printed report carry the distributions, seed, runs and the run\'s results', async () => {
    const { page, errors, close } = await openFuelDemo(PORTRAIT);
    await setNumber(page, 'Realisations', 250);
    await setNumber(page, 'Seed', 9);
    await page.getByRole('button', { name: /^Run/ }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });
    await openFiles(page);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-probabilities').click()]);
    const csv = readFileSync((await dl.path())!, 'utf8');
    expect(csv).toMatch(/^run,realisations,seed/);
    expect(csv).toContain('Monte Carlo,250,9,');
    expect(csv).toContain('probabilistic caution');
    await page.getByTestId('open-report').click();
    await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
    const text = await page.getByTestId('report-uncertainty').innerText();
    expect(text).toContain('250 realisations, seed 9');
    expect(text).toContain('npm run screen -- case.json --runs 250 --seed 9');
    expect(text).toContain('Hydraulic conductivity K: lognormal, median 12 m/d, geometric standard deviation 3');
    expect(text).toMatch(/To narrow it: /);
    expect(text).toContain('conditional on the chosen distributions');
    // the site plan draws the run's probability lines beside the plume, with their levels in the legend
    await expect.poll(() => page.locator('[data-testid=site-plan] path.dg-plan-pexceed').count()).toBeGreaterThanOrEqual(2);
    await expect(page.getByTestId('site-plan-key').innerText()).resolves.toMatch(/P\(exceeds the limit\) 50 %/);
    await expect(page.locator('.dg-plan figcaption').innerText()).resolves.toMatch(/from 250 of the 250 realisations of the Monte Carlo run \(seed 9\)/);
    await page.getByTestId('site-plan').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-report-plan-768x1024.png') });
    await page.getByTestId('report-uncertainty').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-report-768x1024.png') });
    expect(errors).toEqual([]);
    await close();
  });

  it('keeps the map and the receptor table live while a run goes on, and cancels it keeping the partial result', async () => {
    const { page, errors, close } = await openFuelDemo(LANDSCAPE);
    await setNumber(page, 'Realisations', 50000);
    await page.getByRole('button', { name: /^Run/ }).click();
    await page.waitForSelector('.dg-mc-progress progress');
    await page.waitForFunction(() => Number(document.querySelector('.dg-mc-progress progress')?.getAttribute('value') ?? 0) >= 400, undefined, { timeout: 60_000 });
    await expect(page.locator('.dg-mc-progress').innerText()).resolves.toMatch(/of 50000 realisations on \d+ workers?/);
    // the percentile bands are on the breakthrough chart while the run goes on, not only at its end
    await page.waitForSelector('[data-testid=breakthrough-bands]', { timeout: 60_000 });
    await expect(page.locator('.dg-mc-progress progress').isVisible()).resolves.toBe(true);
    // an edit while the run goes on: the deterministic table and the plume on the map follow it at once
    const table = () => page.locator('[data-testid=receptor-table] tbody').innerText();
    const plume = () => page.locator('.leaflet-overlay-pane path.dg-band-0').first().getAttribute('d');
    const [tableBefore, plumeBefore] = [await table(), await plume()];
    const tableText = await page.locator('[data-testid=receptor-table] tbody').textContent();
    await page.click('[data-section=release] .dg-sec-toggle');
    const conc = page.locator('[data-field="source.concentration"] input.dg-num');
    await conc.fill('20');
    await conc.press('Tab');
    await page.waitForFunction((t) => document.querySelector('[data-testid=receptor-table] tbody')?.textContent !== t, tableText, { timeout: 30_000 });
    await page.waitForFunction((d) => document.querySelector('.leaflet-overlay-pane path.dg-band-0')?.getAttribute('d') !== d, plumeBefore, { timeout: 30_000 });
    expect(await table()).not.toBe(tableBefore);
    expect(await plume()).not.toBe(plumeBefore);
    // …while the run is still going
    await expect(page.locator('.dg-mc-progress progress').isVisible()).resolves.toBe(true);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.waitForSelector('text=Cancelled');
    await expect(page.locator('.dg-mc-progress progress').count()).resolves.toBe(0);
    await expect(page.locator('.dg-mc-results .dg-note').first().innerText()).resolves.toMatch(/of 50000 \(partial\)/);
    // the partial results belong to the case before the edit: marked out of date, no probability contours on the map
    await page.waitForSelector('.dg-stale-note');
    expect(await page.locator('.leaflet-overlay-pane path.dg-pexceed').count()).toBe(0);
    expect(errors).toEqual([]);
    await close();
  });

  it('edits which inputs vary and their distributions, with starting values that name their source and messages naming the input', async () => {
    const { page, errors, close } = await openFuelDemo(LANDSCAPE);
    const row = page.locator('[data-input=totalPorosity]');
    await row.getByRole('checkbox').check();
    // the starting distribution comes from the published range, and says so
    await expect(row.locator('.dg-help').innerText()).resolves.toMatch(/Source: .*Freeze & Cherry 1979/);
    const low = page.getByLabel('Total porosity n: low', { exact: true });
    const high = page.getByLabel('Total porosity n: high', { exact: true });
    await low.fill('0.6');
    await low.press('Tab');
    await high.fill('0.4');
    await high.press('Tab');
    await expect(row.getByRole('alert').innerText()).resolves.toMatch(/Total porosity n: the low value \(0\.6\) is not below the high value \(0\.4\)/);
    // a value outside the physical range: refused naming the range, not clipped
    await low.fill('0.3');
    await low.press('Tab');
    await high.fill('1.2');
    await high.press('Tab');
    await expect(row.getByRole('alert').innerText()).resolves.toMatch(/Total porosity n: .* outside the physical range \(in \(0, 1\)\)/);
    await high.fill('0.45');
    await high.press('Tab');
    await expect(row.getByRole('alert').count()).resolves.toBe(0);
    // edited away from the cited range, the source note no longer claims it
    await expect.poll(() => row.locator('.dg-help').innerText()).toMatch(/^Source: my own values \(changed from: .*Freeze & Cherry 1979/);
    // another type keeps the spread (fitted to the 5th, 50th and 95th percentiles)
    const k = page.locator('[data-input=hydraulicConductivity]');
    await k.locator('select').selectOption('normal');
    await expect(page.getByLabel('Hydraulic conductivity K: mean', { exact: true }).inputValue()).resolves.toMatch(/^\d/);
    await expect(k.getByRole('alert').count()).resolves.toBe(1); // a normal K puts probability below 0: said, not clipped
    await expect.poll(() => k.locator('.dg-help').innerText()).toMatch(/^Source: my own values \(changed from: Invented for this demo/);
    // the remedy the message offers: truncate it inside the physical range
    await k.getByRole('button', { name: 'Hydraulic conductivity K: truncate below', exact: true }).click();
    const below = page.getByLabel('Hydraulic conductivity K: truncated below', { exact: true });
    await below.fill('0.5');
    await below.press('Tab');
    await expect.poll(() => k.getByRole('alert').count()).toBe(0);
    // bounds that leave nothing: refused, naming the input and where the distribution lies
    await below.fill('5000');
    await below.press('Tab');
    await expect(k.getByRole('alert').innerText()).resolves.toMatch(/Hydraulic conductivity K: the truncation bounds \[5000, ∞\] leave \(almost\) none of the distribution, which lies from −?[\d.]+ to [\d.]+/);
    await page.setViewportSize(PHONE);
    await k.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-truncation-390x844.png') });
    await page.setViewportSize(LANDSCAPE);
    await k.getByRole('button', { name: 'Hydraulic conductivity K: remove lower bound', exact: true }).click();
    await expect.poll(() => below.count()).toBe(0);
    await expect.poll(() => k.getByRole('alert').innerText()).toMatch(/below 0, outside the physical range/);
    await k.locator('select').selectOption('lognormal-range');
    await expect(k.getByRole('alert').count()).resolves.toBe(0);
    await page.getByTestId('distribution-editor').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-editor-1024x768.png') });
    // axe-core (npm): no serious or critical finding with the editor open, a message showing and the map's contours drawn later
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings, JSON.stringify(findings, null, 1)).toEqual([]);
    // the edited case runs
    await setNumber(page, 'Realisations', 200);
    await page.getByRole('button', { name: /^Run/ }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });
    await expect(page.locator('.dg-mc-results tbody tr').count()).resolves.toBe(2);
    await page.waitForSelector('.leaflet-overlay-pane path.dg-pexceed');
    const after = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(after, JSON.stringify(after, null, 1)).toEqual([]);
    expect(errors).toEqual([]);
    await close();
  });

  it.each([
    ['768x1024', PORTRAIT],
    ['390x844', PHONE],
  ] as const)('renders at %s — screenshot kept', async (name, vp) => {
    const { page, errors, close } = await openFuelDemo(vp);
    await setNumber(page, 'Realisations', 200);
    await page.getByRole('button', { name: /^Run/ }).click();
    await page.waitForSelector('text=Run again', { timeout: 90_000 });
    await page.waitForSelector('.leaflet-overlay-pane path.dg-pexceed');
    await page.getByTestId('exceedance-key').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-map-${name}.png`) });
    await page.locator('.dg-mc-results table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-${name}.png`) });
    await page.locator('.dg-mc-driver').first().scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-drivers-${name}.png`) });
    await page.getByTestId('distribution-editor').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-editor-${name}.png`) });
    expect(errors).toEqual([]);
    await close();
  });
});
