import { describe, expect, it } from 'vitest';
import { axisTicks, niceStep } from '../../server/pdf/chart';

// The pressure profile's axes tick at round values: whole multiples of 1, 2 or 5 × 10^n (common
// practice for chart axes). Exact comparisons: the ticks are k × step, never a running sum.
describe('the profile chart ticks at round values', () => {
  it('when spans of several sizes are ticked, then each step is 1, 2 or 5 times a power of ten', () => {
    for (const [span, target] of [
      [0.37, 5],
      [3.3, 5],
      [68, 5],
      [142.7, 6],
      [1234, 6],
      [9.99, 4],
    ] as const) {
      const step = niceStep(span, target);
      const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-12);
      expect(
        [1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9),
        `step ${step} for span ${span}`,
      ).toBe(true);
      // about `target` intervals: never more than 2.5 times as many (the 1 → 2 → 5 gaps)
      expect(span / step).toBeLessThanOrEqual(target);
      expect(span / step).toBeGreaterThan(target / 5);
    }
  });

  it('when a pressure range 0–68 psi is ticked, then the ticks are 0, 20, 40, 60, 80 and cover it', () => {
    const { step, ticks } = axisTicks(0, 68, 5);
    expect(step).toBe(20);
    expect(ticks.map((t) => t.label)).toEqual(['0', '20', '40', '60', '80']);
  });

  it('when a range needs decimals, then no tick carries a floating-point tail', () => {
    const { step, ticks } = axisTicks(0, 0.7, 5);
    expect(step).toBe(0.2);
    expect(ticks.map((t) => t.label)).toEqual(['0.0', '0.2', '0.4', '0.6', '0.8']);
    const negative = axisTicks(-12, 380, 5);
    expect(negative.step).toBe(100);
    expect(negative.ticks.map((t) => t.label)).toEqual(['\u2212100', '0', '100', '200', '300', '400']);
  });
});
