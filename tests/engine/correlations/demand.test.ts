import { describe, expect, it } from 'vitest';
import { expectClose } from '../../helpers/expectClose';
import { HUNTER_TABLE_IPC, hunterBinomialDemand, hunterDesignFlow, hunterDesignFlowGpm } from '../../../src/engine/demand';

// Table values are printed to 0.1 gpm; interpolation is exact arithmetic on them.
const TABLE = { rtol: 1e-12 };
const GPM = 3.785411784e-3 / 60;

describe('IPC Table E103.3(3) — rows read in a copy of the table ([SEEN], REFERENCES §7c)', () => {
  const seenTank: [number, number][] = [
    [1, 3],
    [2, 5],
    [4, 8],
    [8, 12.8],
    [12, 16.0],
    [15, 17.5],
    [30, 23.3],
    [50, 29.1],
  ];
  const seenValve: [number, number][] = [
    [5, 15],
    [7, 19.8],
    [10, 27],
    [15, 31],
    [20, 35],
    [30, 42],
    [50, 50],
  ];
  for (const [wsfu, gpm] of seenTank) {
    it(`flush tanks: ${wsfu} wsfu → ${gpm} gpm`, () => {
      expectClose(hunterDesignFlowGpm(wsfu, 'flush-tank').gpm, gpm, TABLE);
    });
  }
  for (const [wsfu, gpm] of seenValve) {
    it(`flush valves: ${wsfu} wsfu → ${gpm} gpm`, () => {
      expectClose(hunterDesignFlowGpm(wsfu, 'flush-valve').gpm, gpm, TABLE);
    });
  }
  it('marks exactly those rows as seen and the rest as from memory', () => {
    const tankSeen = HUNTER_TABLE_IPC.filter((r) => r.flushTankSeen).map((r) => r.wsfu);
    const valveSeen = HUNTER_TABLE_IPC.filter((r) => r.flushValveSeen).map((r) => r.wsfu);
    expect(tankSeen).toEqual(seenTank.map(([w]) => w));
    expect(valveSeen).toEqual(seenValve.map(([w]) => w));
  });
});

describe('hunterDesignFlowGpm (IPC E103.3(3), full columns from memory)', () => {
  it('rows increase with load and both columns meet at 1000 wsfu (208 gpm)', () => {
    for (let i = 1; i < HUNTER_TABLE_IPC.length; i++) {
      expect(HUNTER_TABLE_IPC[i].wsfu).toBeGreaterThan(HUNTER_TABLE_IPC[i - 1].wsfu);
      expect(HUNTER_TABLE_IPC[i].flushTankGpm).toBeGreaterThan(HUNTER_TABLE_IPC[i - 1].flushTankGpm);
    }
    expect(hunterDesignFlowGpm(1000, 'flush-tank').gpm).toBe(208);
    expect(hunterDesignFlowGpm(1000, 'flush-valve').gpm).toBe(208);
  });
  it('interpolates linearly as the code table is read: 110 wsfu flush tanks → (43.5 + 48.0)/2', () => {
    expectClose(hunterDesignFlowGpm(110, 'flush-tank').gpm, 45.75, TABLE);
    expect(hunterDesignFlowGpm(110, 'flush-tank').extrapolated).toBe(false);
  });
  it('zero load → zero flow, not extrapolated', () => {
    expect(hunterDesignFlowGpm(0, 'flush-valve')).toEqual({ gpm: 0, extrapolated: false });
  });
  it('below the first row holds the first row and flags it (documented)', () => {
    expect(hunterDesignFlowGpm(0.7, 'flush-tank')).toEqual({ gpm: 3, extrapolated: true });
    expect(hunterDesignFlowGpm(3, 'flush-valve')).toEqual({ gpm: 15, extrapolated: true });
  });
  it('above 5000 wsfu extends the last segment and flags it', () => {
    const r = hunterDesignFlowGpm(6000, 'flush-tank');
    expect(r.extrapolated).toBe(true);
    expectClose(r.gpm, 593 + (593 - 525), TABLE);
  });
  it('SI form converts with 1 gpm = 3.785411784e-3/60 m³/s', () => {
    expectClose(hunterDesignFlow(10, 'flush-valve').flowM3s, 27 * GPM, TABLE);
  });
  it('rejects negative loads and unknown curves', () => {
    expect(() => hunterDesignFlowGpm(-1, 'flush-tank')).toThrow(RangeError);
    expect(() => hunterDesignFlowGpm(1, 'x' as never)).toThrow(RangeError);
  });
});

