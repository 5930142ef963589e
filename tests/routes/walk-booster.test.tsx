/**
 * The booster in the devices step is described by its control, as the engine's static check needs:
 * a constant-speed pump by its design and shutoff gains, a variable-speed package by the discharge
 * pressure it holds. The demo's booster is variable speed (invented demo data).
 */
import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { SystemDocument } from '../../src/engine';
import { AUTOSAVE_DELAY_MS } from '../../src/features/walk/draft/use-draft';
import { demoDocument, fakeApi } from './support/fake-api';
import { field, renderWalk, stepHref } from './support/render-walk';

const demo = demoDocument();
const index = demo.devices.findIndex((d) => d.kind === 'booster-pump') + 1;
const SAVE_WAIT = { timeout: AUTOSAVE_DELAY_MS + 8_000 };

describe('the booster in the devices step', () => {
  it('when the demo booster is switched to constant speed with design and shutoff gains, then the saved draft carries both and is not incomplete for its shutoff', async () => {
    const world = fakeApi();
    const { user } = await renderWalk(world, stepHref(world, 'devices'));
    await screen.findByTestId('step-devices', {}, { timeout: 10_000 });
    const control = screen.getByLabelText(`Device ${index} pump control`) as HTMLSelectElement;
    expect(control.value).toBe('variable-speed');
    expect(field(`Device ${index} discharge pressure held (psi)`).value).toBe('65');
    await user.selectOptions(control, 'constant-speed');
    await user.type(field(`Device ${index} pressure added at design flow (psi)`), '24');
    await user.type(field(`Device ${index} pressure added at shutoff (psi)`), '30');
    await waitFor(() => {
      const saves = world.saves();
      const last = saves[saves.length - 1]?.body as { document: SystemDocument } | undefined;
      const booster = last?.document.devices.find((d) => d.kind === 'booster-pump');
      expect(booster?.boost).toEqual({ control: 'constant-speed', designGain: 24, shutoffGain: 30 });
    }, SAVE_WAIT);
  }, 120_000);
});
