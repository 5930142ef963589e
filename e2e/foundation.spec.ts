import { expect, test } from '@playwright/test';
import type { Page } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, DEMO_PROJECT, mailboxText, mainNav, openProject, shot, signIn, signedInPage } from './helpers';
import { fresh, newProject } from './api';

// Each test stands alone: what it needs beyond the demo seed (a project with the contractor in it)
// it makes itself through the API; names carry a fresh suffix so a reused database does not collide.
const run = Date.now().toString(36);

// Every page of the run must load without an uncaught script error or a content-security-policy
// refusal (the server's CSP must suit the built client).
let pageProblems: string[] = [];
test.beforeEach(({ context }) => {
  pageProblems = [];
  const watch = (page: Page) => {
    page.on('pageerror', (error) => pageProblems.push(`uncaught: ${error.message}`));
    page.on('console', (message) => {
      if (/content security policy/i.test(message.text())) pageProblems.push(`CSP: ${message.text()}`);
    });
  };
  context.pages().forEach(watch);
  context.on('page', watch);
});
test.afterEach(() => {
  expect(pageProblems).toEqual([]);
});

test('when a password is wrong, then sign-in says so and stays on the sign-in page', async ({ page }) => {
  await page.goto('/projects');
  await expect(page).toHaveURL(/\/sign-in\?redirectTo=%2Fprojects/);
  await shot(page, '01-sign-in');
  await page.getByLabel('E-mail address').fill(DEMO.outsider);
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page.getByRole('alert')).toContainText('do not match');
  await expect(page).toHaveURL(/\/sign-in/);
  await shot(page, '02-sign-in-refused');
});

