// OWASP "CSV Injection": a spreadsheet treats a cell that begins with =, +, -, @, tab or carriage return
// as the start of a formula (or strips the control character and then does). Prefixing a single quote
// makes every spreadsheet program show the text as text. Numbers are never touched.

const DANGEROUS_START = /^[=+\-@\t\r]/;

/** The text of a cell, made inert when a spreadsheet could read it as a formula. */
export function neutraliseCell(text: string): string {
  return DANGEROUS_START.test(text) ? `'${text}` : text;
}

// A spreadsheet opened with another list separator (";" in much of Europe, or a tab) splits an
// unquoted cell at it, and one that ignores quotes splits a quoted cell there too: what follows a
// separator or a quote boundary then starts a cell of its own. OWASP's guidance neutralises those
// starts as well. "=" and "@" always start a formula; "+" and "-" only when not a plain number.
const SPLIT_THEN_FORMULA = /([,;\t\r\n"]\s*)(?=[=@]|[+-](?!\d+(?:\.\d+)?(?:[eE][+-]?\d+)?(?:$|[,;\]}"\s])))/g;

/** CSV text: the cell's start neutralised, and every start a split at a separator could make. */
export function neutraliseCsvText(text: string): string {
  return neutraliseCell(text).replace(SPLIT_THEN_FORMULA, "$1'");
}

/** True when the export changed the text (for the header note and tests). */
export function isNeutralised(original: string, written: string): boolean {
  return original !== written;
}

export type CellValue = string | number | null;

/**
 * One RFC 4180 field: text neutralised, then always quoted (quotes doubled), so no reader splits it
 * whatever its list separator. Numbers stay bare numbers; an empty cell stays empty.
 */
export function csvField(value: CellValue): string {
  if (value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  return `"${neutraliseCsvText(value).replace(/"/g, '""')}"`;
}

/** One RFC 4180 record, ended by CRLF. */
export function csvRecord(values: readonly CellValue[]): string {
  return values.map(csvField).join(',') + '\r\n';
}
