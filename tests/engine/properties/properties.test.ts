/**
 * Property tests (fast-check) of the analysis on generated trees (src/engine/testing/generateTree.ts).
 * These are physical consistency properties of the model (common practice of hydraulics), not
 * published values. Tolerances: 1e-9 relative absorbs floating-point reordering, nothing more.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, type Analysis, type SystemDocumentInput } from '../../../src/engine';
import { generateRandomTree, mulberry32 } from '../../../src/engine/testing/generateTree';
import { expectClose } from '../../helpers/expectClose';

const FITTINGS = ['elbow-90-standard', 'tee-run', 'tee-branch', 'valve-globe'];
const RTOL = 1e-9;

function tree(seed: number, segments: number): SystemDocumentInput {
  return generateRandomTree(mulberry32(seed), { segments, fittingTypes: FITTINGS, frictionMethod: 'colebrook' });
}

function pressures(a: Analysis): Map<string, number> {
  return new Map(a.si.nodes.map((n) => [n.id, n.pressure]));
}

/** No node's pressure may be higher after the change than before (within rounding). */
function expectNoRise(before: Analysis, after: Analysis) {
  const p0 = pressures(before);
  for (const [id, p1] of pressures(after)) {
    const p = p0.get(id)!;
    expect(p1).toBeLessThanOrEqual(p + RTOL * Math.abs(p) + 1e-9);
  }
}

const seedAndPick = fc.record({ seed: fc.integer({ min: 1, max: 1e9 }), size: fc.integer({ min: 2, max: 60 }), pick: fc.nat() });

describe('monotonicity: more resistance or more height never raises a residual', () => {
  it('a longer segment', () => {
    fc.assert(
      fc.property(seedAndPick, fc.double({ min: 1.01, max: 4, noNaN: true }), ({ seed, size, pick }, factor) => {
        const d = tree(seed, size);
        const before = analyzeSystem(d);
        const seg = d.segments[pick % d.segments.length];
        seg.length *= factor;
        expectNoRise(before, analyzeSystem(d));
      }),
      { numRuns: 60 },
    );
  });

  it('a smaller diameter', () => {
    fc.assert(
      fc.property(seedAndPick, fc.double({ min: 0.5, max: 0.99, noNaN: true }), ({ seed, size, pick }, factor) => {
        const d = tree(seed, size);
        const before = analyzeSystem(d);
        const seg = d.segments[pick % d.segments.length];
        seg.custom!.innerDiameter *= factor;
        expectNoRise(before, analyzeSystem(d));
      }),
      { numRuns: 60 },
    );
  });

  it('an extra fitting', () => {
    fc.assert(
      fc.property(seedAndPick, fc.constantFrom(...FITTINGS), ({ seed, size, pick }, typeId) => {
        const d = tree(seed, size);
        const before = analyzeSystem(d);
        const seg = d.segments[pick % d.segments.length];
        seg.fittings = [...(seg.fittings ?? []), { typeId, count: 1 }];
        expectNoRise(before, analyzeSystem(d));
      }),
      { numRuns: 60 },
    );
  });

  it('a higher fixture (any node raised)', () => {
    fc.assert(
      fc.property(seedAndPick, fc.double({ min: 0.01, max: 10, noNaN: true }), ({ seed, size, pick }, dz) => {
        const d = tree(seed, size);
        const before = analyzeSystem(d);
        const node = d.nodes[1 + (pick % (d.nodes.length - 1))]; // not the source
        // Document version 2: the random tree places each node by its feed segment's rise; raising
        // that rise raises the node (and, with it, the nodes below it).
        const feed = d.segments.find((s) => s.to === node.id)!;
        feed.rise = (feed.rise ?? 0) + dz;
        const after = analyzeSystem(d);
        expectNoRise(before, after);
        const p0 = before.si.nodes.find((n) => n.id === node.id)!.pressure;
        const p1 = after.si.nodes.find((n) => n.id === node.id)!.pressure;
        expect(p1).toBeLessThan(p0);
      }),
      { numRuns: 60 },
    );
  });
});

describe('conservation', () => {
  it('flow is conserved at every node: inflow = demand drawn there + outflows (continuous demands)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 1, max: 300 }), (seed, size) => {
        const d = tree(seed, size);
        const a = analyzeSystem(d);
        const out = new Map<string, number>();
        for (const s of a.si.segments) out.set(s.from, (out.get(s.from) ?? 0) + s.designFlow);
        const demand = new Map(d.nodes.map((n) => [n.id, ((n.continuousDemand ?? 0) as number) / 1000]));
        for (const s of a.si.segments) {
          expectClose(s.designFlow, demand.get(s.to)! + (out.get(s.to) ?? 0), { rtol: 1e-12, atol: 1e-18 }, `node ${s.to}`);
        }
        // At the source everything leaving equals the source's design flow.
        expectClose(out.get(a.si.source.nodeId)!, a.si.source.designFlow, { rtol: 1e-12 }, 'source');
      }),
      { numRuns: 40 },
    );
  });
});

describe('order independence', () => {
  it('the result does not depend on the order in which segments, nodes and fittings are listed', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 2, max: 80 }), fc.integer({ min: 1, max: 1e9 }), (seed, size, shuffleSeed) => {
        const d = tree(seed, size);
        // Give some nodes fixtures so the fixture-unit path is exercised too.
        d.nodes.forEach((n, i) => {
          if (i % 3 === 1) {
            n.fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 1 + (i % 4) }];
            n.checkedFixtures = [{ id: `fx${i}`, fixtureTypeId: 'lavatory-private' }];
          }
        });
        const a = analyzeSystem(d);
        const rng = mulberry32(shuffleSeed);
        const shuffle = <T>(xs: T[]): T[] => {
          const c = [...xs];
          for (let i = c.length - 1; i > 0; i--) {
            const j = Math.floor(rng() * (i + 1));
            [c[i], c[j]] = [c[j], c[i]];
          }
          return c;
        };
        const e = structuredClone(d);
        e.segments = shuffle(e.segments);
        e.nodes = shuffle(e.nodes);
        for (const s of e.segments) s.fittings = shuffle(s.fittings ?? []);
        const b = analyzeSystem(e);
        const bNodes = new Map(b.si.nodes.map((n) => [n.id, n]));
        for (const n of a.si.nodes) expectClose(bNodes.get(n.id)!.pressure, n.pressure, { rtol: RTOL, atol: 1e-6 }, `node ${n.id}`);
        const bSegs = new Map(b.si.segments.map((s) => [s.id, s]));
        for (const s of a.si.segments) expectClose(bSegs.get(s.id)!.designFlow, s.designFlow, { rtol: RTOL }, `flow ${s.id}`);
        expect(b.criticalFixtureId).toBe(a.criticalFixtureId);
      }),
      { numRuns: 40 },
    );
  });
});
