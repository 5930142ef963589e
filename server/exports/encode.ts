/**
 * The result tables as files: CSV (Papa Parse writes it) and a spreadsheet workbook (exceljs), one
 * sheet per table. Each starts with the verdict line, then the column headings, then the rows.
 */
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import type { ResultTables } from './resultTables';

export function tableCsv(t: ResultTables, id: string): string | null {
  const table = t.tables.find((x) => x.id === id);
  if (!table) return null;
  // the verdict first, a blank line, then an ordinary header-and-rows table
  return `${Papa.unparse([[t.heading]])}\r\n\r\n${Papa.unparse({ fields: table.columns, data: table.rows })}\r\n`;
}

export async function tablesXlsx(t: ResultTables, meta: { title: string; created: Date }): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  book.creator = 'Headroom';
  book.title = meta.title;
  book.created = meta.created;
  for (const table of t.tables) {
    const sheet = book.addWorksheet(table.title);
    sheet.addRow([t.heading]).font = { bold: true };
    sheet.addRow([]);
    sheet.addRow(table.columns).font = { bold: true };
    for (const row of table.rows) sheet.addRow(row);
    sheet.columns.forEach((c, i) => {
      c.width = Math.min(48, Math.max(10, table.columns[i]?.length ?? 10));
    });
    sheet.views = [{ state: 'frozen', ySplit: 3 }];
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}
