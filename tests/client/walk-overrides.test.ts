import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { applyRisers, risersFormSchema, risersFormValues } from '../../src/features/walk/steps/risers-step';
import { applySegmentTable, segmentTableSchema } from '../../src/features/walk/pages/segment-table-page';
import { elevationsFromFloors, floorLevels, floorOf, planProblems } from '../../src/features/walk/lib/floors';
import { deviceFromProjectTemplate, matchProjectPipe, pipeFromProjectEntry, projectOptionValue } from '../../src/features/catalog/lib/apply-entries';
import { EMPTY_ENTRY_FORM, entryBodyFromForm } from '../../src/features/catalog/lib/entry-form';
import type { ProjectEntryOf } from '../../src/shared/api/catalog';
import { expectClose } from '../helpers/expectClose';

// The small house is the engine's invented SI example (src/engine/examples/small-house.json).
const house = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../src/engine/examples/small-house.json', import.meta.url), 'utf8')));

/** The risers form of `doc` with `change` applied to its rows, parsed and written back. */
function viaRisers(doc: SystemDocument, change: (v: ReturnType<typeof risersFormValues>) => void) {
  const values = risersFormValues(doc);
  change(values);
  const parsed = risersFormSchema.safeParse(values);
  return { parsed, next: parsed.success ? applyRisers(doc, parsed.data) : null };
}

/** An invented project tube (test data, not a product): inside diameters made up, roughness and C plausible for plastic. */
const tube: ProjectEntryOf<'material'> = {
  kind: 'material',
  id: '7b0a4a36-7d29-4a47-9d3e-0d6b8d2f3c11',
  label: 'Invented PE-RT tube',
  source: 'Invented sheet PR-7 (test)',
  fromMemory: false,
  projectId: 'p',
  version: 1,
  createdBy: null,
  updatedAt: '2026-01-01T00:00:00.000Z',
  data: {
    velocityClass: 'plastic',
    roughnessM: 0.0000015,
    hazenWilliamsC: 150,
    sizes: [
      { key: '20 mm', innerDiameterM: 0.0162 },
      { key: '25 mm', innerDiameterM: 0.0204 },
    ],
  },
};

