import type { ImportChannel, ImportMapping, PressureReference, ReadingChannel } from '@contract';

// Channels, their headings, the units each takes and the column mapping are the contract's
// (contract/channels.ts, contract/api/imports.ts), shared with the server's row checks.
export { CHANNEL_LABELS, IMPORT_CHANNELS, UNITS_BY_CHANNEL } from '@contract';
export type { ImportChannel, ImportMapping, PressureReference, ReadingChannel, RunTimeUnit as TimeUnit } from '@contract';

/** Qwell's guess for one column, read from its header (and its values for date-times). */
export interface ColumnGuess {
  channel: ImportChannel | null;
  /** A unit as the engine names it; null when the header names none. */
  unit: string | null;
  reference?: PressureReference;
}

export interface PreviewColumn {
  /** Column number from 0. */
  index: number;
  header: string;
  guess: ColumnGuess;
  /** 0…1: how sure the guess is. */
  confidence: number;
}


/** One bad cell, where the spreadsheet program shows it. */
export interface RowError {
  /** Row number as in the spreadsheet. */
  row: number;
  /** Header of the column. */
  column: string;
  index: number;
  message: string;
}

export interface ImportSummary {
  rows: number;
  timeSpan: { from: number | string; to: number | string; unit: string; seconds: number } | null;
  perChannel: Partial<Record<ReadingChannel, { min: number; max: number; unit: string }>>;
}

/** The answer to an upload. */
export interface ImportPreview {
  importId: number;
  filename: string;
  sha256: string;
  /** The same bytes were uploaded before. */
  duplicateOf?: { uploadId: number; runId: number | null; uploadedAt: string };
  sheet: string | null;
  /** Row number of the header, from 1. */
  headerRow: number;
  columns: PreviewColumn[];
  rows: Array<{ row: number; cells: Array<number | string | null> }>;
  /** The mapping the guesses add up to (null when no time column was recognised). */
  mapping: ImportMapping | null;
  summary: ImportSummary;
  errors: RowError[];
  errorCount: number;
  notes: string[];
  suggestedColumnMap?: { id: number; name: string; mapping: ImportMapping };
}

export interface RowCheck {
  errors: RowError[];
  errorCount: number;
  summary: ImportSummary;
}

/** A saved column map ("logger profile"), shared by the lab. */
export interface ColumnMap {
  id: number;
  name: string;
  headers: string[];
  mapping: ImportMapping;
  ownerName: string;
  own: boolean;
}

/** How the file is to be read: CSV separator and decimal mark, and the worksheet of a workbook. */
export interface UploadOptions {
  delimiter: '' | ',' | ';' | '\t';
  decimal: '' | '.' | ',';
  /** Worksheet name; empty reads the first sheet. */
  sheet: string;
}

/** What a new draft may carry besides the file's readings (the server takes gas, amount and ambient in setup). */
export interface NewRunSetup {
  gas?: { model: 'species'; species: string };
  amount?: { from: 'moles'; value: number };
  ambient?: { pressure?: { value: number; unit: string }; temperature?: { value: number; unit: string } };
}

export interface NewRunTarget {
  newRun: { projectId: number; title: string; process: string; runDate: string; gasId?: number; apparatusId?: number; setup?: NewRunSetup };
}
export interface ExistingRunTarget {
  runId: number;
  version: number;
}
export type CommitTarget = NewRunTarget | ExistingRunTarget;

export interface CommitResult {
  importId: number;
  runId: number;
  version: number;
  readings: number;
}
