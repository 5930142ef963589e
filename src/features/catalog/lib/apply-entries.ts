/**
 * A project's own catalog entries, copied into a system document when chosen: the document must
 * analyse the same with the engine alone (on the client and the server), so it never refers to a
 * project entry by id. What the document format holds:
 *   - a pipe material and size → the segment's `custom` pipe (inside diameter, roughness, C, velocity class);
 *   - a device template → a device's loss-at-flow curve.
 * A fixture type's own fixture units and a fitting's own K have no place in the format yet
 * (FixtureGroupSchema and FittingSchema refer to the seeded catalogs only), so those entries are
 * kept in the project's catalog but cannot be chosen in the walk.
 */
import { fromSI } from '../../../engine';
import type { CustomPipe, Device, UnitSystem } from '../../../engine';
import type { ProjectEntryOf } from '../../../shared/api/catalog';

/** Option values of project entries in the walk's selects: `project:<entry id>` (seeded ids never start so). */
const PREFIX = 'project:';
export const projectOptionValue = (entryId: string) => `${PREFIX}${entryId}`;
export const projectEntryIdOf = (value: string | undefined): string | null => (value?.startsWith(PREFIX) ? value.slice(PREFIX.length) : null);

/** Which entry kinds the walk can copy into a document. */
export const COPYABLE_KINDS = ['material', 'device-template'] as const;

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
export function matchProjectPipe(custom: CustomPipe | undefined, entries: readonly ProjectEntryOf<'material'>[], sys: UnitSystem): { entryId: string; sizeKey: string } | null {
  if (!custom) return null;
  for (const entry of entries) {
    for (const size of entry.data.sizes) {
      const pipe = pipeFromProjectEntry(entry, size.key, sys)!;
      if (pipe.velocityClass === custom.velocityClass && same(pipe.innerDiameter, custom.innerDiameter) && same(pipe.roughness, custom.roughness) && same(pipe.hazenWilliamsC, custom.hazenWilliamsC)) {
        return { entryId: entry.id, sizeKey: size.key };
      }
    }
  }
  return null;
}

/** Six significant figures: converted curve points without binary noise (0.1 + 0.2 …), as the seeded templates are shown. */
const tidy = (x: number) => Number(x.toPrecision(6));

/** A device's kind and loss curve from a project device template, in the document's units. */
export function deviceFromProjectTemplate(entry: ProjectEntryOf<'device-template'>, sys: UnitSystem): Pick<Device, 'kind' | 'label'> & { points: { flow: number; loss: number }[] } {
  return {
    kind: entry.data.kind,
    label: entry.label,
    points: entry.data.points.map((p) => ({ flow: tidy(fromSI('flow', p.flowM3s, sys)), loss: tidy(fromSI('pressure', p.lossPa, sys)) })),
  };
}

/**
 * The project's fixture types or fitting types in a picker, after the seeded ones: listed so the
 * designer sees them, but not choosable (see the note at the top: the format cannot hold them).
 */
export function unusableProjectOptions(entries: readonly { id: string; label: string }[]) {
  return entries.map((e) => ({ value: projectOptionValue(e.id), label: `${e.label} — project (cannot be copied into a system yet)`, disabled: true }));
}
