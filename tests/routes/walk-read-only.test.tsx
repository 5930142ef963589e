/**
 * Who may change what the walk shows: an issued revision never changes (its steps are read-only,
 * with the reason and a way to start a new draft), and a member who is not a designer reads a
 * draft without changing it. In both cases no save is offered and none is sent.
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { UNIT_LABELS } from '../../src/engine';
import { walkPaths } from '../../src/features/walk/paths';
import { demoDocument, fakeApi } from './support/fake-api';
import { expectedMarginText, field, renderWalk, shownMargin, stepHref } from './support/render-walk';

const demo = demoDocument();
const u = UNIT_LABELS[demo.unitSystem];
const service = demo.segments[0];
const serviceName = service.label || service.id;

/** Every input, select and textarea of the step's form: all of them are disabled by its fieldset. */
function controlsOf(formName: string) {
  // a querySelector, not getByRole: role queries take seconds on a step of the demo's size in jsdom
  const forms = [...document.querySelectorAll('form')].filter((f) => f.getAttribute('aria-label') === formName);
  expect(forms).toHaveLength(1);
  const controls = [...forms[0].querySelectorAll<HTMLElement>('input, select, textarea')];
  expect(controls.length).toBeGreaterThan(0);
  return controls;
}

describe('an issued revision', () => {
  it.each([
    ['supply', 'Supply', `Static pressure, low (${u.pressure})`, String(demo.source.staticPressureLow)],
    ['fittings', 'Fittings', `${serviceName}: fitting 1 count`, String(service.fittings[0].count)],
    ['risers', 'Risers', `${serviceName} length (${u.length})`, String(service.length)],
    // the demo's risers step is the heaviest page in jsdom (every segment card with its flags and buttons): ~55 s alone on the shared machine
  ] as const)(
    'when its %s step is opened, then the read-only note shows, every input is disabled and no save is offered',
    { timeout: 150_000 },
    async (step, formName, label, value) => {
      const world = fakeApi({ status: 'issued' });
      const { user } = await renderWalk(world, stepHref(world, step));
      await screen.findByTestId(`step-${step}`, {}, { timeout: 10_000 });
      expect(screen.getByTestId('read-only-note').textContent).toContain('Revision 3 is issued: it never changes.');
      expect(screen.getByRole('button', { name: 'Start a new draft from this revision' })).toBeTruthy();
      expect(screen.queryByTestId('save-state')).toBeNull();
      for (const control of controlsOf(formName)) expect(control.matches(':disabled')).toBe(true);
      // the issued values are shown, and typing does not change them
      expect(field(label).value).toBe(value);
      await user.type(field(label), '9');
      expect(field(label).value).toBe(value);
      expect(shownMargin()).toBe(expectedMarginText(demo));
      expect(world.saves()).toHaveLength(0);
    },
  );

  it('when its segment table is opened, then the table’s inputs are disabled too', async () => {
    const world = fakeApi({ status: 'issued' });
    await renderWalk(world, walkPaths.table.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    await screen.findByTestId('segment-table', {}, { timeout: 10_000 });
    expect(screen.getByTestId('read-only-note')).toBeTruthy();
    for (const control of controlsOf('Segment table')) expect(control.matches(':disabled')).toBe(true);
  });
});

describe('a draft read by a member who is not a designer', () => {
  it('when a contractor opens a step of a draft, then it is read-only, says who changes it, and offers no new draft', async () => {
    const world = fakeApi({ myRole: 'contractor' });
    await renderWalk(world, stepHref(world, 'supply'));
    await screen.findByTestId('step-supply', {}, { timeout: 10_000 });
    expect(screen.getByTestId('read-only-note').textContent).toContain('You can read this draft. The project’s designers change it.');
    expect(screen.queryByRole('button', { name: 'Start a new draft from this revision' })).toBeNull();
    expect(screen.queryByTestId('save-state')).toBeNull();
    for (const control of controlsOf('Supply')) expect(control.matches(':disabled')).toBe(true);
  });

  it('when a designer opens the same draft, then the inputs are enabled and the save state shows (the contrast the checks above rely on)', async () => {
    const world = fakeApi();
    await renderWalk(world, stepHref(world, 'supply'));
    await screen.findByTestId('step-supply', {}, { timeout: 10_000 });
    expect(screen.queryByTestId('read-only-note')).toBeNull();
    expect(screen.getByTestId('save-state').getAttribute('data-state')).toBe('saved');
    expect(field(`Static pressure, low (${u.pressure})`).matches(':disabled')).toBe(false);
  });
});
