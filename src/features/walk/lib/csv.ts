/**
 * Comma- or tab-separated lines (what a spreadsheet copies or exports), read one record per line
 * with Papa Parse so quoting follows RFC 4180 ("quoted, fields", "" for a quote); blank lines and
 * lines starting with # are skipped, and every problem names its line. One record per line keeps
 * each message's line number the one the designer sees in their file.
 */
import Papa from 'papaparse';
import { matchFixtureType } from '../../../engine/building/schedule';

export interface CsvRow {
  /** 1-based line number in the text */
  line: number;
  cells: string[];
}

export interface CsvResult<T> {
  rows: T[];
  errors: string[];
}

/** Rows of cells; a line with a tab is split on tabs (spreadsheet paste), otherwise on commas. */
export function readDelimited(text: string): CsvResult<CsvRow> {
  const errors: string[] = [];
  const rows: CsvRow[] = [];
  text
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\n|\r/)
    .forEach((raw, index) => {
      const line = index + 1;
      const trimmed = raw.trim();
      if (trimmed === '' || trimmed.startsWith('#')) return;
      const parsed = Papa.parse<string[]>(raw, { delimiter: raw.includes('\t') ? '\t' : ',', quoteChar: '"' });
      const quoteProblem = parsed.errors.find((e) => e.type === 'Quotes');
      if (quoteProblem) {
        errors.push(`Line ${line}: ${quoteProblem.code === 'MissingQuotes' ? 'a quoted value is not closed' : 'a quoted value is followed by other text'}.`);
        return;
      }
      rows.push({ line, cells: (parsed.data[0] ?? []).map((c) => c.trim()) });
    });
  return { rows, errors };
}

const isNumber = (cell: string) => cell !== '' && Number.isFinite(Number(cell));

/** Drops a first row that is a header (its cells in the numeric columns are not numbers). */
function withoutHeader(rows: CsvRow[], numericColumns: number[]): CsvRow[] {
  if (rows.length === 0) return rows;
  const first = rows[0];
  const looksLikeHeader = numericColumns.every((c) => first.cells[c] !== undefined && !isNumber(first.cells[c]));
  return looksLikeHeader ? rows.slice(1) : rows;
}

/** Loss-curve points: two columns, flow then loss, both numbers ≥ 0, in the document's units. */
export function parseCurvePoints(text: string): CsvResult<{ flow: number; loss: number }> {
  const read = readDelimited(text);
  const errors = [...read.errors];
  const rows: { flow: number; loss: number }[] = [];
  for (const { line, cells } of withoutHeader(read.rows, [0, 1])) {
    if (cells.length !== 2) {
      errors.push(`Line ${line}: expected 2 values (flow, loss), found ${cells.length}.`);
      continue;
    }
    const [flow, loss] = cells.map(Number);
    if (!isNumber(cells[0]) || flow < 0) errors.push(`Line ${line}: the flow “${cells[0]}” is not a number of zero or more.`);
    else if (!isNumber(cells[1]) || loss < 0) errors.push(`Line ${line}: the loss “${cells[1]}” is not a number of zero or more.`);
    else rows.push({ flow, loss });
  }
  if (rows.length === 0 && errors.length === 0) errors.push('No points found: paste or import lines of “flow, loss”.');
  return { rows, errors };
}

export interface FixtureGroupRow {
  nodeId: string;
  fixtureTypeId: string;
  count: number;
}

export interface KnownForGroups {
  /** the system's nodes: a line names one by its name (as the screens show it) or its id */
  nodes: readonly { id: string; label?: string }[];
  /** fixture types a line may name by id (the catalog's and the project's); the catalog's also by the trade's words */
  fixtureTypeIds: ReadonlySet<string>;
}

const norm = (s: string) => s.trim().toLowerCase().replace(/\s+/g, ' ');

/**
 * Fixture groups: node (its name or id), fixture (the trade's words such as "water closet, flush
 * tank" or "lavatory", a catalog label, or a type id), count (a whole number ≥ 1), and optionally
 * occupancy (private when empty, or public).
 */
export function parseFixtureGroups(text: string, known: KnownForGroups): CsvResult<FixtureGroupRow> {
  const read = readDelimited(text);
  const errors = [...read.errors];
  const rows: FixtureGroupRow[] = [];
  const ids = new Set(known.nodes.map((n) => n.id));
  const byName = new Map<string, string[]>();
  for (const n of known.nodes) if (n.label) byName.set(norm(n.label), [...(byName.get(norm(n.label)) ?? []), n.id]);
  for (const { line, cells } of withoutHeader(read.rows, [2])) {
    if (cells.length !== 3 && cells.length !== 4) {
      errors.push(`Line ${line}: expected 3 or 4 values (node, fixture, count, occupancy), found ${cells.length}.`);
      continue;
    }
    const [node, fixture, countText, occupancyText = ''] = cells;
    const named = byName.get(norm(node)) ?? [];
    const nodeId = ids.has(node) ? node : named.length === 1 ? named[0] : null;
    const occupancy = norm(occupancyText);
    const count = Number(countText);
    if (nodeId === null)
      errors.push(
        named.length > 1
          ? `Line ${line}: ${named.length} nodes are named “${node}” (${named.join(', ')}); write the node's id.`
          : `Line ${line}: there is no node “${node}” in this system.`,
      );
    else if (occupancy !== '' && occupancy !== 'private' && occupancy !== 'public')
      errors.push(`Line ${line}: occupancy “${occupancyText}” is neither private nor public.`);
    else {
      const fixtureTypeId = known.fixtureTypeIds.has(fixture)
        ? fixture
        : (matchFixtureType(fixture, occupancy === 'public' ? 'public' : 'private')?.id ?? null);
      if (fixtureTypeId === null || !known.fixtureTypeIds.has(fixtureTypeId)) errors.push(`Line ${line}: “${fixture}” is not a fixture type in the catalog.`);
      else if (!isNumber(countText) || !Number.isInteger(count) || count < 1)
        errors.push(`Line ${line}: the count “${countText}” is not a whole number of 1 or more.`);
      else rows.push({ nodeId, fixtureTypeId, count });
    }
  }
  if (rows.length === 0 && errors.length === 0) errors.push('No fixture groups found: lines of “node, fixture, count” were expected.');
  return { rows, errors };
}
