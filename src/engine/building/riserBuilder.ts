/**
 * The riser builder (pure): from a short description of a building — its floors, one riser, the
 * floor main on each floor and the typical units along it — the tree Headroom analyses:
 *
 *   start node ──foot──▶ riser node on the first floor ──▶ … ──▶ riser node on the top floor
 *                              │ floor main: tap 1 ──▶ tap 2 ──▶ … (one tap per unit position)
 *                              └ each tap feeds one placement of a unit type (its branch piping)
 *
 * Riser segments run floor to floor; their length is the floor-to-floor height (plus the foot's
 * horizontal run for the first) and their rise is never typed: every riser and main node sits on
 * its floor at the main's height above it, so the climb comes from the floor elevations alone.
 * The output is ordinary data (floors, nodes, segments, unit types, placements) that the
 * designer edits like anything entered by hand.
 *
 * Pressure zones by floor range (`zones`, optional): one riser per zone, each starting at the same
 * start node at the base of the building, each fed through its own device on its first pipe —
 * a PRV for a zone the supply over-pressures, a variable-speed booster for a zone above what the
 * supply can reach, or nothing for a zone the supply serves as it is:
 *
 *   start ──[PRV]── low-zone riser: Level 1 … Level 12, a floor main and taps on each
 *        └─[booster]── zone base (level with the start) ── express riser (no taps) ── Level 13 … Level 40
 *
 * Separate zone risers with the pressure-reducing valve or booster at the base, the upper zone's
 * riser running express (no branches) through the floors below it, are the usual arrangement in
 * tall buildings (common practice): every device sits in the mechanical room where it can be
 * reached, and no floor of one zone is fed from another's riser. A zone's first pipe carries its
 * device at the inlet, so the analysis puts every node above it in that zone (analysis/zones.ts).
 * The PRV and booster are written with no loss of their own (a fixed 0): the designer enters the
 * product's loss curve in the Meter & devices step.
 */
import { EngineInputError } from '../errors';
import type { Fitting } from '../model/schema';
import type { UnitType, PlacementInput } from './schema';

export interface Floor {
  id: string;
  name: string;
  /** Elevation of the finished floor, length unit, the document's datum. */
  elevation: number;
}

export interface FloorRow {
  name: string;
  /** Omitted: the previous floor's elevation plus the typical height. */
  elevation?: number;
}

function builderError(field: string, message: string): EngineInputError {
  return new EngineInputError({ code: 'schema-violation', elementType: 'system', elementId: null, field, message });
}

/** A short, stable id from a floor name ("Level 7" → "level-7"); unique within the list. */
export function floorIdOf(name: string, taken: Set<string>): string {
  const base =
    name
      .trim()
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'floor';
  let id = base;
  for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
  taken.add(id);
  return id;
}

/**
 * Floors from a table in which only some elevations are written ("Level 1 at 0 ft, typical 10 ft,
 * Level 7 at 62 ft"): a missing elevation is the previous one plus `typicalHeight`. Elevations must
 * rise from each floor to the next; the first floor needs one.
 */
export function floorsFromTable(rows: readonly FloorRow[], typicalHeight: number): Floor[] {
  if (rows.length === 0) throw builderError('floors', 'Enter at least one floor.');
  if (!(typicalHeight > 0)) throw builderError('typicalHeight', 'The typical floor-to-floor height must be greater than zero.');
  const taken = new Set<string>();
  const floors: Floor[] = [];
  rows.forEach((row, i) => {
    const name = row.name.trim();
    if (name === '') throw builderError(`floors[${i}].name`, `Floor ${i + 1} has no name.`);
    let elevation: number;
    if (row.elevation !== undefined) elevation = row.elevation;
    else if (i === 0) throw builderError(`floors[0].elevation`, `The first floor ("${name}") needs an elevation.`);
    else elevation = floors[i - 1].elevation + typicalHeight;
    if (!Number.isFinite(elevation)) throw builderError(`floors[${i}].elevation`, `Floor "${name}": the elevation is not a number.`);
    if (i > 0 && !(elevation > floors[i - 1].elevation)) {
      throw builderError(
        `floors[${i}].elevation`,
        `Floor "${name}" (${elevation}) is not above "${floors[i - 1].name}" (${floors[i - 1].elevation}); list floors from the lowest up.`,
      );
    }
    floors.push({ id: floorIdOf(name, taken), name, elevation });
  });
  return floors;
}

