import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import { expect, test } from '@playwright/test';
import type { Browser, Locator, Page } from '@playwright/test';
import { DEMO, signIn } from './helpers';

// The review loop end to end, on a project of its own made from the invented Alder & Finch cold-water
// system (so it depends on no other spec): the inspector returns revision 1 with two item comments →
// the designer sees the "returned to you" marker and the comments at their items in the next draft →
// answers them, changes the riser's fittings and issues revision 2 → sends it → the inspector's review
// of revision 2 shows the compare against revision 1 and the answers → accepts → the acceptance
// record downloads.

const OUT = 'e2e-output/review-loop';
const run = Date.now().toString(36);
const PROJECT = `Alder & Finch annex ${run}`;
const SYSTEM = 'Domestic cold water';
const SEGMENT_COMMENT = `Show the fittings on the riser to level 2 (${run}).`;
const FIXTURE_COMMENT = `Confirm the valve model at this shower (${run}).`;
const SEGMENT_REPLY = 'Added the usual set of two elbows and a tee run to the riser.';
const FIXTURE_REPLY = 'The valve is the pressure-balancing model in the fixture schedule.';

const ctx = { projectId: '', systemId: '', rev1: '', rev2: '', inspectorId: '' };
const resultUrl = (revisionId: string) => `/projects/${ctx.projectId}/systems/${ctx.systemId}/revisions/${revisionId}/result`;

async function shot(page: Page, name: string, what: 'page' | Locator = 'page') {
  fs.mkdirSync(OUT, { recursive: true });
  const path = `${OUT}/${name}.png`;
  if (what === 'page') await page.screenshot({ path, fullPage: true });
  else await what.screenshot({ path });
}

/** The signed-in page's API, with its CSRF token (the set-up only; the loop itself goes through the screens). */
async function apiOf(page: Page) {
  const token = (await (await page.request.get('/api/csrf-token')).json()).token as string;
  return async (method: 'POST' | 'PUT' | 'DELETE', url: string, data?: unknown) => {
    const res = await page.request.fetch(url, { method, data, headers: { 'x-csrf-token': token } });
    expect(res.status(), `${method} ${url}: ${await res.text()}`).toBeLessThan(300);
    return res.status() === 204 ? null : res.json();
  };
}

const panel = (page: Page) => page.getByTestId('revision-summary-panel');

// The demo inspector is shared with other specs: once this spec is done (or stopped), this project's
// reviews leave the inspector's inbox (it lists the projects they are a member of), so no other spec sees them.
test.afterAll(async ({ browser }) => {
  if (!ctx.projectId || !ctx.inspectorId) return;
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, DEMO.designer);
  await (
    await apiOf(page)
  )('DELETE', `/api/projects/${ctx.projectId}/members/${ctx.inspectorId}`);
  await context.close();
});
const step = (page: Page, name: string) => page.getByRole('navigation', { name: 'Steps of the walk' }).getByRole('link', { name });

async function part1(page: Page) {
  await signIn(page, DEMO.designer);
  const send = await apiOf(page);
  ctx.projectId = (await send('POST', '/api/projects', { name: PROJECT, address: '412 Quarry Lane, Wrenmoor' })).project.id;
  await send('POST', `/api/projects/${ctx.projectId}/members`, { email: DEMO.inspector, role: 'inspector' });
  const document = { ...JSON.parse(fs.readFileSync('src/engine/examples/alder-finch-cold.json', 'utf8')), id: randomUUID() };
  const created = await send('POST', `/api/projects/${ctx.projectId}/systems`, { name: SYSTEM, service: 'cold', document });
  ctx.systemId = created.system.id;
  ctx.rev1 = created.revision.id;
  await send('POST', `/api/projects/${ctx.projectId}/systems/${ctx.systemId}/revisions/${ctx.rev1}/issue`, {
    version: created.revision.version,
    attestation: { name: 'Dana Whitlow', licenceNumber: 'PE 40417', basis: 'prepared', confirmed: true },
  });
  const members = (await (await page.request.get(`/api/projects/${ctx.projectId}/members`)).json()).members as { userId: string; email: string }[];
  ctx.inspectorId = members.find((m) => m.email === DEMO.inspector)!.userId;
  await send('POST', `/api/projects/${ctx.projectId}/systems/${ctx.systemId}/revisions/${ctx.rev1}/summary/send`, { inspectorIds: [ctx.inspectorId] });
}

