/** One cell as the import sees it: a number, text (date-times as ISO 8601 text), or nothing. */
export type Cell = number | string | null;

/** A sheet as read, before the header is found: rows with their row numbers as people see them. */
export interface RawTable {
  /** Sheet name for workbooks, null for CSV. */
  sheet: string | null;
  rows: Array<{ n: number; cells: Cell[] }>;
  notes: string[];
  /** Merged ranges of the sheet ("A1:C1"), refused when they touch the table. */
  merges: string[];
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Parses a number written with "." or "," as decimal separator; anything else stays text. */
export function parseNumber(text: string, decimal: '.' | ','): number | null {
  const s = decimal === ',' ? text.replace(',', '.') : text;
  if (decimal === ',' && text.includes('.')) return null; // "1.234,5" style thousands are not guessed at
  return NUMBER.test(s) ? Number(s) : null;
}

/** Column letters of a 1-based column number, as spreadsheets show them (1 → A, 28 → AB). */
export function columnLetter(col: number): string {
  let s = '';
  for (let n = col; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

/** Decodes "B3:D4" into 1-based row and column bounds. */
export function decodeRange(ref: string): { r1: number; r2: number; c1: number; c2: number } | null {
  const m = /^([A-Z]+)(\d+)(?::([A-Z]+)(\d+))?$/.exec(ref.toUpperCase());
  if (!m) return null;
  const col = (s: string) => [...s].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);
  const r1 = Number(m[2]);
  const r2 = m[4] ? Number(m[4]) : r1;
  const c1 = col(m[1]);
  const c2 = m[3] ? col(m[3]) : c1;
  return { r1: Math.min(r1, r2), r2: Math.max(r1, r2), c1: Math.min(c1, c2), c2: Math.max(c1, c2) };
}