export interface UnitPosition {
  unitTypeId: string;
  /** Label of each placement; "{floor}" is replaced by the floor's name and "{n}" by the position (1, 2, …). */
  labelPattern: string;
  /** Length of the floor main from the previous tap (or the riser) to this unit's tap, length unit. */
  mainLength: number;
  /** Overrides the length of the unit's inlet segment (its branch from the tap), length unit. */
  inletLength?: number;
}

/** One pressure zone of the riser builder: a range of floors and what feeds it. */
export interface ZoneSpec {
  /** First and last floor of the zone (floor ids, inclusive); zones follow each other up the building. */
  fromFloor: string;
  toFloor: string;
  /** 'supply': straight from the start node; 'prv': through a PRV; 'booster-pump': through a variable-speed booster. */
  feed: 'supply' | 'prv' | 'booster-pump';
  /** PRV outlet set pressure, or the booster's set discharge pressure, pressure unit (not for 'supply'). */
  setPressure?: number;
}

export interface RiserBuilderSpec {
  floors: readonly Floor[];
  /** Node the riser starts from (after the meter set), and its elevation, length unit. */
  startNodeId: string;
  startElevation: number;
  riser: {
    material: string;
    /** Size of the riser segment arriving at each floor; one entry applies from its floor up. */
    sizes: readonly { fromFloor: string; size: string }[];
    /** First and last floor served (floor ids, inclusive). */
    fromFloor: string;
    toFloor: string;
    /** Horizontal run from the start node to the foot of the riser, length unit. */
    footLength: number;
    fittings?: Fitting[];
    /** Fittings on the foot segment (e.g. the elbows into the riser). */
    footFittings?: Fitting[];
  };
  floorMain: {
    material: string;
    size: string;
    /** Height of the floor main above each floor (e.g. in the ceiling below the next), length unit. */
    heightAboveFloor: number;
    fittings?: Fitting[];
  };
  units: readonly UnitPosition[];
  unitTypes: readonly UnitType[];
  /** Pressure zones by floor range, lowest first, covering the riser's floors; absent or empty: one riser, no devices. */
  zones?: readonly ZoneSpec[];
}

export interface GeneratedNode {
  id: string;
  label: string;
  floor: string;
  heightAboveFloor: number;
}
export interface GeneratedSegment {
  id: string;
  label: string;
  from: string;
  to: string;
  material: string;
  size: string;
  length: number;
  fittings: Fitting[];
}

export interface GeneratedDevice {
  id: string;
  kind: 'prv' | 'booster-pump';
  label: string;
  segmentId: string;
  setPressure: number;
}

export interface GeneratedBuilding {
  floors: Floor[];
  nodes: GeneratedNode[];
  segments: GeneratedSegment[];
  placements: PlacementInput[];
  /** The zones' PRVs and boosters (none without zones). */
  devices: GeneratedDevice[];
}

const TEE_RUN: Fitting[] = [{ typeId: 'tee-run', count: 1 }];

