import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { pressureRating } from '../../../src/engine/catalog/pressureRatings';
import { MATERIALS, type MaterialId } from '../../../src/engine/catalog/materials';
import { fahrenheitToCelsius, PA_PER_PSI } from '../../../src/engine/units';

const psiAt = (material: string, size: string | null, tF: number): number => {
  const r = pressureRating(material, size, fahrenheitToCelsius(tF));
  if (r === null) throw new Error(`no rating for ${material} ${size} at ${tF} °F`);
  return r.ratingPa / PA_PER_PSI;
};
// The tables print whole psi; the only error is the °F → °C → °F round trip: rtol 1e-9.
const TABLE = { rtol: 1e-9 };

describe('CPVC SDR 11 against the Charlotte Pipe How-to Guide de-rating table for ASTM D2846 CTS SDR 11 (REFERENCES §13f ends; whole table read in the guide)', () => {
  const rows: [number, number][] = [
    [73, 400],
    [80, 400],
    [90, 360],
    [100, 325],
    [120, 260],
    [140, 200],
    [160, 160],
    [180, 100],
  ];
  for (const [tF, psi] of rows) {
    it(`${tF} °F → ${psi} psi, every size`, () => {
      for (const size of ['1/2', '1', '2', null]) expectClose(psiAt('cpvc-sdr11', size, tF), psi, TABLE, `${size} at ${tF} °F`);
      expect(pressureRating('cpvc-sdr11', '1/2', fahrenheitToCelsius(tF))!.verified).toBe(true);
    });
  }
  it('130 °F is halfway between 120 °F (260) and 140 °F (200) → 230 psi, linear interpolation stated', () => {
    const r = pressureRating('cpvc-sdr11', '3/4', fahrenheitToCelsius(130))!;
    expectClose(r.ratingPa / PA_PER_PSI, 230, TABLE);
    expect(r.source).toMatch(/linear interpolation/);
  });
  it('cold water below 73 °F keeps the 73 °F rating, 400 psi', () => {
    expectClose(psiAt('cpvc-sdr11', '1', 50), 400, TABLE);
  });
  it('110 °F interpolates between 100 °F (325) and 120 °F (260): 292.5 psi, verified', () => {
    const r = pressureRating('cpvc-sdr11', '1', fahrenheitToCelsius(110))!;
    expectClose(r.ratingPa / PA_PER_PSI, 292.5, TABLE);
    expect(r.verified).toBe(true);
  });
  it('above 180 °F (the ASTM D2846 continuous-use limit) there is no rating', () => {
    expect(pressureRating('cpvc-sdr11', '1', fahrenheitToCelsius(190))).toBeNull();
  });
});

describe('PEX SDR 9, ASTM F876 Appendix X1 ratings as restated by trade pages (REFERENCES §13g)', () => {
  it('160 psi at 73.4 °F, 100 psi at 180 °F, 80 psi at 200 °F, all flagged unverified', () => {
    for (const [tF, psi] of [
      [73.4, 160],
      [180, 100],
      [200, 80],
    ] as const) {
      const r = pressureRating('pex-sdr9', '3/4', fahrenheitToCelsius(tF))!;
      expectClose(r.ratingPa / PA_PER_PSI, psi, TABLE, `${tF} °F`);
      expect(r.verified).toBe(false);
    }
  });
  it('140 °F interpolates linearly between 73.4 °F and 180 °F: 160 − 60·66.6/106.6 = 122.5 psi', () => {
    expectClose(psiAt('pex-sdr9', '1/2', 140), 160 - (60 * (140 - 73.4)) / (180 - 73.4), TABLE);
  });
  it('above 200 °F there is no rating', () => {
    expect(pressureRating('pex-sdr9', '1', fahrenheitToCelsius(210))).toBeNull();
  });
});

describe('soldered copper: the 95-5 joint governs (CDA Copper Tube Handbook Table F; Table 14.3c Type M) (REFERENCES §13h)', () => {
  const rows: [MaterialId, string, number, number][] = [
    // Table F, 95-5, 1/4–1 in: 100 °F 500, 150 °F 400, 200 °F 300, 250 °F 200
    ['copper-m', '1/2', 100, 500],
    ['copper-m', '3/4', 150, 400],
    ['copper-l', '1', 200, 300],
    ['copper-k', '3/8', 250, 200],
    // 1-1/4–2 in: 400 / 350 / 250 / 175
    ['copper-m', '1-1/4', 100, 400],
    ['copper-l', '2', 150, 350],
    ['copper-k', '1-1/2', 250, 175],
    // 2-1/2–4 in: 300 / 275 / 200 / 150
    ['copper-m', '4', 100, 300],
    ['copper-l', '3', 200, 200],
    ['copper-k', '3-1/2', 250, 150],
  ];
  for (const [m, size, tF, psi] of rows) {
    it(`${m} ${size} in at ${tF} °F → ${psi} psi`, () => {
      const r = pressureRating(m, size, fahrenheitToCelsius(tF))!;
      expectClose(r.ratingPa / PA_PER_PSI, psi, TABLE);
      expect(r.verified).toBe(true);
      expect(r.source).toMatch(/joint governs/);
    });
  }
  it('the joint rating is below the drawn Type M tube rating at every size (Table 14.3c: 1/2 in 850, 4 in 431 psi)', () => {
    for (const s of MATERIALS['copper-m'].sizes) {
      const r = pressureRating('copper-m', s.key, fahrenheitToCelsius(100))!;
      expect(r.source, s.key).toMatch(/joint governs/);
    }
  });
  it('cold water at 55 °F takes the 100 °F rating; 125 °F interpolates 500 → 400 to 450 psi (1/4–1 in)', () => {
    expectClose(psiAt('copper-l', '3/4', 55), 500, TABLE);
    const r = pressureRating('copper-l', '3/4', fahrenheitToCelsius(125))!;
    expectClose(r.ratingPa / PA_PER_PSI, 450, TABLE);
    expect(r.source).toMatch(/linear interpolation/);
  });
  it('without a size, the lowest rating of any size (2-1/2–4 in range, 300 psi at 100 °F)', () => {
    expectClose(psiAt('copper-m', null, 100), 300, TABLE);
  });
  it('above 250 °F, or an unknown size, gives no rating', () => {
    expect(pressureRating('copper-m', '1', fahrenheitToCelsius(260))).toBeNull();
    expect(pressureRating('copper-m', '9', fahrenheitToCelsius(100))).toBeNull();
  });
});

describe('materials without a published table found', () => {
  it('PVC Schedule 40/80 and steel answer null rather than an unsourced number', () => {
    for (const m of ['pvc-sch40', 'pvc-sch80', 'steel-sch40', 'galvanized-steel-sch40', 'no-such-material']) {
      expect(pressureRating(m, '1', 15), m).toBeNull();
    }
  });
  it('every rating names its source and states its verified flag', () => {
    for (const m of Object.keys(MATERIALS)) {
      for (const tF of [40, 73, 100, 140, 180]) {
        const r = pressureRating(m, '1', fahrenheitToCelsius(tF));
        if (r === null) continue;
        expect(r.source.length).toBeGreaterThan(20);
        expect(typeof r.verified).toBe('boolean');
        expect(r.ratingPa).toBeGreaterThan(0);
      }
    }
  });
});
