import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { flowTestFlowAtResidual, flowTestPressureAt } from '../../../src/engine/supply/flowTest';

// REFERENCES.md refers to a worked flow-test example in §11d, but that section is not in the file, so
// no published projection is reproduced here. These are consistency checks of NFPA 291's relation
// Q_R = Q_F·(h_r/h_f)^0.54 and its algebraic inverse P(Q) = P_s − (P_s − P_r)(Q/Q_F)^1.85 — marked as such.
const PSI = 6894.757293168361;
const GPM = 3.785411784e-3 / 60;
const test = { staticPa: 80 * PSI, residualPa: 60 * PSI, testFlowM3s: 1000 * GPM };

describe('NFPA 291 flow test relation [consistency checks, no published example available]', () => {
  it('passes through the static point and the test point', () => {
    expectClose(flowTestPressureAt(0, test), 80 * PSI, { rtol: 1e-15 });
    expectClose(flowTestPressureAt(1000 * GPM, test), 60 * PSI, { rtol: 1e-14 });
    expectClose(flowTestFlowAtResidual(60 * PSI, test), 1000 * GPM, { rtol: 1e-14 });
  });
  it('projection to 20 psi residual: Q = 1000·(60/20)^0.54 gpm (hand arithmetic of the NFPA 291 formula)', () => {
    expectClose(flowTestFlowAtResidual(20 * PSI, test) / GPM, 1000 * 3 ** 0.54, { rtol: 1e-13 });
  });
  it('the inverse is consistent with the projection to within the 0.54 ≈ 1/1.85 rounding', () => {
    const hf = 20 * PSI;
    for (const residualPsi of [70, 40, 20, 0]) {
      const hr = (80 - residualPsi) * PSI;
      const back = flowTestPressureAt(flowTestFlowAtResidual(residualPsi * PSI, test), test);
      // Exactly: P = P_s − h_f·(h_r/h_f)^(0.54·1.85) (algebra; double rounding only).
      expectClose(back, 80 * PSI - hf * (hr / hf) ** (0.54 * 1.85), { rtol: 1e-12, atol: 1e-6 /* Pa: cancellation when P → 0 */ }, `${residualPsi} psi exact`);
      // 0.54·1.85 = 0.999, so the round trip misses h_r by |(h_r/h_f)^-0.001 − 1| ≤ 0.14 % here (h_r/h_f ≤ 4).
      expectClose(80 * PSI - back, hr, { rtol: 1.5e-3 }, `${residualPsi} psi round trip`);
    }
  });
  it('pressure falls monotonically with flow', () => {
    let last = Infinity;
    for (let g = 0; g <= 3000; g += 250) {
      const p = flowTestPressureAt(g * GPM, test);
      expect(p).toBeLessThan(last);
      last = p;
    }
  });
  it('rejects residual ≥ static, zero test flow, negative flow, and a residual above static', () => {
    expect(() => flowTestPressureAt(1e-3, { ...test, residualPa: test.staticPa })).toThrow(RangeError);
    expect(() => flowTestPressureAt(1e-3, { ...test, testFlowM3s: 0 })).toThrow(RangeError);
    expect(() => flowTestPressureAt(-1e-3, test)).toThrow(RangeError);
    expect(() => flowTestFlowAtResidual(90 * PSI, test)).toThrow(RangeError);
  });
});
