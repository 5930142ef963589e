/**
 * Project fitting and fixture types chosen in the walk and copied into the document
 * (src/features/catalog/lib/apply-entries.ts; the fittings and risers steps). The entries are
 * invented test data; the fixture entry carries the numbers of the seeded bathroom group
 * (IPC 2018 Table E103.3(2), via src/engine/catalog/fixtures.ts) so the copy can be compared
 * with the catalog type it stands for.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, SystemDocumentSchema } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { FIXTURE_TYPES } from '../../src/engine/catalog/fixtures';
import { fittingLabel, fixtureGroupLabel } from '../../src/engine/model/labels';
import {
  COPYABLE_KINDS,
  fittingFromProjectEntry,
  fittingWithProjectData,
  fixtureFromProjectEntry,
  groupWithProjectData,
  projectOptions,
  projectOptionValue,
} from '../../src/features/catalog/lib/apply-entries';
import { applyFittings, fittingsFormSchema } from '../../src/features/walk/steps/fittings-step';
import { applyRisers, risersFormSchema, risersFormValues } from '../../src/features/walk/steps/risers-step';
import type { ProjectEntryOf } from '../../src/shared/api/catalog';

// The small house is the engine's invented SI example (src/engine/examples/small-house.json).
const house = (): SystemDocument =>
  SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../src/engine/examples/small-house.json', import.meta.url), 'utf8')));

const base = { fromMemory: false as const, projectId: 'p', version: 1, createdBy: null, updatedAt: '2026-01-01T00:00:00.000Z' };
/** An invented project valve (test data): K 2.5. */
const valve: ProjectEntryOf<'fitting-type'> = {
  ...base,
  kind: 'fitting-type',
  id: '0d7e3c1a-5b8f-4c2e-9a61-3f4b2d1c0e9a',
  label: 'Invented check valve',
  source: 'Invented sheet CV-2 (test)',
  data: { k: 2.5 },
};
const group = FIXTURE_TYPES['bathroom-group-flush-tank-private'];
/** An invented project fixture type with the seeded bathroom group's numbers. */
const bath: ProjectEntryOf<'fixture-type'> = {
  ...base,
  kind: 'fixture-type',
  id: '5c2d9e4f-1a3b-4c6d-8e7f-9a0b1c2d3e4f',
  label: 'Invented bath suite',
  source: 'Invented sheet BS-1 (test)',
  data: {
    occupancy: 'private',
    demandCurve: group.demandCurve,
    wsfu: { ...group.wsfu },
    minFlowPressurePa: group.minFlowPressurePa,
    flowRateM3s: group.flowRateM3s,
  },
};

function withProjectValve(doc: SystemDocument, entries: readonly ProjectEntryOf<'fitting-type'>[], rowExtra: object = {}) {
  const v = fittingsFormSchema.parse({
    fittingMethod: 'crane',
    segments: doc.segments.map((s) => ({
      id: s.id,
      fittings: s.id === 'to-bath' ? [...s.fittings, { typeId: projectOptionValue(valve.id), count: 2, ...rowExtra }] : s.fittings,
    })),
  });
  return applyFittings(doc, v, entries);
}

