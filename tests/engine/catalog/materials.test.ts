import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { MATERIALS, pipeSize, type MaterialId } from '../../../src/engine/catalog/materials';
import { NOT_VERIFIED } from '../../../src/engine/catalog/notVerified';

const IN = 0.0254;
// Dimensions are printed to 0.001 in; converted with the exact inch: rtol 1e-12.
const DIM = { rtol: 1e-12 };

describe('inside diameters against the published tables (REFERENCES §5)', () => {
  const cases: [MaterialId, string, number, number, string][] = [
    ['copper-k', '1/2', 0.625, 0.527, 'ASTM B88 Type K (CDA Copper Tube Handbook Table 14.2f)'],
    ['copper-k', '2', 2.125, 1.959, 'ASTM B88 Type K'],
    ['copper-l', '3/4', 0.875, 0.785, 'ASTM B88 Type L'],
    ['copper-l', '3-1/2', 3.625, 3.425, 'ASTM B88 Type L (CDA 14.2f)'],
    ['copper-l', '3/8', 0.5, 0.43, 'ASTM B88 Type L (sizes.com, CDA 14.2f)'],
    ['copper-m', '1', 1.125, 1.055, 'ASTM B88 Type M (Field-PM chart)'],
    ['copper-m', '4', 4.125, 3.935, 'ASTM B88 Type M'],
    ['pex-sdr9', '1/2', 0.625, 0.485, 'ASTM F876 SDR 9, supplier sheet [SEEN]'],
    ['pex-sdr9', '1', 1.125, 0.875, 'ASTM F876 SDR 9 [SEEN]'],
    ['pvc-sch40', '2', 2.375, 2.067, 'ASTM D1785 Sch 40'],
    ['pvc-sch80', '1', 1.315, 0.957, 'ASTM D1785 Sch 80'],
    ['steel-sch40', '6', 6.625, 6.065, 'ASME B36.10M Sch 40 (civiljungles chart)'],
    ['cpvc-sdr11', '3/4', 0.875, 0.715, 'ASTM D2846 SDR 11 — not verified (OD/11 rule)'],
  ];
  for (const [material, key, od, id, source] of cases) {
    it(`${material} ${key}: OD ${od} in, ID ${id} in (${source})`, () => {
      const s = pipeSize(material, key);
      expect(s).toBeDefined();
      expectClose(s!.outerDiameterM, od * IN, DIM);
      expectClose(s!.innerDiameterM, id * IN, DIM);
    });
  }
  it('copper OD is nominal + 1/8 in for K, L and M (ASTM B88)', () => {
    for (const m of ['copper-k', 'copper-l', 'copper-m'] as const) {
      for (const s of MATERIALS[m].sizes) expectClose(s.outerDiameterM, (s.nominalIn + 0.125) * IN, DIM, `${m} ${s.key}`);
    }
  });
  it('copper walls match the published wall column: K 1/2 0.049, L 1 0.050, M 2 0.058 in (ASTM B88)', () => {
    const wall = (m: MaterialId, k: string) => (pipeSize(m, k)!.outerDiameterM - pipeSize(m, k)!.innerDiameterM) / 2 / IN;
    expectClose(wall('copper-k', '1/2'), 0.049, { rtol: 1e-9 });
    expectClose(wall('copper-l', '1'), 0.05, { rtol: 1e-9 });
    expectClose(wall('copper-m', '2'), 0.058, { rtol: 1e-9 });
  });
  it('PEX 1-1/4 to 2 in follow wall = OD/9 (SDR 9 definition, ASTM F876) [COMP rows]', () => {
    for (const key of ['1-1/4', '1-1/2', '2']) {
      const s = pipeSize('pex-sdr9', key)!;
      const wall = (s.outerDiameterM - s.innerDiameterM) / 2;
      // The table rounds the wall to 0.001 in: atol half of that.
      expectClose(wall, s.outerDiameterM / 9, { rtol: 0, atol: 0.0005 * IN }, key);
    }
  });
});

describe('MATERIALS catalog', () => {
  for (const [id, m] of Object.entries(MATERIALS)) {
    it(`${id}: sources named, plausible values, sizes ordered`, () => {
      expect(m.id).toBe(id);
      for (const s of [m.roughnessSource, m.hazenWilliamsSource, m.dimensionSource]) expect(s.length).toBeGreaterThan(15);
      expect(m.roughnessM).toBeGreaterThan(0);
      expect(m.roughnessM).toBeLessThan(1e-3);
      expect(m.hazenWilliamsC).toBeGreaterThanOrEqual(100);
      expect(m.hazenWilliamsC).toBeLessThanOrEqual(150);
      expect(m.sizes.length).toBeGreaterThan(3);
      for (let i = 0; i < m.sizes.length; i++) {
        const s = m.sizes[i];
        expect(s.innerDiameterM).toBeGreaterThan(0);
        expect(s.innerDiameterM).toBeLessThan(s.outerDiameterM);
        expect(Number.isFinite(s.nominalIn)).toBe(true);
        if (i > 0) expect(s.innerDiameterM).toBeGreaterThan(m.sizes[i - 1].innerDiameterM);
      }
      // The flag and the words agree: an unverified datum's source says so, a verified one does not.
      expect(m.verified).toBe(m.unverified.length === 0);
      const byDatum = { dimensions: m.dimensionSource, roughness: m.roughnessSource, hazenWilliamsC: m.hazenWilliamsSource } as const;
      for (const [datum, source] of Object.entries(byDatum)) {
        expect(source.includes(NOT_VERIFIED), `${id} ${datum}`).toBe(m.unverified.includes(datum as keyof typeof byDatum));
      }
    });
  }
  it('roughness: drawn copper 1.5e-6 m (Idelchik lower bound), commercial steel 0.0018 in (Crane TP-410, 2009)', () => {
    expect(MATERIALS['copper-l'].roughnessM).toBe(1.5e-6);
    expectClose(MATERIALS['steel-sch40'].roughnessM, 0.0018 * IN, DIM);
    // Moody's 0.00015 ft for commercial steel (from memory) agrees within its 2 printed digits.
    expectClose(MATERIALS['steel-sch40'].roughnessM, 0.00015 * 0.3048, { rtol: 0.01 });
    expect(MATERIALS['galvanized-steel-sch40'].roughnessM).toBe(1.52e-4);
  });
  it('velocity classes: copper, plastic, steel', () => {
    expect(MATERIALS['copper-m'].velocityClass).toBe('copper');
    expect(MATERIALS['pex-sdr9'].velocityClass).toBe('plastic');
    expect(MATERIALS['galvanized-steel-sch40'].velocityClass).toBe('steel');
  });
  it('pipeSize returns undefined for an unknown size or material', () => {
    expect(pipeSize('copper-l', '7/8')).toBeUndefined();
    expect(pipeSize('lead' as MaterialId, '1')).toBeUndefined();
  });
});
