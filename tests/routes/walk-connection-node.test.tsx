/**
 * The connection node in the walk's pipe step: no segment ends at it, so no row of the tree editor
 * opens it; its own section takes its name and its fixtures (a hose bibb at the connection, for
 * one). Before the tree editor the node's card did this; the test keeps it reachable. The live margin
 * shown is the engine's own on the same edited document, never a number written here.
 */
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SystemDocument } from '../../src/engine';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { demoDocument, fakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const demo = demoDocument();
const CATCH_UP = { timeout: 15_000 };
const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 10_000 };
const sourceId = demo.source.nodeId;
const sourceLabel = demo.nodes.find((n) => n.id === sourceId)?.label || sourceId;

/** The demo with a group of `count` of the fixture type at the connection node. */
const withConnectionFixtures = (doc: SystemDocument, fixtureTypeId: string, count: number): SystemDocument => ({
  ...doc,
  nodes: doc.nodes.map((n) => (n.id === sourceId ? { ...n, fixtureGroups: [...n.fixtureGroups, { fixtureTypeId, count }] } : n)),
});

describe('the connection node in the pipe step', () => {
  it(
    'when fixtures are added at the connection, then they and its name reach the draft, and the live margin is the engine’s on the edited document',
    { timeout: 120_000 },
    async () => {
      const world = fakeApi();
      const { user } = await renderWalk(world, stepHref(world, 'risers'));
      await screen.findByTestId('step-risers', {}, CATCH_UP);
      const section = screen.getByTestId('connection-node');
      expect(section.textContent).toContain(sourceLabel);
      expect(section.textContent).toContain('no fixtures');
      await user.click(within(section).getByText(/At the connection/));
      await user.click(within(section).getByRole('button', { name: `Add fixtures at ${sourceLabel}` }));
      await user.selectOptions(field(`${sourceLabel}: fixture group 1 type`), 'hose-bibb');
      const count = field(`${sourceLabel}: fixture group 1 count`);
      await user.clear(count);
      await user.type(count, '3');

      await waitFor(() => expect(shownMargin()).toBe(expectedMarginText(withConnectionFixtures(demo, 'hose-bibb', 3))), CATCH_UP);
      await waitFor(() => {
        const saved = (world.saves().at(-1)?.body as { document: SystemDocument } | undefined)?.document;
        expect(saved?.nodes.find((n) => n.id === sourceId)?.fixtureGroups).toEqual([{ fixtureTypeId: 'hose-bibb', count: 3 }]);
      }, SAVE_WAIT);
      expect(section.textContent).toContain('1 fixture group');
      // its name is edited here too
      const name = field(`Name of node ${sourceId}`);
      await user.clear(name);
      await user.type(name, 'Main at the curb');
      await waitFor(() => {
        const saved = (world.saves().at(-1)?.body as { document: SystemDocument } | undefined)?.document;
        expect(saved?.nodes.find((n) => n.id === sourceId)?.label).toBe('Main at the curb');
      }, SAVE_WAIT);
      expect(section.textContent).toContain('At the connection (Main at the curb)');
      expect(world.unknown).toEqual([]);
    },
  );
});
