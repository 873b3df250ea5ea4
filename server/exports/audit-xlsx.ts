import ExcelJS from 'exceljs';
import { EVENT_COLUMNS, eventCells, headerLines, type AuditExportHeader, type ExportRow } from './audit-export-data';
import { neutraliseCell, type CellValue } from './spreadsheet-safety';

/** Excel refuses cells longer than this; a longer value is cut with a note (the CSV export keeps it whole). */
export const EXCEL_CELL_LIMIT = 32_767;

function cell(value: CellValue): string | number | null {
  if (value === null || typeof value === 'number') return value;
  const safe = neutraliseCell(value);
  if (safe.length <= EXCEL_CELL_LIMIT) return safe;
  const note = ` … [cut at ${EXCEL_CELL_LIMIT} characters of ${safe.length}; the CSV export has the whole value]`;
  return safe.slice(0, EXCEL_CELL_LIMIT - note.length) + note;
}

/** Row number of the column names in the sheet: after the header block and one empty row. */
export const headerBlockRows = (header: AuditExportHeader) => headerLines(header).length;

/**
 * The audit trail as .xlsx through exceljs's streaming writer: each page of rows is committed to the
 * file as it is written, so memory stays flat however long the trail is. One sheet, "Audit trail":
 * the header block (label in A, value in B), an empty row, the column names, one row per event.
 */
export async function writeAuditXlsx(path: string, header: AuditExportHeader, pages: AsyncIterable<ExportRow[]>): Promise<void> {
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: path, useStyles: true, useSharedStrings: false });
  workbook.creator = 'Qwell';
  workbook.created = header.generatedAt;
  const sheet = workbook.addWorksheet('Audit trail', { views: [{ state: 'frozen', ySplit: headerBlockRows(header) + 2 }] });
  sheet.columns = [
    { width: 9 }, { width: 26 }, { width: 30 }, { width: 22 }, { width: 13 }, { width: 10 }, { width: 36 },
    { width: 40 }, { width: 40 }, { width: 66 }, { width: 66 }, { width: 9 }, { width: 16 }, { width: 80 },
  ];
  for (const [label, value] of headerLines(header)) {
    const row = sheet.addRow([cell(label), cell(value)]);
    row.getCell(1).font = { bold: true };
    row.commit();
  }
  sheet.addRow([]).commit();
  const names = sheet.addRow([...EVENT_COLUMNS]);
  names.font = { bold: true };
  names.commit();
  for await (const page of pages) {
    for (const row of page) sheet.addRow(eventCells(row).map(cell)).commit();
  }
  sheet.commit();
  await workbook.commit();
}
