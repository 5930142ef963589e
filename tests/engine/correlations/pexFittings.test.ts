import { describe, expect, it } from 'vitest';
import { FITTING_TYPES, fittingK, isMetalPipeFitting, pexFittingFor, type FittingMethod } from '../../../src/engine/fittings';
import { expectClose } from '../../helpers/expectClose';

// Viega PEX Installation Manual (IM-PF 724596 0416) §10.2, equivalent feet of SDR 9 PEX tubing
// (manufacturer data): rows 1/2, 3/4 and 1 in of the "PEX Crimp" brass and PolyAlloy lines, and
// rows 1/2–2 in of the "PEX Press" bronze and polymer lines, columns coupling, elbow, tee run, tee branch.
const TABLE: Record<string, Record<string, number>> = {
  'pex-insert-brass-coupling': { '1/2': 2.0, '3/4': 0.6, '1': 1.3 },
  'pex-insert-brass-elbow-90': { '1/2': 9.4, '3/4': 9.4, '1': 10.0 },
  'pex-insert-brass-tee-run': { '1/2': 2.2, '3/4': 1.9, '1': 2.3 },
  'pex-insert-brass-tee-branch': { '1/2': 10.4, '3/4': 8.9, '1': 11.0 },
  'pex-insert-polymer-coupling': { '1/2': 7.1, '3/4': 4.8, '1': 4.5 },
  'pex-insert-polymer-elbow-90': { '1/2': 16.5, '3/4': 17.4, '1': 18.0 },
  'pex-insert-polymer-tee-run': { '1/2': 7.2, '3/4': 6.6, '1': 6.0 },
  'pex-insert-polymer-tee-branch': { '1/2': 17.9, '3/4': 17.7, '1': 17.0 },
  'pex-press-bronze-coupling': { '1/2': 2.0, '3/4': 1.0, '1': 1.0, '1-1/4': 2.0, '1-1/2': 2.0, '2': 1.0 },
  'pex-press-bronze-elbow-90': { '1/2': 9.4, '3/4': 8.0, '1': 10.0, '1-1/4': 11.0, '1-1/2': 13.0, '2': 19.0 },
  'pex-press-bronze-tee-run': { '1/2': 2.2, '3/4': 1.0, '1': 2.0, '1-1/4': 2.0, '1-1/2': 2.0, '2': 2.0 },
  'pex-press-bronze-tee-branch': { '1/2': 10.4, '3/4': 9.0, '1': 10.0, '1-1/4': 11.0, '1-1/2': 12.0, '2': 18.0 },
  'pex-press-polymer-coupling': { '1/2': 2.6, '3/4': 2.5, '1': 3.1, '1-1/4': 4.0, '1-1/2': 5.2, '2': 8.9 },
  'pex-press-polymer-elbow-90': { '1/2': 12.6, '3/4': 18.9, '1': 17.7, '1-1/4': 18.6, '1-1/2': 29.4, '2': 36.4 },
  'pex-press-polymer-tee-run': { '1/2': 3.9, '3/4': 3.6, '1': 3.8, '1-1/4': 6.4, '1-1/2': 7.9, '2': 10.2 },
  'pex-press-polymer-tee-branch': { '1/2': 14.0, '3/4': 19.1, '1': 18.4, '1-1/4': 18.7, '1-1/2': 28.3, '2': 37.5 },
};
// ASTM F876 SDR 9 PEX inside diameters (REFERENCES §5b, in), nominal sizes in inches.
// 1-1/4–2 in: wall = OD/9 (F876's SDR 9 definition), REFERENCES §5b, as the materials catalog has them.
const PEX = {
  '1/2': [0.5, 0.485],
  '3/4': [0.75, 0.681],
  '1': [1, 0.875],
  '1-1/4': [1.25, 1.069],
  '1-1/2': [1.5, 1.263],
  '2': [2, 1.653],
} as const;
const METHODS: FittingMethod[] = ['equivalent-length', 'crane', 'hooper-2k', 'darby-3k'];
const M_PER_FT = 0.3048; // exact

describe('PEX insert and press fittings, manufacturer equivalent lengths', () => {
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

  it("every PEX entry is checked above, and each says it is one maker's data (verified as manufacturer data, not a code table)", () => {
    const pex = Object.keys(FITTING_TYPES).filter((id) => id.startsWith('pex-'));
    expect(pex.sort()).toEqual(Object.keys(TABLE).sort());
    for (const id of pex) {
      expect(FITTING_TYPES[id].pipeFamily).toBe('pex');
      expect(FITTING_TYPES[id].verified).toBe(true);
    }
  });

  it('no cold-expansion and no copper press entries: no published values were found', () => {
    for (const id of Object.keys(FITTING_TYPES)) {
      expect(id).not.toMatch(/expansion-fitting|cold-expansion/);
      if (/press/.test(id)) expect(id).toMatch(/^pex-press-/);
    }
  });
});

describe('substituting PEX fittings for metal-pipe ones', () => {
  it('each metal elbow, tee and coupling maps to the same job in the chosen line; a 45° elbow to the 90° (the larger loss)', () => {
    expect(pexFittingFor('elbow-90-standard', 'press-bronze')).toBe('pex-press-bronze-elbow-90');
    expect(pexFittingFor('elbow-45-standard', 'insert-brass')).toBe('pex-insert-brass-elbow-90');
    expect(pexFittingFor('tee-run', 'insert-polymer')).toBe('pex-insert-polymer-tee-run');
    expect(pexFittingFor('tee-branch', 'press-polymer')).toBe('pex-press-polymer-tee-branch');
    expect(pexFittingFor('coupling', 'insert-brass')).toBe('pex-insert-brass-coupling');
  });

  it('valves, entrances and PEX fittings are not metal-pipe fittings and are kept', () => {
    for (const id of ['valve-ball-full-port', 'entrance-sharp', 'exit', 'pex-insert-brass-elbow-90']) {
      expect(isMetalPipeFitting(id)).toBe(false);
      expect(pexFittingFor(id, 'insert-brass')).toBeUndefined();
    }
    expect(isMetalPipeFitting('elbow-90-standard')).toBe(true);
  });
});
