// Pumping wells in the app, on the invented riverside demo: the capture zone and its time-of-travel
// marks are drawn on the map, the receptor table says the release lies in the supply well's capture
// zone, a particle run in workers shows progress with time left, can be cancelled (keeping a partial
// result, said to be partial), and finishes with per-receptor figures ± standard errors that agree
// with the command line's code for the same case, particles and seed (the walk does not depend on
// how the particles are split across workers; summation order aside); the particle plume is drawn.
// Screenshots at 1024×768, 768×1024 and 390×844 go to test-artifacts/; axe-core finds no serious issue.
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { readFileSync } from 'node:fs';
import { artifactPath, LANDSCAPE, PORTRAIT, PHONE } from './browser';
import { axe } from './axe-helpers';
import { download, openDemoPage, openFiles, setNumber, useBrowser } from './offline-helpers';
import { parseCaseFile } from '../../src/case/io';
import { screenCase } from '../../src/case/screen';
import { runCaseParticles } from '../../src/case/particles';

const getBrowser = useBrowser();

async function openRiverside(viewport: { width: number; height: number }): Promise<{ page: Page; errors: string[]; close: () => Promise<void> }> {
  const opened = await openDemoPage(getBrowser(), 'riverside-supply-well.json', viewport);
  await opened.page.waitForSelector('path.dg-capture-zone', { state: 'attached' });
  return opened;
}

async function openWells(page: Page): Promise<void> {
  const toggle = page.locator('#sec-wells button');
  await toggle.waitFor();
  if ((await toggle.getAttribute('aria-expanded')) !== 'true') await toggle.click();
  await page.waitForSelector('[data-testid=wells-table]');
}

