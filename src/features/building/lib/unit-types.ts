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

/**
 * The unit type a form describes. `before` is the stored unit type of the same id, if any: the form
 * shows only some of a node's and a segment's keys (one fixture group, a checked yes/no, the pipe's
 * material, size, length and fittings), so every key it does not show — a designer's size lock, a
 * custom pipe, a second fixture group, a checked fixture's own minimum — is kept
 * from it, and nothing the page cannot show is lost by editing what it can.
 */
export function unitTypeFromForm(form: UnitTypeForm, before?: UnitType): UnitType {
  const ids = uniqueIds(form.rows);
  const byKey = new Map(form.rows.map((r, i) => [r.key, ids[i]]));
  const nodeBefore = new Map((before?.nodes ?? []).map((n) => [n.id, n]));
  const segmentBefore = new Map((before?.segments ?? []).map((s) => [s.id, s]));
  return {
    id: form.id,
    name: form.name.trim(),
    nodes: form.rows.map((r, i) => {
      const old = nodeBefore.get(ids[i]);
      const firstGroup = r.fixtureTypeId ? [{ ...old?.fixtureGroups[0], fixtureTypeId: r.fixtureTypeId, count: r.count }] : [];
      const oldChecked = old?.checkedFixtures ?? [];
      const checked =
        r.fixtureTypeId && r.checked
          ? oldChecked.length > 0
            ? oldChecked.map((c, k) => (k === 0 ? { ...c, fixtureTypeId: r.fixtureTypeId, label: r.name.trim() } : c))
            : [{ id: ids[i], fixtureTypeId: r.fixtureTypeId, label: r.name.trim() }]
          : [];
      return {
        ...old,
        id: ids[i],
        label: r.name.trim(),
        heightAboveFloor: r.heightAboveFloor,
        fixtureGroups: [...firstGroup, ...(old?.fixtureGroups.slice(1) ?? [])],
        checkedFixtures: checked,
      };
    }) as UnitType['nodes'],
    segments: form.rows.map((r, i) => {
      const id = segmentIdFor(i, ids[i]);
      const old = segmentBefore.get(id);
      // a custom pipe stands for material and size: kept while the form's material and size are left as they were
      const keepsCustom = old?.custom !== undefined && (old.material ?? '') === r.material && (old.size ?? '') === r.size;
      const { custom, ...rest } = old ?? {};
      return {
        ...rest,
        ...(keepsCustom ? { custom } : {}),
        id,
        label: i === 0 ? 'branch' : `to ${r.name.trim()}`,
        from: r.from === UNIT_INLET ? UNIT_INLET : (byKey.get(r.from) ?? r.from),
        to: ids[i],
        material: r.material,
        size: r.size,
        length: r.length,
        fittings: r.fittings.map((f) => ({ typeId: f.typeId, count: f.count })),
      };
    }) as UnitType['segments'],
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
