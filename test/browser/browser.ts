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

const ARGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export async function launch(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath(), headless: true, args: ARGS });
}

export const PORTRAIT = { width: 768, height: 1024 };
export const LANDSCAPE = { width: 1024, height: 768 };
export const PHONE = { width: 390, height: 844 };

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

/**
 * Chromium with a profile kept in `userDataDir` (passed as playwright's argument, never as a
 * --user-data-dir flag), so a restart finds what the last run stored.
 */
export async function launchPersistent(userDataDir: string, viewport = LANDSCAPE): Promise<BrowserContext> {
  return chromium.launchPersistentContext(userDataDir, {
    executablePath: chromiumPath(),
    headless: true,
    viewport,
    deviceScaleFactor: 1,
    hasTouch: true,
    args: ARGS,
  });
}

/** SIGKILL the browser process started by this process for `userDataDir` (a hard kill: no unload, no flush). */
export function killBrowser(userDataDir: string): void {
  const ps = execFileSync('ps', ['-eo', 'pid=,ppid=,args='], { encoding: 'utf8' });
  for (const line of ps.split('\n')) {
    const m = /^\s*(\d+)\s+(\d+)\s+(.*)$/.exec(line);
    if (m && Number(m[2]) === process.pid && m[3].includes(userDataDir)) {
      process.kill(Number(m[1]), 'SIGKILL');
      return;
    }
  }
  throw new Error(`no browser process of this test runs with ${userDataDir}`);
}
