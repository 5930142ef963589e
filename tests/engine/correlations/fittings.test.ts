import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import {
  CRANE_FT_2009,
  ENTRANCE_SHARP_K,
  EXIT_K,
  FITTING_TYPES,
  changeKBasis,
  craneFt,
  craneFtLookup,
  craneK,
  darby3K,
  fittingK,
  hooper2K,
  suddenContractionK,
  suddenExpansionK,
} from '../../../src/engine/fittings';

// Explicit formulas against values printed to 16 digits: floating-point rounding only.
const EXPLICIT = { rtol: 1e-12 };

describe('craneFt — Crane TP-410 (2009) f_T by nominal size (REFERENCES §6a)', () => {
  it('reads the table rows exactly', () => {
    const published: [number, number][] = [
      [0.5, 0.026],
      [0.75, 0.024],
      [1, 0.022],
      [1.25, 0.021],
      [1.5, 0.02],
      [2, 0.019],
      [2.5, 0.018],
      [3, 0.017],
      [4, 0.016],
      [5, 0.015],
      [6, 0.015],
      [8, 0.014],
      [10, 0.013],
    ];
    expect(CRANE_FT_2009).toHaveLength(published.length);
    for (const [size, fT] of published) {
      expectClose(craneFt(size), fT, EXPLICIT, `${size} in`);
      expect(craneFtLookup(size).extrapolated).toBe(false);
    }
  });
  it('interpolates linearly between sizes (documented treatment)', () => {
    expectClose(craneFt(1.75), 0.0195, EXPLICIT);
  });
  it('holds the end values outside 1/2–10 in and flags it', () => {
    expect(craneFtLookup(0.375)).toEqual({ fT: 0.026, extrapolated: true });
    expect(craneFtLookup(12)).toEqual({ fT: 0.013, extrapolated: true });
  });
  it('rejects a non-positive size', () => {
    expect(() => craneFt(0)).toThrow(RangeError);
    expect(() => craneFt(-1)).toThrow(RangeError);
  });
});

describe('Crane multiples N (K = N·f_T), checked with the fluids 1.3.1 Crane tests', () => {
  // fluids tests give K for a stated f_d; our N × that f_d must match (values printed to 2–3 digits, exact products).
  it('gate valve: K_gate_valve_Crane(.1, .1, 0, fd=.015) = 0.12', () => {
    expectClose((FITTING_TYPES['valve-gate'].craneN as number) * 0.015, 0.12, EXPLICIT);
  });
  it('globe valve: K_globe_valve_Crane(.01, .01, fd=.015) = 0.015 × 340', () => {
    expectClose((FITTING_TYPES['valve-globe'].craneN as number) * 0.015, 5.1, EXPLICIT);
  });
  it('swing check, angled seat: K(D=.1, fd=.016) = 1.6', () => {
    expectClose((FITTING_TYPES['valve-check-swing'].craneN as number) * 0.016, 1.6, EXPLICIT);
  });
  it('lift check, straight: K_lift_check_valve_Crane(.01, .01, fd=.016, angled=False) = 9.6', () => {
    expectClose((FITTING_TYPES['valve-check-lift'].craneN as number) * 0.016, 9.6, EXPLICIT);
  });
  it('standard elbow: bend_rounded(..., "Crane standard")/ft = 30.0', () => {
    expect(FITTING_TYPES['elbow-90-standard'].craneN).toBe(30);
  });
  it('craneK = N·f_T at the nominal size: 2 in standard elbow 30 × 0.019 = 0.57', () => {
    expectClose(craneK(30, 2), 0.57, EXPLICIT);
  });
});

describe('hooper2K — Hooper (1981), fluids 1.3.1 tests', () => {
  it('globe valve, standard (1500, 4.0) at Di = 2 in, Re = 1e4 → 6.15', () => {
    const { K1, Kinf } = FITTING_TYPES['valve-globe'].hooper as { K1: number; Kinf: number };
    expectClose(hooper2K(K1, Kinf, 1e4, 2), 6.15, EXPLICIT);
  });
  it('K1 = 900, K∞ = 4 at Di = 2 in, Re = 1e4 → 6.09', () => {
    expectClose(hooper2K(900, 4, 1e4, 2), 6.09, EXPLICIT);
  });
  it('rejects Re ≤ 0 and negative constants', () => {
    expect(() => hooper2K(800, 0.4, 0, 2)).toThrow(RangeError);
    expect(() => hooper2K(-1, 0.4, 1e4, 2)).toThrow(RangeError);
  });
});

describe('darby3K — Darby (1999/2001), fluids 1.3.1 tests', () => {
  it('angle valve 45° (950, 0.25, 4.0) at NPS 2, Re = 1e4 → 1.1572523963562353', () => {
    expectClose(darby3K(950, 0.25, 4.0, 1e4, 2), 1.1572523963562353, EXPLICIT);
  });
  it('same valve at NPS 12 → 0.819510280626355', () => {
    expectClose(darby3K(950, 0.25, 4.0, 1e4, 12), 0.819510280626355, EXPLICIT);
  });
  it('rejects a non-positive nominal size', () => {
    expect(() => darby3K(950, 0.25, 4, 1e4, 0)).toThrow(RangeError);
  });
});

