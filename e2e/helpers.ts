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

/**
 * The newest caught e-mail to `address` whose text matches `pattern`, read from the development
 * mail sink's table — the recipient's mailbox, as a developer on the machine reads it. The web
 * page shows another person's mail withheld (issue 13 finding 5), so a one-time link is read here.
 */
export async function mailboxText(address: string, pattern: RegExp): Promise<string | null> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL is not set: run the end-to-end tests through `npm test` (scripts/test.mjs).');
  const { default: pg } = await import('pg');
  const { simpleParser } = await import('mailparser');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query('SELECT raw FROM dev_mail WHERE envelope_to @> $1::jsonb ORDER BY id DESC LIMIT 20', [JSON.stringify([address])]);
    for (const row of rows) {
      const text = (await simpleParser(row.raw as Buffer)).text ?? '';
      if (pattern.test(text)) return text;
    }
    return null;
  } finally {
    await client.end();
  }
}
