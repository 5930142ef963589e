import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, safeAnalyzeSystem, ledgerFor, formatLedger, type Analysis } from '../../../src/engine';
import { waterProperties } from '../../../src/engine/water';
import { colebrook } from '../../../src/engine/friction';
import { fittingK } from '../../../src/engine/fittings';
import { pipeSize } from '../../../src/engine/catalog/materials';
import { flowTestPressureAt } from '../../../src/engine/supply/flowTest';
import { G, PA_PER_PSI, M3S_PER_GPM } from '../../../src/engine/units';
import { expectClose } from '../../helpers/expectClose';
import { clone, oneSegment, smallTree } from '../support/docs';

const EXAMPLES = ['alder-finch-cold', 'alder-finch-hot', 'small-house'];
const loadExample = (name: string): unknown => JSON.parse(readFileSync(new URL(`../../../src/engine/examples/${name}.json`, import.meta.url), 'utf8'));

function allNumbers(value: unknown, out: number[] = []): number[] {
  if (typeof value === 'number') out.push(value);
  else if (Array.isArray(value)) for (const v of value) allNumbers(v, out);
  else if (value && typeof value === 'object') for (const v of Object.values(value)) allNumbers(v, out);
  return out;
}

describe('worked single segment [COMP: consistency check with the correlations written out, not an authority]', () => {
  it('residual = source − friction − fittings − rise, each from the published formula', () => {
    const a = analyzeSystem(oneSegment());
    // Independent computation with A's correlation functions, step by step.
    const water = waterProperties(20);
    const D = pipeSize('copper-l', '3/4')!.innerDiameterM;
    const Q = 0.5e-3; // 0.5 L/s continuous demand
    const V = Q / ((Math.PI * D * D) / 4);
    const Re = (V * D) / water.kinematicViscosity;
    const f = colebrook(Re, 1.5e-6 / D); // copper roughness 1.5e-6 m (catalog value, drawn tubing)
    const dyn = 0.5 * water.density * V * V;
    const friction = f * (20 / D) * dyn;
    const K = 2 * fittingK('elbow-90-standard', { method: 'crane', innerDiameterM: D, nominalSizeIn: 0.75, nominalSizeKey: '3/4', Re, frictionFactor: f }).K;
    const rise = water.density * G * 3;
    const residual = 400e3 - friction - K * dyn - rise;
    const s = a.si.segments[0];
    // rtol 1e-12: the same arithmetic in a different order; only rounding may differ.
    expectClose(s.velocity, V, { rtol: 1e-12 }, 'velocity');
    expectClose(s.reynolds, Re, { rtol: 1e-12 }, 'Re');
    expectClose(s.frictionFactor, f, { rtol: 1e-12 }, 'f');
    expectClose(s.frictionLoss, friction, { rtol: 1e-12 }, 'friction');
    expectClose(s.totalK, K, { rtol: 1e-12 }, 'K');
    expectClose(s.riseLoss, rise, { rtol: 1e-12 }, 'rise');
    expectClose(a.si.fixtures[0].residual, residual, { rtol: 1e-12 }, 'residual');
    // Display units: kPa in an SI document.
    expectClose(a.fixtures[0].residual, residual / 1000, { rtol: 1e-12 }, 'residual kPa');
    expect(a.segments[0].regime).toBe('turbulent');
  });

  it('a foot of rise costs 0.433 psi (IPC E103.2.2: 20 ft → 8.66 psi; common practice)', () => {
    const d = clone(oneSegment());
    d.unitSystem = 'US';
    d.waterTemperature = 60;
    d.source = { kind: 'utility-main', nodeId: 'src', staticPressureLow: 60, staticPressureHigh: 60, pressureBasis: 'test' };
    delete d.nodes[1].elevation; // placed by the typed rise (document version 2)
    d.nodes[1].continuousDemand = 5;
    d.segments[0].rise = 20;
    const a = analyzeSystem(d);
    // 8.66 psi is printed to 3 significant figures; at 60 °F ρg gives 0.4331 psi/ft → 8.662.
    expectClose(a.segments[0].riseLoss, 8.66, { rtol: 1e-3 }, 'rise loss psi');
  });
});

