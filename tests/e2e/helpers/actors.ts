/**
 * One signed-in person of a browser test: their own context and page, with the page's quiet-wait
 * and its problem list; and the steps several tests take with one (wait for something visible,
 * record a step, open a demo project's first proposal).
 */
import type { Browser, BrowserContext, BrowserContextOptions, Locator, Page } from 'playwright-core';
import { checkAccessibility } from './accessibility';
import { networkQuiet, newContext, watchPage, type PageProblems } from './browser';
import type { Screenshots } from './screenshots';
import type { DemoAccount } from './sign-in';

export interface Actor {
  role: DemoAccount;
  context: BrowserContext;
  page: Page;
  quiet: (idleMs?: number, timeoutMs?: number) => Promise<void>;
  problems: PageProblems;
}

/** A fresh context and page for `role` (not signed in yet), waiting up to 20 s by default. */
export async function openActor(browser: Browser, baseUrl: string, role: DemoAccount, options: BrowserContextOptions = {}): Promise<Actor> {
  const context = await newContext(browser, baseUrl, options);
  const page = await context.newPage();
  page.setDefaultTimeout(20_000);
  return { role, context, page, quiet: networkQuiet(page), problems: watchPage(page, role) };
}

/** Waits until the first match is visible; hands the locator back. */
export async function visible(locator: Locator, timeout = 20_000): Promise<Locator> {
  await locator.first().waitFor({ state: 'visible', timeout });
  return locator;
}

/** Waits for the page to settle, takes the step's screenshot and runs axe on it. */
export async function record(actor: Actor, shots: Screenshots, step: string): Promise<void> {
  await actor.quiet();
  await shots.take(actor.page, step);
  await checkAccessibility(actor.page, `${step} (${actor.role})`);
}

/** From the signed-in Projects page: the demo project by name, then its first proposal in the list. */
export async function openFirstProposal(page: Page, project: string): Promise<void> {
  await page.getByRole('link', { name: new RegExp(project) }).click();
  await visible(page.getByRole('heading', { level: 1, name: project }));
  const proposals = await visible(page.getByRole('table', { name: 'Proposals of this project' }));
  await proposals.getByRole('link', { name: /^Proposal #\d+$/ }).first().click();
  await page.waitForURL(/\/proposals\/\d+$/);
}
