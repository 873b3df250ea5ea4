/** What a column of an upload holds: a reading channel, or the time of each reading. */
export type ImportChannel = 'time' | 'pressure' | 'volume' | 'displacement' | 'temperature' | 'voltage' | 'current' | 'power';
export type ReadingChannel = Exclude<ImportChannel, 'time'>;
export type TimeUnit = 'ms' | 's' | 'min' | 'h' | 'iso';
export type PressureReference = 'absolute' | 'gauge';

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

/** How the columns become a run's readings; the server checks every row against it. */
export interface ImportMapping {
  time: { index: number; unit: TimeUnit };
  columns: Array<{ index: number; channel: ReadingChannel; unit: string; reference?: PressureReference; instrumentId?: number }>;
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

export interface NewRunTarget {
  newRun: { projectId: number; title: string; process: string; runDate: string };
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

export const CHANNEL_LABELS: Readonly<Record<ImportChannel, string>> = {
  time: 'Time',
  pressure: 'Pressure',
  volume: 'Volume',
  displacement: 'Piston displacement',
  temperature: 'Temperature',
  voltage: 'Heater voltage',
  current: 'Heater current',
  power: 'Heater power',
};

export const IMPORT_CHANNELS = Object.keys(CHANNEL_LABELS) as ImportChannel[];

/** Units each channel takes, as the server names them. */
export const UNITS_BY_CHANNEL: Readonly<Record<ImportChannel, readonly string[]>> = {
  time: ['s', 'ms', 'min', 'h', 'iso'],
  pressure: ['Pa', 'kPa', 'MPa', 'bar', 'mbar', 'atm', 'psi', 'torr', 'mmHg'],
  volume: ['m3', 'L', 'mL', 'cm3'],
  displacement: ['m', 'mm'],
  temperature: ['K', 'degC', 'degF'],
  voltage: ['V', 'mV'],
  current: ['A', 'mA'],
  power: ['W', 'mW'],
};

export const UNIT_LABELS: Readonly<Record<string, string>> = {
  iso: 'date-time (ISO)', m3: 'm³', cm3: 'cm³', degC: '°C', degF: '°F', min: 'min', h: 'h',
};