test('when the administrator signs in, then Users is offered, and a new account gets a one-time invitation link that works', async ({ page, browser }) => {
  await signIn(page, DEMO.admin);
  await expect(page.getByTestId('signed-in-as')).toContainText('Administrator');
  await mainNav(page).getByRole('link', { name: 'Users' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Users' })).toBeVisible();
  for (const email of Object.values(DEMO)) await expect(page.getByTestId(`user-${email}`)).toBeVisible();
  await shot(page, '03-admin-users');

  // An administrator sees every project to manage its members, but is not offered its details' edit.
  await mainNav(page).getByRole('link', { name: 'Projects' }).click();
  await openProject(page, DEMO_PROJECT);
  await expect(page.getByRole('button', { name: 'Add member' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Edit details' })).toHaveCount(0);
  await shot(page, '03b-admin-project');
  await mainNav(page).getByRole('link', { name: 'Users' }).click();

  const email = `morgan.reyes.${run}@wrenmoor.example`;
  await page.getByLabel('Full name').fill('Morgan Reyes');
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Kind of account').selectOption('inspector');
  await page.getByRole('button', { name: 'Create account and invitation link' }).click();
  const link = page.getByTestId('invitation-url');
  await expect(link).toHaveValue(/\/invitations\//);
  await expect(page.getByTestId(`user-${email}`)).toContainText('Invited');
  await shot(page, '04-admin-invitation-link');

  // The link's host is the server's public address; the path is what matters here.
  const firstPath = new URL(await link.inputValue()).pathname;
  await page.getByRole('button', { name: 'New invitation link for Morgan Reyes' }).click();
  await expect(link).not.toHaveValue(new RegExp(firstPath));
  const invitationPath = new URL(await link.inputValue()).pathname;
  expect(invitationPath).not.toBe(firstPath);
  const replaced = await (await browser.newContext()).newPage();
  await replaced.goto(firstPath);
  await expect(replaced.getByRole('alert')).toContainText('cannot be used');

  const guest = await (await browser.newContext()).newPage();
  await guest.goto(invitationPath);
  await expect(guest.getByTestId('invitation-email')).toHaveText(email);
  await guest.getByLabel('New password', { exact: true }).fill('a long new password');
  await guest.getByLabel('New password again').fill('a long new password');
  await shot(guest, '05-invitation');
  await guest.getByRole('button', { name: 'Set password and sign in' }).click();
  await expect(guest.getByRole('heading', { level: 1, name: 'Projects' })).toBeVisible();
  await expect(guest.getByTestId('signed-in-as')).toContainText('Morgan Reyes');

  // Used once: the same link no longer works.
  const again = await (await browser.newContext()).newPage();
  await again.goto(invitationPath);
  await expect(again.getByRole('alert')).toContainText('cannot be used');
  await shot(again, '06-invitation-used');
});

test('when the designer signs in, then the demo project shows edit controls and Users is not offered', async ({ page }) => {
  await signIn(page, DEMO.designer);
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
  await expect(mainNav(page).getByRole('link', { name: 'Users' })).toHaveCount(0);
  await expect(page.getByRole('link', { name: 'New project' })).toBeVisible();
  await shot(page, '07-designer-projects');
  await openProject(page, DEMO_PROJECT);
  await expect(page.getByRole('button', { name: 'Edit details' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Add member' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Archive project…' })).toBeVisible();
  await expect(page.getByTestId(`member-${DEMO.contractor}`)).toContainText('Contractor');
  await shot(page, '08-designer-project');
});

for (const role of ['contractor', 'inspector'] as const) {
  test(`when the ${role} signs in, then the demo project is readable and offers no edit controls`, async ({ page }) => {
    await signIn(page, DEMO[role]);
    await expect(mainNav(page).getByRole('link', { name: 'Users' })).toHaveCount(0);
    await expect(page.getByRole('link', { name: 'New project' })).toHaveCount(0);
    await openProject(page, DEMO_PROJECT);
    await expect(page.getByText('410 Quarry Lane')).toBeVisible();
    await expect(page.getByTestId('read-only-note')).toBeVisible();
    await expect(page.getByRole('button', { name: 'Edit details' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Add member' })).toHaveCount(0);
    await expect(page.getByRole('button', { name: /Remove / })).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'Archive project…' })).toHaveCount(0);
    await shot(page, `09-${role}-project`);
  });
}

test('when the designer creates a project and adds the contractor, then the contractor is listed with that role', async ({ page }) => {
  const newProjectName = `Wrenmoor Library Annex ${fresh()}`;
  await signIn(page, DEMO.designer);
  await page.getByRole('link', { name: 'New project' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'New project' })).toBeVisible();
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByText('Enter a project name')).toBeVisible();
  await page.getByLabel('Project name').fill(newProjectName);
  await page.getByLabel('Building address').fill('12 Kiln Row, Wrenmoor');
  await page.getByLabel('Units').selectOption('SI');
  await shot(page, '10-designer-new-project');
  await page.getByRole('button', { name: 'Create project' }).click();
  await expect(page.getByRole('heading', { level: 1, name: newProjectName })).toBeVisible();

  await page.getByLabel("Member's e-mail address").fill('nobody@wrenmoor.example');
  await page.getByRole('button', { name: 'Add member' }).click();
  await expect(page.getByText('No account has this e-mail address')).toBeVisible();

  await page.getByLabel("Member's e-mail address").fill(DEMO.contractor);
  await page.getByLabel('Role in this project').selectOption('contractor');
  await page.getByRole('button', { name: 'Add member' }).click();
  await expect(page.getByTestId(`member-${DEMO.contractor}`)).toContainText('Contractor');
  await expect(page.getByRole('status').filter({ hasText: 'was added as contractor' })).toBeVisible();
  await shot(page, '11-designer-added-contractor');
});

test('when the contractor looks, then the new project is listed and opens', async ({ page }) => {
  const { name: newProjectName } = await newProject([{ email: DEMO.contractor, role: 'contractor' }], 'Wrenmoor Library Annex');
  await signIn(page, DEMO.contractor);
  await openProject(page, newProjectName);
  await expect(page.getByText('Your role:')).toBeVisible();
  await expect(page.getByRole('heading', { level: 1, name: newProjectName })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Edit details' })).toHaveCount(0);
  await shot(page, '12-contractor-new-project');
});

test('when the outsider looks, then the new project is neither listed nor reachable by its address', async ({ page }) => {
  const { name: newProjectName, path: newProjectPath } = await newProject([{ email: DEMO.contractor, role: 'contractor' }], 'Wrenmoor Library Annex');
  await signIn(page, DEMO.outsider);
  await expect(page.getByRole('link', { name: newProjectName })).toHaveCount(0);
  await expect(page.getByRole('link', { name: DEMO_PROJECT })).toHaveCount(0);
  await shot(page, '13-outsider-projects');
  await page.goto(newProjectPath);
  await expect(page.getByTestId('not-found')).toBeVisible();
  await expect(page.getByRole('heading', { level: 1, name: 'Not found' })).toBeVisible();
  await expect(page.getByText(newProjectName)).toHaveCount(0);
  await shot(page, '14-outsider-not-found');
});

test('when two designers save the same version, then the second is refused with Reload and nothing is overwritten', async ({ browser }) => {
  const { name: newProjectName, path: newProjectPath } = await newProject([{ email: DEMO.contractor, role: 'contractor' }], 'Wrenmoor Library Annex');
  const first = await signedInPage(browser, DEMO.designer);
  const second = await signedInPage(browser, DEMO.designer);
  for (const page of [first, second]) {
    await page.goto(newProjectPath);
    await page.getByRole('button', { name: 'Edit details' }).click();
  }
  await first.getByLabel('Building address').fill('14 Kiln Row, Wrenmoor');
  await first.getByRole('button', { name: 'Save changes' }).click();
  await expect(first.getByText('14 Kiln Row, Wrenmoor')).toBeVisible();

  await second.getByLabel('Building address').fill('16 Kiln Row, Wrenmoor');
  await second.getByRole('button', { name: 'Save changes' }).click();
  await expect(second.getByText('Someone else changed this project since you opened it')).toBeVisible();
  await shot(second, '15-stale-version');
  await second.getByRole('button', { name: 'Reload' }).click();
  await expect(second.getByLabel('Building address')).toHaveValue('14 Kiln Row, Wrenmoor');

  await first.reload();
  // the project's audit log lists the saved address too: look in the details only
  const details = first.getByRole('region', { name: 'Details' });
  await expect(details.getByText('14 Kiln Row, Wrenmoor')).toBeVisible();
  await expect(details.getByText('16 Kiln Row, Wrenmoor')).toHaveCount(0);

  // Archiving moves it to the archived list.
  await first.getByRole('button', { name: 'Archive project…' }).click();
  await first.getByRole('button', { name: 'Yes, archive it' }).click();
  await expect(first.getByRole('button', { name: 'Restore project' })).toBeVisible();
  await mainNav(first).getByRole('link', { name: 'Projects' }).click();
  await expect(first.getByRole('list', { name: 'Archived projects' }).getByRole('link', { name: newProjectName })).toBeVisible();
  await shot(first, '16-archived');
});

test('when someone opens an unknown address, then the not-found page is shown inside the app', async ({ page }) => {
  await signIn(page, DEMO.inspector);
  await page.goto('/no/such/page');
  await expect(page.getByRole('heading', { level: 1, name: 'Not found' })).toBeVisible();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Sign in' })).toBeVisible();
  await page.goto('/projects');
  await expect(page).toHaveURL(/\/sign-in/);
});

test('when someone uses only the keyboard, then sign-in works and the focused control shows a visible ring', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByLabel('E-mail address')).toBeFocused();
  await page.keyboard.type(DEMO.inspector);
  await page.keyboard.press('Tab');
  await expect(page.getByLabel('Password')).toBeFocused();
  await page.keyboard.type('headroom-demo');
  await page.keyboard.press('Tab');
  const button = page.getByRole('button', { name: 'Sign in', exact: true });
  await expect(button).toBeFocused();
  const outline = await button.evaluate((el) => {
    const style = getComputedStyle(el);
    return { width: style.outlineWidth, style: style.outlineStyle };
  });
  expect(outline).toEqual({ width: '3px', style: 'solid' });
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { level: 1, name: 'Projects' })).toBeVisible();
  // The first Tab on a signed-in page reaches the skip link.
  await page.keyboard.press('Tab');
  await expect(page.getByRole('link', { name: 'Skip to content' })).toBeFocused();
  await shot(page, '17-keyboard-skip-link');
});

test('when the outsider forgets the password, then a link comes by e-mail, sets the password once, and the outsider signs in with it', async ({
  page,
  browser,
}) => {
  await page.goto('/sign-in');
  await page.getByRole('link', { name: 'Forgot your password?' }).click();
  await expect(page.getByRole('heading', { level: 1, name: 'Forgot your password?' })).toBeVisible();
  await page.getByLabel('E-mail address').fill(DEMO.outsider);
  await page.getByRole('button', { name: 'Send me a link' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Check your e-mail' })).toContainText('If an active account');
  await shot(page, '18-forgot-password-sent');

  // the link reaches the outsider's mailbox (the development sink's table; the outbox sends within a second or two)
  let link: string | undefined;
  await expect(async () => {
    const text = await mailboxText(DEMO.outsider, /reset the password of your Headroom account/i);
    link = text?.match(/https?:\/\/\S+\/reset-password\?token=[\w%-]+/)?.[0];
    expect(link, 'the e-mail carries a reset link').toBeTruthy();
  }).toPass({ timeout: 30_000 });

  // an administrator's development mail page lists the message but withholds its text (the link is the outsider's alone)
  const admin = await signedInPage(browser, DEMO.admin);
  await admin.goto('/dev/mail');
  await admin.getByLabel('Only messages to this address').fill(DEMO.outsider);
  const item = admin.getByTestId('dev-mail-item').first();
  await expect(item).toBeVisible();
  await expect(item).not.toContainText('token=');

  // the new password is the demo one again: the other specs and the README's sign-ins keep working on this shared database
  await page.goto(link!);
  await expect(page.getByRole('heading', { level: 1, name: 'Choose a new password' })).toBeVisible();
  await page.getByLabel('New password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByLabel('New password again').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Change password' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Password changed' })).toBeVisible();
  await shot(page, '19-reset-password-done');

  // the link works once
  await page.goto(link!);
  await page.getByLabel('New password', { exact: true }).fill('another long password');
  await page.getByLabel('New password again').fill('another long password');
  await page.getByRole('button', { name: 'Change password' }).click();
  await expect(page.getByRole('alert')).toContainText('cannot be used');
  await expect(page.getByRole('link', { name: 'Ask for a new link' })).toBeVisible();

  await signIn(page, DEMO.outsider, DEMO_PASSWORD);
});
