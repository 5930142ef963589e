/**
 * The tree editor's editing columns named from the segment's description (src/engine/model/elements.ts):
 * each column takes its header, its help and its cells' accessible names from the one segment key
 * whose `editor` names only that column (`material` writes the Material column; `custom`, written
 * by both Material and Size, names neither). The header is the key's `short` name (or its label)
 * with the unit of its range in the document's unit system ("Length (ft)"); a cell is named with its
 * row ("Riser length (ft)"), as a table cell of the walk is (walk/lib/described.ts).
 */
import type { SystemDocument, UnitSystem } from '../../engine';
import { SEGMENT } from '../../engine/model/elements';
import { describedCell, describedColumn } from '../walk/lib/described';
import type { EditablePart } from './policy';

/** The columns that write a segment key, in the editor's order. */
export const DESCRIBED_COLUMNS = ['name', 'material', 'size', 'length', 'rise', 'fittings'] as const satisfies readonly EditablePart[];
export type DescribedColumn = (typeof DESCRIBED_COLUMNS)[number];

type SegmentKey = keyof SystemDocument['segments'][number] & string;

/** The segment key whose `editor` names only `column`; throws when the description has none, or more than one. */
export function columnKey(column: DescribedColumn): SegmentKey {
  const keys = Object.entries(SEGMENT.keys).filter(([, d]) => d.editor?.length === 1 && d.editor[0] === column);
  if (keys.length !== 1) throw new Error(`the segment's description has ${keys.length} keys written by the "${column}" column alone (one is needed)`);
  return keys[0][0] as SegmentKey;
}

export interface ColumnNames {
  header: string;
  /** the key's help, the header's title and its cells' description */
  hint?: string;
  /** a cell's accessible name in the row of the segment named `row` */
  cell: (row: string) => string;
}

const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * The names of the described columns in a unit system. The name column is the one exception to
 * the key's label ("Name"): a column of names is headed by what its rows are, the element's own
 * name ("Segment"); its cells are buttons named "Open <segment>", not a labelled value.
 */
export function columnNames(unitSystem: UnitSystem): Record<DescribedColumn, ColumnNames> {
  const out = {} as Record<DescribedColumn, ColumnNames>;
  for (const column of DESCRIBED_COLUMNS) {
    const key = columnKey(column);
    const { label: header, hint } = describedColumn(SEGMENT, key, unitSystem);
    out[column] = {
      header: column === 'name' ? capitalised(SEGMENT.name) : header,
      ...(hint ? { hint } : {}),
      cell: (row) => describedCell(row, SEGMENT, key, unitSystem).label,
    };
  }
  return out;
}
