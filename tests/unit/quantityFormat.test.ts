import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { UNIT_LABELS } from '../../src/engine';
import { axisTickLabel, decimalsOf, MINUS, num, signed, stepOf, withUnit } from '../../src/shared/format/quantity';
import { expectClose } from '../helpers/expectClose';

// The one number format of the screens and the paper (src/shared/format/quantity.ts). The values
// below are invented inputs, not engineering data; the decimals per unit are Headroom's own choice
// (common practice: what a gauge, tape or meter reads), stated in the module.

/** A printed number read back ("−3.20" → −3.2). */
const back = (text: string) => Number(text.replace(MINUS, '-'));

describe('the number format, by unit', () => {
  it('when every unit the engine reports is formatted, then each has its decimals (none falls through to a guess)', () => {
    for (const system of ['US', 'SI'] as const) for (const unit of Object.values(UNIT_LABELS[system])) expect(() => decimalsOf(unit)).not.toThrow();
    // the units the hot-water results and the screens add: heat, volume, time, fixture units
    for (const unit of ['Btu/h', 'W', 'gal', 'L', 'ms', 'WSFU', 'K']) expect(() => decimalsOf(unit)).not.toThrow();
  });

  it('when a unit has no row, then formatting names it instead of guessing decimals', () => {
    expect(() => num(1, 'furlong')).toThrow(/"furlong"/);
    expect(() => num(1, 'psi', 'roughness')).toThrow(/roughness in "psi"/);
  });

  it('when pressures are printed, then psi has two decimals and kPa one (about the same step: 0.01 psi ≈ 0.07 kPa)', () => {
    expect(num(48.126, 'psi')).toBe('48.13');
    expect(num(331.84, 'kPa')).toBe('331.8');
    expect(withUnit(60, 'psi')).toBe('60.00 psi');
    expectClose(stepOf('psi'), 0.01, { rtol: 1e-12 }, 'psi step'); // floating-point power of ten only
    expectClose(stepOf('kPa'), 0.1, { rtol: 1e-12 }, 'kPa step');
  });

  it('when other quantities are printed, then each unit keeps its own decimals', () => {
    expect(num(12.34, 'ft')).toBe('12.3');
    expect(num(3.456, 'm')).toBe('3.46');
    expect(num(1.0252, 'in')).toBe('1.025');
    expect(num(42.1, 'gpm')).toBe('42.1');
    expect(num(2.654, 'L/s')).toBe('2.65');
    expect(num(7.997, 'ft/s')).toBe('8.00');
    expect(num(140.4, '°F')).toBe('140');
    expect(num(2.25, 'WSFU')).toBe('2.25');
    expect(num(0.76, 'gpm', 'loop flow')).toBe('0.76');
    expect(num(0.000059, 'in', 'roughness')).toBe('0.000059');
  });

  it('when a value is large, then no grouping comma is printed (a comma reads as the decimal sign to many SI users)', () => {
    expect(num(12345.6, 'kPa')).toBe('12345.6');
    expect(withUnit(2000, 'Btu/h')).toBe('2000 Btu/h');
  });

  it('when a value is missing or not finite, then a dash is printed, never NaN', () => {
    expect(num(null, 'psi')).toBe('—');
    expect(num(undefined, 'psi')).toBe('—');
    expect(num(Number.NaN, 'psi')).toBe('—');
    expect(signed(Number.POSITIVE_INFINITY, 'psi')).toBe('—');
    expect(withUnit(null, 'psi')).toBe('— psi');
  });
});

describe('signs', () => {
  it('when a value is negative, then it carries the true minus sign U+2212, never a hyphen', () => {
    expect(num(-3.2, 'psi')).toBe('\u22123.20');
    expect(signed(-0.45, 'psi')).toBe('\u22120.45');
    expect(num(-3.2, 'psi')).not.toContain('-');
  });

  it('when a margin or a change is printed, then its sign is always written and zero has none', () => {
    expect(signed(1.234, 'psi')).toBe('+1.23');
    expect(signed(-1.236, 'psi')).toBe('\u22121.24');
    expect(signed(0, 'psi')).toBe('0.00');
    expect(signed(-0, 'psi')).toBe('0.00');
  });

  it('when a plain value rounds to zero, then it reads 0.00 without a sign', () => {
    expect(num(-0.004, 'psi')).toBe('0.00');
    expect(num(-0.04, 'kPa')).toBe('0.0');
  });

  it('when a margin is not zero but rounds to zero, then it keeps its sign and shows its first significant digit', () => {
    // a failing margin must never read "0.00" beside FAIL, nor a passing one read as negative
    expect(signed(-0.004, 'psi')).toBe('\u22120.004');
    expect(signed(0.004, 'psi')).toBe('+0.004');
    expect(signed(-0.04, 'kPa')).toBe('\u22120.04');
    expect(signed(-1e-15, 'psi')).toBe('\u22120.000000000000001');
  });

  it('when any margin is printed, then its sign is the value’s and it reads back within half a step (or to one significant digit)', () => {
    fc.assert(
      fc.property(fc.double({ min: -500, max: 500, noNaN: true }), fc.constantFrom('psi', 'kPa', 'ft', 'gpm'), (m, unit) => {
        const text = signed(m, unit);
        if (m === 0) return text === num(0, unit);
        if (m < 0 !== text.startsWith(MINUS) || m > 0 !== text.startsWith('+')) return false;
        const read = back(text);
        // half the unit's last digit, or, below that, one significant digit (at most half the value's own magnitude off)
        return Math.abs(read - m) <= Math.max(stepOf(unit) / 2, Math.abs(m) / 2) * (1 + 1e-9);
      }),
    );
  });
});

describe('axis labels', () => {
  it('when ticks are labelled, then the step chooses the decimals and negatives carry the minus sign', () => {
    expect(axisTickLabel(40, 20)).toBe('40');
    expect(axisTickLabel(0.4, 0.2)).toBe('0.4');
    expect(axisTickLabel(-100, 100)).toBe('\u2212100');
    expect(axisTickLabel(-0.0000001, 0.1)).toBe('0.0');
  });
});
