/**
 * The analysis uses Hazen–Williams in the pressure form the codes print: the same friction loss in a
 * pipe whether it carries 60 °F or 140 °F water, equal to 4.52·Q^1.852/(C^1.852·d^4.8704) psi/ft
 * (NFPA 13 hydraulic-calculation form; REFERENCES §3a) evaluated by hand below.
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { analyzeSystem } from '../../../src/engine';
import { oneSegment } from '../support/docs';

describe('Hazen–Williams through analyzeSystem at 60 °F and 140 °F', () => {
  // One 3/4 in Type L copper segment (ID 0.785 in, C = 130 in the catalog), 20 m = 65.617 ft long,
  // carrying 0.5 L/s = 7.9252 gpm of continuous demand. Invented test system.
  const gpm = (0.5e-3 * 60) / 3.785411784e-3;
  const lengthFt = 20 / 0.3048;
  const expectedPsi = (lengthFt * 4.52 * gpm ** 1.852) / (130 ** 1.852 * 0.785 ** 4.8704);
  const PSI = 6894.757293168361;

  for (const tF of [60, 140]) {
    it(`${tF} °F: the segment's friction loss is the printed form's ${expectedPsi.toFixed(4)} psi`, () => {
      const tC = ((tF - 32) * 5) / 9;
      const a = analyzeSystem(oneSegment({ waterTemperature: tC, criteria: { frictionMethod: 'hazen-williams' } }));
      const seg = a.si.segments.find((s) => s.id === 's1')!;
      // Same formula, evaluated in psi and in SI: only rounding separates them (rtol 1e-9).
      expectClose(seg.frictionLoss / PSI, expectedPsi, { rtol: 1e-9 }, `${tF} °F`);
    });
  }
  it('the two temperatures give bit-identical friction (the loss has no temperature term)', () => {
    const at = (tC: number) => analyzeSystem(oneSegment({ waterTemperature: tC, criteria: { frictionMethod: 'hazen-williams' } })).si.segments[0].frictionLoss;
    expect(at(15.5556)).toBe(at(60));
    expect(at(15.5556)).toBeGreaterThan(0);
  });
});