describe('project fitting types in the fittings step', () => {
  it('are offered as choosable options, and every entry kind can now be copied', () => {
    expect(projectOptions([valve])).toEqual([{ value: `project:${valve.id}`, label: 'Invented check valve — project' }]);
    expect([...COPYABLE_KINDS].sort()).toEqual(['device-template', 'fitting-type', 'fixture-type', 'material']);
  });

  it('when one is chosen, then the document carries its K, label and source, and the engine adds count·K to that segment only', () => {
    const doc = house();
    const before = analyzeSystem(doc);
    const next = withProjectValve(doc, [valve]);
    const added = next.segments.find((s) => s.id === 'to-bath')!.fittings.at(-1)!;
    expect(added).toEqual({ typeId: `project:${valve.id}`, count: 2, custom: { label: 'Invented check valve', k: 2.5, source: 'Invented sheet CV-2 (test)' } });
    expect(SystemDocumentSchema.safeParse(next).success).toBe(true);
    const after = analyzeSystem(next);
    const k = (a: typeof after, id: string) => a.segments.find((s) => s.id === id)!.fittingsK;
    // one more addition of 2 × 2.5 = 5 to the segment's K; relative 1e-12 allows only the sum's rounding.
    expect(Math.abs(k(after, 'to-bath') - (k(before, 'to-bath') + 5))).toBeLessThan(1e-12 * k(after, 'to-bath'));
    expect(k(after, 'riser')).toBe(k(before, 'riser'));
    expect(after.fixtures.find((f) => f.id === 'shower')!.margin).toBeLessThan(before.fixtures.find((f) => f.id === 'shower')!.margin);
    expect(after.warnings.some((w) => w.code === 'project-data-used' && w.elementId === 'to-bath')).toBe(true);
  });

  it('a copy already in the document stays as it is when the entry later changes or is removed', () => {
    const doc = house();
    const copied = fittingFromProjectEntry(valve);
    const changed = { ...valve, data: { k: 9 } };
    expect(
      withProjectValve(doc, [changed], { custom: copied })
        .segments.find((s) => s.id === 'to-bath')!
        .fittings.at(-1)!.custom,
    ).toEqual(copied);
    expect(
      withProjectValve(doc, [], { custom: copied })
        .segments.find((s) => s.id === 'to-bath')!
        .fittings.at(-1)!.custom,
    ).toEqual(copied);
  });

  it('a seeded row carries no project data unless the document gave it some; a project row with no entry and no copy stays unresolved', () => {
    expect(fittingWithProjectData({ typeId: 'tee-run', count: 1 }, [valve])).toEqual({ typeId: 'tee-run', count: 1 });
    // own data written in the document over a seeded type is the document's: the form keeps it
    // (choosing another type in the step clears the row's copy before this runs)
    const own = fittingFromProjectEntry(valve);
    expect(fittingWithProjectData({ typeId: 'tee-run', count: 1, custom: own }, [])).toEqual({ typeId: 'tee-run', count: 1, custom: own });
    const orphan = fittingWithProjectData({ typeId: projectOptionValue('gone'), count: 1 }, [valve]);
    expect(orphan).toEqual({ typeId: 'project:gone', count: 1 });
    // the engine then names it rather than guessing a K
    const doc = house();
    doc.segments[0].fittings = [orphan];
    expect(() => analyzeSystem(doc)).toThrow(/not in the fittings catalog/);
  });

  it('lists with its own label and value', () => {
    expect(fittingLabel({ typeId: 'x', count: 1, custom: fittingFromProjectEntry(valve) })).toBe('Invented check valve (project data, K 2.5)');
    expect(fittingLabel({ typeId: 'tee-run', count: 1 })).not.toContain('project');
  });
});

describe('project fixture types in the risers step', () => {
  it('copy their fixture units and demand curve; an absent service value stays absent', () => {
    expect(fixtureFromProjectEntry(bath)).toEqual({
      label: 'Invented bath suite',
      wsfuCold: group.wsfu.cold,
      wsfuHot: group.wsfu.hot,
      wsfuTotal: group.wsfu.total,
      flushValve: false,
      source: 'Invented sheet BS-1 (test)',
    });
    const coldOnly = { ...bath, data: { ...bath.data, demandCurve: 'flush-valve' as const, wsfu: { cold: 5, hot: null, total: 5 } } };
    const own = fixtureFromProjectEntry(coldOnly);
    expect(own).not.toHaveProperty('wsfuHot');
    expect(own.flushValve).toBe(true);
  });

  it('when the bathroom group is replaced by the project type with the same numbers, then the analysis is the same, with a note', () => {
    const doc = house();
    const values = risersFormValues(doc);
    values.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0].fixtureTypeId = projectOptionValue(bath.id);
    const next = applyRisers(doc, risersFormSchema.parse(values), [bath]);
    const g = next.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0];
    expect(g.custom).toEqual(fixtureFromProjectEntry(bath));
    expect(fixtureGroupLabel(g)).toBe('Invented bath suite (project data)');
    const a = analyzeSystem(doc);
    const b = analyzeSystem(next);
    expect(b.segments).toStrictEqual(a.segments);
    expect(b.fixtures).toStrictEqual(a.fixtures);
    expect(b.warnings.filter((w) => w.code === 'project-data-used').map((w) => w.elementId)).toEqual(['bath']);
    // the copy comes back into the form, and survives a second pass with the entry gone
    const again = risersFormValues(next);
    expect(again.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0].custom).toEqual(g.custom);
    const twice = applyRisers(next, risersFormSchema.parse(again), []);
    expect(twice.nodes.find((n) => n.id === 'bath')!.fixtureGroups[0]).toEqual(g);
  });

  it('a seeded group gets no project data; a group that has some keeps it, whatever its type id', () => {
    expect(groupWithProjectData({ fixtureTypeId: 'lavatory-private', count: 2 }, [bath])).toEqual({ fixtureTypeId: 'lavatory-private', count: 2 });
    const own = fixtureFromProjectEntry(bath);
    expect(groupWithProjectData({ fixtureTypeId: 'lavatory-private', count: 2, custom: own }, [])).toEqual({
      fixtureTypeId: 'lavatory-private',
      count: 2,
      custom: own,
    });
  });
});
