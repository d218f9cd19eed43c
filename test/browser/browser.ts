// Shared helpers for browser tests: Debian's chromium driven by playwright-core (no browser download).
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';

export const ARTIFACTS = 'test-artifacts';

function chromiumPath(): string {
  for (const name of ['chromium', 'chromium-browser']) {
    try {
      return execFileSync('which', [name], { encoding: 'utf8' }).trim();
    } catch {
      /* try the next name */
    }
  }
  throw new Error('chromium not found on PATH: run scripts/setup-test-env.sh (installs Debian chromium)');
}

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath(),
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export const PORTRAIT = { width: 768, height: 1024 };
export const LANDSCAPE = { width: 1024, height: 768 };

export async function newPage(
  browser: Browser,
  viewport = LANDSCAPE,
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport, deviceScaleFactor: 1, hasTouch: true });
  const page = await context.newPage();
  return { context, page };
}

export function artifactPath(name: string): string {
  mkdirSync(ARTIFACTS, { recursive: true });
  return `${ARTIFACTS}/${name}`;
}
