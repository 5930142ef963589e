/**
 * Editing a draft through the walk's real routes: the live ledger follows each change at once,
 * because the engine runs in the browser, and the draft is saved afterwards (debounced) with the
 * version it was opened at; a save over someone else's answers 409 and the person chooses.
 * Expected margins come from the engine run here on the same edited document, formatted as the
 * panel formats them, so a wrong or stale panel fails.
 */
import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SystemDocument } from '../../src/engine';
import { UNIT_LABELS } from '../../src/engine';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { walkPaths } from '../../src/features/walk/paths';
import { CSRF_TOKEN, demoDocument, fakeApi } from './support/fake-api';
import type { FakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const demo = demoDocument();
const u = UNIT_LABELS[demo.unitSystem];
// The building service is the first segment from the source: every fixture's path runs through it.
const service = demo.segments[0];
const serviceName = service.label || service.id;
/** Nine more of a segment's first fitting. */
const withMoreFittings = (doc: SystemDocument, index: number, count: number): SystemDocument => ({
  ...doc,
  segments: doc.segments.map((s, i) => (i === index ? { ...s, fittings: s.fittings.map((f, k) => (k === 0 ? { ...f, count } : f)) } : s)),
});
// The first segment whose first fitting the critical margin feels: with the demo's booster holding its outlet
// pressure, the segments above it do not move the critical fixture's margin.
const fittedIndex = demo.segments.findIndex(
  (s, i) => s.fittings.length > 0 && expectedMarginText(withMoreFittings(demo, i, s.fittings[0].count + 9)) !== expectedMarginText(demo),
);
const fitted = demo.segments[fittedIndex];
const countLabel = `${fitted.label || fitted.id}: fitting 1 count`;
/**
 * Room for the debounce to run out and the request to go: the delay itself plus time to render.
 * Waits end as soon as the condition holds; the margins are for a loaded 2-core machine.
 */
const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 8_000 };
/** The ledger runs on a deferred copy of the draft; re-rendering a step of the demo's size took 1–5 s in jsdom here. */
const CATCH_UP = { timeout: 10_000 };

/** The demo with the service's first fitting counted `count` times. */
const withServiceLength = (doc: SystemDocument, length: number): SystemDocument => ({
  ...doc,
  segments: doc.segments.map((s, i) => (i === 0 ? { ...s, length } : s)),
});

const saveState = () => screen.getByTestId('save-state').getAttribute('data-state');
type SentSave = { document: SystemDocument; version: number };
const sent = (world: FakeApi, k: number) => world.saves()[k].body as SentSave;

async function retype(user: Awaited<ReturnType<typeof renderWalk>>['user'], label: string, value: string) {
  const input = field(label);
  await user.clear(input);
  await user.type(input, value);
  expect(field(label).value).toBe(value);
}

describe('a change on a draft', () => {
  it('when a fitting count is changed, then the live margin follows before any save has returned, and the save sends the version', async () => {
    const world = fakeApi({ holdSaves: true });
    const { user } = await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    const before = expectedMarginText(demo);
    expect(shownMargin()).toBe(before);
    expect(saveState()).toBe('saved');

    expect(fittedIndex).toBeGreaterThanOrEqual(0);
    const count = fitted.fittings[0].count + 9;
    await user.click(screen.getByRole('button', { name: `Open ${fitted.label || fitted.id}` }));
    await retype(user, countLabel, String(count));
    const after = expectedMarginText(withMoreFittings(demo, fittedIndex, count));
    // nine more fittings must show in the margin's second decimal, or the check below proves nothing
    expect(after).not.toBe(before);
    await waitFor(() => expect(shownMargin()).toBe(after), CATCH_UP);
    // every save is held by the fake server: none has been answered while the margin moved
    expect(saveState()).not.toBe('saved');
    expect(world.server.version).toBe(1);

    await waitFor(() => expect(world.saves()).toHaveLength(1), SAVE_WAIT);
    const [save] = world.saves();
    expect(save.headers['x-csrf-token']).toBe(CSRF_TOKEN);
    expect(sent(world, 0).version).toBe(1);
    expect(sent(world, 0).document.segments[fittedIndex].fittings[0].count).toBe(count);
    // what was sent is what the panel computed on
    expect(expectedMarginText(sent(world, 0).document)).toBe(after);

    world.releaseSaves();
    await waitFor(() => expect(saveState()).toBe('saved'), CATCH_UP);
    expect(world.server.version).toBe(2);
    expect(screen.getByTestId('save-state').textContent).toContain('All changes saved');
  });

  it('when a segment length is changed in the table, then the margin follows and each save sends the version the last one returned', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, walkPaths.table.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    await screen.findByTestId('segment-table', {}, { timeout: 10_000 });
    const lengthLabel = `${serviceName} length (${u.length})`;

    const longer = service.length * 4;
    await retype(user, lengthLabel, String(longer));
    const first = expectedMarginText(withServiceLength(demo, longer));
    expect(first).not.toBe(expectedMarginText(demo));
    await waitFor(() => expect(shownMargin()).toBe(first), CATCH_UP);
    await waitFor(() => expect(saveState()).toBe('saved'), SAVE_WAIT);
    expect(world.saves()).toHaveLength(1);
    expect(sent(world, 0)).toMatchObject({ version: 1 });
    expect(sent(world, 0).document.segments[0].length).toBe(longer);

    const shorter = service.length * 2;
    await retype(user, lengthLabel, String(shorter));
    const second = expectedMarginText(withServiceLength(demo, shorter));
    expect(second).not.toBe(first);
    await waitFor(() => expect(shownMargin()).toBe(second), CATCH_UP);
    await waitFor(() => expect(world.saves()).toHaveLength(2), SAVE_WAIT);
    // the second save is made at the version the first one returned
    expect(sent(world, 1).version).toBe(2);
    expect(sent(world, 1).document.segments[0].length).toBe(shorter);
    await waitFor(() => expect(saveState()).toBe('saved'), CATCH_UP);
    expect(world.server.version).toBe(3);
  });
});

