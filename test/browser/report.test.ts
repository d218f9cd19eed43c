// The printable report in real Chromium: opened for a demo case, checked for everything the issue
// lists (case name, date, app version, inputs with units and sources, site plan with contours,
// receptor table, charts, warnings, assumptions, caution), printed to PDF by Chromium's own
// print path (page.pdf with print media), and the PDF's first page opened in Chromium's PDF viewer
// and kept as a screenshot in test-artifacts/ to be looked at.
import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { artifactPath, PORTRAIT, LANDSCAPE } from './browser';
import { demoCase, openDemo, openFiles, useBrowser, waitSaved, watchedPage } from './offline-helpers';

const getBrowser = useBrowser();

const demo = demoCase();

describe('printable report', () => {
  it('holds every required part and prints to a PDF whose first page is looked at', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page);
    await openFiles(page);
    await page.getByTestId('open-report').click();
    const report = page.getByTestId('report');
    await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
    await page.screenshot({ path: artifactPath('report-preview-portrait.png') });
    await page.setViewportSize(LANDSCAPE);
    await page.screenshot({ path: artifactPath('report-preview-landscape.png') });

    const text = (await report.textContent()) ?? '';
    expect(text).toContain(demo.name);
    expect(text).toMatch(/Printed/);
    expect(text).toMatch(/Downgradient \d+\.\d+\.\d+/);
    expect(text).toMatch(/Screening-level estimates only/);
    // inputs with their units and published sources (Koc of benzene: US EPA 1996, seen)
    expect(text).toMatch(/Hydraulic conductivity K/);
    expect(text).toMatch(/12 m\/d/);
    expect(text).toMatch(/Xu & Eckstein|Xu and Eckstein|xu-eckstein/i);
    await expect.poll(() => page.locator('[data-testid=report-receptors] tbody tr').count()).toBe(demo.site.receptors.length);
    expect(await page.locator('[data-testid=site-plan] .dg-plan-band').count()).toBeGreaterThan(0);
    expect(await page.locator('.dg-report [data-testid=breakthrough-chart]').count()).toBe(demo.site.receptors.length);
    expect(text).toMatch(/Warnings/);
    expect(text).toMatch(/Assumptions/);

    // print media shows the report alone
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('.dg-app').isVisible()).toBe(false);
    expect(await page.locator('.dg-report-bar').isVisible()).toBe(false);
    expect(await report.isVisible()).toBe(true);
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    const pdfPath = artifactPath('report.pdf');
    writeFileSync(pdfPath, pdf);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    expect(pages).toBeGreaterThanOrEqual(2);
    await context.close();

    // the first page, as Chromium's PDF viewer shows it
    const viewer = await getBrowser().newPage({ viewport: { width: 900, height: 1250 } });
    await viewer.goto(`file://${resolve(pdfPath)}#page=1&zoom=65`);
    await viewer.waitForTimeout(2500);
    await viewer.screenshot({ path: artifactPath('report-pdf-page1.png') });
    await viewer.close();
  });

  it('issue 13 item 17: the site plan keeps its labels inside, colours receptors by status and its legend draws the map\'s symbols; kinds in words, one date format, page numbers, headings kept with their content', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, 'solvent-release-creek.json');
    await openFiles(page);
    await page.getByTestId('open-report').click();
    await page.locator('[data-testid=report][data-ready=yes]').waitFor({ timeout: 30_000 });
    const report = page.getByTestId('report');
    const text = (await report.textContent()) ?? '';
    // the receptor kinds in the screen's words, never the file's codes
    expect(text).toMatch(/\(creek, pond or river\)/);
    expect(text).toMatch(/\(property line\)/);
    expect(text).not.toMatch(/surface-water|property-line/);
    // one date format: both moments as YYYY-MM-DD HH:MM
    const meta = (await page.locator('.dg-report-meta').innerText()).replace(/\s+/g, ' ');
    expect(meta).toMatch(/Printed \d{4}-\d{2}-\d{2} \d{2}:\d{2}/);
    expect(meta).toMatch(/Case last changed \d{4}-\d{2}-\d{2} \d{2}:\d{2}/);

    const plan = page.getByTestId('site-plan');
    const layout = await plan.evaluate((svg: SVGSVGElement) => {
      const vb = svg.viewBox.baseVal;
      const labels = [...svg.querySelectorAll<SVGTextElement>('.dg-plan-label')].map((t) => {
        const b = t.getBBox();
        return { text: t.textContent, left: b.x, right: b.x + b.width, top: b.y, bottom: b.y + b.height };
      });
      return { width: vb.width, height: vb.height, labels };
    });
    expect(layout.labels.map((l) => l.text)).toEqual(['Property line (south fence)', 'Mill creek bank']);
    for (const l of layout.labels) {
      expect(l.left, l.text!).toBeGreaterThanOrEqual(0);
      expect(l.right, l.text!).toBeLessThanOrEqual(layout.width);
      expect(l.top, l.text!).toBeGreaterThanOrEqual(0);
      expect(l.bottom, l.text!).toBeLessThanOrEqual(layout.height);
    }
    // each receptor on the plan carries the status of its row in the table, in the map's status colour
    const tableStatus = await page.locator('[data-testid=report-receptors] tbody tr td:nth-child(4)').allInnerTexts();
    const planStatus = await plan.locator('.dg-plan-rec').evaluateAll((gs) => gs.map((g) => g.getAttribute('data-status')));
    expect(planStatus.map((st) => ({ 'reaches-limit': 'reaches the limit within the horizon', 'below-limit': 'stays below the limit', 'not-reached-in-horizon': 'reaches the limit only after the horizon' })[st!])).toEqual(tableStatus);
    const fills = await plan.locator('.dg-plan-rec > g > :first-child').evaluateAll((els) => els.map((e) => getComputedStyle(e).fill));
    const mapColour: Record<string, string> = { 'reaches-limit': 'rgb(255, 82, 82)', 'below-limit': 'rgb(102, 209, 122)', 'not-reached-in-horizon': 'rgb(255, 179, 0)' };
    expect(fills).toEqual(planStatus.map((st) => mapColour[st!]));
    // the release is the map's hexagon on the plan and in its legend, not a square
    expect(await plan.locator('.dg-plan-source polygon').count()).toBe(2);
    expect(await plan.locator('rect.dg-plan-source').count()).toBe(0);
    const key = page.getByTestId('site-plan-key');
    expect(await key.locator('[data-key=release] polygon').first().getAttribute('points')).toBe(await plan.locator('.dg-plan-source polygon').first().getAttribute('points'));
    expect(await key.locator('li').allInnerTexts()).toEqual(expect.arrayContaining(['release', 'creek, pond or river', 'property line', 'groundwater flow']));
    await plan.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('report-site-plan-creek.png') });

    // print: page numbers in the page's foot, and a heading never left alone at the foot of a page
    await page.emulateMedia({ media: 'print' });
    const pageRule = await page.evaluate(() => {
      const all: string[] = [];
      const walk = (rules: CSSRuleList) => {
        for (const r of rules) {
          if (r instanceof CSSPageRule) all.push(r.cssText);
          else if ('cssRules' in r) walk((r as CSSGroupingRule).cssRules);
        }
      };
      for (const sheet of document.styleSheets) walk(sheet.cssRules);
      return all.join('\n');
    });
    expect(pageRule).toMatch(/@bottom-right\s*\{[^}]*counter\(page\)[^}]*counter\(pages\)/);
    const h2 = await page.locator('.dg-report h2').first().evaluate((h) => getComputedStyle(h).breakAfter);
    expect(h2).toBe('avoid');
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    writeFileSync(artifactPath('report-creek.pdf'), pdf);
    await context.close();
  });

  it('a case with monitoring data gets the "Monitoring data" section: a row per well, rates, the model comparison and the cautions', async () => {
    const w = await watchedPage(getBrowser(), PORTRAIT);
    const { page, context } = w;
    await page.goto(w.base);
    await waitSaved(page);
    await openDemo(page, 'depot-benzene-monitoring.json');
    await openFiles(page);
    // the Files tab renders after the click: wait for the button rather than count at once
    await page.getByTestId('export-observations').waitFor({ timeout: 15_000 });
    await page.getByTestId('open-report').click();
    const section = page.getByTestId('report-observations');
    await section.waitFor({ timeout: 30_000 });
    await expect.poll(() => section.locator('tbody tr').count()).toBe(5);
    const text = (await section.textContent()) ?? '';
    expect(text).toMatch(/Biodegradation rate \(Buscheck & Alcantar 1995/);
    expect(text).toMatch(/within a factor of ten/);
    expect(text).toMatch(/must not be used as one in the transport solutions/);
    expect(text).toMatch(/< 1 µg\/L/);
    // the measured-against-modelled scatter with its 1:1 line, factor-of-ten lines and named figures
    expect(await section.locator('[data-testid=model-scatter] .dg-chart-oneone').count()).toBe(1);
    expect(await section.locator('[data-testid=model-scatter] .dg-chart-tenfold').count()).toBe(2);
    expect(await section.getByTestId('scatter-figures').textContent()).toMatch(/root-mean-square log₁₀ misfit/);
    await section.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('report-monitoring-portrait.png') });
    await page.setViewportSize({ width: 390, height: 844 });
    await section.scrollIntoViewIfNeeded();
    await page.screenshot({ path: artifactPath('report-monitoring-phone.png') });
    await context.close();
  });
});
