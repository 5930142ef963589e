import { describe, expect, it } from 'vitest';
import { FITTING_TYPES, fittingK, type FittingMethod } from '../../../src/engine/fittings';
import { expectClose } from '../../helpers/expectClose';

// Viega PEX Installation Manual (IM-PF 724596 0416) §10.2, equivalent feet of SDR 9 PEX tubing
// (manufacturer data), rows 1/2, 3/4 and 1 in of the "PEX Crimp" brass and PolyAlloy lines.
const TABLE: Record<string, Record<string, number>> = {
  'pex-insert-brass-elbow-90': { '1/2': 9.4, '3/4': 9.4, '1': 10.0 },
  'pex-insert-brass-tee-run': { '1/2': 2.2, '3/4': 1.9, '1': 2.3 },
  'pex-insert-brass-tee-branch': { '1/2': 10.4, '3/4': 8.9, '1': 11.0 },
  'pex-insert-polymer-elbow-90': { '1/2': 16.5, '3/4': 17.4, '1': 18.0 },
  'pex-insert-polymer-tee-run': { '1/2': 7.2, '3/4': 6.6, '1': 6.0 },
  'pex-insert-polymer-tee-branch': { '1/2': 17.9, '3/4': 17.7, '1': 17.0 },
};
// ASTM F876 SDR 9 PEX inside diameters (REFERENCES §5b, in), nominal sizes in inches.
const PEX = { '1/2': [0.5, 0.485], '3/4': [0.75, 0.681], '1': [1, 0.875] } as const;
const METHODS: FittingMethod[] = ['equivalent-length', 'crane', 'hooper-2k', 'darby-3k'];
const M_PER_FT = 0.3048; // exact

describe('PEX insert fittings, manufacturer equivalent lengths', () => {
  for (const [id, row] of Object.entries(TABLE)) {
    it(`${id}: the table's lengths, K = f·L/D under every method, the source names the maker`, () => {
      const entry = FITTING_TYPES[id];
      expect(entry).toBeDefined();
      expect(entry.sources.join(' ')).toMatch(/Viega.*manufacturer data/);
      for (const [key, ft] of Object.entries(row)) {
        expect(entry.equivalentLengthFt![key]).toBe(ft);
        const [nominal, idIn] = PEX[key as keyof typeof PEX];
        const D = idIn * 0.0254;
        for (const method of METHODS) {
          const r = fittingK(id, { method, nominalSizeIn: nominal, nominalSizeKey: key, innerDiameterM: D, Re: 3e4, frictionFactor: 0.025 });
          // Exact arithmetic of the rule: 1e-12 relative.
          expectClose(r.K, (0.025 * ft * M_PER_FT) / D, { rtol: 1e-12 }, `${method} ${key}`);
          expect(r.method).toBe('equivalent-length');
        }
      }
    });
  }

  it('a size the maker does not publish is refused, not guessed', () => {
    expect(() =>
      fittingK('pex-insert-brass-elbow-90', { method: 'crane', nominalSizeIn: 2, nominalSizeKey: '2', innerDiameterM: 0.05, Re: 1e5, frictionFactor: 0.02 }),
    ).toThrow(/no data .* at size 2/);
  });

  it('no cold-expansion and no copper press entries: no published values were found', () => {
    for (const id of Object.keys(FITTING_TYPES)) expect(id).not.toMatch(/expansion-fitting|cold-expansion|press/);
  });
});
