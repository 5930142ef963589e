import { describe, expect, it } from 'vitest';
import { analyzeSystem, applyFedFrom, closedSystemCheck, type ColdSupplyView, type SystemDocument } from '../../../src/engine';
import { SystemDocumentSchema, type SystemDocumentInput } from '../../../src/engine/model/schema';
import { closingElementsUpstream } from '../../../src/engine/hotWater/fedFrom';
import { RETURN_FRICTION_LIMIT_PA_PER_M } from '../../../src/engine/hotWater/recirculation';
import { MATERIALS } from '../../../src/engine/catalog/materials';
import { expectClose } from '../../helpers/expectClose';
import { clone, smallTree } from '../support/docs';

// Invented systems only. Constants, each with its source:
const M_PER_FT = 0.3048; // exact (NIST SP 811 (2008) App. B.8)
const PA_PER_PSI = 6894.757293168; // 0.45359237 kg × 9.80665 m/s² / 0.0254² m² (NIST SP 811 App. B.8 lists 6.894757 E+03)
const M3S_PER_GPM = 3.785411784e-3 / 60; // 1 US gal = 3.785411784 L exactly (NIST SP 811 App. B.8)
// Water at 120 °F, 1 atm (IAPWS-95, 6 figures): 61.7121 lbm/ft³, kinematic viscosity 6.0636e-6 ft²/s.
const RHO_120F_LB_FT3 = 61.7121;
const NU_120F_FT2_S = 6.0636e-6;

/** Darcy–Weisbach with the Swamee & Jain (1976) factor, written out here; copper's roughness from the materials catalog. */
function gradient(q: number, d: number): { v: number; dpdx: number } {
  const rho = (RHO_120F_LB_FT3 * 0.45359237) / M_PER_FT ** 3;
  const nu = NU_120F_FT2_S * M_PER_FT ** 2;
  const eps = MATERIALS['copper-l'].roughnessM;
  const v = q / ((Math.PI * d * d) / 4);
  const re = (v * d) / nu;
  const f = 0.25 / Math.log10(eps / (3.7 * d) + 5.74 / re ** 0.9) ** 2;
  return { v, dpdx: ((f / d) * (rho * v * v)) / 2 };
}

/**
 * A hot system (US, 120 °F) whose heater is its source node "heater", one riser to "top", and a loop:
 * 100 ft of 1-1/2 in copper L out to "top" (20 Btu/h per ft), 60 ft of return to "r1" (1,200 Btu/h
 * given), 40 ft of return back to the heater (20 Btu/h per ft): 4,000 Btu/h in all, 10 °F drop.
 */
function hotWithLoop(loop: Partial<NonNullable<SystemDocumentInput['recirculation']>> = {}): SystemDocumentInput {
  return {
    schemaVersion: 2,
    id: 'hot-loop',
    name: 'Wrenmoor Bathhouse hot water',
    service: 'hot',
    unitSystem: 'US',
    waterTemperature: 120,
    source: { kind: 'tank', nodeId: 'heater', staticPressureLow: 60, staticPressureHigh: 65, pressureBasis: 'invented test figure' },
    devices: [],
    nodes: [
      { id: 'heater', label: 'Heater outlet', elevation: 0 },
      { id: 'top', label: 'Top floor', elevation: 20, continuousDemand: 2, checkedFixtures: [{ id: 'lav', fixtureTypeId: 'lavatory-private' }] },
    ],
    segments: [{ id: 'riser', from: 'heater', to: 'top', material: 'copper-l', size: '1-1/2', length: 100, fittings: [] }],
    recirculation: {
      segments: [
        { id: 'out', label: 'Supply to the top', from: 'heater', to: 'top', length: 100, material: 'copper-l', size: '1-1/2' },
        { id: 'back1', label: 'Return down the riser', from: 'top', to: 'r1', length: 60, material: 'copper-l', heatLoss: 1200 },
        { id: 'back2', label: 'Return to the heater', from: 'r1', to: 'heater', length: 40, material: 'copper-l' },
      ],
      heatLossPerLength: 20,
      temperatureDrop: 10,
      heaterLoss: 2,
      ...loop,
    },
  };
}

function loopOf(doc: SystemDocumentInput) {
  const a = analyzeSystem(doc);
  if (!a.recirculation) throw new Error('expected a recirculation result');
  return { a, r: a.recirculation };
}