describe('a save over someone else’s', () => {
  async function conflict() {
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'fittings'));
    await screen.findByTestId('step-fittings', {}, { timeout: 10_000 });
    // another designer saves the draft with two more fittings on that segment, after this page opened it
    const theirCount = fitted.fittings[0].count + 2;
    world.someoneElseSaves((doc) => withMoreFittings(doc, fittedIndex, theirCount));
    const myCount = fitted.fittings[0].count + 9;
    await user.click(screen.getByRole('button', { name: `Open ${fitted.label || fitted.id}` }));
    await retype(user, countLabel, String(myCount));
    await waitFor(() => expect(saveState()).toBe('conflict'), SAVE_WAIT);
    expect(sent(world, 0).version).toBe(1);
    return { world, user, theirCount, myCount };
  }

  // a conflict runs a save, a 409, a reload and a second save through the demo's fittings step: about 30 s alone, 60 s on the shared machine
  it('when the server answers 409, then the choices show and nothing is overwritten; "Keep mine" saves at their version', { timeout: 150_000 }, async () => {
    const { world, user, theirCount, myCount } = await conflict();
    expect(screen.getByTestId('save-state').textContent).toContain('Not saved: changed by someone else');
    expect(screen.getByText('Someone else saved this draft since you opened it')).toBeTruthy();
    const keep = screen.getByRole('button', { name: 'Keep mine' });
    expect(screen.getByRole('button', { name: 'Reload theirs' })).toBeTruthy();
    // their save stands, and the page still shows mine
    expect(world.server.document.segments[fittedIndex].fittings[0].count).toBe(theirCount);
    expect(shownMargin()).toBe(expectedMarginText(withMoreFittings(demo, fittedIndex, myCount)));

    await user.click(keep);
    await waitFor(() => expect(saveState()).toBe('saved'), CATCH_UP);
    expect(world.saves()).toHaveLength(2);
    expect(sent(world, 1).version).toBe(2);
    expect(world.server.document.segments[fittedIndex].fittings[0].count).toBe(myCount);
    expect(screen.queryByRole('button', { name: 'Keep mine' })).toBeNull();
  });

  it('when "Reload theirs" is chosen, then the step and the ledger show their draft and nothing more is sent', { timeout: 150_000 }, async () => {
    const { world, user, theirCount } = await conflict();
    await user.click(screen.getByRole('button', { name: 'Reload theirs' }));
    await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(withMoreFittings(demo, fittedIndex, theirCount))), CATCH_UP);
    // the step is read again from their draft: open the row once more to see its fittings
    if (!screen.queryAllByLabelText(countLabel).length) await user.click(screen.getByRole('button', { name: `Open ${fitted.label || fitted.id}` }));
    await waitFor(() => expect(field(countLabel).value).toBe(String(theirCount)), CATCH_UP);
    expect(saveState()).toBe('saved');
    expect(world.saves()).toHaveLength(1);
    expect(world.server.version).toBe(2);
  });
});
