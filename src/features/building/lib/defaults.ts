/**
 * Starting values of a new building form. The fittings written in are a typical starting set
 * (common practice: the tee off the floor main, the unit's shut-off valve and two 90° elbows on its
 * branch, two 90° elbows on a fixture branch); they are shown and edited like any other value.
 */
import type { SystemDocument } from '../../../engine';
import { readBuilding } from './document-adapter';
import type { BuildingForm, PipingRow, UnitTypeForm } from './form';
import { unitTypeToForm } from './unit-types';

export const BRANCH_FITTINGS = [
  { typeId: 'tee-branch', count: 1 },
  { typeId: 'valve-ball-full-port', count: 1 },
  { typeId: 'elbow-90-standard', count: 2 },
];
export const FIXTURE_BRANCH_FITTINGS = [{ typeId: 'elbow-90-standard', count: 2 }];

/** A key for a new row, unique while the page is open. */
export const newRowKey = () => `row-${crypto.randomUUID()}`;

export function newFixtureRow(rows: readonly PipingRow[]): PipingRow {
  const first = rows[0];
  const last = rows[rows.length - 1];
  return {
    key: newRowKey(),
    name: '',
    from: first?.key ?? 'inlet',
    heightAboveFloor: 0,
    fixtureTypeId: '',
    count: 1,
    checked: false,
    material: last?.material ?? '',
    // a fixture branch copies the size of the fixture branch above it, not the unit's main branch
    size: rows.length > 1 ? last.size : '',
    length: undefined as unknown as number,
    fittings: FIXTURE_BRANCH_FITTINGS.map((f) => ({ ...f })),
  };
}

export function newUnitType(id: string, name: string): UnitTypeForm {
  return {
    id,
    name,
    rows: [
      {
        key: newRowKey(),
        name: 'unit manifold',
        from: 'inlet',
        heightAboveFloor: 0,
        fixtureTypeId: '',
        count: 1,
        checked: false,
        material: '',
        size: '',
        length: undefined as unknown as number,
        fittings: BRANCH_FITTINGS.map((f) => ({ ...f })),
      },
    ],
  };
}

/** The leaf of the tree furthest along from the source: where a new riser usually starts (after the meter set). */
export function defaultStartNode(doc: SystemDocument): string {
  const feeds = new Set(doc.segments.map((s) => s.from));
  const leaves = doc.nodes.filter((n) => !feeds.has(n.id));
  return (leaves[leaves.length - 1] ?? doc.nodes[doc.nodes.length - 1]).id;
}

/**
 * The floor-to-floor height most of the stored floors share (the lower one where two are as common),
 * or undefined with fewer than two floors: what a floor added above them takes unless told otherwise.
 */
function typicalStoreyHeight(floors: readonly { elevation: number }[]): number | undefined {
  const sorted = [...floors].sort((a, b) => a.elevation - b.elevation);
  const counts = new Map<number, number>();
  for (let i = 1; i < sorted.length; i++) {
    // to a thousandth of the length unit: elevations typed in feet or metres, not sums of floats
    const step = Math.round((sorted[i].elevation - sorted[i - 1].elevation) * 1000) / 1000;
    counts.set(step, (counts.get(step) ?? 0) + 1);
  }
  let best: [number, number] | undefined;
  for (const [step, n] of counts) if (!best || n > best[1] || (n === best[1] && step < best[0])) best = [step, n];
  return best?.[0];
}

export function defaultBuildingForm(doc: SystemDocument): BuildingForm {
  const stored = readBuilding(doc);
  const sorted = [...stored.floors].sort((a, b) => a.elevation - b.elevation);
  return {
    floors: {
      rows: sorted.length > 0 ? sorted.map((f) => ({ name: f.name, elevation: f.elevation })) : [{ name: 'Level 1', elevation: 0 }],
      typicalHeight: typicalStoreyHeight(sorted) as number,
    },
    unitTypes: stored.unitTypes.length > 0 ? stored.unitTypes.map(unitTypeToForm) : [newUnitType('unit-a', 'Unit A')],
    riser: {
      startNodeId: defaultStartNode(doc),
      mode: 'replace',
      material: '',
      size: '',
      sizeChanges: [],
      fromFloor: '',
      toFloor: '',
      footLength: 0,
      mainMaterial: '',
      mainSize: '',
      mainHeight: 0,
      zones: [],
    },
    units: [{ unitTypeId: stored.unitTypes[0]?.id ?? 'unit-a', labelPattern: 'Unit {floor}-{n}', mainLength: undefined as unknown as number }],
  };
}
