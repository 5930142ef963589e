import { describe, expect, it } from 'vitest';
import { analyzeSystem, applyFedFrom, type ColdSupplyView, type SystemDocument } from '../../../src/engine';
import { SystemDocumentSchema } from '../../../src/engine/model/schema';
import { PA_PER_PSI } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';
import { clone, oneSegment, smallTree } from '../support/docs';

/** The cold system: the small tree (SI); its node "a" feeds the heater. */
function coldView(overrides: Partial<ColdSupplyView> = {}, doc: unknown = smallTree()): ColdSupplyView {
  return {
    systemId: 'cold-1',
    name: 'Domestic cold',
    service: 'cold',
    revision: { number: 3, status: 'draft', analysis: { ok: true, analysis: analyzeSystem(doc) } },
    ...overrides,
  };
}

/** A hot system fed from node "a" of the cold one, with a water heater (fixed 10 kPa) on its first segment. */
function hotDoc(unitSystem: 'SI' | 'US' = 'SI'): SystemDocument {
  const d = SystemDocumentSchema.parse(oneSegment({ service: 'hot', waterTemperature: unitSystem === 'SI' ? 60 : 140, unitSystem }));
  d.source = { ...d.source, staticPressureLow: 1, staticPressureHigh: 2, pressureBasis: 'typed', fedFrom: { systemId: 'cold-1', nodeId: 'a' } };
  d.devices = [{ id: 'wh', kind: 'water-heater', label: 'Water heater', segmentId: 's1', loss: { kind: 'fixed', loss: unitSystem === 'SI' ? 10 : 1.5 } }];
  return d;
}

describe('a hot system fed from a cold system', () => {
  it("when the cold analysis is computable, then the hot supply is the cold node's residual and high static, and the heater's loss is deducted once", () => {
    const cold = coldView();
    const coldNode = (cold.revision!.analysis as { ok: true; analysis: ReturnType<typeof analyzeSystem> }).analysis.nodes.find((n) => n.id === 'a')!;
    const doc = applyFedFrom(hotDoc(), cold);
    const r = doc.source.fedFrom!.resolution!;
    expect(r.status).toBe('resolved');
    if (r.status !== 'resolved') return;
    // Same unit system (SI, kPa): the figure is copied by the resolver exactly.
    expect(r.residualPressure).toBe(coldNode.pressure);
    expect(r.staticPressureHigh).toBe(coldNode.staticPressureHigh);
    expect(doc.source.staticPressureLow).toBe(coldNode.pressure);
    expect(doc.source.pressureBasis).toMatch(/Fed from the cold-water system "Domestic cold" at a \(revision 3, draft\)/);
    const hot = analyzeSystem(doc);
    expect(hot.verdict.incomplete.map((x) => x.code)).not.toContain('not-yet-resolved');
    // The ledger starts at the cold residual (no flow test: low static = pressure at design flow),
    // and the heater's 10 kPa appears once, as its device line.
    expectClose(hot.source.pressureAtDesignFlow, coldNode.pressure, { rtol: 1e-12 }, 'start');
    const heaterLoss = hot.segments[0].deviceLoss;
    expectClose(heaterLoss, 10, { rtol: 1e-12 }, 'heater once');
  });

  it('when the hot document is in US units and the cold one in SI, then the pressures are converted (1 psi = 6.894757 kPa, exact definition)', () => {
    const cold = coldView();
    const coldNode = (cold.revision!.analysis as { ok: true; analysis: ReturnType<typeof analyzeSystem> }).analysis.si.nodes.find((n) => n.id === 'a')!;
    const r = applyFedFrom(hotDoc('US'), cold).source.fedFrom!.resolution!;
    if (r.status !== 'resolved') throw new Error('expected resolved');
    expectClose(r.residualPressure, coldNode.pressure / PA_PER_PSI, { rtol: 1e-12 }, 'psi');
  });

  it('when the cold supply changes, then the hot supply follows it', () => {
    const before = applyFedFrom(hotDoc(), coldView());
    const colder = clone(smallTree());
    colder.source.staticPressureLow = 400;
    const after = applyFedFrom(before, coldView({}, colder));
    expect(after).not.toBe(before);
    expect(after.source.staticPressureLow).toBeLessThan(before.source.staticPressureLow - 90);
    // Applying again with the same cold analysis changes nothing (the same object back).
    expect(applyFedFrom(after, coldView({}, colder))).toBe(after);
  });

  const cases: [string, ColdSupplyView | null, string, (d: SystemDocument) => SystemDocument][] = [
    ['the cold system is missing (deleted)', null, 'cold-system-missing', (d) => d],
    ['the chosen system is a hot system', coldView({ service: 'hot' }), 'cold-system-not-cold', (d) => d],
    [
      'the node is not in the cold system',
      coldView(),
      'cold-node-missing',
      (d) => ({ ...d, source: { ...d.source, fedFrom: { systemId: 'cold-1', nodeId: 'gone' } } }),
    ],
    [
      'the cold system cannot be computed',
      coldView({ revision: { number: 1, status: 'draft', analysis: { ok: false, error: { message: 'a cycle' } } } }),
      'cold-analysis-missing',
      (d) => d,
    ],
    ['the cold system has no revision', coldView({ revision: null }), 'cold-analysis-missing', (d) => d],
  ];
  for (const [when, cold, code, edit] of cases) {
    it(`when ${when}, then the verdict is Incomplete with "${code}", and the typed figures are kept`, () => {
      const input = edit(hotDoc());
      const doc = applyFedFrom(input, cold);
      expect(doc.source.fedFrom!.resolution).toMatchObject({ status: 'unresolved', code });
      expect(doc.source.staticPressureLow).toBe(1);
      expect(doc.source.pressureBasis).toBe('typed');
      expect({ ...doc, source: input.source }).toEqual(input);
      const a = analyzeSystem(doc);
      expect(a.verdict.status).toBe('incomplete');
      const reason = a.verdict.incomplete.find((x) => x.code === code)!;
      expect(reason.elementType).toBe('source');
      expect(reason.message.length).toBeGreaterThan(20);
    });
  }

  it('when fedFrom was never resolved, then the verdict is Incomplete (never green on typed figures)', () => {
    const d = hotDoc();
    d.source.staticPressureLow = 500;
    d.source.staticPressureHigh = 550;
    expect(analyzeSystem(d).verdict.incomplete.map((x) => x.code)).toContain('not-yet-resolved');
  });

  it('when a document is not fed from a system, then it is returned as it is', () => {
    const d = SystemDocumentSchema.parse(oneSegment());
    expect(applyFedFrom(d, coldView())).toBe(d);
  });
});
