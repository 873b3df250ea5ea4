import ExcelJS from 'exceljs';
import { Readable } from 'node:stream';
import type { ImportLimits } from './import-limits';
import { unreadableFile } from './import-problems';
import { columnLetter, placesOfFormat, placesOfText, type Cell, type RawTable } from './raw-table';
import { inspectWorkbook, tookTooLong } from './zip-inspection';

/** Rows above the header that a logger may write (title, serial number, notes). */
export const HEADER_SEARCH_ROWS = 50;

type ExcelValue = ExcelJS.CellValue | { formula?: string; sharedFormula?: string; result?: unknown } | undefined;

function plain(value: unknown): Cell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (typeof value === 'string') return value.trim() === '' ? null : value.trim();
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value.toISOString();
  if (typeof value === 'object') {
    const v = value as Record<string, unknown>;
    if (Array.isArray(v['richText'])) return plain((v['richText'] as Array<{ text: string }>).map((t) => t.text).join(''));
    if (typeof v['text'] === 'string') return plain(v['text']);
    if (typeof v['error'] === 'string') return v['error'];
  }
  return String(value);
}

/**
 * Reads one sheet of a .xlsx with exceljs's streaming WorkbookReader, after the archive has been checked
 * (size, ZIP bomb, workbook inside). Formulas give their cached results, and the notes say so.
 */
export async function readXlsx(buf: Buffer, filename: string, limits: ImportLimits, wantedSheet?: string): Promise<RawTable> {
  const deadline = Date.now() + limits.maxSeconds * 1000;
  const inspection = inspectWorkbook(buf, limits, deadline);
  if (inspection.sheets.length === 0) throw unreadableFile(`"${filename}" holds no worksheets.`);
  const sheet = wantedSheet ?? inspection.sheets[0];
  if (!inspection.sheets.includes(sheet)) {
    throw unreadableFile(`"${filename}" has no sheet "${sheet}"; its sheets are ${inspection.sheets.map((s) => `"${s}"`).join(', ')}.`);
  }
  const rows: RawTable['rows'] = [];
  let formulas = 0;
  const rowCap = limits.maxRows + HEADER_SEARCH_ROWS;
  // exceljs reads the parts the inspection checked, never the upload's own bytes: one ZIP reader.
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from([inspection.workbookPart(sheet)]), {
    worksheets: 'emit', sharedStrings: 'cache', styles: 'cache', hyperlinks: 'ignore', entries: 'ignore',
  });
  let found = false;
  for await (const worksheet of reader) {
    // The archive exceljs reads holds the wanted sheet alone.
    const mine = !found;
    if (mine) found = true;
    for await (const row of worksheet) {
      if (!mine) continue;
      if (row.number % 1000 === 0 && Date.now() > deadline) throw tookTooLong(limits);
      const values = row.values as ExcelValue[];
      const cells: Cell[] = [];
      const places: Array<number | null> = [];
      let any = false;
      for (let c = 1; c < values.length; c++) {
        let v: unknown = values[c];
        if (v && typeof v === 'object' && !(v instanceof Date) && ('formula' in v || 'sharedFormula' in v)) {
          const result = (v as { result?: unknown }).result;
          if (result === undefined || (typeof result === 'number' && Number.isNaN(result))) {
            throw unreadableFile(
              `Cell ${columnLetter(c)}${row.number} of sheet "${sheet}" holds a formula without a stored result, so Qwell cannot read its value. ` +
              'Open the file in your spreadsheet program, let it recalculate, save it, and upload it again (or paste the values as values).',
            );
          }
          formulas += 1;
          v = result;
        }
        const cell = plain(v);
        cells.push(cell);
        // The decimals the sheet shows: its number format ("0.000"), else the value's own digits (General).
        places.push(typeof cell === 'number' ? (placesOfFormat(row.getCell(c).numFmt) ?? placesOfText(String(cell))) : null);
        if (cell !== null) any = true;
      }
      if (!any) continue;
      rows.push({ n: row.number, cells, places });
      if (rows.length > rowCap) {
        throw unreadableFile(`"${filename}" has more than ${limits.maxRows} rows of data, the most Qwell imports at once. Split the file into smaller parts.`);
      }
    }
  }
  const notes: string[] = [];
  if (inspection.sheets.length > 1) notes.push(`sheet "${sheet}" was read; the workbook also has ${inspection.sheets.filter((s) => s !== sheet).map((s) => `"${s}"`).join(', ')} (upload again with "sheet" to read another)`);
  if (formulas > 0) notes.push(`formulas: cached values used (${formulas} cell${formulas === 1 ? '' : 's'}); the file's stored results were read, not recalculated`);
  return { sheet, rows, notes, merges: inspection.merges.get(sheet) ?? [] };
}
