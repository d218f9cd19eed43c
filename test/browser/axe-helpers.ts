// axe-core (npm) run in the page, shared by the browser tests that check accessibility.
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';

const require = createRequire(import.meta.url);
const axeSource: string = require('axe-core').source;

export interface Finding {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

/** axe-core's findings on the page as it is now (Runtime.evaluate, so the app's CSP does not apply). */
export async function axe(page: Page): Promise<Finding[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
  return page.evaluate(async () => {
    const r = await (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Finding[] }> } }).axe.run(document, {
      resultTypes: ['violations'],
    });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
}

