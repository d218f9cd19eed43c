// The probabilistic screening in the app: a demo case with distributions runs in a pool of web
// workers with progress, gives per-receptor probabilities ± SE and drivers in words, marks its
// results out of date after an edit, can be cancelled keeping partial results, and gives the same
// figures as the command line's code (src/case/uncertainty.ts) for the same case, seed and runs.
// Screenshots at the three sizes go to test-artifacts/.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { readFileSync } from 'node:fs';
import { launch, artifactPath, LANDSCAPE, PORTRAIT } from './browser';
import { openFiles } from './offline-helpers';
import { parseCaseFile } from '../../src/case/io';
import { runUncertainty } from '../../src/case/uncertainty';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const PHONE = { width: 390, height: 844 };

async function openFuelDemo(viewport: { width: number; height: number }): Promise<{ page: Page; errors: string[]; close: () => Promise<void> }> {
  const context = await browser.newContext({ viewport, deviceScaleFactor: 1, hasTouch: true, serviceWorkers: 'block' });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(inject('baseUrl'));
  await page.waitForSelector('.dg-mark-source');
  const ok = page.locator('button', { hasText: /^OK$/ });
  if (await ok.isVisible().catch(() => false)) await ok.click();
  await page.selectOption('select.dg-demo', 'fuel-release-farm-well.json');
  await page.waitForFunction(() => document.querySelectorAll('[data-testid=receptor-table] tbody tr').length === 2);
  await page.locator('#sec-uncertainty button').click();
  return { page, errors, close: () => context.close() };
}

async function setNumber(page: Page, label: string, value: number): Promise<void> {
  const input = page.getByLabel(label, { exact: true });
  await input.fill(String(value));
  await input.press('Tab');
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
    await expect(page.locator('[data-testid=breakthrough-chart] .dg-chart-key').innerText()).resolves.toMatch(/5–95 %.*25–75 %.*median of 300 Monte Carlo realisations/s);
    await page.locator('[data-testid=breakthrough-chart]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-bands-1024x768.png') });
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
    expect(text).toContain('hydraulic conductivity (K): lognormal, median 12 m/d, geometric standard deviation 3');
    expect(text).toMatch(/To narrow it: /);
    expect(text).toContain('conditional on the chosen distributions');
    await page.getByTestId('report-uncertainty').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('uncertainty-report-768x1024.png') });
    expect(errors).toEqual([]);
    await close();
  });

  it('cancels a long run and keeps the partial result', async () => {
    const { page, errors, close } = await openFuelDemo(LANDSCAPE);
    await setNumber(page, 'Realisations', 50000);
    await page.getByRole('button', { name: /^Run/ }).click();
    await page.waitForSelector('.dg-mc-progress progress');
    await page.waitForFunction(() => Number(document.querySelector('.dg-mc-progress progress')?.getAttribute('value') ?? 0) >= 400, undefined, { timeout: 60_000 });
    await expect(page.locator('.dg-mc-progress').innerText()).resolves.toMatch(/of 50000 realisations on \d+ workers?/);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.waitForSelector('text=Cancelled');
    await expect(page.locator('.dg-mc-results .dg-note').first().innerText()).resolves.toMatch(/of 50000 \(partial\)/);
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
    await page.locator('.dg-mc-results table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-${name}.png`) });
    await page.locator('.dg-mc-driver').first().scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath(`uncertainty-drivers-${name}.png`) });
    expect(errors).toEqual([]);
    await close();
  });
});