describe('pressure ledger', () => {
  it('its lines add up exactly (bit for bit, in SI) to the residual, for every fixture of the demo building', () => {
    const a = analyzeSystem(loadExample('alder-finch-cold'));
    for (const fx of a.si.fixtures) {
      const l = ledgerFor(a, fx.id);
      expect(l.residualSI).toBe(fx.residual); // exactness is the claim: the same subtractions in the same order
      expect(l.lines[l.lines.length - 1].pressureAfterSI).toBe(fx.residual);
      let p = 0;
      for (const line of l.lines) p = line.kind === 'start' ? line.changeSI : p + line.changeSI;
      expect(p).toBe(fx.residual);
      // Display lines: each converted on its own; they sum to the displayed residual within rounding.
      const sumDisplay = l.lines.reduce((acc, line) => acc + line.change, 0);
      expectClose(sumDisplay, l.residual, { rtol: 1e-9, atol: 1e-9 }, `ledger ${fx.id}`);
    }
  });

  it('lists the devices, then friction, fittings and rise of each segment on the path, in order', () => {
    const a = analyzeSystem(loadExample('alder-finch-cold'));
    const l = ledgerFor(a, a.criticalFixtureId!);
    expect(l.lines[0].kind).toBe('start');
    const devices = l.lines.filter((x) => x.kind === 'device').map((x) => x.elementId);
    expect(devices).toEqual(['meter', 'rp-assembly', 'booster']);
    const fx = a.fixtures.find((f) => f.id === a.criticalFixtureId)!;
    expect(l.lines.filter((x) => x.kind === 'friction').map((x) => x.segmentId)).toEqual(fx.path);
    expect(formatLedger(l, a)).toContain('Margin');
  });
});

