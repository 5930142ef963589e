import { describe, expect, it } from 'vitest';
import { analyzeSystem, type SystemDocumentInput } from '../../../src/engine';
import { frictionBudgetOf, frictionBudgetPer100Ft, pressureAvailableForFriction } from '../../../src/engine/sizing/frictionBudget';
import { sizeSystem, SizingError } from '../../../src/engine/sizing/sizeSystem';
import { apartmentBuildingDocument } from '../../../src/engine/building/apartmentBuilding';
import { KGM3_PER_LBFT3, M_PER_FT, PA_PER_PSI } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';

/**
 * A small invented system worked by hand with the model codes' "pressure available for friction"
 * procedure (IPC Appendix E, E103; UPC Appendix A, A 104 — common practice):
 *
 *   minimum static pressure at the main         55    psi  (invented: the scenario's utility letter)
 *   − lavatory minimum flow pressure             8    psi  (IPC 2018 Table 604.3, lavatory)
 *   − elevation 20 ft × 0.433 psi/ft             8.66 psi  (IPC E103.2.2's own example: 20 ft → 8.66 psi)
 *   − meter loss at design flow                  5    psi  (invented: stands for the maker's data)
 *   − backflow preventer loss                   12    psi  (invented: stands for the maker's data)
 *   = pressure available for friction           21.34 psi
 *
 *   developed length 40 + 30 ft = 70 ft; fittings: two copper 90° elbows at 1 in (6 ft each) and a
 *   tee side outlet at 3/4 in (9 ft) from the "pipe fittings expressed as equivalent footage of
 *   pipe" sheet printed with the AWWA meter losses (plastic or copper column) → 21 ft
 *   budget = 21.34 psi / (70 + 21) ft × 100 ft = 23.45 psi per 100 ft
 */
const HAND = {
  staticPsi: 55,
  lavatoryPsi: 8,
  risesFt: 20,
  elevationPsi: 8.66,
  meterPsi: 5,
  backflowPsi: 12,
  availablePsi: 21.34,
  developedFt: 70,
  fittingsFt: 21,
  budgetPsiPer100Ft: 23.45,
};

function handSystem(): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'wrenmoor-kiosk',
    name: 'Wrenmoor kiosk washroom (invented)',
    service: 'cold',
    unitSystem: 'US',
    waterTemperature: 60,
    source: { kind: 'utility-main', nodeId: 'main', staticPressureLow: HAND.staticPsi, staticPressureHigh: 70, pressureBasis: 'invented utility letter' },
    devices: [
      { id: 'meter', kind: 'meter', label: 'Meter', segmentId: 'service', loss: { kind: 'fixed', loss: HAND.meterPsi } },
      { id: 'rpz', kind: 'backflow-preventer', label: 'Backflow preventer', segmentId: 'service', loss: { kind: 'fixed', loss: HAND.backflowPsi } },
    ],
    nodes: [
      { id: 'main', label: 'Main', elevation: 0 },
      { id: 'entry', label: 'Entry' },
      {
        id: 'washroom',
        label: 'Washroom',
        fixtureGroups: [{ fixtureTypeId: 'lavatory-private', count: 2 }],
        checkedFixtures: [{ id: 'lav', label: 'Washroom lavatory', fixtureTypeId: 'lavatory-private' }],
      },
    ],
    segments: [
      {
        id: 'service',
        label: 'Service',
        from: 'main',
        to: 'entry',
        material: 'copper-l',
        size: '1',
        length: 40,
        rise: 0,
        fittings: [
          {
            typeId: 'sheet:elbow-90',
            count: 2,
            custom: { label: 'Copper 90° elbow, 1 in', equivalentLength: 6, source: 'utility sheet of fitting equivalent footage (copper column)' },
          },
        ],
        reducerAuto: false,
      },
      {
        id: 'branch',
        label: 'Branch',
        from: 'entry',
        to: 'washroom',
        material: 'copper-l',
        size: '3/4',
        length: 30,
        rise: HAND.risesFt,
        fittings: [
          {
            typeId: 'sheet:tee-side',
            count: 1,
            custom: { label: 'Copper tee, side outlet, 3/4 in', equivalentLength: 9, source: 'utility sheet of fitting equivalent footage (copper column)' },
          },
        ],
        reducerAuto: false,
      },
    ],
  };
}

