import { describe, expect, it } from 'vitest';
import { checkRange, LIMITS, rangeText, siBase, formatBound, type LimitQuantity } from '../../../src/engine';
import { toSI } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';

describe('plausible input ranges (model/limits.ts)', () => {
  it('states the range in the document units', () => {
    expect(rangeText('length', 'US')).toBe('length 0–5,000 ft');
    expect(rangeText('staticPressure', 'US')).toBe('static pressure 0–300 psi');
    expect(rangeText('waterTemperature', 'US')).toBe('water temperature 33–200 °F');
    expect(rangeText('elevation', 'SI')).toBe('elevation −300 to 300 m');
    expect(rangeText('fixtureCount', 'US')).toBe('fixture count 1–10,000');
    expect(rangeText('pressureFalloff', 'SI')).toBe('PRV fall-off 0–1,000 kPa per L/s');
  });

  it('accepts values inside and at the bounds, refuses outside, non-finite and fractional counts', () => {
    expect(checkRange('length', 5000, 'US')).toBeNull();
    expect(checkRange('length', 5000.01, 'US')).toBe('Out of range: length 0–5,000 ft (more than 0)');
    expect(checkRange('length', 0, 'US')).toMatch(/more than 0/);
    expect(checkRange('length', 1e9, 'US')).toMatch(/^Out of range/);
    expect(checkRange('staticPressure', 99999, 'US')).toBe('Out of range: static pressure 0–300 psi');
    expect(checkRange('staticPressure', -20, 'US')).toBe('Out of range: static pressure 0–300 psi');
    expect(checkRange('waterTemperature', 250, 'US')).toBe('Out of range: water temperature 33–200 °F');
    expect(checkRange('waterTemperature', 140, 'US')).toBeNull();
    expect(checkRange('elevation', -1000, 'US')).toBeNull();
    expect(checkRange('elevation', -1000.5, 'US')).not.toBeNull();
    expect(checkRange('fixtureCount', 2.5, 'US')).toBe('Enter a whole number: fixture count 1–10,000');
    expect(checkRange('length', Number.NaN, 'SI')).toBe('Enter a number: length 0–1,500 m');
    expect(checkRange('length', Number.POSITIVE_INFINITY, 'SI')).toMatch(/^Enter a number/);
  });

  it('keeps the US and SI bounds of each quantity within 12 % of each other (round numbers of both systems)', () => {
    // Tolerance: the SI bounds are round numbers near the US ones, not exact conversions;
    // 12 % allows 1,500 m for 5,000 ft (1,524 m) and 2,000 kPa for 300 psi (2,068 kPa).
    for (const [q, lim] of Object.entries(LIMITS) as [LimitQuantity, (typeof LIMITS)[LimitQuantity]][]) {
      expect(lim.why.length, q).toBeGreaterThan(20);
      if (lim.unitQuantity && q !== 'waterTemperature') {
        const usMaxSi = toSI(lim.unitQuantity, lim.US.max, 'US');
        expectClose(siBase(q).max, usMaxSi, { rtol: 0.12 }, `${q} max`);
      }
    }
    // Temperature: 33–200 °F is 0.56–93.3 °C; the SI bounds 0.5–93 °C sit within 0.3 K.
    expectClose(siBase('waterTemperature').max, toSI('temperature', 200, 'US'), { rtol: 0.005 });
    // Fall-off: 1,000 kPa per L/s = 1e6 Pa / 1e-3 m³/s = 1e9 Pa per m³/s (10 psi/gpm is 1.09e9).
    expectClose(siBase('pressureFalloff').max, 1e9, { rtol: 1e-12 });
  });

  it('formats bounds with grouped thousands and a true minus sign', () => {
    expect(formatBound(20000)).toBe('20,000');
    expect(formatBound(-1000)).toBe('−1,000');
    expect(formatBound(0.5)).toBe('0.5');
    expect(formatBound(86400)).toBe('86,400');
  });
});
