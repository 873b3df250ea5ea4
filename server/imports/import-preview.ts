import { guessColumn, type ColumnGuess } from './header-guess';
import { checkRows, type ImportMapping, type RowError, type ImportSummary } from './row-validation';
import { isDateTimeText, type ParsedTable } from './table-builder';
import type { Cell } from './raw-table';

export const PREVIEW_ROWS = 20;

export interface PreviewColumn {
  index: number;
  header: string;
  guess: ColumnGuess;
  confidence: number;
}

export interface ImportPreview {
  importId: number;
  filename: string;
  sha256: string;
  duplicateOf?: { uploadId: number; runId: number | null; uploadedAt: string };
  sheet: string | null;
  headerRow: number;
  columns: PreviewColumn[];
  rows: Array<{ row: number; cells: Cell[] }>;
  /** The mapping Qwell guessed, which errors and summary below were checked against (null: no time column found). */
  mapping: ImportMapping | null;
  summary: ImportSummary;
  errors: RowError[];
  errorCount: number;
  notes: string[];
  suggestedColumnMap?: { id: number; name: string; mapping: Record<string, unknown> };
}

/** Guesses each column from its header, and from its values where the header is silent (date-times). */
export function guessColumns(table: ParsedTable): PreviewColumn[] {
  return table.headers.map((header, index) => {
    const { guess, confidence } = guessColumn(header);
    const sample = table.columns[index].slice(0, 50).filter((c) => c !== null);
    const dateTimes = sample.length > 0 && sample.every(isDateTimeText);
    if (dateTimes && (guess.channel === 'time' || guess.channel === null)) {
      return { index, header, guess: { channel: 'time', unit: 'iso' }, confidence: guess.channel === 'time' ? 0.95 : 0.7 };
    }
    return { index, header, guess, confidence };
  });
}

/** The mapping the guesses add up to: the most confident time column and the first column of each channel. */
export function guessedMapping(columns: PreviewColumn[]): ImportMapping | null {
  const times = columns.filter((c) => c.guess.channel === 'time' && c.guess.unit).sort((a, b) => b.confidence - a.confidence);
  if (times.length === 0) return null;
  const time = times[0];
  const taken = new Set<string>();
  const mapped: ImportMapping['columns'] = [];
  for (const c of columns) {
    const { channel, unit, reference } = c.guess;
    if (c.index === time.index || !channel || channel === 'time' || !unit || taken.has(channel)) continue;
    taken.add(channel);
    mapped.push({ index: c.index, channel, unit, ...(reference ? { reference } : {}) });
  }
  return { time: { index: time.index, unit: time.guess.unit as ImportMapping['time']['unit'] }, columns: mapped };
}

/** The preview of a parsed upload: guesses, first rows, summary and every row error under the guessed mapping. */
export function buildPreview(
  table: ParsedTable,
  meta: Pick<ImportPreview, 'importId' | 'filename' | 'sha256' | 'duplicateOf' | 'suggestedColumnMap'>,
): ImportPreview {
  const columns = guessColumns(table);
  const mapping = guessedMapping(columns);
  const notes = [...table.notes];
  let summary: ImportSummary = { rows: table.rowNumbers.length, timeSpan: null, perChannel: {} };
  let errors: RowError[] = [];
  let errorCount = 0;
  if (mapping && mapping.columns.length > 0) {
    const check = checkRows(table, mapping);
    ({ summary, errors, errorCount } = check);
  } else {
    notes.push(mapping ? 'no reading columns recognised from the headers: choose the channel and unit of each column' : 'no time column recognised from the headers: choose which column holds the time');
  }
  if (meta.duplicateOf) notes.push(`this exact file (same SHA-256) was uploaded before, on ${meta.duplicateOf.uploadedAt.slice(0, 10)}`);
  const rows = table.rowNumbers.slice(0, PREVIEW_ROWS).map((row, i) => ({ row, cells: table.columns.map((col) => col[i]) }));
  return {
    ...meta,
    sheet: table.sheet,
    headerRow: table.headerRow,
    columns,
    rows,
    mapping,
    summary,
    errors,
    errorCount,
    notes,
  };
}
