/**
 * Headless Chromium through playwright-core: Debian's /usr/bin/chromium (`apt-get install -y
 * chromium`; .ci/run installs it when missing), never a downloaded browser. Plain `launch` gives
 * every run a fresh temporary profile (user-data dir). The flags keep it quiet on a closed
 * network and runnable as root in a container (DEVELOPERS.md, pitfalls).
 */
import { existsSync } from 'node:fs';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Page } from 'playwright-core';

export const CHROMIUM_PATH = process.env.LONGTAIL_CHROMIUM ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export async function launchBrowser(): Promise<Browser> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`No Chromium at ${CHROMIUM_PATH}: install Debian's (apt-get install -y chromium) or set LONGTAIL_CHROMIUM.`);
  }
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}

/** A desktop-sized context in the light theme (the app follows the system theme until one is chosen). */
export function newContext(browser: Browser, baseUrl: string, options: BrowserContextOptions = {}): Promise<BrowserContext> {
  return browser.newContext({ baseURL: baseUrl, viewport: { width: 1440, height: 900 }, colorScheme: 'light', locale: 'en-GB', timezoneId: 'Europe/London', ...options });
}

/** What went wrong inside a page that the UI itself may not show: uncaught exceptions and CSP refusals. */
export interface PageProblems {
  list: string[];
}

export function watchPage(page: Page, label: string): PageProblems {
  const problems: PageProblems = { list: [] };
  page.on('pageerror', (error) => problems.list.push(`${label}: uncaught ${error.name}: ${error.message}`));
  page.on('console', (message) => {
    if (message.type() === 'error' && /Content Security Policy/i.test(message.text())) problems.list.push(`${label}: CSP: ${message.text()}`);
  });
  return problems;
}

/**
 * Waits until the page has had no request in flight for `idleMs` (a single-page app's
 * navigations never reach a new load state, so Playwright's 'networkidle' does not apply to
 * them), then until no loading placeholder (role=status ending in "…") is visible.
 */
export function networkQuiet(page: Page): (idleMs?: number, timeoutMs?: number) => Promise<void> {
  let inFlight = 0;
  let lastChange = performance.now();
  const change = (delta: number) => {
    inFlight = Math.max(0, inFlight + delta);
    lastChange = performance.now();
  };
  page.on('request', () => change(1));
  page.on('requestfinished', () => change(-1));
  page.on('requestfailed', () => change(-1));
  return async (idleMs = 300, timeoutMs = 30_000) => {
    const deadline = performance.now() + timeoutMs;
    while (inFlight > 0 || performance.now() - lastChange < idleMs) {
      if (performance.now() > deadline) throw new Error(`The page (${page.url()}) kept ${inFlight} request(s) in flight for ${timeoutMs} ms`);
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    await page.getByRole('status').filter({ hasText: /…\s*$/ }).first().waitFor({ state: 'hidden', timeout: Math.max(1000, deadline - performance.now()) });
  };
}
