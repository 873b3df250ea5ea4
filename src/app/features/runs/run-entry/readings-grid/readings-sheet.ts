import { signal } from '@angular/core';

/** A column of the readings grid: time or one of the channels. */
export type SheetKey = 'time' | 'pressure' | 'volume' | 'displacement' | 'temperature' | 'voltage' | 'current' | 'power';

/** A decimal number with a decimal point, as a spreadsheet copies it; no thousands separators. */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Parses one cell: null when empty, NaN when it is not a number. */
export function parseCell(text: string): number | null {
  const trimmed = text.trim();
  if (trimmed === '') {
    return null;
  }
  return NUMBER.test(trimmed) ? Number(trimmed) : NaN;
}

/** The readings as the server takes them: one array per column, in entered units. */
export interface SheetValues {
  time: number[];
  channels: Partial<Record<Exclude<SheetKey, 'time'>, (number | null)[]>>;
}

/**
 * The text of the readings grid, column by column, exactly as typed. Hidden channels keep their
 * text, so switching a channel off and on again loses nothing. `revision` ticks on every change
 * so that views and autosave can follow it.
 */
export class ReadingsSheet {
  private readonly data = new Map<SheetKey, string[]>();
  private rows: number;
  readonly revision = signal(0);

  constructor(rowCount = 1, columns: Partial<Record<SheetKey, string[]>> = {}) {
    this.rows = rowCount;
    for (const [key, texts] of Object.entries(columns) as [SheetKey, string[]][]) {
      this.data.set(key, [...texts]);
      this.rows = Math.max(this.rows, texts.length);
    }
  }

  get rowCount(): number {
    return this.rows;
  }

  cell(row: number, key: SheetKey): string {
    return this.data.get(key)?.[row] ?? '';
  }

  /** Sets one cell; text in the last row opens a fresh row below, so Enter always has somewhere to go. */
  setCell(row: number, key: SheetKey, text: string): void {
    this.column(key)[row] = text;
    if (row >= this.rows - 1 && text.trim() !== '') {
      this.rows = row + 2;
    }
    this.touch();
  }

  addRow(): void {
    this.rows += 1;
    this.touch();
  }

  removeRow(row: number): void {
    if (row < 0 || row >= this.rows) {
      return;
    }
    for (const texts of this.data.values()) {
      texts.splice(row, 1);
    }
    // The grid always keeps one row to type into.
    this.rows = Math.max(1, this.rows - 1);
    this.touch();
  }

  /**
   * Fills a block copied from a spreadsheet (tab between cells, newline between rows) from the
   * given cell rightwards and downwards, adding rows as needed. Cells right of the last column are
   * left out. Answers the size of the block that landed.
   */
  paste(row: number, keys: readonly SheetKey[], firstColumn: number, text: string): { rows: number; columns: number } {
    const lines = text.replace(/\r\n?/g, '\n').split('\n');
    if (lines.length > 1 && lines[lines.length - 1] === '') {
      lines.pop();
    }
    let widest = 0;
    lines.forEach((line, i) => {
      const cells = line.split('\t').slice(0, keys.length - firstColumn);
      widest = Math.max(widest, cells.length);
      cells.forEach((cell, j) => (this.column(keys[firstColumn + j])[row + i] = cell.trim()));
    });
    // One empty row stays below the block to go on typing.
    this.rows = Math.max(this.rows, row + lines.length + 1);
    this.touch();
    return { rows: lines.length, columns: widest };
  }

  /** What is wrong with one cell, in words, or null. */
  cellError(row: number, key: SheetKey, label: string): string | null {
    const text = this.cell(row, key);
    const value = parseCell(text);
    if (Number.isNaN(value)) {
      return `${label}: “${text.trim()}” is not a number (use a decimal point)`;
    }
    if (key !== 'time') {
      return null;
    }
    if (value === null) {
      return null;
    }
    const before = this.previousTime(row);
    if (before !== null && value <= before) {
      return `Time must increase: ${value} is not after ${before}`;
    }
    return null;
  }

  /** The errors of one row, for the given visible columns. */
  rowErrors(row: number, columns: readonly { key: SheetKey; label: string }[]): string[] {
    const errors: string[] = [];
    for (const column of columns) {
      const error = this.cellError(row, column.key, column.label);
      if (error) {
        errors.push(error);
      }
    }
    if (parseCell(this.cell(row, 'time')) === null && columns.some((c) => c.key !== 'time' && this.cell(row, c.key).trim())) {
      errors.push('Time is missing');
    }
    return errors;
  }

  /** Rows with at least one error, for the given visible columns. */
  rowsWithErrors(columns: readonly { key: SheetKey; label: string }[]): number[] {
    const rows: number[] = [];
    for (let row = 0; row < this.rows; row++) {
      if (this.rowErrors(row, columns).length) {
        rows.push(row);
      }
    }
    return rows;
  }

  /** The readings of the visible columns; rows left wholly empty are skipped. */
  values(keys: readonly SheetKey[]): SheetValues {
    const time: number[] = [];
    const channels: SheetValues['channels'] = {};
    const channelKeys = keys.filter((k): k is Exclude<SheetKey, 'time'> => k !== 'time');
    for (const key of channelKeys) {
      channels[key] = [];
    }
    for (let row = 0; row < this.rows; row++) {
      if (keys.every((key) => this.cell(row, key).trim() === '')) {
        continue;
      }
      time.push(parseCell(this.cell(row, 'time')) as number);
      for (const key of channelKeys) {
        channels[key]!.push(parseCell(this.cell(row, key)));
      }
    }
    return { time, channels };
  }

  /**
   * The most decimals the column's numbers were typed with ("3.000" → 3, "5e-4" → 4), at most 12; null
   * when it holds no number. The run page shows the readings back with them.
   */
  decimalsOf(key: SheetKey): number | null {
    let most: number | null = null;
    for (const text of this.data.get(key) ?? []) {
      const m = NUMBER.exec(text.trim());
      if (!m) {
        continue;
      }
      const [mantissa, exponent] = text.trim().toLowerCase().split('e');
      const dot = mantissa.indexOf('.');
      const places = Math.min(12, Math.max(0, (dot < 0 ? 0 : mantissa.length - dot - 1) - Number(exponent ?? 0)));
      most = most === null ? places : Math.max(most, places);
    }
    return most;
  }

  /** The largest number in a column, or null when it has none. */
  maxOf(key: SheetKey): number | null {
    let max: number | null = null;
    for (const text of this.data.get(key) ?? []) {
      const value = text ? parseCell(text) : null;
      if (value !== null && !Number.isNaN(value) && (max === null || value > max)) {
        max = value;
      }
    }
    return max;
  }

  private previousTime(row: number): number | null {
    for (let r = row - 1; r >= 0; r--) {
      const value = parseCell(this.cell(r, 'time'));
      if (value !== null) {
        return Number.isNaN(value) ? null : value;
      }
    }
    return null;
  }

  private column(key: SheetKey): string[] {
    let texts = this.data.get(key);
    if (!texts) {
      texts = [];
      this.data.set(key, texts);
    }
    return texts;
  }

  private touch(): void {
    this.revision.update((n) => n + 1);
  }
}