export function buildRiser(spec: RiserBuilderSpec): GeneratedBuilding {
  const floorIndex = new Map(spec.floors.map((f, i) => [f.id, i]));
  const from = floorIndex.get(spec.riser.fromFloor);
  const to = floorIndex.get(spec.riser.toFloor);
  if (from === undefined) throw builderError('riser.fromFloor', `Floor "${spec.riser.fromFloor}" is not in the floor list.`);
  if (to === undefined) throw builderError('riser.toFloor', `Floor "${spec.riser.toFloor}" is not in the floor list.`);
  if (to < from) throw builderError('riser.toFloor', 'The riser must end on or above the floor it starts on.');
  if (spec.units.length === 0) throw builderError('units', 'Place at least one unit on the floor main.');
  const typeIds = new Set(spec.unitTypes.map((t) => t.id));
  spec.units.forEach((u, i) => {
    if (!typeIds.has(u.unitTypeId)) throw builderError(`units[${i}].unitTypeId`, `Unit type "${u.unitTypeId}" does not exist.`);
    if (!(u.mainLength > 0)) throw builderError(`units[${i}].mainLength`, 'The floor-main length to each unit must be greater than zero.');
  });
  for (const s of spec.riser.sizes) {
    if (!floorIndex.has(s.fromFloor)) throw builderError('riser.sizes', `Riser size from floor "${s.fromFloor}": that floor is not in the list.`);
  }
  const sizeAt = (i: number): string => {
    let size: string | undefined;
    let best = -1;
    for (const s of spec.riser.sizes) {
      const at = floorIndex.get(s.fromFloor)!;
      if (at <= i && at > best) {
        best = at;
        size = s.size;
      }
    }
    if (size === undefined) throw builderError('riser.sizes', `No riser size is given for floor "${spec.floors[i].name}" or below.`);
    return size;
  };

  const h = spec.floorMain.heightAboveFloor;
  const nodes: GeneratedNode[] = [];
  const segments: GeneratedSegment[] = [];
  const placements: PlacementInput[] = [];
  const devices: GeneratedDevice[] = [];

  /** The floor main and the units on floor i, from its riser node. */
  const floorMain = (floor: Floor, riserNode: string) => {
    let tapFrom = riserNode;
    spec.units.forEach((u, k) => {
      const n = k + 1;
      const tap = `main-${floor.id}-${n}`;
      nodes.push({ id: tap, label: `${floor.name} main, tap ${n}`, floor: floor.id, heightAboveFloor: h });
      segments.push({
        id: `main-${floor.id}-${n}`,
        label: `${floor.name} main to tap ${n}`,
        from: tapFrom,
        to: tap,
        material: spec.floorMain.material,
        size: spec.floorMain.size,
        length: u.mainLength,
        fittings: spec.floorMain.fittings ?? TEE_RUN,
      });
      tapFrom = tap;
      const type = spec.unitTypes.find((t) => t.id === u.unitTypeId)!;
      const inlet = type.segments.find((s) => s.from === 'inlet');
      const placement: PlacementInput = {
        id: `${floor.id}-u${n}`,
        unitTypeId: u.unitTypeId,
        label: u.labelPattern.replaceAll('{floor}', floor.name).replaceAll('{n}', String(n)),
        floor: floor.id,
        at: tap,
      };
      if (u.inletLength !== undefined && inlet && u.inletLength !== inlet.length) {
        placement.overrides = { segments: { [inlet.id]: { length: u.inletLength } } };
      }
      placements.push(placement);
    });
  };

  /**
   * One riser from the start node serving floors lo..hi. `zone` (1-based) names its pipes apart
   * from another zone's; its device sits at the inlet of its first pipe. A zone above the
   * building's first served floor starts with a short pipe to a base node beside the start
   * (where its device is, in the mechanical room) and an express riser up to its first floor.
   */
  const riser = (lo: number, hi: number, zone: { index: number; spec: ZoneSpec } | null) => {
    let below = spec.startNodeId;
    let belowElevation = spec.startElevation;
    const tag = zone ? `zone-${zone.index}-` : '';
    const zoneWords = zone ? `Zone ${zone.index} ` : '';
    let deviceSeg: string | null = null;
    if (zone && lo > from) {
      // the zone's base: level with the start point, the run to the foot away (its device sits there,
      // in the mechanical room); the express riser climbs from it
      const base = spec.floors[from];
      const baseNode = `${tag}base`;
      if (!(spec.riser.footLength > 0)) {
        throw builderError(
          'riser.footLength',
          `${zoneWords}needs a run from the start point to the foot of its riser, where its device sits: enter the run to the foot of the risers.`,
        );
      }
      nodes.push({ id: baseNode, label: `${zoneWords}riser base`, floor: base.id, heightAboveFloor: spec.startElevation - base.elevation });
      segments.push({
        id: `${tag}foot`,
        label: `${zoneWords}riser foot`,
        from: below,
        to: baseNode,
        material: spec.riser.material,
        size: sizeAt(lo),
        length: spec.riser.footLength,
        fittings: [...(spec.riser.footFittings ?? [])],
      });
      deviceSeg = `${tag}foot`;
      below = baseNode;
    }
    for (let i = lo; i <= hi; i++) {
      const floor = spec.floors[i];
      const riserNode = `riser-${floor.id}`;
      const z = floor.elevation + h;
      nodes.push({ id: riserNode, label: `Riser at ${floor.name}`, floor: floor.id, heightAboveFloor: h });
      const first = i === lo;
      const foot = first && deviceSeg === null;
      const length = Math.abs(z - belowElevation) + (foot ? spec.riser.footLength : 0);
      // A pipe of no length is not a description of anything: the start point sits level with the first floor main
      // and no run to the riser's foot was given. Said here, before anything is written to the draft.
      if (first && !(length > 0)) {
        throw builderError(
          'riser.footLength',
          `The riser's first pipe would have no length: the start point is level with the ${floor.name} floor main. Enter the run from the start point to the foot of the riser.`,
        );
      }
      const id = foot ? `${tag}riser-foot` : first ? `${tag}express` : `riser-to-${floor.id}`;
      segments.push({
        id,
        label: foot
          ? `${zoneWords}riser foot to ${floor.name}`.replace(/^./, (c) => c.toUpperCase())
          : first
            ? `${zoneWords}express riser to ${floor.name}`
            : `Riser to ${floor.name}`,
        from: below,
        to: riserNode,
        material: spec.riser.material,
        size: sizeAt(i),
        // Vertical pipe: its developed length is the climb (plus the foot's horizontal run).
        length,
        fittings: [...(foot ? (spec.riser.footFittings ?? []) : []), ...(spec.riser.fittings ?? TEE_RUN)],
      });
      if (first && deviceSeg === null) deviceSeg = id;
      floorMain(floor, riserNode);
      below = riserNode;
      belowElevation = z;
    }
    if (zone && zone.spec.feed !== 'supply') {
      const range = lo === hi ? spec.floors[lo].name : `${spec.floors[lo].name}–${spec.floors[hi].name}`;
      devices.push({
        id: `${tag}${zone.spec.feed === 'prv' ? 'prv' : 'booster'}`,
        kind: zone.spec.feed,
        label: `${zone.spec.feed === 'prv' ? 'PRV' : 'Booster pump'} for ${range}`,
        segmentId: deviceSeg!,
        setPressure: zone.spec.setPressure!,
      });
    }
  };

  const zones = spec.zones ?? [];
  if (zones.length === 0) riser(from, to, null);
  else zoneRanges(spec, floorIndex, from, to).forEach((r, k) => riser(r.lo, r.hi, { index: k + 1, spec: zones[k] }));
  return { floors: [...spec.floors], nodes, segments, placements, devices };
}

