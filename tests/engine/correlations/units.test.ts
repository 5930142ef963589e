import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import {
  G,
  M3S_PER_GPM,
  M3_PER_GAL,
  M_PER_FT,
  M_PER_IN,
  PA_PER_PSI,
  KGM3_PER_LBFT3,
  UNIT_LABELS,
  fromSI,
  toSI,
  type Quantity,
} from '../../../src/engine/units';
import { waterProperties } from '../../../src/engine/water';

// Exact definitions are compared at 1e-15 (double rounding only).
const EXACT = { rtol: 1e-15 };

describe('unit factors', () => {
  it('1 US gallon = 3.785411784 L (REFERENCES §12; NIST SP 811 (2008) App. B, exact)', () => {
    expectClose(M3_PER_GAL * 1000, 3.785411784, EXACT);
    // 1 gal = 231 in³ exactly (NIST SP 811): independent route through the inch.
    expectClose(231 * M_PER_IN ** 3, M3_PER_GAL, { rtol: 1e-14 });
    expectClose(toSI('flow', 1, 'US'), 3.785411784e-3 / 60, EXACT);
    expectClose(M3S_PER_GPM, 3.785411784e-3 / 60, EXACT);
  });
  it('1 psi = 6894.757 Pa (REFERENCES §12; NIST SP 811 (2008) App. B.8 prints 6.894757 E+03)', () => {
    // rtol 1e-7: NIST prints 7 significant digits.
    expectClose(PA_PER_PSI, 6894.757, { rtol: 1e-7 });
    expectClose(toSI('pressure', 1, 'US'), 6894.757293168361, { rtol: 1e-15 });
  });
  it('g = 9.80665 m/s² = 32.174 ft/s² (REFERENCES §12; CGPM 1901)', () => {
    expect(G).toBe(9.80665);
    // 32.174 is printed to 5 significant digits.
    expectClose(G / M_PER_FT, 32.174, { rtol: 2e-5 });
  });
  it('foot and inch are exact (International Yard and Pound Agreement, 1959)', () => {
    expectClose(toSI('length', 1, 'US'), 0.3048, EXACT);
    expectClose(toSI('diameter', 1, 'US'), 0.0254, EXACT);
    expectClose(toSI('diameter', 25.4, 'SI'), 0.0254, EXACT);
  });
  it('62.4 lb/ft³ ≈ 999.5 kg/m³ (lb = 0.45359237 kg exact, NIST SP 811)', () => {
    // 62.4 × 16.018463 = 999.552; compared at 1e-6 (the product is printed to 7 digits here).
    expectClose(62.4 * KGM3_PER_LBFT3, 999.552, { rtol: 1e-6 });
  });
  it('temperature: 32 °F = 0 °C, 212 °F = 100 °C (definition of the Fahrenheit scale)', () => {
    expectClose(toSI('temperature', 32, 'US'), 0, { rtol: 0, atol: 1e-12 });
    expectClose(toSI('temperature', 212, 'US'), 100, EXACT);
    expectClose(fromSI('temperature', 60, 'US'), 140, EXACT);
    expect(toSI('temperature', 20, 'SI')).toBe(20);
  });
  it('psi per 100 ft and kPa per 100 m convert to Pa/m', () => {
    expectClose(toSI('pressurePerLength', 1, 'US'), 6894.757293168361 / 30.48, { rtol: 1e-14 });
    expectClose(toSI('pressurePerLength', 1, 'SI'), 10, EXACT);
  });
  it('every quantity round-trips in both systems and has a label', () => {
    const quantities = Object.keys(UNIT_LABELS.US) as Quantity[];
    expect(quantities).toHaveLength(9);
    for (const system of ['US', 'SI'] as const) {
      for (const q of quantities) {
        expect(UNIT_LABELS[system][q]).toBeTruthy();
        // Round trip: only double rounding, 1e-14.
        expectClose(fromSI(q, toSI(q, 123.456, system), system), 123.456, { rtol: 1e-14 }, `${system} ${q}`);
      }
    }
  });
  it('throws a RangeError for non-finite values', () => {
    expect(() => toSI('pressure', Number.NaN, 'US')).toThrow(RangeError);
    expect(() => fromSI('flow', Infinity, 'SI')).toThrow(RangeError);
  });
});

describe('0.433 psi per foot of water (common practice; IPC E103.2.2 example: 20 ft → 8.66 psi)', () => {
  const rho60F = waterProperties(toSI('temperature', 60, 'US')).density;
  const psiPerFt = (rho60F * G * M_PER_FT) / PA_PER_PSI;
  it('ρ·g·(1 ft) at 60 °F is 0.433 psi', () => {
    // 0.433 is printed to 3 significant digits: rtol 1e-3. [COMP] REFERENCES §8c gives 0.4331.
    expectClose(psiPerFt, 0.433, { rtol: 1e-3 });
    expectClose(psiPerFt, 0.4331, { rtol: 2e-4 });
  });
  it('20 ft of rise costs 8.66 psi (IPC Appendix E, E103.2.2 example)', () => {
    // 8.66 printed to 3 significant digits.
    expectClose(psiPerFt * 20, 8.66, { rtol: 1e-3 });
  });
  it('2.31 ft of water per psi (US Army EN0389 sample problem)', () => {
    expectClose(1 / psiPerFt, 2.31, { rtol: 2e-3 });
  });
});