describe('expansions, contractions, entrance, exit (REFERENCES §6d)', () => {
  it('sudden expansion 0.5 → 1: diffuser_sharp(.5, 1) = 0.5625 (fluids)', () => {
    expectClose(suddenExpansionK(0.5, 1), 0.5625, EXPLICIT);
  });
  it('sudden contraction 3 → 2 (Crane): contraction_sharp(3, 2, "Crane") = 0.277778 (fluids)', () => {
    // printed to 6 significant digits
    expectClose(suddenContractionK(3, 2), 0.277778, { rtol: 2e-6 });
  });
  it('the same contraction referred to the 3 in pipe: 1.40625 (Crane Example 7-19, via fluids)', () => {
    expectClose(changeKBasis(suddenContractionK(3, 2), 2, 3), 1.40625, EXPLICIT);
  });
  it('change_K_basis(32.68875692997804, .01, .02) = 523.0201108796487 (fluids)', () => {
    expectClose(changeKBasis(32.68875692997804, 0.01, 0.02), 523.0201108796487, EXPLICIT);
  });
  it('entrance 0.5 and exit 1.0 (Crane TP-410; common practice)', () => {
    expect(ENTRANCE_SHARP_K).toBe(0.5);
    expect(EXIT_K).toBe(1.0);
  });
  it('equal diameters lose nothing; reversed diameters are rejected', () => {
    expect(suddenExpansionK(0.05, 0.05)).toBe(0);
    expect(suddenContractionK(0.05, 0.05)).toBe(0);
    expect(() => suddenExpansionK(0.1, 0.05)).toThrow(RangeError);
    expect(() => suddenContractionK(0.05, 0.1)).toThrow(RangeError);
    expect(() => suddenExpansionK(-0.05, 0.1)).toThrow(RangeError);
  });
});

describe('fittingK', () => {
  const base = { innerDiameterM: 2.067 * 0.0254, nominalSizeIn: 2, nominalSizeKey: '2', Re: 1e5, frictionFactor: 0.02 };

  it('crane: 2 in standard elbow → 30 × 0.019', () => {
    const r = fittingK('elbow-90-standard', { ...base, method: 'crane' });
    expectClose(r.K, 0.57, EXPLICIT);
    expect(r).toMatchObject({ method: 'crane' });
    expect(r.fellBackFrom).toBeUndefined();
    expect(r.source).toMatch(/Crane/);
  });
  it('hooper-2k uses the actual inside diameter in inches', () => {
    const r = fittingK('valve-globe', { ...base, method: 'hooper-2k' });
    expectClose(r.K, hooper2K(1500, 4, 1e5, 2.067), EXPLICIT);
  });
  it('darby-3k uses the nominal size', () => {
    const r = fittingK('valve-globe', { ...base, method: 'darby-3k' });
    expectClose(r.K, darby3K(1500, 1.7, 3.6, 1e5, 2), EXPLICIT);
  });
  it('equivalent-length: 3/4 in standard elbow 2.5 ft (IPC Table E103.3(5), from memory) → K = f·Le/D', () => {
    const d = 0.824 * 0.0254;
    const r = fittingK('elbow-90-standard', { ...base, method: 'equivalent-length', innerDiameterM: d, nominalSizeIn: 0.75, nominalSizeKey: '3/4' });
    expectClose(r.equivalentLengthM as number, 2.5 * 0.3048, EXPLICIT);
    expectClose(r.K, (0.02 * 2.5 * 0.3048) / d, EXPLICIT);
  });
  it('falls back to crane when a type lacks equivalent-length data, and says so', () => {
    const r = fittingK('elbow-90-long-radius', { ...base, method: 'equivalent-length' });
    expect(r.method).toBe('crane');
    expect(r.fellBackFrom).toBe('equivalent-length');
    expectClose(r.K, 20 * 0.019, EXPLICIT);
  });
  it('falls back to hooper-2k for a reduced-port ball valve under crane (no constant N published)', () => {
    const r = fittingK('valve-ball-reduced-port', { ...base, method: 'crane' });
    expect(r.method).toBe('hooper-2k');
    expect(r.fellBackFrom).toBe('crane');
  });
  it('a coupling under crane falls back to its fixed K 0.04 (Perry, after Lapple)', () => {
    const r = fittingK('coupling', { ...base, method: 'crane' });
    expect(r).toMatchObject({ K: 0.04, fixedK: true, fellBackFrom: 'crane' });
  });
  it('entrance and exit give their constant K under every method, without a fallback', () => {
    for (const method of ['crane', 'hooper-2k', 'darby-3k', 'equivalent-length'] as const) {
      const e = fittingK('entrance-sharp', { ...base, method });
      expect(e.K).toBe(0.5);
      expect(e.fellBackFrom).toBeUndefined();
      expect(fittingK('exit', { ...base, method }).K).toBe(1.0);
    }
  });
  it('stays finite at zero flow (Re = 0 drops the K1/Re term)', () => {
    const r = fittingK('valve-globe', { ...base, method: 'hooper-2k', Re: 0 });
    expectClose(r.K, 4 * (1 + 1 / 2.067), EXPLICIT);
  });
  it('flags a Crane f_T read outside the table', () => {
    const r = fittingK('elbow-90-standard', { ...base, method: 'crane', nominalSizeIn: 0.375, nominalSizeKey: '3/8', innerDiameterM: 0.0109 });
    expect(r.extrapolated).toBe(true);
  });
  it('rejects unknown types and bad geometry', () => {
    expect(() => fittingK('press-connect-elbow', { ...base, method: 'crane' })).toThrow(RangeError);
    expect(() => fittingK('elbow-90-standard', { ...base, method: 'crane', innerDiameterM: -1 })).toThrow(RangeError);
  });
});
