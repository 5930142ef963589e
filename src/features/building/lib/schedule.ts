/**
 * Fixture schedules on the building page: rows of the typical floor ("typical", "all floors")
 * name a unit type and set the count of its fixtures; each row gets a match or an error that names
 * its line, and nothing is applied until the designer confirms. The parsing is the engine's; the
 * optional columns a unit type also reads — height (above the floor), length and size of the
 * fixture's branch, check (yes) — are read here with the same CSV parser (Papa Parse).
 */
import Papa from 'papaparse';
import { FIXTURE_TYPES } from '../../../engine/catalog/fixtures';
import { SCHEDULE_MAX_BYTES, parseFixtureSchedule, type ScheduleRow } from '../../../engine/building/schedule';
import type { PipingRow, UnitTypeForm } from './form';
import { FIXTURE_BRANCH_FITTINGS, newRowKey } from './defaults';

export const TYPICAL_FLOOR_WORDS = ['typical', 'typical floor', 'all', 'all floors', 'every floor'];
const norm = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

export interface BranchColumns {
  heightAboveFloor?: number;
  length?: number;
  size?: string;
  checked?: boolean;
}

export interface PreviewRow extends ScheduleRow, BranchColumns {
  /** the unit type the row goes to */
  unitTypeId: string | null;
}

const EXTRA_HEADERS: Record<string, keyof BranchColumns> = {
  height: 'heightAboveFloor',
  'height above floor': 'heightAboveFloor',
  length: 'length',
  'branch length': 'length',
  size: 'size',
  'branch size': 'size',
  check: 'checked',
  checked: 'checked',
};

/** The optional branch columns of each line (by line number), or the line's error. */
function branchColumns(text: string): Map<number, BranchColumns | string> {
  const out = new Map<number, BranchColumns | string>();
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimiter: '' });
  const header = (parsed.data[0] ?? []).map((h) => EXTRA_HEADERS[norm(h)]);
  parsed.data.slice(1).forEach((cells, i) => {
    const line = i + 2;
    const cols: BranchColumns = {};
    for (const [k, key] of header.entries()) {
      const v = (cells[k] ?? '').trim();
      if (!key || v === '') continue;
      if (key === 'size') cols.size = v;
      else if (key === 'checked') cols.checked = /^(yes|y|true|x|1)$/i.test(v);
      else {
        const n = Number(v);
        if (!Number.isFinite(n) || n < 0 || (key === 'length' && n === 0)) {
          out.set(line, `Line ${line}: ${key === 'length' ? 'length' : 'height'} “${v}” is not a ${key === 'length' ? 'positive' : 'non-negative'} number.`);
          return;
        }
        cols[key] = n;
      }
    }
    out.set(line, cols);
  });
  return out;
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
  const extra = parsed.fileErrors.length === 0 ? branchColumns(text) : new Map<number, BranchColumns | string>();
  const rows = parsed.rows.map((r): PreviewRow => {
    const type = types.find((t) => norm(t.name) === norm(r.unit));
    if (r.error) return { ...r, unitTypeId: null };
    const cols = extra.get(r.line) ?? {};
    if (typeof cols === 'string') return { ...r, unitTypeId: null, error: cols };
    if (!TYPICAL_FLOOR_WORDS.includes(norm(r.floor))) {
      return {
        ...r,
        unitTypeId: null,
        error: `Line ${r.line}: floor “${r.floor}” — this page takes the typical floor’s fixtures (write “typical”); a single floor’s differences are overrides of its placements.`,
      };
    }
    if (!type)
      return { ...r, unitTypeId: null, error: `Line ${r.line}: there is no unit type named “${r.unit}” (${types.map((t) => `“${t.name}”`).join(', ')}).` };
    return { ...r, ...cols, unitTypeId: type.id };
  });
  return { rows, fileErrors: parsed.fileErrors, good: parsed.fileErrors.length === 0 ? rows.filter((r) => !r.error).length : 0 };
}

/** The unit types with the schedule's counts written in: an existing fixture point's count, or a new point fed from the unit's first. */
export function applySchedule(types: readonly UnitTypeForm[], preview: SchedulePreview): UnitTypeForm[] {
  return types.map((t) => {
    const rows: PipingRow[] = t.rows.map((r) => ({ ...r }));
    for (const s of preview.rows) {
      if (s.error || s.unitTypeId !== t.id || !s.fixtureTypeId || s.count === null) continue;
      const given = {
        ...(s.heightAboveFloor !== undefined ? { heightAboveFloor: s.heightAboveFloor } : {}),
        ...(s.length !== undefined ? { length: s.length } : {}),
        ...(s.size !== undefined ? { size: s.size } : {}),
        ...(s.checked !== undefined ? { checked: s.checked } : {}),
      };
      const existing = rows.find((r) => r.fixtureTypeId === s.fixtureTypeId);
      if (existing) Object.assign(existing, { count: s.count }, given);
      else {
        const last = rows[rows.length - 1];
        rows.push({
          key: newRowKey(),
          name: s.fixture,
          from: rows[0].key,
          heightAboveFloor: 0,
          fixtureTypeId: s.fixtureTypeId,
          count: s.count,
          checked: false,
          material: last.material,
          size: rows.length > 1 ? last.size : '',
          length: undefined as unknown as number,
          fittings: FIXTURE_BRANCH_FITTINGS.map((f) => ({ ...f })),
          ...given,
        });
      }
    }
    return { ...t, rows };
  });
}

/** The unit types' fixtures in the same format the import reads (with the branch columns). */
export function exportSchedule(types: readonly UnitTypeForm[]): string {
  return Papa.unparse({
    fields: ['floor', 'unit', 'fixture', 'count', 'occupancy', 'height', 'length', 'size', 'check'],
    data: types.flatMap((t) =>
      t.rows
        .filter((r) => r.fixtureTypeId)
        .map((r) => {
          const f = FIXTURE_TYPES[r.fixtureTypeId];
          return [
            'typical',
            t.name,
            f ? f.label : r.fixtureTypeId,
            r.count,
            f?.occupancy === 'public' ? 'public' : 'private',
            r.heightAboveFloor,
            r.length,
            r.size,
            r.checked ? 'yes' : 'no',
          ];
        }),
    ),
  });
}