async function part2(page: Page) {
  await signIn(page, DEMO.inspector);
  await page.goto(resultUrl(ctx.rev1));
  const form = panel(page).getByRole('form', { name: 'Review of revision 1' });
  await expect(form).toBeVisible({ timeout: 20_000 });
  await form.getByLabel(/Return with comments/).check();
  await form.getByLabel('Why it is returned').fill('Two items to settle before this can be accepted.');
  await form.getByRole('button', { name: 'Add a comment on an item' }).click();
  await form.getByLabel('Comment 1 is about').selectOption('segment');
  await form.getByLabel('Which segment (comment 1)').selectOption({ label: 'Riser to level 2 (riser-2)' });
  await form.getByLabel('Comment 1', { exact: true }).fill(SEGMENT_COMMENT);
  await form.getByRole('button', { name: 'Add a comment on an item' }).click();
  await form.getByLabel('Which checked fixture (comment 2)').selectOption({ label: 'Shower, apartment 201 (shower-201)' });
  await form.getByLabel('Comment 2', { exact: true }).fill(FIXTURE_COMMENT);
  await form.getByRole('button', { name: 'Record decision…' }).click();
  await form.getByRole('button', { name: 'Yes, return revision 1' }).click();
  const mine = panel(page).getByRole('article', { name: 'Review by Imogen Hale' });
  await expect(mine.getByText('Returned with comments')).toBeVisible();
  await expect(mine.getByTestId('review-item')).toHaveCount(2);
}

