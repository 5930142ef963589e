import { QueryClient } from '@tanstack/react-query';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { matchRoutes } from 'react-router-dom';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { walkPaths } from '../../src/features/walk/paths';
import { walkRoutes } from '../../src/features/walk/routes';
import { WALK_STEPS } from '../../src/features/walk/steps';
import { applySupply, supplyFormSchema } from '../../src/features/walk/steps/supply-step';
import { applyFittings, fittingsFormSchema, USUAL_SET } from '../../src/features/walk/steps/fittings-step';
import { applyRisers, risersFormSchema } from '../../src/features/walk/steps/risers-step';
import { devicesFormSchema } from '../../src/features/walk/steps/devices-step';
import { applySegmentTable, segmentTableSchema } from '../../src/features/walk/pages/segment-table-page';
import { readOnlyReasonFor } from '../../src/features/walk/components/walk-layout';
import { treeOrder } from '../../src/features/walk/lib/tree';

// The small house is the engine's invented SI example (src/engine/examples/small-house.json).
const house = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../src/engine/examples/small-house.json', import.meta.url), 'utf8')));

const routes = walkRoutes(new QueryClient());
const leaf = (url: string) => matchRoutes(routes, url)?.at(-1);

describe('walk routes', () => {
  it('when each step’s link is followed, then it reaches the step route with that step, under the revision frame', () => {
    for (const step of WALK_STEPS) {
      const match = matchRoutes(routes, walkPaths.step.getHref('p 1', 's/2', 'r?3', step.id));
      expect(match?.at(-1)?.route.path).toBe(walkPaths.step.path);
      expect(match?.at(-1)?.params).toMatchObject({ projectId: 'p 1', systemId: 's/2', revisionId: 'r?3', step: step.id });
      expect(match?.[0].route.path).toBe(walkPaths.revision.path);
    }
  });

  it('when the table, diagram, overview and compare links are followed, then each reaches its own route (not a step)', () => {
    expect(leaf(walkPaths.table.getHref('p', 's', 'r'))?.route.path).toBe(walkPaths.table.path);
    expect(leaf(walkPaths.diagram.getHref('p', 's', 'r'))?.route.path).toBe(walkPaths.diagram.path);
    expect(leaf(walkPaths.system.getHref('p', 's'))?.route.path).toBe(walkPaths.system.path);
    expect(leaf(walkPaths.compare.getHref('p', 's', 'a1', 'b2'))?.route.path).toBe(walkPaths.compare.path);
    expect(walkPaths.compare.getHref('p', 's', 'a1', 'b2')).toBe('/projects/p/systems/s/compare?a=a1&b=b2');
    expect(leaf(walkPaths.revision.getHref('p', 's', 'r'))?.route.index).toBe(true);
  });
});

describe('who may edit a revision', () => {
  it('when the revision is issued or the person is not a designer, then the steps are read-only and say why', () => {
    expect(readOnlyReasonFor({ myRole: 'designer' }, { status: 'draft', number: 2 })).toBeNull();
    expect(readOnlyReasonFor({ myRole: 'designer' }, { status: 'issued', number: 1 })).toMatch(/issued/);
    expect(readOnlyReasonFor({ myRole: 'contractor' }, { status: 'draft', number: 2 })).toMatch(/designers/);
    expect(readOnlyReasonFor({ myRole: 'inspector' }, { status: 'draft', number: 2 })).not.toBeNull();
    expect(readOnlyReasonFor({ myRole: null }, { status: 'draft', number: 2 })).not.toBeNull();
  });
});

