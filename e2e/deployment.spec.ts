import { expect, test } from '@playwright/test';
import config from '../playwright.config';

/**
 * Issue 13 finding 4: served over plain http under a host name other than localhost, the app must
 * load (a content security policy with upgrade-insecure-requests sent every script to https, which
 * the server does not serve, and left a blank page). Chromium resolves an invented name to the
 * loopback test server, so the page is asked for as from any other machine on the network.
 */
const HOST = 'headroom-e2e.test';
const base = new URL(process.env.E2E_BASE_URL ?? 'http://127.0.0.1:5480');
const args = config.use?.launchOptions?.args ?? [];
test.use({ launchOptions: { ...config.use?.launchOptions, args: [...args, `--host-resolver-rules=MAP ${HOST} 127.0.0.1`] } });

test('when the app is opened over http under a non-localhost host name, then its scripts load and sign-in is shown, with no CSP refusal', async ({ page }) => {
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.message}`));
  page.on('console', (message) => {
    if (/content security policy|mixed content|ERR_/i.test(message.text())) problems.push(message.text());
  });
  const failed: string[] = [];
  page.on('requestfailed', (request) => failed.push(`${request.url()} ${request.failure()?.errorText ?? ''}`));
  const response = await page.goto(`http://${HOST}:${base.port}/sign-in`);
  expect(response?.status()).toBe(200);
  expect(response?.headers()['content-security-policy'] ?? '').not.toMatch(/upgrade-insecure-requests/);
  await expect(page.getByRole('button', { name: 'Sign in', exact: true })).toBeVisible();
  expect(new URL(page.url()).protocol).toBe('http:');
  expect(failed).toEqual([]);
  expect(problems).toEqual([]);
});