async function part3(page: Page) {
  // the longest walk of the suite on a shared machine: the demo building's steps, two replies, an issue and a send
  await signIn(page, DEMO.designer);
  const row = page.getByRole('listitem').filter({ has: page.getByRole('link', { name: PROJECT, exact: true }) });
  await expect(row.getByTestId('returned-project-marker')).toContainText('Returned to you');
  await page.getByRole('link', { name: PROJECT, exact: true }).click();
  await expect(page.getByRole('heading', { level: 1, name: PROJECT })).toBeVisible();
  await expect(page.getByTestId('returned-project-marker')).toContainText('Returned to you');
  await expect(page.getByTestId(`system-${SYSTEM}`).getByTestId('returned-marker')).toContainText('0 of 2 comments answered');
  await shot(page, '01-project-returned');

  // the next draft, from the returned revision
  await page.goto(resultUrl(ctx.rev1));
  await page.getByRole('button', { name: 'Start a new draft from this revision' }).click();
  await expect(page.getByText('Revision 2 · draft')).toBeVisible();
  ctx.rev2 = page.url().split('/revisions/')[1].split('/')[0];
  const comments = page.getByTestId('review-comments-panel');
  await expect(comments.getByRole('heading', { name: 'Inspector’s comments on revision 1' })).toBeVisible();
  await expect(page.getByTestId('returned-marker').first()).toContainText('Returned to you');

  // Remote fixture: the shower's comment is at this step; answer it
  await step(page, 'Remote fixture').click();
  await expect(page.getByRole('heading', { level: 2, name: 'Remote fixture' })).toBeVisible({ timeout: 30_000 });
  const fixtureNote = comments.getByRole('list', { name: 'Comments at this step' }).getByTestId('review-note-fixture-shower-201');
  await expect(fixtureNote).toContainText('Checked fixture Shower, apartment 201');
  await expect(fixtureNote).toContainText(FIXTURE_COMMENT);
  await fixtureNote.getByLabel('Your reply to comment 2').fill(FIXTURE_REPLY);
  await fixtureNote.getByRole('button', { name: 'Mark comment 2 answered' }).click();
  await expect(fixtureNote).toContainText(`Answered by`);
  await expect(fixtureNote).toContainText(FIXTURE_REPLY);
  await shot(page, '02-fixture-comment-answered', comments);

  // Fittings: the riser's comment is at this step; change the riser's fittings and answer it
  await step(page, 'Fittings').click();
  await expect(page.getByRole('heading', { level: 2, name: 'Fittings' })).toBeVisible({ timeout: 30_000 });
  const segmentNote = comments.getByRole('list', { name: 'Comments at this step' }).getByTestId('review-note-segment-riser-2');
  await expect(segmentNote).toContainText('Segment Riser to level 2');
  await page.getByTestId('segment-riser-2').getByRole('button', { name: 'Open Riser to level 2' }).click();
  await page.getByRole('button', { name: 'Add the usual set (2 elbows, 1 tee run) to Riser to level 2' }).click();
  await segmentNote.getByLabel('Your reply to comment 1').fill(SEGMENT_REPLY);
  await segmentNote.getByRole('button', { name: 'Mark comment 1 answered' }).click();
  await expect(segmentNote).toContainText(SEGMENT_REPLY);
  await expect(page.getByTestId('returned-marker').first()).toContainText('2 of 2 comments answered');
  await shot(page, '03-segment-comment-answered');

  // Issue revision 2 (the pending change is saved first), then send it to the inspector
  await step(page, 'Result').click();
  await expect(page.getByRole('heading', { level: 2, name: 'Result' })).toBeVisible({ timeout: 30_000 });
  await page.getByRole('button', { name: 'Issue revision…' }).click();
  const confirm = page.getByRole('group', { name: 'Confirm issuing' });
  const statement = confirm.getByLabel('Your statement: why this failing revision is issued');
  if (await statement.count()) await statement.fill('Issued with the riser fittings the inspector asked for; the failing fixture is being resized.');
  // the preparer's attestation (invented name and licence number)
  await confirm.getByLabel('Your name, as on your licence').fill('Dana Whitlow');
  await confirm.getByLabel('Licence or registration number').fill('PE 40417');
  await confirm.getByLabel(/^I confirm:/).check();
  await confirm.getByRole('button', { name: /^Yes, issue/ }).click();
  // issuing makes the summary PDF in the same request: slow on a loaded machine
  await expect(page.getByTestId('issued-note')).toContainText('issued', { timeout: 90_000 });
  await expect(page.getByTestId('review-comments-panel')).toHaveCount(0);
  await expect(panel(page).getByTestId('summary-ready')).toBeVisible({ timeout: 60_000 });
  await panel(page).getByRole('button', { name: 'Send to inspectors…' }).click();
  const dialog = page.getByRole('dialog', { name: 'Send revision 2 to inspectors' });
  await dialog.getByLabel(`Imogen Hale (${DEMO.inspector})`).check();
  await dialog.getByRole('button', { name: 'Send the summary' }).click();
  await expect(dialog).toBeHidden();

  // the marker is gone once revision 2 is issued
  await page.goto(`/projects/${ctx.projectId}`);
  await expect(page.getByTestId(`system-${SYSTEM}`)).toBeVisible();
  await expect(page.getByTestId('returned-marker')).toHaveCount(0);
  await expect(page.getByTestId('returned-project-marker')).toHaveCount(0);

  // the issued summary prints the response to the review comments
  const pdf = await page.request.get(`/api/projects/${ctx.projectId}/systems/${ctx.systemId}/revisions/${ctx.rev2}/summary.pdf`);
  expect(pdf.status()).toBe(200);
  fs.mkdirSync(OUT, { recursive: true });
  fs.writeFileSync(`${OUT}/summary-revision-2.pdf`, await pdf.body());
  // -raw keeps each table cell's lines together (the content order), so a wrapped reply reads whole
  const text = execFileSync('pdftotext', ['-raw', `${OUT}/summary-revision-2.pdf`, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  expect(text).toContain('Response to review comments');
  expect(text).toContain(SEGMENT_REPLY);
  expect(text).toContain(FIXTURE_REPLY);
}

async function part4(page: Page) {
  await signIn(page, DEMO.inspector);
  await page.goto(resultUrl(ctx.rev2));
  const answers = page.getByTestId('review-answers');
  await expect(answers).toBeVisible({ timeout: 20_000 });
  // changed rows first, in words
  const changes = answers.getByTestId('answers-changes');
  await expect(changes).toContainText('Segment Riser to level 2: fittings');
  await expect(changes).toContainText('→');
  await expect(answers.getByTestId('answers-fixtures-changed')).toBeVisible();
  const items = answers.getByTestId('answered-item');
  await expect(items).toHaveCount(2);
  await expect(items.filter({ hasText: SEGMENT_COMMENT })).toContainText(SEGMENT_REPLY);
  await expect(items.filter({ hasText: FIXTURE_COMMENT })).toContainText(FIXTURE_REPLY);
  await shot(page, '04-inspector-answers', answers);

  const form = panel(page).getByRole('form', { name: 'Review of revision 2' });
  await form.getByLabel(/^Accept/).check();
  await form.getByLabel('Comment (optional)').fill('Both items settled; accepted.');
  await form.getByRole('button', { name: 'Record decision…' }).click();
  await form.getByRole('button', { name: 'Yes, accept revision 2' }).click();
  const mine = panel(page).getByRole('article', { name: 'Review by Imogen Hale' });
  await expect(mine.getByText('Accepted', { exact: true })).toBeVisible();
  const link = mine.getByTestId('acceptance-record-link');
  const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
  expect(download.suggestedFilename()).toMatch(/^Acceptance record .*revision 2\.pdf$/);
  const file = `${OUT}/acceptance-record.pdf`;
  await download.saveAs(file);
  const bytes = fs.readFileSync(file);
  expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  expect(execFileSync('pdfinfo', [file], { encoding: 'utf8' })).toMatch(/Pages:\s+1\n/);
  const text = execFileSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  expect(text).toContain('ACCEPTED');
  expect(text).toContain('Both items settled; accepted.');
  execFileSync('pdftoppm', ['-png', '-r', '60', file, `${OUT}/acceptance-record`]);
  await shot(page, '05-inspector-accepted', panel(page));
}

/** Each part of the story in a browser context of its own (its own sign-in), failing on any uncaught page error. */
async function fresh(browser: Browser, part: (page: Page) => Promise<void>) {
  const context = await browser.newContext();
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.message}`));
  try {
    await part(page);
    expect(problems).toEqual([]);
  } finally {
    await context.close();
  }
}

// One test: the loop is one story whose parts build on each other, so no test depends on another's success.
test('when an inspector returns a revision with item comments and the designer answers and reissues, then the inspector sees the compare and the answers and accepts, and the acceptance record downloads', async ({
  browser,
}) => {
  test.setTimeout(600_000);
  await test.step('set-up: the designer issues revision 1 of a new project’s cold-water system and sends it to the inspector', () => fresh(browser, part1));
  await test.step('when the inspector returns revision 1 with two item comments, then the review records both', () => fresh(browser, part2));
  await test.step('when the designer opens the returned project, then the marker shows on the list, the project and the system, and the next draft shows each comment at its item', () =>
    fresh(browser, part3));
  await test.step('when the inspector opens revision 2, then the review shows the compare against revision 1 and the answers; accepting stores a record that downloads', () =>
    fresh(browser, part4));
});
