import { describe, expect, it } from 'vitest';
import { FITTING_TYPES, fittingK, publishedAtSize, type FittingMethod } from '../../../src/engine/fittings';
import { NOT_VERIFIED } from '../../../src/engine/catalog/notVerified';

const REQUIRED = [
  'elbow-90-standard',
  'elbow-90-long-radius',
  'elbow-45-standard',
  'tee-run',
  'tee-branch',
  'valve-gate',
  'valve-ball-full-port',
  'valve-ball-reduced-port',
  'valve-globe',
  'valve-check-swing',
  'valve-check-lift',
  'valve-angle',
  'valve-butterfly',
  'coupling',
  'entrance-sharp',
  'exit',
];
const METHODS: FittingMethod[] = ['crane', 'hooper-2k', 'darby-3k', 'equivalent-length'];

describe('FITTING_TYPES registry', () => {
  it('has every type the engine needs', () => {
    for (const id of REQUIRED) expect(FITTING_TYPES[id], id).toBeDefined();
  });
  it("lists no copper press-connect fitting (no published K found); PEX press only from its maker's table, push-fit only from the NIST measurements", () => {
    for (const id of Object.keys(FITTING_TYPES)) {
      if (/push/.test(id)) expect(id).toMatch(/^push-brass-(elbow-90|coupling)$/);
      if (/press/.test(id)) expect(id).toMatch(/^pex-press-(bronze|polymer)-/);
    }
  });
  for (const [id, entry] of Object.entries(FITTING_TYPES)) {
    it(`${id}: each datum names its source`, () => {
      expect(entry.id).toBe(id);
      expect(entry.label.length).toBeGreaterThan(3);
      expect(entry.sources.length).toBeGreaterThan(0);
      const has = (prefix: string) => entry.sources.some((s) => s.startsWith(prefix) && s.length > prefix.length + 10);
      if (entry.craneN !== undefined || entry.craneNBySize) expect(has('crane:')).toBe(true);
      if (entry.hooper) expect(has('hooper-2k:')).toBe(true);
      if (entry.darby) expect(has('darby-3k:')).toBe(true);
      if (entry.equivalentLengthFt) expect(has('equivalent-length:')).toBe(true);
      if (entry.fixedK !== undefined || entry.kBySize !== undefined) expect(has('fixed K')).toBe(true);
      expect(entry.verified).toBe(entry.sources.every((line) => !line.includes(NOT_VERIFIED)));
    });
    it(`${id}: gives a finite, non-negative K by every method at every common size`, () => {
      for (const method of METHODS) {
        for (const [key, nominal, idIn] of [
          ['1/2', 0.5, 0.545],
          ['1', 1, 1.025],
          ['2', 2, 1.985],
          ['4', 4, 3.905],
        ] as const) {
          // A line published only at some sizes (PEX inserts, 1/2–1 in; push-fit, 3/4 in) has no value at the others.
          if (!publishedAtSize(entry, key)) continue;
          const r = fittingK(id, { method, nominalSizeIn: nominal, nominalSizeKey: key, innerDiameterM: idIn * 0.0254, Re: 5e4, frictionFactor: 0.022 });
          expect(Number.isFinite(r.K) && r.K >= 0, `${method} ${key}`).toBe(true);
          expect(r.source.length).toBeGreaterThan(5);
        }
      }
    });
  }
});