/** The zones' floor indices, checked: each a known range, lowest first, together exactly the riser's floors, each with its setting. */
function zoneRanges(spec: RiserBuilderSpec, floorIndex: Map<string, number>, from: number, to: number): { lo: number; hi: number }[] {
  const out: { lo: number; hi: number }[] = [];
  let next = from;
  (spec.zones ?? []).forEach((z, k) => {
    const where = `zones[${k}]`;
    const lo = floorIndex.get(z.fromFloor);
    const hi = floorIndex.get(z.toFloor);
    if (lo === undefined) throw builderError(`${where}.fromFloor`, `Zone ${k + 1}: floor "${z.fromFloor}" is not in the floor list.`);
    if (hi === undefined) throw builderError(`${where}.toFloor`, `Zone ${k + 1}: floor "${z.toFloor}" is not in the floor list.`);
    if (hi < lo) throw builderError(`${where}.toFloor`, `Zone ${k + 1} must end on or above the floor it starts on.`);
    if (lo !== next) {
      const expected = spec.floors[next]?.name ?? 'no further floor';
      throw builderError(
        `${where}.fromFloor`,
        `Zone ${k + 1} starts at "${spec.floors[lo].name}"; the zones must follow each other up the riser's floors without gap or overlap, so it should start at "${expected}".`,
      );
    }
    if (z.feed !== 'supply' && !(z.setPressure !== undefined && z.setPressure > 0)) {
      throw builderError(
        `${where}.setPressure`,
        `Zone ${k + 1} (${spec.floors[lo].name}–${spec.floors[hi].name}): enter the ${z.feed === 'prv' ? "PRV's set pressure" : "booster's set discharge pressure"}.`,
      );
    }
    out.push({ lo, hi });
    next = hi + 1;
  });
  if (next !== to + 1)
    throw builderError(
      'zones',
      `The zones end at "${spec.floors[next - 1].name}" but the riser goes up to "${spec.floors[to].name}": add a zone for the floors above.`,
    );
  return out;
}