describe('segment overrides in the risers form', () => {
  it('when a custom pipe is given instead of a material, then the document carries only the custom data and the engine uses its inside diameter', () => {
    const { parsed, next } = viaRisers(house(), (v) => {
      const riser = v.segments.find((s) => s.id === 'riser')!;
      riser.material = '';
      riser.size = '';
      riser.custom = { innerDiameter: 25, roughness: 0.0015, hazenWilliamsC: 150, velocityClass: 'plastic' };
    });
    expect(parsed.success).toBe(true);
    const riser = next!.segments.find((s) => s.id === 'riser')!;
    expect(riser).not.toHaveProperty('material');
    expect(riser).not.toHaveProperty('size');
    expect(riser.custom).toEqual({ innerDiameter: 25, roughness: 0.0015, hazenWilliamsC: 150, velocityClass: 'plastic' });
    // SI document: the inside diameter is in mm and is reported back in mm unchanged
    expectClose(analyzeSystem(next!).segments.find((s) => s.id === 'riser')!.innerDiameter, 25, { rtol: 1e-12 }); // a unit round trip only
  });

  it('when a custom pipe lacks its inside diameter, then the error sits on that field and nothing is applied', () => {
    const { parsed } = viaRisers(house(), (v) => {
      const riser = v.segments.find((s) => s.id === 'riser')!;
      riser.material = '';
      riser.custom = { innerDiameter: Number.NaN, roughness: 0.0015, hazenWilliamsC: 150, velocityClass: 'plastic' };
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join('.'))).toEqual(['segments.3.custom.innerDiameter']);
  });

  it('when a segment gets a design-flow override and a node a continuous demand, then the engine uses both and clearing them removes them', () => {
    const doc = house();
    const { next } = viaRisers(doc, (v) => {
      v.segments.find((s) => s.id === 'to-garden')!.flowOverride = 0.4;
      v.nodes.find((n) => n.id === 'kitchen')!.continuousDemand = 0.05;
    });
    const a = analyzeSystem(next!);
    expectClose(a.segments.find((s) => s.id === 'to-garden')!.designFlow, 0.4, { rtol: 1e-12 }); // the override is the design flow, in L/s
    const before = analyzeSystem(doc).segments.find((s) => s.id === 'to-kitchen')!.designFlow;
    // the continuous demand adds to the fixture-unit flow of the kitchen branch (common practice: continuous loads add to the probable demand)
    expect(a.segments.find((s) => s.id === 'to-kitchen')!.designFlow).toBeGreaterThan(before);
    const { next: cleared } = viaRisers(next!, (v) => {
      v.segments.find((s) => s.id === 'to-garden')!.flowOverride = Number.NaN;
      v.nodes.find((n) => n.id === 'kitchen')!.continuousDemand = Number.NaN;
    });
    expect(cleared!.segments.find((s) => s.id === 'to-garden')).not.toHaveProperty('flowOverride');
    expect(cleared!.nodes.find((n) => n.id === 'kitchen')).not.toHaveProperty('continuousDemand');
    expect(cleared).toEqual(doc);
  });

  it('when a fixture group is set to the flush-valve curve, then the document says so and the design flow of its branch goes up', () => {
    const doc = house();
    const { parsed, next } = viaRisers(doc, (v) => {
      v.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0].demandCurve = 'flush-valve';
    });
    expect(parsed.success).toBe(true);
    expect(next!.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0]).toEqual({
      fixtureTypeId: 'bathroom-group-flush-tank-private',
      count: 1,
      demandCurve: 'flush-valve',
    });
    // Hunter's curves: at the same fixture units the flush-valve curve gives more flow (IPC 2018 Table E103.3(3))
    const flow = (d: SystemDocument) => analyzeSystem(d).segments.find((s) => s.id === 'to-bath')!.designFlow;
    expect(flow(next!)).toBeGreaterThan(flow(doc));
  });

  it('when a group’s usage is half given, then the missing field is named; when all empty, no usage is written', () => {
    const { parsed } = viaRisers(house(), (v) => {
      v.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0].usage = { durationSeconds: 60, recurrenceSeconds: Number.NaN };
    });
    expect(parsed.error?.issues.map((i) => i.path.join('.'))).toEqual(['nodes.5.fixtureGroups.0.usage.recurrenceSeconds']);
    const { next } = viaRisers(house(), (v) => {
      v.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0].usage = { flow: Number.NaN, durationSeconds: Number.NaN, recurrenceSeconds: Number.NaN };
    });
    expect(next!.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0]).not.toHaveProperty('usage');
  });
});

