/**
 * Hydrant flow test relation of NFPA 291: the supply curve is a straight line on N^1.85 paper from
 * the static pressure at Q = 0 through the test point (residual pressure at the test flow).
 *
 * Reference: NFPA 291, *Recommended Practice for Fire Flow Testing and Marking of Hydrants*,
 * Chapter 4, Q_R = Q_F·(h_r/h_f)^0.54 (section number from memory). The inverse below is algebra
 * from the same relation.
 */
import { requireNonNegative, requirePositive } from '../guards';

export interface FlowTest {
  /** Static pressure (no flow), Pa. */
  staticPa: number;
  /** Residual pressure measured while flowing testFlowM3s, Pa. */
  residualPa: number;
  /** Flow during the test, m³/s. */
  testFlowM3s: number;
}

/** Exponent of the N^1.85 supply curve (NFPA 291; the Hazen–Williams flow exponent, rounded). */
export const FLOW_TEST_EXPONENT = 1.85;
/** Exponent of the projection Q_R = Q_F·(h_r/h_f)^0.54 as NFPA 291 prints it (≈ 1/1.85 = 0.5405). */
export const FLOW_TEST_PROJECTION_EXPONENT = 0.54;

function checkTest(fn: string, test: FlowTest): void {
  requireNonNegative(fn, 'staticPa', test.staticPa);
  requireNonNegative(fn, 'residualPa', test.residualPa);
  requirePositive(fn, 'testFlowM3s', test.testFlowM3s);
  if (!(test.residualPa < test.staticPa)) {
    throw new RangeError(`${fn}: residual pressure (${test.residualPa} Pa) must be below static pressure (${test.staticPa} Pa)`);
  }
}

/**
 * Pressure available at flow Q on the tested supply: P(Q) = P_s − (P_s − P_r)·(Q/Q_F)^1.85.
 * @param flowM3s Q, m³/s (≥ 0); beyond Q_F the curve is extrapolated (the caller may warn)
 * @returns pressure in Pa (may be below zero at large Q: the supply cannot deliver that flow)
 */
export function flowTestPressureAt(flowM3s: number, test: FlowTest): number {
  requireNonNegative('flowTestPressureAt', 'flowM3s', flowM3s);
  checkTest('flowTestPressureAt', test);
  return test.staticPa - (test.staticPa - test.residualPa) * (flowM3s / test.testFlowM3s) ** FLOW_TEST_EXPONENT;
}

/**
 * Flow available at a desired residual pressure (NFPA 291): Q_R = Q_F·(h_r/h_f)^0.54, with
 * h_r = P_s − P_desired and h_f = P_s − P_r.
 * @param residualPa desired residual pressure, Pa (0 ≤ residualPa ≤ static; NFPA 291 rates at 20 psi)
 * @returns flow in m³/s
 */
export function flowTestFlowAtResidual(residualPa: number, test: FlowTest): number {
  requireNonNegative('flowTestFlowAtResidual', 'residualPa', residualPa);
  checkTest('flowTestFlowAtResidual', test);
  if (residualPa > test.staticPa) {
    throw new RangeError(`flowTestFlowAtResidual: desired residual (${residualPa} Pa) exceeds static pressure (${test.staticPa} Pa)`);
  }
  const hr = test.staticPa - residualPa;
  const hf = test.staticPa - test.residualPa;
  return test.testFlowM3s * (hr / hf) ** FLOW_TEST_PROJECTION_EXPONENT;
}
