/** Signing in as a demo role through the sign-in form, the way a person does. */
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from './server';

export const DEMO_ROLES = ['admin', 'requirements', 'designer', 'reviewer'] as const;
export type DemoRole = (typeof DEMO_ROLES)[number];
/** A demo account: one per role, and the lead (a designer in one project and a reviewer in another). */
export type DemoAccount = DemoRole | 'lead';

export const demoEmail = (role: DemoAccount) => `${role}@demo.longtail.test`;

/** Opens /sign-in (or stays on it), types the demo account's e-mail and password, and waits for the Projects page. */
export async function signInAs(page: Page, role: DemoAccount): Promise<void> {
  if (!page.url().includes('/sign-in')) await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill(demoEmail(role));
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1, name: 'Projects' }).waitFor();
}