describe('project entries copied into the document', () => {
  it('when a project tube and size are chosen, then the segment gets the tube’s data as its custom pipe in the document’s units, and it is recognised again', () => {
    const doc = house();
    const pipe = pipeFromProjectEntry(tube, '20 mm', 'SI')!;
    expectClose(pipe.innerDiameter, 16.2, { rtol: 1e-12 }); // 0.0162 m in mm: a unit conversion only
    expectClose(pipe.roughness, 0.0015, { rtol: 1e-12 });
    expect(pipeFromProjectEntry(tube, '32 mm', 'SI')).toBeNull();
    const v = segmentTableSchema.parse({
      segments: doc.segments.map((s) => ({
        id: s.id,
        material: s.id === 'riser' ? projectOptionValue(tube.id) : s.material,
        size: s.id === 'riser' ? '20 mm' : s.size,
        length: s.length,
        rise: s.rise,
        custom: s.id === 'riser' ? pipe : undefined,
      })),
    });
    const next = applySegmentTable(doc, v);
    const riser = next.segments.find((s) => s.id === 'riser')!;
    expect(riser.custom).toEqual(pipe);
    expect(riser).not.toHaveProperty('material');
    expect(SystemDocumentSchema.safeParse(next).success).toBe(true);
    expect(matchProjectPipe(JSON.parse(JSON.stringify(riser.custom)), [tube], 'SI')).toEqual({ entryId: tube.id, sizeKey: '20 mm' });
    expect(risersFormValues(next, [tube]).segments.find((s) => s.id === 'riser')).toMatchObject({ material: projectOptionValue(tube.id), size: '20 mm' });
    // a retyped diameter is a different pipe: not recognised
    expect(matchProjectPipe({ ...pipe, innerDiameter: 16.3 }, [tube], 'SI')).toBeNull();
  });

  it('when a project material without a size is in the table, then the size is named; a seeded material drops an old custom pipe', () => {
    const doc = house();
    const bad = segmentTableSchema.safeParse({ segments: [{ id: 'riser', material: projectOptionValue(tube.id), size: '', length: 3, rise: 2.9 }] });
    expect(bad.error?.issues.map((i) => i.path.join('.'))).toEqual(['segments.0.size']);
    const withCustom = { ...doc, segments: doc.segments.map((s) => (s.id === 'riser' ? { ...s, custom: pipeFromProjectEntry(tube, '25 mm', 'SI')! } : s)) };
    const v = segmentTableSchema.parse({
      segments: withCustom.segments.map((s) => ({ id: s.id, material: 'pex-sdr9', size: s.size ?? '3/4', length: s.length, rise: s.rise })),
    });
    expect(applySegmentTable(withCustom, v).segments.find((s) => s.id === 'riser')).not.toHaveProperty('custom');
  });

  it('when a project device template is used, then its kind and points come over in the document’s units', () => {
    const t: ProjectEntryOf<'device-template'> = {
      kind: 'device-template',
      id: 'e1',
      label: 'Invented filter',
      source: 'Invented curve (test)',
      fromMemory: false,
      projectId: 'p',
      version: 1,
      createdBy: null,
      updatedAt: '2026-01-01T00:00:00.000Z',
      data: { kind: 'filter', points: [{ flowM3s: 0.000063090196, lossPa: 6894.757 }] },
    };
    const us = deviceFromProjectTemplate(t, 'US');
    expect(us.kind).toBe('filter');
    // 1 gpm = 6.3090196e-5 m³/s and 1 psi = 6894.757 Pa (NIST SP 811, 2008, Appendix B): the point is 1 gpm at 1 psi
    // rounded to the places a designer writes (convertUnits.ts: 0.01 gpm, 0.01 psi; 0.0001 L/s, 0.1 kPa)
    expect(us.points[0].flow).toBe(1);
    expect(us.points[0].loss).toBe(1);
    const si = deviceFromProjectTemplate(t, 'SI');
    expect(si.points[0].flow).toBe(0.0631); // L/s: 0.0630902 to 4 places
    expect(si.points[0].loss).toBe(6.9); // kPa: 6.894757 to 1 place
  });

  it('when the catalog form is filled in US units, then the body is in SI; a missing diameter is named on the sizes box', () => {
    const ok = entryBodyFromForm(
      {
        ...EMPTY_ENTRY_FORM,
        kind: 'material',
        label: 'Invented tube',
        source: 'Invented sheet',
        velocityClass: 'plastic',
        roughness: '0.00006',
        hazenWilliamsC: '150',
        sizes: 'size, inside\n3/4, 0.75\n1, 1.0',
      },
      'US',
    );
    expect(ok.ok).toBe(true);
    if (!ok.ok) return;
    const data = ok.body.data as { sizes: { key: string; innerDiameterM: number }[]; roughnessM: number };
    expect(data.sizes.map((s) => s.key)).toEqual(['3/4', '1']);
    expectClose(data.sizes[0].innerDiameterM, 0.75 * 0.0254, { rtol: 1e-12 }); // 1 in = 0.0254 m exactly
    expectClose(data.roughnessM, 0.00006 * 0.0254, { rtol: 1e-12 });
    const bad = entryBodyFromForm(
      { ...EMPTY_ENTRY_FORM, kind: 'material', label: 'Invented tube', source: '', roughness: '0', hazenWilliamsC: '150', sizes: '3/4,' },
      'US',
    );
    expect(bad.ok).toBe(false);
    if (bad.ok) return;
    expect(Object.keys(bad.errors).sort()).toEqual(['sizes', 'source']);
    const fixture = entryBodyFromForm(
      {
        ...EMPTY_ENTRY_FORM,
        kind: 'fixture-type',
        label: 'Invented fountain',
        source: 'Invented sheet',
        wsfuCold: '1',
        wsfuHot: '',
        wsfuTotal: '1',
        minFlowPressure: '8',
        flowRate: '0.5',
      },
      'US',
    );
    expect(fixture.ok && fixture.body.kind === 'fixture-type' && fixture.body.data.wsfu.hot).toBeNull();
  });
});

