import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { DEMO, DEMO_PROJECT, openProject, signIn } from './helpers';

// At a laptop's width, no page of the demo's walk scrolls sideways as a whole: a wide table or
// diagram scrolls inside its own box, so the step's heading, the verdict bar and the navigation
// stay where the designer left them. Waits are on each page's own heading.

const WIDTH = 1280;
const PAGES = ['supply', 'devices', 'risers', 'fittings', 'elevation', 'fixtures', 'result', 'table', 'diagram', 'building'];

const sideways = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

test('when the demo’s cold-water system is opened page by page at 1280 px, then no page scrolls sideways', async ({ page }) => {
  test.slow(); // every page computes the demo (94 segments) in the browser
  await page.setViewportSize({ width: WIDTH, height: 900 });
  await signIn(page, DEMO.designer);
  await openProject(page, DEMO_PROJECT);
  await page.getByRole('link', { name: 'Domestic cold water', exact: true }).first().click();
  const diagram = page.getByRole('link', { name: 'Riser diagram of revision 1', exact: true });
  const base = (await diagram.getAttribute('href'))!.replace(/\/diagram$/, '');
  const wide: string[] = [];
  for (const name of PAGES) {
    await page.goto(`${base}/${name}`);
    await expect(page.getByTestId('verdict-bar')).toHaveAttribute('data-status', /^(pass|fail|incomplete)$/, { timeout: 60_000 });
    await expect(page.locator('main h2').first()).toBeVisible();
    const extra = await sideways(page);
    if (extra > 0) wide.push(`${name}: ${extra} px`);
  }
  expect(wide).toEqual([]);
});
