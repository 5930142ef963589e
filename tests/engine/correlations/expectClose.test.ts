import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';

describe('expectClose (test helper)', () => {
  it('passes within the relative tolerance and fails outside it', () => {
    expect(() => expectClose(1.0005, 1, { rtol: 1e-3 })).not.toThrow();
    expect(() => expectClose(1.002, 1, { rtol: 1e-3 }, 'ratio')).toThrow(/ratio: expected 1.002/);
  });
  it('uses atol near zero', () => {
    expect(() => expectClose(1e-12, 0, { rtol: 1e-9, atol: 1e-10 })).not.toThrow();
    expect(() => expectClose(1e-9, 0, { rtol: 1e-9 })).toThrow();
  });
  it('rejects NaN and Infinity as actual values', () => {
    expect(() => expectClose(Number.NaN, 1, { rtol: 1 })).toThrow(/finite/);
    expect(() => expectClose(Infinity, 1, { rtol: 1 })).toThrow(/finite/);
  });
});
