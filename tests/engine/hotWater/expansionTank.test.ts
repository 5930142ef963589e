import { describe, expect, it } from 'vitest';
import { thermalExpansionTank } from '../../../src/engine/hotWater/expansionTank';
import { closedSystemCheck } from '../../../src/engine/hotWater/closedSystem';
import { HotWaterInputError } from '../../../src/engine/hotWater/errors';
import { expectClose } from '../../helpers/expectClose';
import type { SystemDocument } from '../../../src/engine';

// Constants, each with its source:
const PA_PER_PSI = 6894.757; // 1 psi = 6894.757 Pa (NIST SP 811 (2008) App. B, to 7 figures)
const ATM_PSI = 101_325 / PA_PER_PSI; // standard atmosphere 101 325 Pa (ISO 2533) = 14.696 psi
const M3_PER_GAL = 3.785411784e-3; // 1 US gallon = 231 in³ = 3.785411784 L exactly (NIST SP 811 B.8)
const f2c = (f: number) => (f - 32) / 1.8; // NIST SP 811 §B.9

describe('thermal expansion tank, diaphragm form V = V_w·(ρc/ρh − 1)/(1 − p0/p1)', () => {
  it('50 gal heater, 50 → 140 °F, precharge 60 psig, sized for 135 psig: 1.68 gal', () => {
    // Check example computed with the diaphragm-tank form and IAPWS-95 densities (a computed check,
    // not a published worked example; none was found). Printed to 3 figures → 0.5 % tolerance.
    const r = thermalExpansionTank({ heaterVolumeM3: 50 * M3_PER_GAL, coldC: f2c(50), hotC: f2c(140), supplyPa: 60 * PA_PER_PSI, reliefPa: 135 * PA_PER_PSI });
    expectClose(r.expansionVolumeM3 / M3_PER_GAL, 0.839, { rtol: 0.005 }, 'expansion, gal');
    expectClose(r.tankVolumeM3 / M3_PER_GAL, 1.68, { rtol: 0.005 }, 'tank, gal');
    const r125 = thermalExpansionTank({
      heaterVolumeM3: 50 * M3_PER_GAL,
      coldC: f2c(50),
      hotC: f2c(140),
      supplyPa: 60 * PA_PER_PSI,
      reliefPa: 125 * PA_PER_PSI,
    });
    expectClose(r125.tankVolumeM3 / M3_PER_GAL, 1.8, { rtol: 0.005 }, 'tank sized for 125 psig, gal');
  });

  it('matches a hand calculation with tabulated IAPWS-95 densities at 10 °C and 60 °C', () => {
    // IAPWS-95 at 1 atm: 999.702 kg/m³ at 10 °C, 983.196 kg/m³ at 60 °C (6 figures, so 1e-5 relative).
    const netExpansion = 999.702 / 983.196 - 1;
    const acceptance = 1 - (50 + ATM_PSI) / (150 + ATM_PSI);
    const expected = (0.3 * netExpansion) / acceptance; // 300 L heater, 50 psig supply, 150 psig relief
    const r = thermalExpansionTank({ heaterVolumeM3: 0.3, coldC: 10, hotC: 60, supplyPa: 50 * PA_PER_PSI, reliefPa: 150 * PA_PER_PSI });
    expectClose(r.netExpansion, netExpansion, { rtol: 1e-4 }, 'net expansion');
    expectClose(r.acceptanceFactor, acceptance, { rtol: 1e-12 }, 'acceptance factor');
    expectClose(r.tankVolumeM3, expected, { rtol: 1e-4 }, 'tank volume, m³');
  });

  it('a higher supply pressure needs a bigger tank (less of it can take water)', () => {
    const at = (psi: number) =>
      thermalExpansionTank({ heaterVolumeM3: 0.2, coldC: 10, hotC: 60, supplyPa: psi * PA_PER_PSI, reliefPa: 125 * PA_PER_PSI }).tankVolumeM3;
    expect(at(80)).toBeGreaterThan(at(40));
  });

  it.each([
    ['heater-volume-not-positive', { heaterVolumeM3: 0 }],
    ['relief-not-above-supply', { reliefPa: 60 * PA_PER_PSI }],
    ['relief-not-above-supply', { reliefPa: 40 * PA_PER_PSI }],
    ['hot-not-above-cold', { hotC: 10 }],
    ['temperature-out-of-range', { hotC: 120 }],
  ] as const)('bad input → named error %s', (code, change) => {
    const base = { heaterVolumeM3: 0.2, coldC: 10, hotC: 60, supplyPa: 60 * PA_PER_PSI, reliefPa: 125 * PA_PER_PSI };
    let caught: unknown;
    try {
      thermalExpansionTank({ ...base, ...change });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(HotWaterInputError);
    expect((caught as HotWaterInputError).code).toBe(code);
  });
});

describe('closed system check', () => {
  const heater = { id: 'wh', kind: 'water-heater' as const, label: 'Water heater', segmentId: 's1', loss: { kind: 'fixed' as const, loss: 1 } };
  const bfp = { id: 'bf', kind: 'backflow-preventer' as const, label: 'Dual check', segmentId: 's1', loss: { kind: 'fixed' as const, loss: 5 } };
  const seg = { id: 's1', from: 'a', to: 'b', length: 10, fittings: [], reducerAuto: true } as SystemDocument['segments'][number];

  it('when a backflow preventer closes a system with a heater and no tank, then a caution names it', () => {
    const r = closedSystemCheck({ service: 'cold', devices: [bfp, heater], segments: [seg] });
    expect(r.closed).toBe(true);
    expect(r.cautionMissingTank).toBe(true);
    expect(r.message).toContain('Dual check');
  });

  it('when an expansion tank is present, then no caution', () => {
    const tank = { id: 'et', kind: 'other' as const, label: 'Thermal expansion tank, 2 gal', segmentId: 's1', loss: { kind: 'fixed' as const, loss: 0 } };
    expect(closedSystemCheck({ service: 'cold', devices: [bfp, heater, tank], segments: [seg] }).cautionMissingTank).toBe(false);
  });

  it('when nothing closes the system, then it is open', () => {
    const r = closedSystemCheck({ service: 'hot', devices: [heater], segments: [seg] });
    expect(r.closed).toBe(false);
    expect(r.cautionMissingTank).toBe(false);
  });

  it('when a check valve fitting is on a segment of a hot system, then the system is closed', () => {
    const r = closedSystemCheck({ service: 'hot', devices: [], segments: [{ ...seg, fittings: [{ typeId: 'valve-check-swing', count: 1 }] }] });
    expect(r.closingElements.map((c) => c.kind)).toEqual(['check-valve']);
    expect(r.cautionMissingTank).toBe(true);
  });
});