describe('step forms write the draft the engine reads', () => {
  it('when the supply form has a high static below the low one, then that field is in error and nothing is applied', () => {
    const r = supplyFormSchema.safeParse({
      kind: 'utility-main',
      staticPressureLow: 400,
      staticPressureHigh: 300,
      pressureBasis: 'gauge',
      pressureDate: '',
      connectionElevation: 0,
      waterTemperature: 10,
      hasFlowTest: false,
      flowTest: {},
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.'))).toEqual(['staticPressureHigh']);
  });

  it('when a flow test is entered, then the document carries it, the connection node moves, and the engine uses the test', () => {
    const doc = house();
    const v = supplyFormSchema.parse({
      kind: 'utility-main',
      staticPressureLow: 380,
      staticPressureHigh: 480,
      pressureBasis: 'Hydrant test',
      pressureDate: '2026-05-01',
      connectionElevation: -1.5,
      waterTemperature: 12,
      hasFlowTest: true,
      flowTest: { staticPressure: 380, residualPressure: 300, flow: 10, date: '' },
    });
    const next = applySupply(doc, v);
    expect(next.source.flowTest).toEqual({ staticPressure: 380, residualPressure: 300, flow: 10 });
    expect(next.nodes.find((n) => n.id === 'main')?.elevation).toBe(-1.5);
    expect(SystemDocumentSchema.safeParse(next).success).toBe(true);
    expect(analyzeSystem(next).source.pressureBasis).toBe('flow-test');
  });

  it('when the usual set of fittings is added to the bathroom branch, then the bathroom’s margin goes down (more loss, same supply)', () => {
    const doc = house();
    const before = analyzeSystem(doc).fixtures.find((f) => f.id === 'shower')!.margin;
    const v = fittingsFormSchema.parse({
      fittingMethod: 'crane',
      segments: doc.segments.map((s) => ({ id: s.id, fittings: s.id === 'to-bath' ? [...s.fittings, ...USUAL_SET] : s.fittings })),
    });
    const after = analyzeSystem(applyFittings(doc, v)).fixtures.find((f) => f.id === 'shower')!.margin;
    expect(after).toBeLessThan(before);
  });

  it('when the risers form changes a length, then fittings and checked fixtures the form does not show are kept', () => {
    const doc = house();
    const values = {
      segments: doc.segments.map((s) => ({
        id: s.id,
        label: s.label ?? '',
        from: s.from,
        to: s.to,
        material: s.material ?? '',
        size: s.size ?? '',
        length: s.id === 'riser' ? 7 : s.length,
        rise: s.rise,
      })),
      nodes: doc.nodes.map((n) => ({ id: n.id, label: n.label ?? '', elevation: n.elevation, fixtureGroups: n.fixtureGroups })),
    };
    const next = applyRisers(doc, risersFormSchema.parse(values));
    expect(next.segments.find((s) => s.id === 'riser')?.length).toBe(7);
    expect(next.segments.map((s) => s.fittings)).toEqual(doc.segments.map((s) => s.fittings));
    expect(next.nodes.map((n) => n.checkedFixtures)).toEqual(doc.nodes.map((n) => n.checkedFixtures));
    expect(SystemDocumentSchema.safeParse(next).success).toBe(true);
  });

  it('when a PRV row has no set pressure, then the error sits on the set-pressure field', () => {
    const r = devicesFormSchema.safeParse({
      devices: [
        {
          id: 'prv',
          kind: 'prv',
          label: 'PRV',
          segmentId: 'service',
          lossKind: 'fixed',
          fixedLoss: 0,
          points: [],
          prvSet: undefined,
          prvFalloff: 0,
          boostGain: undefined,
        },
      ],
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.'))).toContain('devices.0.prvSet');
  });

  it('when the segment table clears a rise, then the rise is removed (taken from the elevations), not set to 0', () => {
    const doc = house();
    const v = segmentTableSchema.parse({
      segments: doc.segments.map((s) => ({
        id: s.id,
        material: s.material ?? '',
        size: s.size ?? '',
        length: s.length,
        rise: s.id === 'riser' ? Number.NaN : s.rise,
      })),
    });
    const next = applySegmentTable(doc, v);
    expect('rise' in next.segments.find((s) => s.id === 'riser')!).toBe(false);
    // Document version 2: the riser's top node has its elevation, which places it; nothing is missing.
    expect(analyzeSystem(next).verdict.incomplete.map((r) => r.code)).not.toContain('node-elevation-missing');
  });
});

describe('tree order', () => {
  it('when segments are listed out of order, then each one comes right before the segments it feeds', () => {
    const segs = [
      { id: 'c', from: 'n2', to: 'n3' },
      { id: 'a', from: 'src', to: 'n1' },
      { id: 'b', from: 'n1', to: 'n2' },
      { id: 'd', from: 'n1', to: 'n4' },
      { id: 'lost', from: 'x', to: 'y' },
    ];
    expect(treeOrder(segs, 'src').map(({ index, depth }) => `${segs[index].id}:${depth}`)).toEqual(['a:1', 'b:2', 'c:3', 'd:2', 'lost:1']);
  });
});
