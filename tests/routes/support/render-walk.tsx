/**
 * Renders the walk's real routes (src/features/walk/routes.tsx) at an address, in a memory
 * router, with the app's own QueryClient set-up and the module-level API client, whose `fetch`
 * is the fake API's.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { vi } from 'vitest';
import { ledgerFor, analyzeSystem } from '../../../src/engine';
import type { SystemDocument } from '../../../src/engine';
import { walkPaths } from '../../../src/features/walk/paths';
import { walkRoutes } from '../../../src/features/walk/routes';
import type { WalkStepId } from '../../../src/features/walk/steps';
import { signed } from '../../../src/shared/format/quantity';
import { api } from '../../../src/lib/api-client';
import { createQueryClient } from '../../../src/lib/query-client';
import type { FakeApi } from './fake-api';

export async function renderWalk(world: FakeApi, href: string) {
  vi.stubGlobal('fetch', world.fetch);
  // the token is cached by the one API client; each test's fake server hands out its own
  api.resetCsrfToken();
  const queryClient = createQueryClient(() => {});
  // The app places the walk's routes among the signed-in routes (src/app/router.tsx); here they sit
  // under a bare layout route whose only job is a fallback while the lazy pages load.
  const router = createMemoryRouter([{ hydrateFallbackElement: <p>Loading the page…</p>, children: walkRoutes(queryClient) }], { initialEntries: [href] });
  const user = userEvent.setup();
  const view = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  // the frame is open once its step navigation is there (project, system, revision and catalog loaded)
  await screen.findByRole('navigation', { name: 'Steps of the walk' }, { timeout: 20_000 });
  return { ...view, router, queryClient, user };
}

export const stepHref = (world: FakeApi, step: WalkStepId | string) =>
  walkPaths.step.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId, step as WalkStepId);

/** The margin to the critical fixture as the live ledger shows it, computed here by the engine itself. */
export function expectedMarginText(document: SystemDocument): string {
  const analysis = analyzeSystem(document);
  if (!analysis.criticalFixtureId) throw new Error('the demo has no critical fixture');
  const ledger = ledgerFor(analysis, analysis.criticalFixtureId);
  // the panel writes signed(margin, unit) and the unit (src/features/walk/components/ledger-panel.tsx)
  return `${signed(ledger.margin, ledger.pressureUnit)} ${ledger.pressureUnit}`;
}

/** The margin the live ledger panel shows now. */
export const shownMargin = () => screen.getByTestId('live-margin').textContent?.replace(/\s+/g, ' ').trim();

/**
 * The one form control with this accessible name: an `aria-label` (the walk's table cells) or a
 * `<label for>` (its form fields). Testing Library's getByLabelText gives the same answer but
 * takes tens of seconds on a step of the demo's size (thousands of elements in jsdom).
 */
export function field(name: string, container: ParentNode = document): HTMLInputElement {
  const byAria = [...container.querySelectorAll<HTMLElement>('[aria-label]')].filter((el) => el.getAttribute('aria-label') === name);
  const byLabel = [...container.querySelectorAll('label')]
    .filter((l) => l.htmlFor && l.textContent?.trim() === name)
    .map((l) => document.getElementById(l.htmlFor));
  const found = [...byAria, ...byLabel].filter(
    (el): el is HTMLElement => el instanceof HTMLInputElement || el instanceof HTMLSelectElement || el instanceof HTMLTextAreaElement,
  );
  if (found.length !== 1) throw new Error(`expected one form control named “${name}”, found ${found.length}`);
  return found[0] as HTMLInputElement;
}