describe('the recirculation loop of a hot system (post-pass of the analysis)', () => {
  it('loop flow against the hand calculation: 4,000 Btu/h at 10 °F → gpm = H / (8.2498 lb/gal × 60 × ΔT), and the 500 form within 2 %', () => {
    const { a, r } = loopOf(hotWithLoop());
    if (!r.ok) throw new Error(r.error.message);
    // 100 ft × 20 + 1,200 + 40 ft × 20 = 4,000 Btu/h.
    expectClose(r.heatLoss, 4000, { rtol: 1e-12 }, 'Btu/h');
    // lb per gal at 120 °F = 61.7121 × 231 / 1728 (1 gal = 231 in³, exact); c = 1 Btu/(lb·°F).
    const lbPerGal = (RHO_120F_LB_FT3 * 231) / 1728;
    expectClose(r.flow, 4000 / (lbPerGal * 60 * 10), { rtol: 1e-5 }, 'gpm (6-figure density)');
    // The manufacturer's form gpm = Btu/h / (500·ΔT) (Rinnai R-TRWH-E-02 Rev D, p. 8) rounds 8.33 lb/gal (60 °F water): 2 %.
    expectClose(r.flow, 4000 / (500 * 10), { rtol: 0.02 }, 'gpm (500 form)');
    expect(r.pumpFlow).toBe(r.flow);
    expect(r.units).toMatchObject({ flow: 'gpm', pressure: 'psi', length: 'ft', heat: 'Btu/h' });
    // The rest of the analysis is the same as without the loop.
    const without = hotWithLoop();
    delete without.recirculation;
    expect(a.fixtures).toEqual(analyzeSystem(without).fixtures);
    expect(a.verdict.status).toBe(analyzeSystem(without).verdict.status);
  });

  it('the returns are the smallest copper L within 5 ft/s (NSPC 10.14.1, hot copper) and 3 psi/100 ft; the given supply size is kept', () => {
    const { r } = loopOf(hotWithLoop());
    if (!r.ok) throw new Error(r.error.message);
    const [out, back1, back2] = r.pipes;
    expect(out).toMatchObject({ segmentId: 'out', size: '1-1/2', sizeChosen: false });
    expect(back1.sizeChosen && back2.sizeChosen).toBe(true);
    const sizes = [...MATERIALS['copper-l'].sizes].sort((x, y) => x.innerDiameterM - y.innerDiameterM);
    const q = r.pumpFlow * M3S_PER_GPM;
    for (const p of [back1, back2]) {
      const i = sizes.findIndex((z) => z.key === p.size);
      const g = gradient(q, sizes[i].innerDiameterM);
      expect(g.v).toBeLessThanOrEqual(5 * M_PER_FT);
      expect(g.dpdx).toBeLessThanOrEqual(RETURN_FRICTION_LIMIT_PA_PER_M);
      if (i > 0) {
        const smaller = gradient(q, sizes[i - 1].innerDiameterM);
        expect(smaller.v > 5 * M_PER_FT || smaller.dpdx > RETURN_FRICTION_LIMIT_PA_PER_M).toBe(true);
      }
      // Reported in the document's units: ft/s; 6-figure water table: 1e-3.
      expectClose(p.velocity, g.v / M_PER_FT, { rtol: 1e-3 }, 'ft/s');
      expectClose(p.velocityLimit, 5, { rtol: 1e-12 }, 'limit, ft/s');
      expect(p.withinLimits).toBe(true);
    }
    console.log(`loop flow ${r.flow.toFixed(3)} gpm; returns ${back1.size} in and ${back2.size} in`);
  });

  it('pump head = Σ friction × 1.25 + heater loss (2 psi), and as feet of 120 °F water: psi × 144 / 61.7121', () => {
    const { r } = loopOf(hotWithLoop());
    if (!r.ok) throw new Error(r.error.message);
    const q = r.pumpFlow * M3S_PER_GPM;
    const lengthsFt = [100, 60, 40];
    let frictionPa = 0;
    r.pipes.forEach((p, i) => {
      const d = MATERIALS['copper-l'].sizes.find((z) => z.key === p.size)!.innerDiameterM;
      frictionPa += gradient(q, d).dpdx * lengthsFt[i] * M_PER_FT;
    });
    const headPsi = (frictionPa * 1.25) / PA_PER_PSI + 2;
    // Density and viscosity from a 6-figure table: 1e-3 relative.
    expectClose(r.pumpHead, headPsi, { rtol: 1e-3 }, 'pump head, psi');
    // 1 psi = 144 lbf/ft²; a column of 61.7121 lbm/ft³ under standard gravity: h = p × 144 / ρ ft.
    expectClose(r.pumpHeadLength, (r.pumpHead * 144) / RHO_120F_LB_FT3, { rtol: 1e-5 }, 'pump head, ft');
    console.log(`pump ${r.pumpFlow.toFixed(3)} gpm at ${r.pumpHead.toFixed(3)} psi (${r.pumpHeadLength.toFixed(2)} ft)`);
  });

  it('the same loop in SI units gives the same flow and head, converted (1 Btu_IT/h = 0.29307107 W, NIST SP 811 App. B.8)', () => {
    const us = loopOf(hotWithLoop()).r;
    const si = hotWithLoop();
    si.unitSystem = 'SI';
    si.waterTemperature = (120 - 32) / 1.8;
    si.source = { ...si.source, staticPressureLow: (60 * PA_PER_PSI) / 1000, staticPressureHigh: (65 * PA_PER_PSI) / 1000 };
    si.nodes = si.nodes.map((n) => ({
      ...n,
      elevation: (n.elevation ?? 0) * M_PER_FT,
      continuousDemand: n.continuousDemand === undefined ? undefined : n.continuousDemand * M3S_PER_GPM * 1000,
    }));
    si.segments = si.segments.map((s) => ({ ...s, length: s.length * M_PER_FT }));
    const wPerBtuH = 1055.05585262 / 3600;
    si.recirculation = {
      ...si.recirculation!,
      segments: si.recirculation!.segments.map((s) => ({
        ...s,
        length: s.length * M_PER_FT,
        heatLoss: s.heatLoss === undefined ? undefined : s.heatLoss * wPerBtuH,
      })),
      heatLossPerLength: (20 * wPerBtuH) / M_PER_FT,
      temperatureDrop: 10 / 1.8,
      heaterLoss: (2 * PA_PER_PSI) / 1000,
    };
    const r = loopOf(si).r;
    if (!r.ok || !us.ok) throw new Error('expected both computed');
    expect(r.units).toMatchObject({ flow: 'L/s', pressure: 'kPa', heat: 'W' });
    // Exact conversions both ways: only floating-point rounding differs.
    expectClose(r.heatLoss, 4000 * wPerBtuH, { rtol: 1e-9 }, 'W');
    expectClose(r.flow, us.flow * M3S_PER_GPM * 1000, { rtol: 1e-9 }, 'L/s');
    expectClose(r.pumpHead, (us.pumpHead * PA_PER_PSI) / 1000, { rtol: 1e-9 }, 'kPa');
    expect(r.pipes.map((p) => p.size)).toEqual(us.pipes.map((p) => p.size));
  });

  it('a document without a loop has no recirculation result', () => {
    const doc = hotWithLoop();
    delete doc.recirculation;
    expect(analyzeSystem(doc).recirculation).toBeUndefined();
  });
});

