/** One cell as the import sees it: a number, text (date-times as ISO 8601 text), or nothing. */
export type Cell = number | string | null;

/** A sheet as read, before the header is found: rows with their row numbers as people see them. */
export interface RawTable {
  /** Sheet name for workbooks, null for CSV. */
  sheet: string | null;
  /** `places`: for each number cell, the decimals it was written with (the text, or a workbook cell's number format). */
  rows: Array<{ n: number; cells: Cell[]; places?: Array<number | null> }>;
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

/** Most decimals recorded for a column (as a run channel's `decimals`). */
const MAX_PLACES = 12;

/** Decimals a number is written with: "3.000" → 3, "5e-4" → 4, "2.50E+3" → 0; null when it is not a number. */
export function placesOfText(text: string): number | null {
  const m = /^[+-]?(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(text.trim());
  if (!m || (m[1] === '' && !m[2])) return null;
  return Math.min(MAX_PLACES, Math.max(0, (m[2]?.length ?? 0) - Number(m[3] ?? 0)));
}

/**
 * Decimals a spreadsheet number format shows: "0.000" → 3, "#,##0.0" → 1, "0.00E+00" and "General" → null
 * (the value's own digits decide), the first section of "0.00;[Red]-0.00" only.
 */
export function placesOfFormat(format: string | undefined): number | null {
  if (!format || /general/i.test(format)) return null;
  const section = format.split(';')[0].replace(/"[^"]*"|\\.|\[[^\]]*\]/g, '');
  if (/[eE][+-]/.test(section) || /[dmyhs]/i.test(section)) return null;
  const m = /\.([0#?]+)/.exec(section);
  if (m) return Math.min(MAX_PLACES, m[1].length);
  return /[0#?]/.test(section) ? 0 : null;
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
