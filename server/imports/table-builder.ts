import type { ImportLimits } from './import-limits';
import { unreadableFile } from './import-problems';
import { columnLetter, decodeRange, type Cell, type RawTable } from './raw-table';
import { HEADER_SEARCH_ROWS } from './xlsx-reader';

/** The table of one upload after its header was found: what imports.parsed keeps between preview and commit. */
export interface ParsedTable {
  kind: 'xlsx' | 'csv';
  sheet: string | null;
  /** 1-based row number of the header, as the spreadsheet program shows it. */
  headerRow: number;
  headers: string[];
  /** Row number (as people see it) of each data row. */
  rowNumbers: number[];
  /** Column-major data: columns[c][i] is the cell of data row i. */
  columns: Cell[][];
  /** Per column, the most decimals its numbers were written with (null: none, or not known for tables stored before it). */
  decimals?: Array<number | null>;
  notes: string[];
}

const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}/;

export const isDateTimeText = (c: Cell): c is string => typeof c === 'string' && ISO_DATE_TIME.test(c) && Number.isFinite(Date.parse(c));
const isNumberLike = (c: Cell) => typeof c === 'number' || isDateTimeText(c);

function isHeaderLike(cells: Cell[]): boolean {
  const filled = cells.filter((c) => c !== null);
  const text = filled.filter((c) => typeof c === 'string' && !isNumberLike(c));
  return filled.length >= 2 && text.length >= 0.6 * filled.length;
}

function isDataLike(cells: Cell[]): boolean {
  const filled = cells.filter((c) => c !== null);
  return filled.length >= 1 && filled.filter(isNumberLike).length >= 0.5 * filled.length;
}

/**
 * Finds the header (the first row of mostly text followed by a row of mostly numbers), refuses merged
 * cells in the table and too many rows, and turns the rest into columns.
 */
export function buildTable(raw: RawTable, kind: ParsedTable['kind'], filename: string, limits: ImportLimits): ParsedTable {
  if (raw.rows.length === 0) throw unreadableFile(`"${filename}"${raw.sheet ? ` (sheet "${raw.sheet}")` : ''} has no data in it.`);
  const search = Math.min(raw.rows.length - 1, HEADER_SEARCH_ROWS);
  let h = -1;
  for (let i = 0; i < search; i++) {
    if (isHeaderLike(raw.rows[i].cells) && isDataLike(raw.rows[i + 1].cells)) {
      h = i;
      break;
    }
  }
  if (h < 0) {
    throw unreadableFile(
      `No header row found in "${filename}"${raw.sheet ? ` (sheet "${raw.sheet}")` : ''}: Qwell looks in the first ${HEADER_SEARCH_ROWS} rows for a row of column names ` +
      '(like "Time (s)", "P (kPa)", "T/°C") followed by rows of numbers. Add such a row above the data and upload it again.',
    );
  }
  const headerRow = raw.rows[h].n;
  for (const ref of raw.merges) {
    const r = decodeRange(ref);
    if (!r || r.r2 < headerRow) continue; // a merged title above the table is harmless
    const where = r.r1 <= headerRow ? `in the header row (row ${headerRow})` : `in the data (rows ${r.r1}–${r.r2})`;
    throw unreadableFile(
      `The sheet "${raw.sheet}" has merged cells ${ref} ${where}. Merged cells hide which column a value belongs to: ` +
      'unmerge them so that every column has its own header cell, then upload the file again.',
    );
  }
  const data = raw.rows.slice(h + 1);
  if (data.length > limits.maxRows) {
    throw unreadableFile(`"${filename}" has ${data.length} rows of data; Qwell imports at most ${limits.maxRows} at once. Split the file into smaller parts.`);
  }
  const width = Math.max(raw.rows[h].cells.length, ...data.slice(0, 1000).map((r) => r.cells.length));
  const headers = Array.from({ length: width }, (_, c) => {
    const v = raw.rows[h].cells[c];
    return v === null || v === undefined ? `Column ${columnLetter(c + 1)}` : String(v);
  });
  const columns: Cell[][] = headers.map(() => new Array<Cell>(data.length));
  const rowNumbers = new Array<number>(data.length);
  const decimals = new Array<number | null>(width).fill(null);
  for (let i = 0; i < data.length; i++) {
    const { cells, places } = data[i];
    rowNumbers[i] = data[i].n;
    for (let c = 0; c < width; c++) {
      columns[c][i] = cells[c] ?? null;
      const p = places?.[c];
      if (typeof p === 'number' && (decimals[c] === null || p > decimals[c]!)) decimals[c] = p;
    }
  }
  return { kind, sheet: raw.sheet, headerRow, headers, rowNumbers, columns, decimals, notes: raw.notes };
}