/** Independent binomial CDF for the checks below (direct sum of C(n,r)·p^r·(1−p)^(n−r)). */
function binomialCdf(m: number, n: number, p: number): number {
  let sum = 0;
  let c = 1;
  for (let r = 0; r <= m; r++) {
    sum += c * p ** r * (1 - p) ** (n - r);
    c = (c * (n - r)) / (r + 1);
  }
  return sum;
}
function smallestM(n: number, p: number, pct: number): number {
  let m = 0;
  while (binomialCdf(m, n, p) < pct) m++;
  return m;
}

describe('hunterBinomialDemand (Hunter, NBS BMS65, 1940; 99th percentile)', () => {
  // The grid used to merge flows is 1e-7 of the maximum flow: rtol 1e-6 covers it.
  const GRID = { rtol: 1e-6 };
  it("one flush valve (Hunter: q = 27 gpm, t = 9 s, T = 300 s, from memory) → 27 gpm, the table's 10 wsfu row", () => {
    // Hunter weighted a flush-valve closet 10 fixture units (from memory); IPC Table E103.3(3) gives
    // 27.0 gpm at 10 wsfu for flush valves ([SEEN] row).
    const q = hunterBinomialDemand([{ count: 1, flowM3s: 27 * GPM, durationS: 9, recurrenceS: 300 }]);
    expectClose(q, 27 * GPM, GRID);
  });
  it('one group equals m·q with the smallest m whose binomial CDF reaches 0.99 (independent sum)', () => {
    for (const [n, t, T] of [
      [10, 60, 300],
      [50, 9, 300],
      [200, 60, 900],
      [1000, 9, 300],
    ] as const) {
      const q = 4 * GPM;
      const m = smallestM(n, t / T, 0.99);
      expectClose(hunterBinomialDemand([{ count: n, flowM3s: q, durationS: t, recurrenceS: T }]), m * q, GRID, `n=${n}`);
    }
  });
  it('two identical groups behave as one group of the combined count', () => {
    const g = { flowM3s: 8 * GPM, durationS: 60, recurrenceS: 900 };
    const split = hunterBinomialDemand([
      { ...g, count: 30 },
      { ...g, count: 20 },
    ]);
    const whole = hunterBinomialDemand([{ ...g, count: 50 }]);
    expectClose(split, whole, GRID);
  });
  it('mixed groups lie between the larger single-group demand and the sum of both', () => {
    const a = { count: 20, flowM3s: 27 * GPM, durationS: 9, recurrenceS: 300 };
    const b = { count: 40, flowM3s: 4 * GPM, durationS: 60, recurrenceS: 300 };
    const both = hunterBinomialDemand([a, b]);
    expect(both).toBeGreaterThanOrEqual(Math.max(hunterBinomialDemand([a]), hunterBinomialDemand([b])) * (1 - 1e-6));
    expect(both).toBeLessThanOrEqual((hunterBinomialDemand([a]) + hunterBinomialDemand([b])) * (1 + 1e-6));
  });
  it('a higher percentile never gives less flow', () => {
    const g = [{ count: 100, flowM3s: 4 * GPM, durationS: 60, recurrenceS: 300 }];
    expect(hunterBinomialDemand(g, 0.999)).toBeGreaterThanOrEqual(hunterBinomialDemand(g, 0.99));
  });
  it('no fixtures → no flow; bad inputs throw RangeError', () => {
    expect(hunterBinomialDemand([])).toBe(0);
    expect(() => hunterBinomialDemand([{ count: 1.5, flowM3s: 1e-4, durationS: 9, recurrenceS: 300 }])).toThrow(RangeError);
    expect(() => hunterBinomialDemand([{ count: 1, flowM3s: 1e-4, durationS: 400, recurrenceS: 300 }])).toThrow(RangeError);
    expect(() => hunterBinomialDemand([], 1)).toThrow(RangeError);
  });
});
