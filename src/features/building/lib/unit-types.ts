/**
 * Between the page's unit-type rows (one row per point of the unit, with the pipe that feeds it)
 * and the engine's UnitType (local nodes and segments). Local ids come from the point names, so
 * a generated element reads "Apt Level 4-4 · shower valve".
 */
import { UNIT_INLET, type UnitType } from '../../../engine/building/schema';
import type { PipingRow, UnitTypeForm } from './form';

const slug = (name: string) =>
  name
    .trim()
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '') || 'point';

/** A row read from a stored unit type keeps its node id (placements' overrides and checked fixtures refer to it); a new row gets one from its name. */
const isNewRow = (key: string) => key.startsWith('row-');

function uniqueIds(rows: readonly { key: string; name: string }[]): string[] {
  const taken = new Set<string>([UNIT_INLET, ...rows.filter((r) => !isNewRow(r.key)).map((r) => r.key)]);
  return rows.map(({ key, name }) => {
    if (!isNewRow(key)) return key;
    const base = slug(name);
    let id = base;
    for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
    taken.add(id);
    return id;
  });
}

/** The id of the segment feeding a point: the unit's branch for the first row, "to-<point>" for the others. */
export const segmentIdFor = (rowIndex: number, nodeId: string) => (rowIndex === 0 ? 'branch' : `to-${nodeId}`);

export function unitTypeFromForm(form: UnitTypeForm): UnitType {
  const ids = uniqueIds(form.rows);
  const byKey = new Map(form.rows.map((r, i) => [r.key, ids[i]]));
  return {
    id: form.id,
    name: form.name.trim(),
    nodes: form.rows.map((r, i) => ({
      id: ids[i],
      label: r.name.trim(),
      heightAboveFloor: r.heightAboveFloor,
      fixtureGroups: r.fixtureTypeId ? [{ fixtureTypeId: r.fixtureTypeId, count: r.count }] : [],
      checkedFixtures: r.fixtureTypeId && r.checked ? [{ id: ids[i], fixtureTypeId: r.fixtureTypeId, label: r.name.trim() }] : [],
    })) as UnitType['nodes'],
    segments: form.rows.map((r, i) => ({
      id: segmentIdFor(i, ids[i]),
      label: i === 0 ? 'branch' : `to ${r.name.trim()}`,
      from: r.from === UNIT_INLET ? UNIT_INLET : (byKey.get(r.from) ?? r.from),
      to: ids[i],
      material: r.material,
      size: r.size,
      length: r.length,
      fittings: r.fittings.map((f) => ({ typeId: f.typeId, count: f.count })),
    })) as UnitType['segments'],
  };
}

/** A stored unit type back into rows (each node with the segment that feeds it). */
export function unitTypeToForm(type: UnitType): UnitTypeForm {
  const feeding = new Map(type.segments.map((s) => [s.to, s]));
  const ordered = [...type.nodes].sort((a, b) => Number(feeding.get(b.id)?.from === UNIT_INLET) - Number(feeding.get(a.id)?.from === UNIT_INLET));
  const rows: PipingRow[] = ordered.map((n) => {
    const s = feeding.get(n.id);
    const group = n.fixtureGroups[0];
    return {
      key: n.id,
      name: n.label ?? n.id,
      from: s?.from ?? UNIT_INLET,
      heightAboveFloor: n.heightAboveFloor,
      fixtureTypeId: group?.fixtureTypeId ?? '',
      count: group?.count ?? 1,
      checked: n.checkedFixtures.length > 0,
      material: s?.material ?? '',
      size: s?.size ?? '',
      length: s?.length ?? 1,
      fittings: (s?.fittings ?? []).map((f) => ({ typeId: f.typeId, count: f.count })),
    };
  });
  return { id: type.id, name: type.name, rows };
}