describe('a loop that cannot be computed: a named error, the rest of the analysis shown, never green', () => {
  const cases: [string, Partial<NonNullable<SystemDocumentInput['recirculation']>>, string, string | RegExp][] = [
    [
      'the return does not come back to the heater',
      {
        segments: [
          hotWithLoop().recirculation!.segments[0],
          hotWithLoop().recirculation!.segments[1],
          { ...hotWithLoop().recirculation!.segments[2], to: 'basement' },
        ],
      },
      'loop-not-closed',
      'recirculation.segments',
    ],
    ['the loop does not start at the heater', { segments: hotWithLoop().recirculation!.segments.slice(1) }, 'loop-not-closed', 'recirculation.segments'],
    ['a temperature drop of zero', { temperatureDrop: 0 }, 'temperature-drop-not-positive', 'recirculation.temperatureDrop'],
    ['a negative temperature drop', { temperatureDrop: -5 }, 'temperature-drop-not-positive', 'recirculation.temperatureDrop'],
    [
      'an unknown material',
      { segments: hotWithLoop().recirculation!.segments.map((s) => (s.id === 'back2' ? { ...s, material: 'brass-unobtainium' } : s)) },
      'unknown-catalog-entry',
      'recirculation.segments[2].material',
    ],
    ['no heat loss for a pipe', { heatLossPerLength: undefined }, 'heat-loss-missing', /^recirculation\.segments\[0\]\.heatLoss$/],
  ];
  for (const [what, change, code, field] of cases) {
    it(`when ${what}, then ${code} naming ${String(field)}`, () => {
      const { a, r } = loopOf(hotWithLoop(change));
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.error.code).toBe(code);
      if (typeof field === 'string') expect(r.error.field).toBe(field);
      else expect(r.error.field).toMatch(field);
      // The rest stands: every checked fixture still computed.
      expect(a.fixtures.map((f) => f.id)).toEqual(['lav']);
      expect(Number.isFinite(a.fixtures[0].residual)).toBe(true);
      // Never green: Incomplete, with the reason naming the loop and the field.
      expect(a.verdict.status).toBe('incomplete');
      const reason = a.verdict.incomplete.find((x) => x.code === 'recirculation-not-computed');
      expect(reason?.message).toContain('Recirculation loop');
      expect(reason?.message).toContain(r.error.field ?? '');
    });
  }

  it('the heater is the source node: a loop from another node is named as not closed, with the node', () => {
    const { r } = loopOf(
      hotWithLoop({
        segments: hotWithLoop().recirculation!.segments.map((s) => ({
          ...s,
          from: s.from === 'heater' ? 'boiler' : s.from,
          to: s.to === 'heater' ? 'boiler' : s.to,
        })),
      }),
    );
    if (r.ok) throw new Error('expected an error');
    expect(r.error.message).toContain('"heater"');
  });
});