describe('examples', () => {
  for (const name of EXAMPLES) {
    it(`${name}: analyses with finite numbers only, and every fixture has a path from the source`, () => {
      const a = analyzeSystem(loadExample(name));
      for (const v of allNumbers(a)) expect(Number.isFinite(v)).toBe(true);
      for (const fx of a.fixtures) {
        expect(fx.path.length).toBeGreaterThan(0);
        const first = a.segments.find((s) => s.id === fx.path[0])!;
        expect(first.from).toBe(a.source.nodeId);
      }
      expect(a.criticalFixtureId).not.toBeNull();
      expect(a.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    });
  }

  it('the demo building: the top-floor shower is critical with a modest margin; a grade flush valve is the runner-up', () => {
    const a = analyzeSystem(loadExample('alder-finch-cold'));
    const byMargin = [...a.fixtures].sort((x, y) => x.margin - y.margin);
    expect(a.criticalFixtureId).toBe(byMargin[0].id);
    expect(byMargin[0].id).toBe('shower-704');
    expect(byMargin[0].margin).toBeGreaterThan(0);
    expect(byMargin[0].margin).toBeLessThan(10); // psi: "modest" for the demo
    // the grade's flush valve follows the top floor's showers (the level-7 bathroom lines are 1 in to pass with PEX insert fittings)
    expect(byMargin.slice(0, 5).map((f) => f.id)).toContain('retail-wc-2');
    expect(a.verdict.allFixturesPass).toBe(true);
  });
});

describe('critical fixture', () => {
  it('is the smallest margin; the result says when it is not the highest, not the farthest, or not the expected one', () => {
    const d = clone(smallTree());
    // Make the low hose bibb at d need far more pressure than the rest: it becomes critical.
    d.nodes[4].checkedFixtures = [{ id: 'fd', fixtureTypeId: 'hose-bibb', minFlowPressure: 490 }];
    d.nodes[3].checkedFixtures = [{ id: 'fc', fixtureTypeId: 'kitchen-sink-private', expectedCritical: true }];
    d.segments[3].length = 5; // d is no longer the farthest
    const a = analyzeSystem(d);
    expect(a.criticalFixtureId).toBe('fd');
    const codes = a.warnings.filter((w) => w.elementId === 'fd').map((w) => w.code);
    expect(codes).toContain('critical-not-highest');
    expect(codes).toContain('critical-not-farthest');
    expect(codes).toContain('critical-not-expected');
    expect(codes).toContain('residual-below-minimum');
    const fd = a.fixtures.find((f) => f.id === 'fd')!;
    expect(fd.pass).toBe(false);
    expectClose(fd.margin, fd.residual - 490, { rtol: 1e-12 }, 'margin');
  });
});

describe('devices and source', () => {
  it('a PRV passes min(inlet, set − fall-off·Q) and caps the static pressure downstream', () => {
    const d = clone(oneSegment());
    d.source.staticPressureLow = 700;
    d.source.staticPressureHigh = 800;
    d.devices = [{ id: 'prv', kind: 'prv', label: 'PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 0 }, prv: { setPressure: 350, falloffPerFlow: 20 } }];
    const a = analyzeSystem(d);
    const s = a.segments[0];
    // outlet of the PRV = 350 − 20 kPa/(L/s)·0.5 L/s = 340 kPa; loss = 700 − 340.
    expectClose(s.devices[0].loss, 360, { rtol: 1e-12 }, 'PRV loss');
    expectClose(s.outletPressure, 340 - s.frictionLoss - s.fittingLoss - s.riseLoss, { rtol: 1e-12 }, 'outlet');
    const end = a.nodes.find((n) => n.id === 'end')!;
    expectClose(end.staticPressureHigh, 350 - s.riseLoss, { rtol: 1e-12 }, 'static after PRV');
    // With the inlet below the set pressure the PRV passes its inlet (no loss).
    d.source.staticPressureLow = 300;
    const b = analyzeSystem(d);
    expect(b.segments[0].devices[0].loss).toBe(0);
    expect(b.warnings.map((w) => w.code)).toContain('prv-inlet-below-set');
  });

  it('without a PRV, a high static over the maximum is flagged where the fixtures are', () => {
    const d = clone(oneSegment());
    d.source.staticPressureHigh = 700; // kPa, above 80 psi ≈ 551.6 kPa
    d.source.staticPressureLow = 650;
    const a = analyzeSystem(d);
    expect(a.warnings.some((w) => w.code === 'static-over-max' && w.elementId === 'end')).toBe(true);
    expect(a.verdict.allStaticPass).toBe(false);
  });

  it('with a flow test, the start pressure follows NFPA 291 at the design flow', () => {
    const d = clone(oneSegment());
    d.unitSystem = 'US';
    d.waterTemperature = 55;
    d.nodes[1].continuousDemand = 40; // gpm
    d.source = {
      kind: 'utility-main',
      nodeId: 'src',
      staticPressureLow: 70,
      staticPressureHigh: 75,
      pressureBasis: 'hydrant flow test',
      flowTest: { staticPressure: 72, residualPressure: 55, flow: 1000 },
    };
    const a = analyzeSystem(d);
    const expected = flowTestPressureAt(40 * M3S_PER_GPM, { staticPa: 72 * PA_PER_PSI, residualPa: 55 * PA_PER_PSI, testFlowM3s: 1000 * M3S_PER_GPM });
    expectClose(a.si.source.pressureAtDesignFlow, expected, { rtol: 1e-12 }, 'start');
    // Hand check: 72 − 17·(40/1000)^1.85 = 72 − 0.0431 psi (plain arithmetic).
    expectClose(a.source.pressureAtDesignFlow, 72 - 17 * (40 / 1000) ** 1.85, { rtol: 1e-12 }, 'start psi');
    expect(a.source.pressureBasis).toBe('flow-test');
    expect(a.warnings.map((w) => w.code)).toContain('flow-test-static-above-low');
  });

  it('a device curve used beyond its last point is extrapolated and flagged', () => {
    const d = clone(oneSegment());
    d.devices = [
      {
        id: 'm',
        kind: 'meter',
        label: 'Meter',
        segmentId: 's1',
        loss: {
          kind: 'curve',
          points: [
            { flow: 0.1, loss: 2 },
            { flow: 0.25, loss: 10 },
          ],
        },
      },
    ];
    const a = analyzeSystem(d);
    expect(a.segments[0].devices[0].extrapolated).toBe(true);
    expect(a.warnings.some((w) => w.code === 'device-curve-extrapolated' && w.elementId === 'm')).toBe(true);
    // Beyond the last point the loss grows with Q² from it: 10·(0.5/0.25)² = 40 kPa (contract of lossCurveAt).
    expectClose(a.segments[0].devices[0].loss, 40, { rtol: 1e-9 }, 'extrapolated loss');
    // Within the curve there is no flag.
    d.devices[0].loss = {
      kind: 'curve',
      points: [
        { flow: 0.25, loss: 3 },
        { flow: 1, loss: 30 },
      ],
    };
    const b = analyzeSystem(d);
    expect(b.segments[0].devices[0].extrapolated).toBe(false);
  });

  it('a booster adds its gain to the residual and to the static pressure', () => {
    const d = clone(oneSegment());
    const base = analyzeSystem(d);
    d.devices = [{ id: 'bp', kind: 'booster-pump', label: 'Booster', segmentId: 's1', loss: { kind: 'fixed', loss: 5 }, boost: { gain: 100 } }];
    const a = analyzeSystem(d);
    expectClose(a.fixtures[0].residual, base.fixtures[0].residual + 95, { rtol: 1e-12 }, 'boosted residual');
  });
});

describe('demand', () => {
  it('fixture units accumulate downstream; a flush valve downstream selects the flush-valve curve', () => {
    const d = clone(smallTree());
    d.nodes[2].fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 4 }];
    d.nodes[4].fixtureGroups = [{ fixtureTypeId: 'water-closet-flush-valve-public', count: 1 }];
    const a = analyzeSystem(d);
    const seg = (id: string) => a.segments.find((s) => s.id === id)!;
    expectClose(seg('sa').wsfu, seg('sb').wsfu + seg('sd').wsfu, { rtol: 1e-12 }, 'wsfu conserved at a');
    expect(seg('sa').demandCurve).toBe('flush-valve');
    expect(seg('sb').demandCurve).toBe('flush-tank');
    expect(seg('sd').demandCurve).toBe('flush-valve');
  });

  it('a flow override replaces the design flow of that segment only', () => {
    const d = clone(smallTree());
    d.segments[1].flowOverride = 2;
    const a = analyzeSystem(d);
    expect(a.segments[1].designFlow).toBe(2);
    expect(a.segments[1].flowBasis).toBe('override');
    expectClose(a.segments[0].designFlow, 0.9, { rtol: 1e-12 }, 'upstream keeps the demand sum');
  });

  it('binomial method needs usage data, and gives a flow no larger than all fixtures at once', () => {
    const d = clone(smallTree());
    d.criteria = { demandMethod: 'hunter-binomial' };
    d.nodes[2].fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 10, usage: { flow: 0.1, durationSeconds: 60, recurrenceSeconds: 300 } }];
    const a = analyzeSystem(d);
    const sb = a.segments.find((s) => s.id === 'sb')!;
    expect(sb.flowBasis).toBe('binomial');
    expect(sb.designFlow).toBeLessThanOrEqual(10 * 0.1 + 0.5 + 1e-12);
    expect(sb.designFlow).toBeGreaterThan(0.5);
    delete d.nodes[2].fixtureGroups[0].usage;
    expect(() => analyzeSystem(d)).toThrow(/binomial/);
  });
});

describe('results', () => {
  it('come in the document units and in SI; the two agree through units.ts', () => {
    const a: Analysis = analyzeSystem(loadExample('alder-finch-cold'));
    expect(a.units.pressure).toBe('psi');
    const k = a.fixtures.length - 1;
    expectClose(a.fixtures[k].residual * PA_PER_PSI, a.si.fixtures[k].residual, { rtol: 1e-12 }, 'psi ↔ Pa');
    expect(a.methods.friction.source).toMatch(/Colebrook/);
  });

  it('a rise on a segment whose downstream node has an elevation is refused: one position per node (document version 2)', () => {
    // Version 1 flagged a disagreeing rise and used the elevations; version 2 cannot hold the contradiction.
    const d = clone(oneSegment());
    d.segments[0].rise = 5;
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('rise-and-elevation');
      expect(r.error.elementId).toBe('s1');
      expect(r.error.message).toContain('"end"');
    }
  });
});
