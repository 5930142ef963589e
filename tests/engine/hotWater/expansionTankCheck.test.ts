import { describe, expect, it } from 'vitest';
import { analyzeSystem, sizeDocumentExpansionTank } from '../../../src/engine';
import type { SystemDocumentInput } from '../../../src/engine/model/schema';
import { expectClose } from '../../helpers/expectClose';
import { oneSegment } from '../support/docs';

/** A hot system (US) with a PRV on its only segment: closed to thermal expansion. */
function closedHot(extra: Partial<SystemDocumentInput> = {}): SystemDocumentInput {
  const d = oneSegment({ service: 'hot', waterTemperature: 60, ...extra });
  d.devices = [
    { id: 'prv', kind: 'prv', label: 'Building PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 350, falloffPerFlow: 0 } },
  ];
  return d;
}

describe('the thermal expansion tank of a document', () => {
  it('50 gal heated from 50 °F to 140 °F, precharged at 60 psig, sized for 135 psig: 1.68 gal (REFERENCES §13j [COMP] hand check with the IAPWS-95 densities; not a published example)', () => {
    const sizing = sizeDocumentExpansionTank({
      unitSystem: 'US',
      expansionTank: { heaterVolume: 50, coldTemperature: 50, hotTemperature: 140, supplyPressure: 60, reliefPressure: 135 },
    });
    if (!sizing?.ok) throw new Error('expected a sizing');
    // rtol 3e-3: the hand check prints 3 significant figures (1.68 gal, 0.839 gal).
    expectClose(sizing.tankVolume, 1.68, { rtol: 3e-3 }, 'tank gal');
    expectClose(sizing.expansionVolume, 0.839, { rtol: 3e-3 }, 'expansion gal');
    expect(sizing.volumeUnit).toBe('gal');
  });

  it('the same tank in SI (189.27 L, 10 °C → 60 °C, 413.7 → 930.8 kPa) gives the same volume in litres', () => {
    const us = sizeDocumentExpansionTank({
      unitSystem: 'US',
      expansionTank: { heaterVolume: 50, coldTemperature: 50, hotTemperature: 140, supplyPressure: 60, reliefPressure: 135 },
    });
    const si = sizeDocumentExpansionTank({
      unitSystem: 'SI',
      expansionTank: {
        heaterVolume: 50 * 3.785411784,
        coldTemperature: 10,
        hotTemperature: 60,
        supplyPressure: 60 * 6.894757293168,
        reliefPressure: 135 * 6.894757293168,
      },
    });
    if (!us?.ok || !si?.ok) throw new Error('expected sizings');
    // The same inputs converted exactly (1 gal = 3.785411784 L, 1 psi = 6.894757293168 kPa): only rounding differs.
    expectClose(si.tankVolume, us.tankVolume * 3.785411784, { rtol: 1e-9 }, 'L');
  });

  it('when the heater volume is zero, then a named error for that field (nothing is sized)', () => {
    const sizing = sizeDocumentExpansionTank({
      unitSystem: 'US',
      expansionTank: { heaterVolume: 0, coldTemperature: 50, hotTemperature: 140, supplyPressure: 60, reliefPressure: 135 },
    });
    expect(sizing).toEqual({
      ok: false,
      error: { code: 'heater-volume-not-positive', field: 'expansionTank.heaterVolume', message: expect.stringMatching(/heater volume/) },
    });
  });

  it('when a closed hot system has no tank, then a caution names what closes it; with a tank, or open, none', () => {
    const missing = analyzeSystem(closedHot()).warnings.filter((w) => w.code === 'expansion-tank-missing');
    expect(missing).toHaveLength(1);
    expect(missing[0].severity).toBe('caution');
    expect(missing[0].detail).toContain('Building PRV');
    const withTank = closedHot({ expansionTank: { heaterVolume: 50, coldTemperature: 50, hotTemperature: 140, supplyPressure: 50, reliefPressure: 135 } });
    expect(analyzeSystem(withTank).warnings.some((w) => w.code === 'expansion-tank-missing')).toBe(false);
    const open = oneSegment({ service: 'hot', waterTemperature: 60 });
    expect(analyzeSystem(open).warnings.some((w) => w.code === 'expansion-tank-missing')).toBe(false);
  });
});