describe('the floor-height helper', () => {
  it('when seven floors have a taller ground floor, then each level is the ground level plus the heights below it', () => {
    const plan = { floors: 7, typicalHeight: 10, groundHeight: 14, groundLevel: 0, aboveFloor: 0 };
    expect(planProblems(plan)).toEqual([]);
    expect(floorLevels(plan)).toEqual([0, 14, 24, 34, 44, 54, 64]);
    expect(floorLevels({ ...plan, groundHeight: undefined })).toEqual([0, 10, 20, 30, 40, 50, 60]);
    expect(planProblems({ ...plan, floors: 0, typicalHeight: -1 })).toHaveLength(2);
  });

  it('when nodes are put on floors, then their elevations are filled, the connection takes its own, others keep theirs; the rises can follow', () => {
    const plan = { floors: 3, typicalHeight: 3.1, groundHeight: 4.2, groundLevel: 0, aboveFloor: 0.3 };
    const nodes = [
      { id: 'main', elevation: 0 },
      { id: 'f1', elevation: 0 },
      { id: 'f3', elevation: 0 },
      { id: 'loose', elevation: 9 },
    ];
    const next = elevationsFromFloors(
      nodes,
      new Map([
        ['f1', 1],
        ['f3', 3],
        ['main', 2],
      ]),
      plan,
      { nodeId: 'main', elevation: -1.2 },
    );
    expect(next).toEqual([
      { id: 'main', elevation: -1.2 },
      { id: 'f1', elevation: 0.3 },
      { id: 'f3', elevation: 7.6 },
      { id: 'loose', elevation: 9 },
    ]);
    expect(floorOf(7.6, floorLevels(plan), 0.3)).toBe(3);
    expect(floorOf(7.29, floorLevels(plan), 0.3)).toBe(2);
    expect(floorOf(-2, floorLevels(plan))).toBe(1);
  });
});

describe('risers form: a fixture group whose usage boxes are left empty', () => {
  it('when the three usage inputs are empty (undefined from the number boxes), then the group still reaches the draft, without usage', () => {
    const segment = {
      id: 's',
      label: '',
      from: 'a',
      to: 'b',
      material: 'copper-l',
      size: '3/4',
      length: 10,
      rise: 0,
      custom: { innerDiameter: undefined, roughness: undefined, hazenWilliamsC: undefined, velocityClass: '' },
      flowOverride: undefined,
    };
    const group = {
      fixtureTypeId: 'lavatory-private',
      count: 6,
      demandCurve: '',
      wsfuBasis: '',
      usage: { flow: undefined, durationSeconds: undefined, recurrenceSeconds: undefined },
    };
    const parsed = risersFormSchema.safeParse({
      segments: [segment],
      nodes: [{ id: 'b', label: '', elevation: 0, continuousDemand: undefined, fixtureGroups: [group] }],
    });
    expect(parsed.success).toBe(true);
    expect(parsed.data?.nodes[0].fixtureGroups).toEqual([{ fixtureTypeId: 'lavatory-private', count: 6 }]);
  });
});
