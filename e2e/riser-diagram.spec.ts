import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import { demoColdDocument } from './api';
import { DEMO, DEMO_PROJECT, openProject, signIn } from './helpers';
import { withUnit } from '../src/shared/format/quantity';

// The on-screen riser diagram of the invented demo "Alder & Finch" (cold water, issued revision 1
// seeded from src/engine/examples/alder-finch-cold.json): fitted to the window's width, with its
// devices and its named floors as levels, and on one printed sheet. Screenshots go to e2e-output/screens/.
const DEVICES = ['2-inch water meter', '2-inch reduced-pressure backflow assembly', 'Level 2 pressure-reducing valve'];
/** The demo building's floors, lowest to highest, as the key lists them (name and elevation). */
const FLOORS = [...(demoColdDocument().floors as { name: string; elevation: number }[])].sort((a, b) => a.elevation - b.elevation);
const LEVELS = FLOORS.map((f) => `${f.name} (el. ${withUnit(f.elevation, 'ft')})`);

let pageProblems: string[] = [];
test.beforeEach(({ page }) => {
  pageProblems = [];
  page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
});
test.afterEach(() => expect(pageProblems).toEqual([]));

test('when the designer opens the demo cold system’s riser diagram, then it fits the window’s width, names its devices and levels, zooms, and prints on one sheet', async ({
  page,
}) => {
  test.slow(); // the diagram computes the whole demo (94 segments) in the browser
  fs.mkdirSync('e2e-output/screens', { recursive: true });
  await page.setViewportSize({ width: 1280, height: 900 });
  await signIn(page, DEMO.designer);
  await openProject(page, DEMO_PROJECT);
  await page.getByRole('link', { name: 'Domestic cold water', exact: true }).first().click();
  await page.getByRole('link', { name: 'Riser diagram of revision 1', exact: true }).click();
  const svg = page.getByTestId('riser-diagram');
  await expect(svg).toBeVisible();
  await expect(svg).toHaveAttribute('data-fit', 'width');
  // the demo sits on eight named floors, Level 1 to the roof: they are the diagram's levels, not its nodes' names
  expect(FLOORS.map((f) => f.name)).toEqual(['Level 1', 'Level 2', 'Level 3', 'Level 4', 'Level 5', 'Level 6', 'Level 7', 'Roof']);
  for (const name of [...DEVICES, ...FLOORS.map((f) => f.name)]) await expect(svg).toContainText(name); // a shortened name keeps its wording as its title
  await expect(page.getByTestId('riser-levels')).toHaveText(`Levels: ${LEVELS.join('; ')}.`);
  await expect(page.getByTestId('riser-levels')).not.toContainText('corridor header');
  await expect(page.getByTestId('riser-devices')).toContainText('PRV Level 2 pressure-reducing valve — Level 2');
  await expect(svg.locator('[data-testid^="diagram-fixture-"]').first()).toBeAttached();

  const frame = (await page.getByTestId('riser-diagram-box').boundingBox())!;
  const drawn = (await svg.boundingBox())!;
  console.log(`fitted: box ${frame.width.toFixed(0)} px wide, diagram ${drawn.width.toFixed(0)} × ${drawn.height.toFixed(0)} px`);
  // 2 px: the frame's border on each side
  expect(drawn.width).toBeLessThanOrEqual(frame.width);
  expect(drawn.width).toBeGreaterThan(frame.width - 8);
  await page.screenshot({ path: 'e2e-output/screens/riser-diagram-fit.png', fullPage: true });

  await page.getByRole('button', { name: 'Zoom in' }).click();
  await expect(page.getByTestId('riser-zoom')).toHaveText('125 %');
  await expect(svg).toHaveAttribute('data-fit', 'zoom');
  await page.getByTestId('riser-diagram-box').screenshot({ path: 'e2e-output/screens/riser-diagram-125.png' });
  await page.getByRole('button', { name: 'Fit to width' }).click();
  await expect(svg).toHaveAttribute('data-fit', 'width');

  // print: the page's chrome hidden and the diagram within one US Letter sheet's printable area
  await page.emulateMedia({ media: 'print' });
  await page.setViewportSize({ width: 768, height: 1000 }); // 8.5 in less 2 × 12 mm, at 96 px an inch
  const printed = (await svg.boundingBox())!;
  console.log(`printed: diagram ${printed.width.toFixed(0)} × ${printed.height.toFixed(0)} px`);
  await expect(page.getByRole('navigation', { name: 'Steps of the walk' })).toBeHidden();
  expect(printed.width).toBeLessThanOrEqual(768);
  // 200 mm at 96 px an inch: the stylesheet's cap, under US Letter's 279 mm less margins and heading
  expect(printed.height).toBeLessThanOrEqual((200 / 25.4) * 96 + 1);
  await page.pdf({ path: 'e2e-output/screens/riser-diagram-print.pdf', format: 'Letter' });
  // the whole drawing on the first printed sheet: its lowest and highest levels are both on page 1
  const first = execFileSync('pdftotext', ['-f', '1', '-l', '1', '-layout', 'e2e-output/screens/riser-diagram-print.pdf', '-'], { encoding: 'utf8' });
  expect(first).toContain(FLOORS[0].name);
  expect(first).toContain(FLOORS.at(-1)!.name);
  await page.screenshot({ path: 'e2e-output/screens/riser-diagram-print.png', fullPage: true });
});
