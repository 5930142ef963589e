import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { lossCurveAt } from '../../../src/engine/devices/lossCurve';

const PSI = 6894.757293168361;
const GPM = 3.785411784e-3 / 60;
// 5/8 in displacement meter, unattributed "AWWA standard pressure loss" sheet (REFERENCES §10):
// 1 → 0.2, 5 → 0.9, 10 → 3.7, 15 → 8.3, 20 → 15.0 psi. Used as realistic curve data.
const meter = [
  [1, 0.2],
  [5, 0.9],
  [10, 3.7],
  [15, 8.3],
  [20, 15.0],
].map(([g, p]) => ({ flowM3s: g * GPM, lossPa: p * PSI }));

describe('lossCurveAt — Fritsch–Carlson monotone cubic (SIAM J. Numer. Anal. 17(2), 1980)', () => {
  it('passes through every point (interpolation)', () => {
    for (const pt of meter) {
      const r = lossCurveAt(meter, pt.flowM3s);
      expectClose(r.lossPa, pt.lossPa, { rtol: 1e-12 });
      expect(r.extrapolated).toBe(false);
    }
  });
  it('implies (0, 0) and stays monotone between points', () => {
    expect(lossCurveAt(meter, 0).lossPa).toBe(0);
    let last = -1;
    for (let g = 0; g <= 20; g += 0.05) {
      const v = lossCurveAt(meter, g * GPM).lossPa;
      expect(v).toBeGreaterThanOrEqual(last);
      last = v;
    }
  });
  it('does not overshoot a flat stretch (the property that plain cubic splines lack)', () => {
    const pts = [
      { flowM3s: 1, lossPa: 10 },
      { flowM3s: 2, lossPa: 10 },
      { flowM3s: 3, lossPa: 30 },
    ];
    // Hermite basis sums to 1 with zero tangents: only rounding, 1e-12.
    for (let q = 1; q <= 2; q += 0.01) expectClose(lossCurveAt(pts, q).lossPa, 10, { rtol: 1e-12 });
  });
  it('reproduces a straight line exactly', () => {
    const pts = [1, 2, 3, 4].map((q) => ({ flowM3s: q, lossPa: 5 * q }));
    expectClose(lossCurveAt(pts, 2.7).lossPa, 13.5, { rtol: 1e-12 });
  });
  it('beyond the last point extrapolates with ΔP ∝ Q² and flags it', () => {
    const r = lossCurveAt(meter, 25 * GPM);
    expect(r.extrapolated).toBe(true);
    expectClose(r.lossPa, 15 * PSI * (25 / 20) ** 2, { rtol: 1e-12 });
  });
  it('keeps a given zero-flow loss (e.g. a backflow assembly) instead of implying zero', () => {
    const rp = [
      { flowM3s: 0, lossPa: 10 * PSI },
      { flowM3s: 50 * GPM, lossPa: 12 * PSI },
    ];
    expectClose(lossCurveAt(rp, 0).lossPa, 10 * PSI, { rtol: 1e-12 });
  });
  it('sorts unsorted input, and rejects duplicates, negatives and empty curves', () => {
    const shuffled = [meter[3], meter[0], meter[4], meter[1], meter[2]];
    expectClose(lossCurveAt(shuffled, 12 * GPM).lossPa, lossCurveAt(meter, 12 * GPM).lossPa, { rtol: 1e-12 });
    expect(() => lossCurveAt([meter[0], meter[0]], 1e-4)).toThrow(RangeError);
    expect(() => lossCurveAt([{ flowM3s: -1, lossPa: 1 }], 1e-4)).toThrow(RangeError);
    expect(() => lossCurveAt([], 1e-4)).toThrow(RangeError);
    expect(() => lossCurveAt(meter, Number.NaN)).toThrow(RangeError);
  });
});
