/**
 * A small, strict reader of comma- or tab-separated lines (what a spreadsheet copies or exports).
 * No CSV package is installed, and these files are a few dozen lines of numbers and ids, so this
 * reads one record per line (no line breaks inside quotes), allows "quoted, fields" with ""
 * for a quote, skips blank lines and lines starting with #, and names the line of every problem.
 */
export interface CsvRow {
  /** 1-based line number in the text */
  line: number;
  cells: string[];
}

export interface CsvResult<T> {
  rows: T[];
  errors: string[];
}

function splitLine(text: string, delimiter: string, line: number, errors: string[]): string[] | null {
  const cells: string[] = [];
  let i = 0;
  while (i <= text.length) {
    if (text[i] === '"') {
      let value = '';
      i++;
      for (;;) {
        if (i >= text.length) {
          errors.push(`Line ${line}: a quoted value is not closed.`);
          return null;
        }
        if (text[i] === '"') {
          if (text[i + 1] === '"') {
            value += '"';
            i += 2;
            continue;
          }
          i++;
          break;
        }
        value += text[i++];
      }
      const rest = text.indexOf(delimiter, i);
      const after = (rest === -1 ? text.slice(i) : text.slice(i, rest)).trim();
      if (after !== '') {
        errors.push(`Line ${line}: unexpected text after a quoted value.`);
        return null;
      }
      cells.push(value.trim());
      if (rest === -1) break;
      i = rest + 1;
    } else {
      const next = text.indexOf(delimiter, i);
      cells.push((next === -1 ? text.slice(i) : text.slice(i, next)).trim());
      if (next === -1) break;
      i = next + 1;
    }
  }
  return cells;
}

/** Rows of cells; a line with a tab is split on tabs (spreadsheet paste), otherwise on commas. */
export function readDelimited(text: string): CsvResult<CsvRow> {
  const errors: string[] = [];
  const rows: CsvRow[] = [];
  text.split(/\r\n|\n|\r/).forEach((raw, index) => {
    const line = index + 1;
    const trimmed = raw.trim();
    if (trimmed === '' || trimmed.startsWith('#')) return;
    const cells = splitLine(raw, raw.includes('\t') ? '\t' : ',', line, errors);
    if (cells) rows.push({ line, cells });
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

/** Fixture groups: three columns, node id, fixture type id, count (a whole number ≥ 1). */
export function parseFixtureGroups(text: string, known: { nodeIds: ReadonlySet<string>; fixtureTypeIds: ReadonlySet<string> }): CsvResult<FixtureGroupRow> {
  const read = readDelimited(text);
  const errors = [...read.errors];
  const rows: FixtureGroupRow[] = [];
  for (const { line, cells } of withoutHeader(read.rows, [2])) {
    if (cells.length !== 3) {
      errors.push(`Line ${line}: expected 3 values (node id, fixture type id, count), found ${cells.length}.`);
      continue;
    }
    const [nodeId, fixtureTypeId, countText] = cells;
    const count = Number(countText);
    if (!known.nodeIds.has(nodeId)) errors.push(`Line ${line}: there is no node “${nodeId}” in this system.`);
    else if (!known.fixtureTypeIds.has(fixtureTypeId)) errors.push(`Line ${line}: “${fixtureTypeId}” is not a fixture type in the catalog.`);
    else if (!isNumber(countText) || !Number.isInteger(count) || count < 1)
      errors.push(`Line ${line}: the count “${countText}” is not a whole number of 1 or more.`);
    else rows.push({ nodeId, fixtureTypeId, count });
  }
  if (rows.length === 0 && errors.length === 0) errors.push('No fixture groups found: lines of “node id, fixture type id, count” were expected.');
  return { rows, errors };
}