describe('the closed-system check across the cold system (fedFrom)', () => {
  /** The small cold tree with an RP assembly on its first segment, a PRV on the side branch to "d", and a check valve on "sb". */
  function coldDoc(): SystemDocumentInput {
    const d = clone(smallTree());
    d.devices = [
      { id: 'rp', kind: 'backflow-preventer', label: 'RP assembly at the meter', segmentId: 'sa', loss: { kind: 'fixed', loss: 70 } },
      { id: 'prv-d', kind: 'prv', label: 'Hose branch PRV', segmentId: 'sd', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 300, falloffPerFlow: 0 } },
    ];
    d.segments = d.segments.map((s) => (s.id === 'sb' ? { ...s, fittings: [...(s.fittings ?? []), { typeId: 'valve-check-swing', count: 1 }] } : s));
    return d;
  }
  const view = (doc: SystemDocumentInput, withDocument = true): ColdSupplyView => ({
    systemId: 'cold-1',
    name: 'Bathhouse cold',
    service: 'cold',
    revision: { number: 1, status: 'draft', analysis: { ok: true, analysis: analyzeSystem(doc) }, ...(withDocument ? { document: doc } : {}) },
  });
  function hotFedFrom(nodeId: string): SystemDocument {
    const d = SystemDocumentSchema.parse({
      ...hotWithLoop(),
      unitSystem: 'SI',
      waterTemperature: 60,
      source: { kind: 'tank', nodeId: 'heater', staticPressureLow: 1, staticPressureHigh: 2, pressureBasis: 'typed', fedFrom: { systemId: 'cold-1', nodeId } },
    });
    delete d.recirculation;
    d.nodes = d.nodes.map((n) => ({ ...n, elevation: 0, continuousDemand: 0.1 }));
    d.segments = d.segments.map((s) => ({ ...s, length: 30 }));
    return d;
  }

  it('only the elements on the path from the cold source to the feed node count, source first', () => {
    const a = analyzeSystem(coldDoc());
    expect(closingElementsUpstream(a, 'c', coldDoc()).map((c) => [c.kind, c.elementId])).toEqual([
      ['backflow-preventer', 'rp'],
      ['check-valve', 'sb'],
    ]);
    // The PRV on the branch to "d" is upstream of "d" only.
    expect(closingElementsUpstream(a, 'd', coldDoc()).map((c) => c.elementId)).toEqual(['rp', 'prv-d']);
    // Without the document, check valves are not known; devices still are (from the analysis).
    expect(closingElementsUpstream(a, 'c').map((c) => c.elementId)).toEqual(['rp']);
    expect(closingElementsUpstream(a, 'src', coldDoc())).toEqual([]);
  });

  it("when a cold system with an RP assembly feeds a hot system with no tank, then the hot analysis cautions, naming the cold system's device", () => {
    const hot = applyFedFrom(hotFedFrom('a'), view(coldDoc()));
    const r = hot.source.fedFrom!.resolution!;
    expect(r.status === 'resolved' && r.closedBy).toEqual([{ kind: 'backflow-preventer', elementId: 'rp', label: 'RP assembly at the meter' }]);
    const caution = analyzeSystem(hot).warnings.filter((w) => w.code === 'expansion-tank-missing');
    expect(caution).toHaveLength(1);
    expect(caution[0].detail).toContain('RP assembly at the meter');
    expect(caution[0].detail).toContain('Bathhouse cold');
    expect(closedSystemCheck(hot).closingElements[0]).toMatchObject({ elementId: 'rp', coldSystemName: 'Bathhouse cold' });
  });

  it('when the cold system has nothing that closes it upstream of the feed, then no caution (and no closedBy recorded)', () => {
    const open = clone(smallTree());
    const hot = applyFedFrom(hotFedFrom('a'), view(open));
    const r = hot.source.fedFrom!.resolution!;
    expect(r.status).toBe('resolved');
    expect('closedBy' in r).toBe(false);
    expect(analyzeSystem(hot).warnings.some((w) => w.code === 'expansion-tank-missing')).toBe(false);
  });

  it('when the hot system describes an expansion tank, then no caution although the cold side closes it', () => {
    const hot = applyFedFrom(hotFedFrom('a'), view(coldDoc()));
    hot.expansionTank = { heaterVolume: 200, coldTemperature: 10, hotTemperature: 60, supplyPressure: 400, reliefPressure: 900 };
    expect(analyzeSystem(hot).warnings.some((w) => w.code === 'expansion-tank-missing')).toBe(false);
  });
});