describe('pumping wells: capture zones and particles', () => {
  it('draws the capture zone with travel-time marks and the river; the table says the release is in the supply well’s zone', async () => {
    const { page, errors, close } = await openRiverside(LANDSCAPE);
    expect(await page.locator('path.dg-capture-zone').count()).toBe(1);
    expect(await page.locator('.leaflet-pane path.dg-travel-mark').count()).toBe(4);
    await expect(page.locator('.dg-travel-label').allInnerTexts()).resolves.toEqual(['1 yr', '5 yr', '10 yr', '25 yr']);
    expect(await page.locator('path.dg-boundary-constant-head').count()).toBe(2);
    const row = page.locator('[data-testid=receptor-table] tr[data-receptor=supply-well]');
    await expect(row.locator('[data-col=capture]').innerText()).resolves.toMatch(/Release in its capture zone: contaminant arrives in about 1\.7\d* yr/);
    await expect(page.locator('#dg-receptor-table-note').innerText()).resolves.toContain('Method: analytical');
    await openWells(page);
    await expect(page.locator('[data-testid=wells-table] tr[data-well=supply-well]').getAttribute('data-captures')).resolves.toBe('true');
    // water levels at the receptors, confined (constant thickness) and unconfined (Dupuit) forms, stated as such
    const levels = page.locator('[data-testid=water-levels]');
    await expect(levels.locator('thead').innerText()).resolves.toMatch(/confined form[\s\S]*Dupuit–Forchheimer/);
    await expect(levels.locator('tr[data-receptor=supply-well] [data-col=confined]').innerText()).resolves.toMatch(/^-\d[\d.]* m$/);
    await expect(levels.locator('tr[data-receptor=supply-well] [data-col=unconfined]').innerText()).resolves.toMatch(/^1\d(\.\d+)? m$/);
    await levels.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('wells-levels-1024x768.png') });
    // the contaminant's marks lie inside the water's (R > 1)
    await page.getByRole('button', { name: 'the contaminant (× R)' }).click();
    await page.waitForSelector('path.dg-travel-mark');
    await page.screenshot({ path: artifactPath('wells-map-1024x768.png') });
    expect(errors).toEqual([]);
    await close();
  });

  it('a particle run shows progress and time left, can be cancelled, and finishes with figures ± SE equal to the shared code', async () => {
    const { page, errors, close } = await openRiverside(LANDSCAPE);
    await openWells(page);
    await setNumber(page, 'Particles', 200000);
    await setNumber(page, 'Seed', 7);
    await page.getByRole('button', { name: 'Run particles' }).click();
    const progress = page.locator('[data-testid=particle-progress]');
    await progress.waitFor();
    await page.waitForFunction(() => /s left/.test(document.querySelector('[data-testid=particle-progress]')?.textContent ?? ''), null, { timeout: 30_000 });
    await expect(progress.innerText()).resolves.toMatch(/of 200,000 particles on \d worker/);
    // the map and the analytical results stay usable meanwhile: the solution can be switched
    await page.getByRole('radio', { name: 'Exact rectangular source' }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid=summary]')?.textContent?.includes('exact solution'));
    await page.getByRole('radio', { name: 'Domenico (1987, approximate)' }).click();
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.waitForSelector('[data-testid=particle-cancelled]');
    await expect(page.locator('[data-testid=particle-method]').innerText()).resolves.toMatch(/of 200,000 particles, seed 7, partial/);

    // a whole run, compared with the command line's code for the same case, particles and seed
    await setNumber(page, 'Particles', 4000);
    await page.locator('[data-action=run-particles]').click();
    await page.waitForFunction(() => document.querySelector('[data-action=run-particles]') && !document.querySelector('[data-testid=particle-progress]'), null, { timeout: 60_000 });
    const parsed = parseCaseFile(readFileSync('cases/riverside-supply-well.json', 'utf8'));
    if (!parsed.ok) throw new Error('demo case unreadable');
    const s = screenCase(parsed.case);
    const expected = runCaseParticles(parsed.case, s.prepared, s.wells, { particles: 4000, seed: 7 });
    const shown = await page.evaluate(() => (window as unknown as { __downgradient: { particleRun: () => { receptors: { concentrationAtHorizon: number; standardError: number }[] } } }).__downgradient.particleRun());
    expected.receptors.forEach((r, j) => {
      // same particles and streams; only the order of summation differs (1e-9 relative)
      expect(shown.receptors[j].concentrationAtHorizon).toBeCloseTo(r.concentrationAtHorizon, 12);
      expect(Math.abs(shown.receptors[j].concentrationAtHorizon - r.concentrationAtHorizon)).toBeLessThanOrEqual(1e-9 * r.concentrationAtHorizon);
      expect(Math.abs(shown.receptors[j].standardError - r.standardError)).toBeLessThanOrEqual(1e-9 * r.standardError);
    });
    const rows = await page.locator('[data-testid=particle-results] tbody tr').allInnerTexts();
    expect(rows).toHaveLength(2);
    for (const r of rows) expect(r).toMatch(/±/);
    await expect(page.locator('[data-testid=receptor-table] [data-col=particles-horizon]').first().innerText()).resolves.toMatch(/^Particles: .* ± /);
    await expect(page.locator('[data-testid=particle-mass]').innerText()).resolves.toMatch(/pumped out by wells/);
    await page.waitForSelector('.leaflet-pane path.dg-particle-band', { state: 'attached' });
    await page.screenshot({ path: artifactPath('wells-particles-1024x768.png') });
    // the supply well's breakthrough chart: the water it delivers (captured mass / Q) as steps over the
    // 100 output intervals, with the ± 2 SE band, named in the key with count and seed
    await page.getByRole('group', { name: 'Breakthrough curve for' }).getByRole('button', { name: 'Town supply well' }).click();
    const chart = page.locator('[data-testid=breakthrough-chart]');
    await chart.locator('[data-testid=particle-curve]').waitFor();
    await expect(chart.locator('[data-testid=particle-key]').innerText()).resolves.toMatch(/particles \(4,000, seed 7\), the water pumped.*± 2 standard errors/);
    const d = await chart.locator('path.dg-chart-particle-line').getAttribute('d');
    expect(d!.split(/[ML]/).filter(Boolean)).toHaveLength(2 * expected.receptors[0].times.length);
    await chart.scrollIntoViewIfNeeded();
    await chart.screenshot({ path: artifactPath('wells-breakthrough-particles-1024x768.png') });
    await page.locator('[data-testid=particle-results]').scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('wells-panel-1024x768.png') });
    const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
    expect(findings).toEqual([]);
    // the files: capture zones, and the particle figures and curves of the run, each naming its method
    await openFiles(page);
    const zones = await download(page, 'export-capture-zones');
    expect(zones.name).toMatch(/-capture-zones\.csv$/);
    expect(zones.text).toMatch(/^pumping well,feature,travelling,travel time \(yr\),travel time \(d\),part,vertex,east \(m\),north \(m\)/);
    expect(zones.text).toMatch(/Town supply well,travel-time mark,water,25,/);
    const figures = await download(page, 'export-particles');
    expect(figures.text.split('\r\n')[1]).toMatch(/^Town supply well,well,"particles: random walk[^"]*",.*,4000,7,/);
    const curves = await download(page, 'export-particle-curves');
    expect(curves.text.split('\r\n')).toHaveLength(1 + 100 + 1 + 1);
    // the receptor table names the method of each figure: analytical, the well field's capture, the particles'
    const table = await download(page, 'export-table');
    const [head, well] = table.text.split('\r\n');
    expect(head).toMatch(/,method,solution,.*,well field: release in its capture zone,well field: contaminant travel time from the release \(d\),well field: method,particles: method,/);
    expect(well).toMatch(/^Town supply well,.*,"?analytical: Domenico 1987 approximation, uniform regional flow \(pumping not represented\)"?,domenico,.*,yes,[\d.]+,"steady well field: [^"]*","particles: random walk[^"]*",.*,4000,7$/);
    // the printed report carries the well field and the particle figures with their seed and errors
    await page.getByTestId('open-report').click();
    const report = page.locator('[data-testid=report-wells]');
    await report.waitFor({ timeout: 30_000 });
    await expect(report.innerText()).resolves.toMatch(/4000 particles, seed 7/);
    await expect(report.innerText()).resolves.toMatch(/--method particles --particles 4000 --seed 7/);
    await expect(report.innerText()).resolves.toMatch(/±/);
    await expect(report.innerText()).resolves.toMatch(/fully penetrating/);
    // the report's breakthrough charts carry the complete run's particle curves
    await expect(page.locator('.dg-report-charts [data-testid=particle-curve]').count()).resolves.toBe(2);
    await report.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('wells-report-1024x768.png') });
    // the report's site plan draws the well field as the map does: capture zone, river, water-level lines with levels
    const plan = page.locator('[data-testid=site-plan]');
    await expect(plan.locator('path.dg-plan-capture').count()).resolves.toBe(1);
    await expect(plan.locator('path.dg-plan-boundary-constant-head').count()).resolves.toBe(1);
    await expect(plan.locator('path.dg-plan-head').count()).resolves.toBeGreaterThanOrEqual(6);
    const planLevels = await plan.locator('text.dg-plan-head-label').allTextContents();
    expect(planLevels.length).toBeGreaterThanOrEqual(3);
    for (const t of planLevels) expect(t).toMatch(/^-?\d+(\.\d)? m$/);
    await expect(page.locator('[data-testid=site-plan-key]').innerText()).resolves.toMatch(/capture zone[\s\S]*river or shore \(constant head\)[\s\S]*water level relative to the release, every 0\.2 m/);
    await plan.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('wells-report-plan-1024x768.png') });
    expect(errors).toEqual([]);
    await close();
  });

  it('draws the lines of equal head with their levels beside the capture zone; the legend’s switch hides and shows them', async () => {
    for (const [vp, name, labels] of [
      [LANDSCAPE, '1024x768', 3],
      [PORTRAIT, '768x1024', 1],
      [PHONE, '390x844', 1],
    ] as const) {
      const { page, errors, close } = await openRiverside(vp);
      // the riverside demo: a line every 0.2 m (src/case/headContours.ts; test/case/headContours.test.ts holds the levels)
      await expect.poll(() => page.locator('.leaflet-pane path.dg-head-line').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(6);
      await expect.poll(() => page.locator('.dg-head-label').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(labels);
      for (const t of await page.locator('.dg-head-label').allInnerTexts()) expect(t).toMatch(/^-?\d+(\.\d)? m$/);
      // head labels and the river's name overlap neither one another nor the marks' labels; the
      // river's name, on the line where there is room, covers no mark (the flow handle sits where
      // the river crosses the plume's axis)
      const rects = (sel: string) =>
        page.locator(sel).evaluateAll((els) => els.map((e) => e.getBoundingClientRect()).filter((r) => r.width > 0).map((r) => ({ x: r.left, y: r.top, w: r.width, h: r.height })));
      const hit = (A: { x: number; y: number; w: number; h: number }, B: typeof A) => A.x < B.x + B.w && B.x < A.x + A.w && A.y < B.y + B.h && B.y < A.y + A.h;
      await expect.poll(() => rects('.dg-boundary-label span').then((r) => r.length)).toBe(1);
      const boxes = await rects('.dg-head-label span, .dg-boundary-label span, .dg-mark:not(.dg-label-hidden) .dg-mark-label');
      for (let a = 0; a < boxes.length; a++)
        for (let b = a + 1; b < boxes.length; b++) expect(hit(boxes[a], boxes[b]), `labels ${a} and ${b} overlap`).toBe(false);
      const [river] = await rects('.dg-boundary-label span');
      for (const m of await rects('.leaflet-marker-icon.dg-mark > svg')) expect(hit(river, m), 'the river’s name covers a mark').toBe(false);
      if (vp === PHONE) {
        // the phone's map keeps its share of the screen however long the keys below it (app.css: it
        // fell to 165 px with the well field's keys), the time bar straight under it
        const map = (await page.locator('.dg-map-box').boundingBox())!;
        const bar = (await page.locator('.dg-timebar').boundingBox())!;
        expect(map.height).toBeGreaterThanOrEqual(0.45 * PHONE.height);
        expect(bar.y).toBeGreaterThanOrEqual(map.y + map.height);
        expect(bar.y).toBeLessThan(map.y + map.height + 20);
      }
      const key = page.locator('[data-testid=head-lines-key]');
      await expect(key.innerText()).resolves.toMatch(/Water level relative to the release: a line every 0\.2 m, none within 20 m of a pumping well/);
      await page.screenshot({ path: artifactPath(`wells-head-lines-${name}.png`) });
      const toggle = key.getByRole('checkbox', { name: /Water level relative to the release/ });
      const box = await key.locator('label.dg-key-check').boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(44);
      await toggle.uncheck();
      await expect.poll(() => page.locator('.leaflet-pane path.dg-head-line').count()).toBe(0);
      await expect.poll(() => page.locator('.dg-head-label').count()).toBe(0);
      await toggle.check();
      await expect.poll(() => page.locator('.leaflet-pane path.dg-head-line').count()).toBeGreaterThanOrEqual(6);
      await expect.poll(() => page.locator('.dg-head-label').count()).toBeGreaterThanOrEqual(labels);
      if (vp === LANDSCAPE) {
        // the same lines labelled as the water table of an unconfined aquifer (Dupuit–Forchheimer)
        await key.getByRole('button', { name: 'unconfined' }).click();
        await expect.poll(() => key.innerText()).toMatch(/Water table \(Dupuit–Forchheimer\) relative to the release: a line every 0\.2 m/);
        await expect.poll(() => page.locator('.dg-head-label').count()).toBeGreaterThanOrEqual(labels);
        await page.screenshot({ path: artifactPath(`wells-head-lines-unconfined-${name}.png`) });
        await key.getByRole('button', { name: 'confined', exact: true }).click();
        await expect.poll(() => key.innerText()).toMatch(/^Water level relative to the release/);
        // the dark theme: lines and labels in its own colours (wells.css --heads)
        await page.click('button[aria-label="Dark theme"]');
        await expect.poll(() => page.getAttribute('html', 'data-theme')).toBe('dark');
        await page.screenshot({ path: artifactPath(`wells-head-lines-dark-${name}.png`) });
      }
      const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
      expect(findings).toEqual([]);
      expect(errors).toEqual([]);
      await close();
    }
  });

  it('GeoJSON of the capture zones on the site grid: refused with the way forward (place on the basemap), then written with the zones', async () => {
    const { page, errors, close } = await openRiverside(PORTRAIT);
    await openFiles(page);
    await expect(page.getByTestId('export-geojson').innerText()).resolves.toMatch(/capture zones and travel-time marks, water-level lines for a GIS; first place the case on the basemap/);
    await expect(page.getByTestId('export-capture-zones').innerText()).resolves.toMatch(/as the site grid's east\/north metres/);
    await page.getByTestId('export-geojson').click();
    await expect.poll(() => page.getByTestId('files-message').textContent()).toMatch(/local site grid.*capture zones and travel-time marks alike/);
    await page.screenshot({ path: artifactPath('wells-geojson-local-768x1024.png') });
    await page.getByTestId('place-on-map').click();
    const lon = page.locator('#dg-datum-lon');
    await expect.poll(() => lon.evaluate((el) => el === document.activeElement)).toBe(true);
    await lon.fill('-2.731');
    await page.getByLabel(/Datum latitude/).fill('52.413');
    await page.getByRole('button', { name: 'Put this case on the basemap' }).click();
    await page.getByRole('button', { name: 'Close' }).click();
    // the river moved with the case: the zone is traced again and the release still lies in it
    const row = page.locator('[data-testid=receptor-table] tr[data-receptor=supply-well]');
    await expect.poll(() => row.locator('[data-col=capture]').innerText(), { timeout: 20_000 }).toMatch(/Release in its capture zone: contaminant arrives in about 1\.7\d* yr/);
    // the lines of equal head follow the case onto the basemap (positions now longitude/latitude)
    await expect.poll(() => page.locator('.leaflet-pane path.dg-head-line').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(6);
    await expect.poll(() => page.locator('.dg-head-label').count(), { timeout: 20_000 }).toBeGreaterThanOrEqual(1);
    await page.screenshot({ path: artifactPath('wells-placed-768x1024.png') });
    await openFiles(page);
    await expect(page.getByTestId('export-capture-zones').innerText()).resolves.toMatch(/as longitude and latitude/);
    const g = await download(page, 'export-geojson');
    const fc = JSON.parse(g.text);
    const roles = fc.features.map((f: { properties: { role: string } }) => f.properties.role);
    expect(roles).toContain('capture-zone');
    expect(roles.filter((x: string) => x === 'travel-time-mark')).toHaveLength(8);
    expect(roles.filter((x: string) => x === 'head-contour').length).toBeGreaterThanOrEqual(6);
    expect(errors).toEqual([]);
    await close();
  });

  it('portrait tablet and phone: the map layers, the wells panel and its run fit', async () => {
    for (const [vp, name] of [
      [PORTRAIT, '768x1024'],
      [PHONE, '390x844'],
    ] as const) {
      const { page, errors, close } = await openRiverside(vp);
      await page.screenshot({ path: artifactPath(`wells-map-${name}.png`) });
      await openWells(page);
      await setNumber(page, 'Particles', 3000);
      await page.getByRole('button', { name: 'Run particles' }).click();
      await page.waitForSelector('[data-testid=particle-results]', { timeout: 60_000 });
      await page.waitForFunction(() => !document.querySelector('[data-testid=particle-progress]'), null, { timeout: 60_000 });
      await page.locator('[data-testid=particle-results]').scrollIntoViewIfNeeded();
      await page.screenshot({ path: artifactPath(`wells-panel-${name}.png`) });
      const findings = (await axe(page)).filter((f) => f.impact === 'serious' || f.impact === 'critical');
      expect(findings).toEqual([]);
      expect(errors).toEqual([]);
      await close();
    }
  });
});
