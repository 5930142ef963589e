/**
 * The inspector's comments beside their items in the next draft: the draft of a system whose
 * issued revision was returned shows the "returned to you" marker and, on each step, the comments
 * on that step's items (the others folded, with a link to their step); the designer answers a
 * comment with a reply, sent to PUT …/comments/:commentId/reply; other roles read the comments only.
 */
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { reviewUrls } from '../../src/features/reviews/api/urls';
import { demoDocument, fakeApi, CSRF_TOKEN } from './support/fake-api';
import { renderWalk, stepHref } from './support/render-walk';

const demo = demoDocument();
const riser = demo.segments.find((s) => s.id === 'riser-2')!;
const shower = demo.nodes.flatMap((n) => n.checkedFixtures).find((f) => f.id === 'shower-201')!;
const returned = {
  comment: 'Two items to address.',
  items: [
    { itemType: 'segment' as const, itemId: riser.id, comment: 'Show the fittings on this riser.' },
    { itemType: 'fixture' as const, itemId: shower.id, comment: 'Confirm the shower valve model.' },
  ],
};

describe('the inspector’s comments in the next draft', () => {
  it(
    'when the designer opens the Remote fixture step, then the fixture’s comment is at this step, the segment’s is folded with a link to its step, and the marker shows',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi({ returned });
      await renderWalk(world, stepHref(world, 'fixtures'));
      const panel = await screen.findByTestId('review-comments-panel', {}, { timeout: 10_000 });
      expect(within(panel).getByRole('heading', { name: 'Inspector’s comments on revision 2' })).toBeTruthy();
      expect(panel.textContent).toContain('Overall: Two items to address.');
      expect(screen.getAllByTestId('returned-marker')[0].textContent).toContain('Returned to you');
      expect(screen.getAllByTestId('returned-marker')[0].textContent).toContain('0 of 2 comments answered');

      const here = within(panel).getByRole('list', { name: 'Comments at this step' });
      const fixtureNote = within(here).getByTestId(`review-note-fixture-${shower.id}`);
      // named as the designer typed it, not by its id
      expect(fixtureNote.textContent).toContain(`Checked fixture ${shower.label}`);
      expect(fixtureNote.textContent).toContain('Confirm the shower valve model.');
      expect(fixtureNote.textContent).toContain('Not answered yet');

      const other = within(panel).getByRole('list', { name: 'Comments on other steps' });
      const segmentNote = within(other).getByTestId(`review-note-segment-${riser.id}`);
      expect(segmentNote.textContent).toContain(`Segment ${riser.label}`);
      expect(within(segmentNote).getByRole('link', { name: 'Go to the Risers step' }).getAttribute('href')).toBe(stepHref(world, 'risers'));
      expect(world.unknown).toEqual([]);
    },
  );

  it(
    'when the designer replies to a comment, then the reply is sent to its address and the comment shows as answered; an empty reply is refused in place',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi({ returned });
      const { user } = await renderWalk(world, stepHref(world, 'fixtures'));
      const note = await screen.findByTestId(`review-note-fixture-${shower.id}`, {}, { timeout: 10_000 });
      const form = within(note).getByRole('form', { name: 'Reply to comment 2' });
      await user.click(within(form).getByRole('button', { name: 'Mark comment 2 answered' }));
      expect(await within(form).findByText('Write the reply')).toBeTruthy();
      const replyUrl = reviewUrls.reply(world.ids.projectId, '1a2b3c4d-5e6f-4a8b-9c0d-1e2f3a4b5c6d', '2');
      expect(world.calls.filter((c) => c.url === replyUrl)).toHaveLength(0);

      await user.type(within(form).getByLabelText('Your reply to comment 2'), 'The valve is the pressure-balancing model in the schedule.');
      await user.click(within(form).getByRole('button', { name: 'Mark comment 2 answered' }));
      await waitFor(() => expect(screen.getByTestId(`review-note-fixture-${shower.id}`).textContent).toContain('Answered by Dana Okafor'), { timeout: 5_000 });
      const sent = world.calls.filter((c) => c.url === replyUrl);
      expect(sent).toHaveLength(1);
      expect(sent[0].method).toBe('PUT');
      expect(sent[0].headers['x-csrf-token']).toBe(CSRF_TOKEN);
      expect(sent[0].body).toEqual({ reply: 'The valve is the pressure-balancing model in the schedule.' });
      expect(screen.getByTestId(`review-note-fixture-${shower.id}`).textContent).toContain('The valve is the pressure-balancing model in the schedule.');
      // the marker counts it once the system is read again
      await waitFor(() => expect(screen.getAllByTestId('returned-marker')[0].textContent).toContain('1 of 2 comments answered'), { timeout: 5_000 });
      expect(world.unknown).toEqual([]);
    },
  );

  it('when a contractor opens the draft, then the comments show without a reply form', { timeout: 120_000 }, async () => {
    const world = fakeApi({ returned, myRole: 'contractor' });
    await renderWalk(world, stepHref(world, 'fixtures'));
    const panel = await screen.findByTestId('review-comments-panel', {}, { timeout: 10_000 });
    expect(panel.textContent).toContain('Confirm the shower valve model.');
    expect(screen.getAllByTestId('returned-marker')[0].textContent).toContain('Returned to the designer');
    expect(within(panel).queryAllByRole('form')).toHaveLength(0);
  });

  it('when the system has no returned review, then the walk shows no comments panel and no marker', { timeout: 120_000 }, async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'fixtures'));
    await screen.findByTestId('step-fixtures', {}, { timeout: 10_000 });
    expect(screen.queryByTestId('review-comments-panel')).toBeNull();
    expect(screen.queryByTestId('returned-marker')).toBeNull();
    expect(world.unknown).toEqual([]);
  });
});
