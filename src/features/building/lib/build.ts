/**
 * The page's form → the engine's riser builder → the generated building, and the preview's
 * counts of what would be written. Pure.
 */
import type { SystemDocument } from '../../../engine';
import { fixtureGroupWsfu } from '../../../engine';
import { buildRiser, floorsFromTable, type Floor, type GeneratedBuilding } from '../../../engine/building/riserBuilder';
import type { UnitType } from '../../../engine/building/schema';
import type { BuildingForm } from './form';
import { unitTypeFromForm } from './unit-types';

export interface BuildResult {
  floors: Floor[];
  unitTypes: UnitType[];
  built: GeneratedBuilding;
}

export function floorsOf(form: Pick<BuildingForm, 'floors'>): Floor[] {
  return floorsFromTable(
    form.floors.rows.map((r) => ({ name: r.name, elevation: r.elevation })),
    form.floors.typicalHeight,
  );
}

/** Throws the builder's EngineInputError (its message names the field) when the form cannot be built. */
/** `storedTypes`: the draft's unit types, whose keys the form does not show are kept (unitTypeFromForm). */
export function buildFromForm(form: BuildingForm, startElevation: number, storedTypes: readonly UnitType[] = []): BuildResult {
  const floors = floorsOf(form);
  const idOf = (name: string, fallback: Floor) => floors.find((f) => f.name === name.trim())?.id ?? fallback.id;
  const unitTypes = form.unitTypes.map((t) =>
    unitTypeFromForm(
      t,
      storedTypes.find((s) => s.id === t.id),
    ),
  );
  const r = form.riser;
  const from = idOf(r.fromFloor, floors[0]);
  const built = buildRiser({
    floors,
    startNodeId: r.startNodeId,
    startElevation,
    riser: {
      material: r.material,
      sizes: [{ fromFloor: from, size: r.size }, ...r.sizeChanges.map((c) => ({ fromFloor: idOf(c.fromFloor, floors[0]), size: c.size }))],
      fromFloor: from,
      toFloor: idOf(r.toFloor, floors[floors.length - 1]),
      footLength: r.footLength,
      footFittings: r.footLength > 0 ? [{ typeId: 'elbow-90-standard', count: 2 }] : [],
    },
    floorMain: { material: r.mainMaterial, size: r.mainSize, heightAboveFloor: r.mainHeight },
    units: form.units.map((u) => ({ unitTypeId: u.unitTypeId, labelPattern: u.labelPattern, mainLength: u.mainLength, inletLength: u.branchLength })),
    unitTypes,
    zones: r.zones.map((zr) => ({
      fromFloor: idOf(zr.fromFloor, floors[0]),
      toFloor: idOf(zr.toFloor, floors[floors.length - 1]),
      feed: zr.feed,
      setPressure: zr.setPressure,
    })),
  });
  return { floors, unitTypes, built };
}

export interface BuildingCounts {
  segments: number;
  nodes: number;
  placements: number;
  /** PRVs and boosters of the zones. */
  devices: number;
  fixtureUnits: number;
  checkedFixtures: number;
}

/** What generating would add: the riser and mains plus every placement's own piping and fixtures. */
export function countBuilding({ built, unitTypes }: BuildResult, service: SystemDocument['service']): BuildingCounts {
  const types = new Map(unitTypes.map((t) => [t.id, t]));
  let segments = built.segments.length;
  let nodes = built.nodes.length;
  let fixtureUnits = 0;
  let checkedFixtures = 0;
  for (const p of built.placements) {
    const t = types.get(p.unitTypeId);
    if (!t) continue;
    segments += t.segments.length;
    nodes += t.nodes.length;
    for (const n of t.nodes) {
      checkedFixtures += n.checkedFixtures.length;
      for (const g of n.fixtureGroups) fixtureUnits += (fixtureGroupWsfu(g, g.wsfuBasis ?? service) ?? 0) * g.count;
    }
  }
  return { segments, nodes, placements: built.placements.length, devices: built.devices.length, fixtureUnits, checkedFixtures };
}
