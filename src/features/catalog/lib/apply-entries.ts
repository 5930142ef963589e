/**
 * A project's own catalog entries, copied into a system document when chosen: the document must
 * analyse the same with the engine alone (on the client and the server), so its values never come
 * from a project entry by id. What the document format holds:
 *   - a pipe material and size → the segment's `custom` pipe (inside diameter, roughness, C, velocity class);
 *   - a device template → a device's loss-at-flow curve;
 *   - a fitting type → the fitting's `custom` {label, k, source} (typeId `project:<entry id>`, a reference only);
 *   - a fixture type → the fixture group's `custom` {label, wsfuCold?, wsfuHot?, wsfuTotal, flushValve, source}
 *     (fixtureTypeId `project:<entry id>`). Its minimum flow pressure belongs to a checked fixture
 *     (CheckedFixtureSchema.minFlowPressure), not to the group.
 * The data is copied when the entry is chosen and kept in the document: a later change of the
 * entry, or its removal, does not change a document already carrying the copy.
 */
import { fromSI } from '../../../engine';
import { roundedFromSI } from '../../../engine/building/convertUnits';
import type { CustomFitting, CustomFixture, CustomPipe, Device, Fitting, FixtureGroup, UnitSystem } from '../../../engine';
import type { ProjectEntryOf } from '../../../shared/api/catalog';

/** Option values of project entries in the walk's selects: `project:<entry id>` (seeded ids never start so). */
const PREFIX = 'project:';
export const projectOptionValue = (entryId: string) => `${PREFIX}${entryId}`;
export const projectEntryIdOf = (value: string | undefined): string | null => (value?.startsWith(PREFIX) ? value.slice(PREFIX.length) : null);

/** Which entry kinds the walk can copy into a document. */
export const COPYABLE_KINDS = ['material', 'device-template', 'fitting-type', 'fixture-type'] as const;

/** The custom pipe of a project material at one of its sizes, in the document's units; null for an unknown size. */
export function pipeFromProjectEntry(entry: ProjectEntryOf<'material'>, sizeKey: string, sys: UnitSystem): CustomPipe | null {
  const size = entry.data.sizes.find((s) => s.key === sizeKey);
  if (!size) return null;
  return {
    innerDiameter: fromSI('diameter', size.innerDiameterM, sys),
    roughness: fromSI('diameter', entry.data.roughnessM, sys),
    hazenWilliamsC: entry.data.hazenWilliamsC,
    velocityClass: entry.data.velocityClass,
  };
}

/**
 * Relative tolerance of "the same number" when a stored custom pipe is recognised as a project
 * entry: the unit conversion and back is exact to about 1e-15; 1e-9 leaves room for a JSON
 * round trip and nothing more (a retyped value differs by far more).
 */
const SAME = 1e-9;
const same = (a: number, b: number) => Math.abs(a - b) <= SAME * Math.max(Math.abs(a), Math.abs(b), Number.MIN_VALUE);

/** The project material and size a segment's custom pipe was copied from, if one matches exactly. */
export function matchProjectPipe(
  custom: CustomPipe | undefined,
  entries: readonly ProjectEntryOf<'material'>[],
  sys: UnitSystem,
): { entryId: string; sizeKey: string } | null {
  if (!custom) return null;
  for (const entry of entries) {
    for (const size of entry.data.sizes) {
      const pipe = pipeFromProjectEntry(entry, size.key, sys)!;
      if (
        pipe.velocityClass === custom.velocityClass &&
        same(pipe.innerDiameter, custom.innerDiameter) &&
        same(pipe.roughness, custom.roughness) &&
        same(pipe.hazenWilliamsC, custom.hazenWilliamsC)
      ) {
        return { entryId: entry.id, sizeKey: size.key };
      }
    }
  }
  return null;
}

/** A device's kind and loss curve from a project device template, in the document's units. */
export function deviceFromProjectTemplate(
  entry: ProjectEntryOf<'device-template'>,
  sys: UnitSystem,
): Pick<Device, 'kind' | 'label'> & { points: { flow: number; loss: number }[] } {
  return {
    kind: entry.data.kind,
    label: entry.label,
    points: entry.data.points.map((p) => ({ flow: roundedFromSI('flow', p.flowM3s, sys), loss: roundedFromSI('pressure', p.lossPa, sys) })),
  };
}

/** A project fitting type as a document fitting's own data: its K, label and source as entered. */
export function fittingFromProjectEntry(entry: ProjectEntryOf<'fitting-type'>): CustomFitting {
  return { label: entry.label, k: entry.data.k, source: entry.source };
}

/**
 * A project fixture type as a fixture group's own data: fixture units per fixture as entered (a
 * type without a cold or hot value has no load on that service), its demand curve as `flushValve`.
 */
export function fixtureFromProjectEntry(entry: ProjectEntryOf<'fixture-type'>): CustomFixture {
  const { cold, hot, total } = entry.data.wsfu;
  return {
    label: entry.label,
    ...(cold !== null ? { wsfuCold: cold } : {}),
    ...(hot !== null ? { wsfuHot: hot } : {}),
    wsfuTotal: total,
    flushValve: entry.data.demandCurve === 'flush-valve',
    source: entry.source,
  };
}

/**
 * A fitting row of the walk as the document stores it. A row that carries own data keeps it (the
 * copy made when its type was chosen, or data written in the document): choosing another type in
 * the walk clears the row's copy first. A project type (`project:<id>`) without a copy gets a fresh
 * copy of the entry; a seeded type carries none; a project row whose entry is gone and that has no
 * copy is left as it is (the engine then names it).
 */
export function fittingWithProjectData(row: Fitting, entries: readonly ProjectEntryOf<'fitting-type'>[]): Fitting {
  if (row.custom) return { typeId: row.typeId, count: row.count, custom: row.custom };
  const entryId = projectEntryIdOf(row.typeId);
  const entry = entryId === null ? undefined : entries.find((e) => e.id === entryId);
  return entry ? { typeId: row.typeId, count: row.count, custom: fittingFromProjectEntry(entry) } : { typeId: row.typeId, count: row.count };
}

/** The same for a fixture group row: the other fields of the group are kept as they are. */
export function groupWithProjectData(row: FixtureGroup, entries: readonly ProjectEntryOf<'fixture-type'>[]): FixtureGroup {
  const { custom, ...rest } = row;
  if (custom) return { ...rest, custom };
  const entryId = projectEntryIdOf(row.fixtureTypeId);
  const entry = entryId === null ? undefined : entries.find((e) => e.id === entryId);
  return entry ? { ...rest, custom: fixtureFromProjectEntry(entry) } : rest;
}

/** The project's entries of a kind in a picker, after the seeded ones, marked as the project's. */
export function projectOptions(entries: readonly { id: string; label: string }[]) {
  return entries.map((e) => ({ value: projectOptionValue(e.id), label: `${e.label} — project` }));
}

/**
 * Listed but not choosable (kept for pickers whose document field cannot hold project data:
 * a checked fixture's type must be a seeded type).
 */
export function unusableProjectOptions(entries: readonly { id: string; label: string }[]) {
  return entries.map((e) => ({ value: projectOptionValue(e.id), label: `${e.label} — project (cannot be copied into a system yet)`, disabled: true }));
}