describe('pressure available for friction, worked by hand (IPC Appendix E / UPC Appendix A procedure, common practice)', () => {
  it('when the hand figures are entered, then the procedure gives the hand result', () => {
    // 0.433 psi/ft is 62.4 lb/ft³ / 144 in²/ft² (common practice): the same density here.
    const density = 62.4 * KGM3_PER_LBFT3;
    const available = pressureAvailableForFriction({
      supplyPressurePa: HAND.staticPsi * PA_PER_PSI,
      fixtureMinimumPa: HAND.lavatoryPsi * PA_PER_PSI,
      riseM: HAND.risesFt * M_PER_FT,
      densityKgM3: density,
      deviceLossesPa: [HAND.meterPsi * PA_PER_PSI, HAND.backflowPsi * PA_PER_PSI],
    });
    // The hand figure is printed to 0.01 psi and 0.433 is rounded from 0.4333: 1e-3 relative covers both.
    expectClose(available / PA_PER_PSI, HAND.availablePsi, { rtol: 1e-3 }, 'available for friction');
    const budget = frictionBudgetPer100Ft(available, (HAND.developedFt + HAND.fittingsFt) * M_PER_FT)!;
    expectClose(budget / PA_PER_PSI, HAND.budgetPsiPer100Ft, { rtol: 1e-3 }, 'budget per 100 ft');
    expect(frictionBudgetPer100Ft(available, 0)).toBeNull();
  });

  it('when the engine analyses the same system, then its budget for the critical fixture is the hand budget', () => {
    const analysis = analyzeSystem(handSystem());
    const b = frictionBudgetOf(analysis)!;
    expect(b.fixtureId).toBe('lav');
    // The engine's water at 60 °F (IAPWS) weighs 62.37 lb/ft³ against the hand's 62.4: 0.05 % of the
    // 8.66 psi elevation term, under 0.1 % of the budget. Lengths are exact.
    expectClose(b.elevationPa / PA_PER_PSI, HAND.elevationPsi, { rtol: 1e-3 }, 'elevation');
    expectClose(b.devicesPa / PA_PER_PSI, HAND.meterPsi + HAND.backflowPsi, { rtol: 1e-9 }, 'devices');
    expectClose(b.requiredPa / PA_PER_PSI, HAND.lavatoryPsi, { rtol: 1e-9 }, 'lavatory minimum');
    expectClose(b.availablePa / PA_PER_PSI, HAND.availablePsi, { rtol: 1e-3 }, 'available');
    expectClose(b.developedLengthM / M_PER_FT, HAND.developedFt, { rtol: 1e-9 }, 'developed length');
    expectClose(b.fittingsEquivalentLengthM / M_PER_FT, HAND.fittingsFt, { rtol: 1e-9 }, 'fittings equivalent length');
    expectClose(b.perHundredFtPa! / PA_PER_PSI, HAND.budgetPsiPer100Ft, { rtol: 1e-3 }, 'budget per 100 ft');
    // What friction takes now and what is left add up to the residual the ledger ends with.
    const fixture = analysis.si.fixtures[0];
    expectClose(b.availablePa - b.frictionUsedPa, fixture.residual - fixture.required, { rtol: 1e-9 }, 'slack');
  });

  it('when the system is sized, then the friction on the path stays within the pressure available for it', () => {
    const result = sizeSystem(handSystem());
    expect(result.feasible).toBe(true);
    expectClose(result.frictionBudget!.availablePa / PA_PER_PSI, HAND.availablePsi, { rtol: 1e-3 }, 'budget in the answer');
    const after = frictionBudgetOf(analyzeSystem(result.document!))!;
    expect(after.frictionUsedPa).toBeLessThanOrEqual(after.availablePa);
    // One size smaller on any upsized segment would spend more than is available (or break a velocity limit).
    for (const s of result.segments.filter((x) => typeof x.governing === 'object')) {
      expect(typeof s.governing === 'object' && s.governing.fixtureLabel).toBe('Washroom lavatory');
    }
  });
});

