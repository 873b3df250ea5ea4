// OWASP "CSV Injection": a spreadsheet treats a cell that begins with =, +, -, @, tab or carriage return
// as the start of a formula (or strips the control character and then does). Prefixing a single quote
// makes every spreadsheet program show the text as text. Numbers are never touched.

const DANGEROUS_START = /^[=+\-@\t\r]/;

/** The text of a cell, made inert when a spreadsheet could read it as a formula. */
export function neutraliseCell(text: string): string {
  return DANGEROUS_START.test(text) ? `'${text}` : text;
}

/** True when the export changed the text (for the header note and tests). */
export function isNeutralised(original: string, written: string): boolean {
  return original !== written;
}

export type CellValue = string | number | null;

/** One RFC 4180 field: text neutralised, then quoted when it holds a quote, comma, CR or LF. */
export function csvField(value: CellValue): string {
  if (value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  const safe = neutraliseCell(value);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** One RFC 4180 record, ended by CRLF. */
export function csvRecord(values: readonly CellValue[]): string {
  return values.map(csvField).join(',') + '\r\n';
}
