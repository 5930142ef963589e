/**
 * Fixture schedules on the building page: rows of the typical floor ("typical", "all floors")
 * name a unit type and set the count of its fixtures; each row gets a match or an error that names
 * its line, and nothing is applied until the designer confirms. The parsing is the engine's.
 */
import { SCHEDULE_MAX_BYTES, formatFixtureSchedule, parseFixtureSchedule, type ScheduleRow } from '../../../engine/building/schedule';
import type { PipingRow, UnitTypeForm } from './form';
import { FIXTURE_BRANCH_FITTINGS, newRowKey } from './defaults';

export const TYPICAL_FLOOR_WORDS = ['typical', 'typical floor', 'all', 'all floors', 'every floor'];
const norm = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

export interface PreviewRow extends ScheduleRow {
  /** the unit type the row goes to */
  unitTypeId: string | null;
}

export interface SchedulePreview {
  rows: PreviewRow[];
  fileErrors: string[];
  /** rows that will be applied */
  good: number;
}

/** A file the page accepts: text (CSV, TSV, TXT) of at most 1 MiB; otherwise the reason. */
export function fileProblem(file: { name: string; type: string; size: number }): string | null {
  if (file.size > SCHEDULE_MAX_BYTES) return `“${file.name}” is larger than 1 MiB; split the schedule by floor.`;
  const textType = file.type === '' || file.type.startsWith('text/') || file.type === 'application/vnd.ms-excel';
  if (!textType || !/\.(csv|tsv|txt)$/i.test(file.name)) return `“${file.name}” is not a CSV or text file; save the schedule as CSV.`;
  return null;
}

export function previewSchedule(text: string, types: readonly UnitTypeForm[]): SchedulePreview {
  const parsed = parseFixtureSchedule(text);
  const rows = parsed.rows.map((r): PreviewRow => {
    const type = types.find((t) => norm(t.name) === norm(r.unit));
    if (r.error) return { ...r, unitTypeId: null };
    if (!TYPICAL_FLOOR_WORDS.includes(norm(r.floor))) {
      return { ...r, unitTypeId: null, error: `Line ${r.line}: floor “${r.floor}” — this page takes the typical floor’s fixtures (write “typical”); a single floor’s differences are overrides of its placements.` };
    }
    if (!type) return { ...r, unitTypeId: null, error: `Line ${r.line}: there is no unit type named “${r.unit}” (${types.map((t) => `“${t.name}”`).join(', ')}).` };
    return { ...r, unitTypeId: type.id };
  });
  return { rows, fileErrors: parsed.fileErrors, good: parsed.fileErrors.length === 0 ? rows.filter((r) => !r.error).length : 0 };
}

/** The unit types with the schedule's counts written in: an existing fixture point's count, or a new point fed from the unit's first. */
export function applySchedule(types: readonly UnitTypeForm[], preview: SchedulePreview): UnitTypeForm[] {
  return types.map((t) => {
    const rows: PipingRow[] = t.rows.map((r) => ({ ...r }));
    for (const s of preview.rows) {
      if (s.error || s.unitTypeId !== t.id || !s.fixtureTypeId || s.count === null) continue;
      const existing = rows.find((r) => r.fixtureTypeId === s.fixtureTypeId);
      if (existing) existing.count = s.count;
      else {
        const last = rows[rows.length - 1];
        rows.push({
          key: newRowKey(), name: s.matchedLabel ?? s.fixture, from: rows[0].key, heightAboveFloor: 0, fixtureTypeId: s.fixtureTypeId, count: s.count, checked: false,
          material: last.material, size: rows.length > 1 ? last.size : '', length: undefined as unknown as number, fittings: FIXTURE_BRANCH_FITTINGS.map((f) => ({ ...f })),
        });
      }
    }
    return { ...t, rows };
  });
}

/** The unit types' fixtures in the same format the import reads. */
export function exportSchedule(types: readonly UnitTypeForm[]): string {
  return formatFixtureSchedule(
    types.flatMap((t) => t.rows.filter((r) => r.fixtureTypeId).map((r) => ({ floor: 'typical', unit: t.name, fixtureTypeId: r.fixtureTypeId, count: r.count }))),
  );
}