describe('the sizing answer explains itself', () => {
  /** The hand system with the supply raised to 100 psi so that both segments can shrink. */
  const roomy = (): SystemDocumentInput => ({ ...handSystem(), source: { ...handSystem().source, staticPressureLow: 100, staticPressureHigh: 100 } });
  /** And lowered to 30 psi: 38 psi of fixed deductions alone cannot leave 8 psi at the lavatory. */
  const starved = (): SystemDocumentInput => ({ ...handSystem(), source: { ...handSystem().source, staticPressureLow: 30, staticPressureHigh: 30 } });

  it('when a segment carries sizeLocked in the document, then it keeps its size and is reported locked', () => {
    const doc = roomy();
    doc.segments[0].sizeLocked = true;
    const result = sizeSystem(doc);
    const service = result.segments.find((s) => s.segmentId === 'service')!;
    expect(service.governing).toBe('locked');
    expect(service.after).toBe('1');
    const unlocked = sizeSystem(roomy()).segments.find((s) => s.segmentId === 'service')!;
    expect(unlocked.after).not.toBe('1');
  });

  it('when every selected segment is locked, then the all-locked error names the segments and the input is unchanged', () => {
    const doc = roomy();
    doc.segments.forEach((s) => (s.sizeLocked = true));
    const copy = JSON.parse(JSON.stringify(doc));
    let error: unknown = null;
    try {
      sizeSystem(doc);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(SizingError);
    expect((error as SizingError).code).toBe('all-locked');
    expect((error as SizingError).message).toMatch(/"Service", "Branch"/);
    expect(doc).toEqual(copy);
    // A selection of only the locked branch, in a document where the service is free: the same error.
    const one = roomy();
    one.segments[1].sizeLocked = true;
    expect(() => sizeSystem(one, { segmentIds: ['branch'] })).toThrow(/Every segment selected is locked/);
  });

  it('when a segment is sized, then the row gives sizes, velocities against the limit and the worst fixture before and after', () => {
    const result = sizeSystem(roomy());
    const before = analyzeSystem(roomy());
    for (const row of result.segments) {
      const seg = before.si.segments.find((s) => s.id === row.segmentId)!;
      expectClose(row.velocityBefore, seg.velocity, { rtol: 1e-12 }, 'velocity before');
      expect(row.velocityAfter).not.toBeNull();
      expect(row.velocityAfter!).toBeLessThanOrEqual(row.velocityLimit! * (1 + 1e-9));
      expect(row.worstFixture?.label).toBe('Washroom lavatory');
      expectClose(row.worstFixture!.marginBeforePa, before.si.fixtures[0].margin, { rtol: 1e-12 }, 'margin before');
      expect(row.worstFixture!.marginAfterPa!).toBeGreaterThanOrEqual(0);
      expect(['velocity', 'smallest'].includes(row.governing as string) || typeof row.governing === 'object').toBe(true);
    }
    expect(result.changedSegments).toBeGreaterThan(0);
  });

  it('when the designer asks for a margin, then every fixture keeps at least that margin after sizing', () => {
    const marginPa = 5 * PA_PER_PSI;
    const plain = sizeSystem(roomy());
    const kept = sizeSystem(roomy(), { marginPa });
    expect(kept.feasible).toBe(true);
    expect(kept.minMarginAfterPa!).toBeGreaterThanOrEqual(marginPa * (1 - 1e-9));
    expect(kept.volumeAfterM3!).toBeGreaterThanOrEqual(plain.volumeAfterM3!);
  });

  it('when the supply cannot serve the lavatory at any size, then the answer says by how much and suggests a booster, and changes nothing', () => {
    const result = sizeSystem(starved());
    expect(result.feasible).toBe(false);
    expect(result.document).toBeNull();
    // 30 − 8 − 8.66 − 5 − 12 = −3.66 psi before any friction (hand figures above): short by more than that.
    expect(result.shortfallPa / PA_PER_PSI).toBeGreaterThan(3.6);
    expect(result.boosterPressurePa!).toBeGreaterThanOrEqual(result.shortfallPa);
    expect(result.frictionBudget!.availablePa).toBeLessThan(0);
  });

  it('when the margin is negative, then a named error', () => {
    expect(() => sizeSystem(roomy(), { marginPa: -1 })).toThrow(SizingError);
  });
});

describe('sizing a building with a booster and pressure-reducing valves', () => {
  it('when the demo system is sized, then the analysis of the sized document passes every fixture and velocity', async () => {
    const { readFileSync } = await import('node:fs');
    const doc = JSON.parse(readFileSync(new URL('../../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8'));
    const result = sizeSystem(doc);
    expect(result.feasible).toBe(true);
    expect(result.verified).toBe(true);
    expect(result.unitPiping).toBeNull(); // the demo has no typical units
    const a = analyzeSystem(result.document!);
    expect(a.verdict.allFixturesPass).toBe(true);
    expect(a.verdict.allVelocitiesPass).toBe(true);
    expect(result.minMarginAfterPa!).toBeGreaterThanOrEqual(0);
    // Least volume: the sizes may only shrink the pipe held, never grow it past a design that already passes.
    expect(result.volumeAfterM3!).toBeLessThanOrEqual(result.volumeBeforeM3);
    console.log(
      `demo sizing: ${result.changedSegments} segments changed, ${result.analyses} analyses, volume ${result.volumeBeforeM3.toFixed(4)} → ${result.volumeAfterM3!.toFixed(4)} m³`,
    );
  });

  it('when a building with typical units is sized, then each unit type segment is one row applying to every placement, and the sizes land in the unit type', () => {
    // 4 storeys × 4 apartments of one type (invented example building) on an invented 100 psi main, where a sizing exists
    const built = apartmentBuildingDocument(4);
    const doc = { ...built, source: { ...built.source, staticPressureLow: 100, staticPressureHigh: 100 } };
    const result = sizeSystem(doc);
    const perType = doc.unitTypes[0].segments.length;
    expect(result.unitPiping).toEqual({ unitTypes: 1, segments: perType, placements: 16, sized: perType, left: [], leastProven: true });
    // no row names a placement's copy ("<placement>.<segment>"); one row per unit type segment, applying to all 16 placements
    expect(result.segments.every((s) => !s.segmentId.includes('.'))).toBe(true);
    const unitRows = result.segments.filter((s) => s.unitType);
    expect(unitRows.map((r) => r.unitType!.segmentId)).toEqual(doc.unitTypes[0].segments.map((s) => s.id));
    expect(unitRows.every((r) => r.unitType!.placements === 16 && r.label!.startsWith(doc.unitTypes[0].name))).toBe(true);
    expect(result.feasible).toBe(true);
    const sizedType = result.document!.unitTypes![0];
    for (const r of unitRows) expect(sizedType.segments.find((s) => s.id === r.unitType!.segmentId)!.size).toBe(r.after);
    // a row held by a fixture names a checked fixture of one placement (its label carries the placement's)
    const fixtureIds = new Set(analyzeSystem(doc).fixtures.map((f) => f.id));
    for (const r of unitRows) if (typeof r.governing === 'object') expect(fixtureIds.has(r.governing.fixtureId)).toBe(true);
    // the sized document passes the engine's own analysis
    const a = analyzeSystem(result.document!);
    expect(a.verdict.allFixturesPass).toBe(true);
    expect(a.verdict.allVelocitiesPass).toBe(true);
  });
});
