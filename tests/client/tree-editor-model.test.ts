/**
 * The tree editor's plain functions (src/features/tree-editor/model.ts and policy.ts) on the invented
 * demo "Alder & Finch": tree order and subtree sizes, what collapsing hides, the bulk edits, and the
 * contractor's policy against the server's own field-change rule.
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem } from '../../src/engine';
import type { SystemDocument } from '../../src/engine';
import { branchIds, fittingsSummary, rangeIds, setFittings, setMaterial, setSize, sizesOf, treeRows, visibleLines } from '../../src/features/tree-editor/model';
import { SEGMENT } from '../../src/engine/model/elements';
import { CONTRACTOR_POLICY, DESIGNER_POLICY, EDITABLE_PARTS, segmentKeysWritten } from '../../src/features/tree-editor/policy';
import { treeOrder } from '../../src/features/walk/lib/tree';
import { forbiddenDifferences, SEGMENT_KEYS_ALLOWED } from '../../server/services/fieldChangeRules';
import { demoDocument } from '../routes/support/fake-api';
import { generateBuilding } from '../../src/engine/testing/generateTree';

const demo = demoDocument();

describe('rows in tree order', () => {
  it('when the demo is read, then there is one row per segment in the walk’s tree order, and each row counts the segments its branch feeds', () => {
    const rows = treeRows(demo);
    expect(rows.map((r) => r.index)).toEqual(treeOrder(demo.segments, demo.source.nodeId).map((o) => o.index));
    // the count below a row, by walking the document's own from/to links
    const below = (nodeId: string): number => demo.segments.filter((s) => s.from === nodeId).reduce((n, s) => n + 1 + below(s.to), 0);
    for (const r of rows) expect(r.below).toBe(below(r.toId));
    expect(rows[0].below).toBe(demo.segments.length - 1);
  });

  it('when a generated 4-storey building on named floors is read, then each row counts its branch and says whether its end node sits on a floor', () => {
    const doc = generateBuilding({ storeys: 4 }) as unknown as SystemDocument;
    const rows = treeRows(doc);
    expect(rows).toHaveLength(doc.segments.length);
    const children = new Map<string, string[]>();
    for (const s of doc.segments) children.set(s.from, [...(children.get(s.from) ?? []), s.to]);
    const below = (nodeId: string): number => (children.get(nodeId) ?? []).reduce((n, to) => n + 1 + below(to), 0);
    const nodes = new Map(doc.nodes.map((n) => [n.id, n]));
    for (const r of rows) {
      expect(r.below).toBe(below(r.toId));
      expect(r.toOnFloor).toBe(nodes.get(r.toId)?.floor !== undefined);
    }
    // the building has nodes of both kinds (on a floor, and placed by a rise), so both answers are checked
    expect(new Set(rows.map((r) => r.toOnFloor))).toEqual(new Set([true, false]));
  });

  it('when a branch is collapsed, then only its subtree is hidden and the line says how many', () => {
    const rows = treeRows(demo);
    const floor2 = rows.find((r) => r.id === 'floor-2')!;
    const lines = visibleLines(rows, new Set(['floor-2']), null);
    expect(lines).toHaveLength(rows.length - floor2.below);
    const line = lines.find((l) => l.kind === 'segment' && l.row.id === 'floor-2');
    expect(line && line.kind === 'segment' ? line.hiddenBelow : -1).toBe(floor2.below);
    const hidden = new Set(branchIds(rows, 'floor-2').slice(1));
    expect(lines.some((l) => l.kind === 'segment' && hidden.has(l.row.id))).toBe(false);
  });

  it('when the document has floors and the rows are grouped by floor, then each floor heads its segments and a collapsed floor hides them', () => {
    const doc: SystemDocument = {
      ...demo,
      floors: [{ id: 'l2', name: 'Level 2', elevation: 14 }],
      // one node on the one floor; the demo's own floors are left out (the rest are on no floor)
      nodes: demo.nodes.map((n) =>
        n.id === demo.segments.find((s) => s.id === 'floor-2')!.to ? { ...n, floor: 'l2', elevation: undefined } : { ...n, floor: undefined },
      ),
    } as SystemDocument;
    const rows = treeRows(doc);
    expect(rows.find((r) => r.id === 'floor-2')!.floorLabel).toBe('Level 2');
    // a segment is on the floor of its end node, or else of its start node: the floor main and the branches leaving it
    const node = demo.segments.find((s) => s.id === 'floor-2')!.to;
    const onL2 = demo.segments.filter((s) => s.to === node || s.from === node).length;
    expect(onL2).toBeGreaterThan(1);
    const open = visibleLines(rows, new Set(), { floors: doc.floors, collapsed: new Set() });
    const heads = open.filter((l) => l.kind === 'floor');
    expect(heads.map((h) => (h.kind === 'floor' ? [h.label, h.count] : null))).toEqual([
      ['Level 2', onL2],
      ['Not on a floor', rows.length - onL2],
    ]);
    const shut = visibleLines(rows, new Set(), { floors: doc.floors, collapsed: new Set(['l2']) });
    expect(shut.some((l) => l.kind === 'segment' && l.row.id === 'floor-2')).toBe(false);
  });

  it('when two rows are shift-clicked, then the range between them in tree order is selected', () => {
    const rows = treeRows(demo);
    expect(rangeIds(rows, rows[5].id, rows[2].id)).toEqual(rows.slice(2, 6).map((r) => r.id));
  });
});

describe('bulk edits', () => {
  it('when a material is set on a branch, then each keeps a size the new material has, and nothing else in the document changes', () => {
    const ids = branchIds(treeRows(demo), 'retail-1');
    const next = setMaterial(demo, ids, 'copper-k');
    for (const s of next.segments) {
      const was = demo.segments.find((x) => x.id === s.id)!;
      if (ids.includes(s.id)) {
        expect(s.material).toBe('copper-k');
        expect(s.size).toBe(sizesOf('copper-k').includes(was.size!) ? was.size : undefined);
      } else expect(s).toBe(was);
    }
    expect(analyzeSystem(next).segments.length).toBe(demo.segments.length);
  });

  it('when a size is set on segments whose material lacks it, then those are skipped and named', () => {
    const missing = sizesOf('pex-sdr9').includes('3') ? null : '3';
    expect(missing).toBe('3');
    const { doc, skipped } = setSize(demo, ['service', '2A-branch'], '3');
    expect(skipped).toEqual(['2A-branch']);
    expect(doc.segments.find((s) => s.id === 'service')!.size).toBe('3');
  });

  it('when a fittings set is added or put in place, then the summary line says it', () => {
    const added = setFittings(demo, ['2A-bath'], [{ typeId: 'elbow-90-standard', count: 2 }], false);
    const before = demo.segments.find((s) => s.id === '2A-bath')!.fittings;
    expect(added.segments.find((s) => s.id === '2A-bath')!.fittings).toHaveLength(before.length + 1);
    const replaced = setFittings(demo, ['2A-bath'], [{ typeId: 'elbow-90-standard', count: 2 }], true);
    expect(fittingsSummary(replaced.segments.find((s) => s.id === '2A-bath')!.fittings)).toMatch(/^2× .*elbow/i);
    expect(fittingsSummary([])).toBe('none');
  });
});

describe('edit policies', () => {
  it('when the contractor’s policy is compared with the server’s field-change rule, then it writes only keys the server allows, and a change it allows passes the rule', () => {
    for (const key of segmentKeysWritten(CONTRACTOR_POLICY)) expect(SEGMENT_KEYS_ALLOWED).toContain(key);
    expect(CONTRACTOR_POLICY.locked.topology).not.toBeNull();
    expect(CONTRACTOR_POLICY.locked.rise).not.toBeNull();
    const ids = branchIds(treeRows(demo), 'retail-1');
    expect(forbiddenDifferences(demo, setMaterial(demo, ids, 'copper-k'))).toEqual({});
    // the designer's policy writes more than a field change may: the rise is refused by the server's rule
    expect(segmentKeysWritten(DESIGNER_POLICY)).toContain('rise');
    expect(SEGMENT_KEYS_ALLOWED).not.toContain('rise');
  });

  it('when the segment description names the editor columns of its keys, then each is a column of the editor, and the contractor keeps name and rise locked', () => {
    for (const [key, d] of Object.entries(SEGMENT.keys)) for (const part of d.editor ?? []) expect(EDITABLE_PARTS, key).toContain(part);
    expect(CONTRACTOR_POLICY.locked.name).not.toBeNull();
    expect(CONTRACTOR_POLICY.locked.material).toBeNull();
    expect(CONTRACTOR_POLICY.locked.fittings).toBeNull();
  });
});
