import { expect } from '@playwright/test';
import type { Browser, Page } from '@playwright/test';

/** Demo sign-ins seeded by seeds/ (invented people of the Alder & Finch demo). */
export const DEMO_PASSWORD = 'headroom-demo';
export const DEMO = {
  admin: 'admin@alder-finch.example',
  designer: 'designer@alder-finch.example',
  contractor: 'contractor@alder-finch.example',
  inspector: 'inspector@alder-finch.example',
  outsider: 'outsider@alder-finch.example',
} as const;

export const DEMO_PROJECT = 'Alder & Finch';

/** Every screenshot of the run lands in e2e-output/screens (git-ignored). */
export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: `e2e-output/screens/${name}.png`, fullPage: true });
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Projects' })).toBeVisible();
}

/** A fresh browser context (its own cookies) signed in as `email`. */
export async function signedInPage(browser: Browser, email: string): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, email);
  return page;
}

export function mainNav(page: Page) {
  return page.getByRole('navigation', { name: 'Main' });
}

export async function openProject(page: Page, name: string): Promise<void> {
  await page.getByRole('link', { name, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
}
