import { badRequest, type FieldError } from '../core/problem';
import type { ReadingsInput } from '../runs/run-document-mapper';
import { PRESSURE_REFERENCES, UNITS_BY_CHANNEL, type ReadingChannel } from '../../contract/channels';
import { unitSymbol } from '../../contract/units';
import type { ImportMapping } from '../../contract/api/imports';
import { channelNames } from '../runs/run-setup';
import type { ParsedTable } from './table-builder';

/** How the columns of an upload become a run's readings (the contract's shape). */
export type { ImportMapping };

/** One bad cell: the spreadsheet row number, the column's header, and what is wrong. */
export interface RowError {
  row: number;
  column: string;
  index: number;
  message: string;
}

export interface ImportSummary {
  rows: number;
  timeSpan: { from: number | string; to: number | string; unit: string; seconds: number } | null;
  perChannel: Partial<Record<ReadingChannel, { min: number; max: number; unit: string }>>;
}

export interface RowCheck {
  errors: RowError[];
  errorCount: number;
  input: ReadingsInput;
  summary: ImportSummary;
}

export const ROW_ERROR_CAP = 500;

/** A text sent by the client, quoted in a message: at most 40 characters of it. */
export const shortText = (v: unknown) => {
  const text = String(v);
  return JSON.stringify(text.length > 40 ? `${text.slice(0, 40)}…` : text);
};

/** Refuses a mapping that cannot be applied at all (unknown column, unit, channel twice); says which part. */
export function checkMapping(table: ParsedTable, mapping: ImportMapping): void {
  const errors: FieldError[] = [];
  const width = table.headers.length;
  const inRange = (i: number) => Number.isInteger(i) && i >= 0 && i < width;
  if (!inRange(mapping.time.index)) errors.push({ field: 'mapping.time.index', message: `the time column must be a column index from 0 to ${width - 1}` });
  if (!UNITS_BY_CHANNEL.time.includes(mapping.time.unit)) errors.push({ field: 'mapping.time.unit', message: 'the time unit is ms, s, min, h or iso (date-times)' });
  const seen = new Set<string>();
  mapping.columns.forEach((c, k) => {
    const at = `mapping.columns[${k}]`;
    if (!inRange(c.index)) errors.push({ field: `${at}.index`, message: `column index ${c.index} is not in the file (0 to ${width - 1})` });
    else if (c.index === mapping.time.index) errors.push({ field: `${at}.index`, message: `column "${table.headers[c.index]}" is already the time column` });
    if (!channelNames.includes(c.channel)) {
      errors.push({ field: `${at}.channel`, message: `${shortText(c.channel)} is not a channel; channels are ${channelNames.join(', ')}` });
      return;
    }
    if (seen.has(c.channel)) errors.push({ field: `${at}.channel`, message: `${c.channel} is mapped to two columns; a run has one ${c.channel} channel` });
    seen.add(c.channel);
    if (!UNITS_BY_CHANNEL[c.channel].includes(c.unit)) {
      errors.push({ field: `${at}.unit`, message: `${shortText(c.unit)} is not a ${c.channel} unit; choose one of ${UNITS_BY_CHANNEL[c.channel].join(', ')}` });
    }
    if (c.reference !== undefined && (c.channel !== 'pressure' || !(PRESSURE_REFERENCES as readonly string[]).includes(c.reference))) {
      errors.push({ field: `${at}.reference`, message: 'reference is "absolute" or "gauge", and only for pressure' });
    }
  });
  if (mapping.columns.length === 0) errors.push({ field: 'mapping.columns', message: 'map at least one column to a channel' });
  if (errors.length) throw badRequest(`The column mapping cannot be applied: ${errors.map((e) => e.message).join('; ')}.`, errors);
}

const show = (v: unknown) => (typeof v === 'string' && v.length > 40 ? `${v.slice(0, 40)}…` : String(v));

/** Checks every row against the mapping; bad cells become row errors (capped), good ones readings. */
export function checkRows(table: ParsedTable, mapping: ImportMapping): RowCheck {
  const errors: RowError[] = [];
  let errorCount = 0;
  const fail = (i: number, index: number, message: string) => {
    errorCount += 1;
    if (errors.length < ROW_ERROR_CAP) errors.push({ row: table.rowNumbers[i], column: table.headers[index], index, message });
  };
  const n = table.rowNumbers.length;
  const t = table.columns[mapping.time.index];
  const iso = mapping.time.unit === 'iso';
  const timeValues: Array<number | string> = new Array(n);
  let prev = NaN;
  let prevRow = 0;
  for (let i = 0; i < n; i++) {
    const v = t[i];
    timeValues[i] = v ?? '';
    let key = NaN;
    if (v === null) fail(i, mapping.time.index, 'the time is empty; every reading needs its time');
    else if (iso) {
      key = typeof v === 'string' ? Date.parse(v) : NaN;
      if (!Number.isFinite(key)) fail(i, mapping.time.index, `${show(v)} is not a date-time (expected like 2026-03-14T10:15:00)`);
    } else if (typeof v !== 'number') {
      fail(i, mapping.time.index, Number.isFinite(Date.parse(String(v))) && /\d{4}-\d{2}-\d{2}/.test(String(v))
        ? `${show(v)} is a date-time; choose the time unit "date-time (ISO)" for this column`
        : `text "${show(v)}" in the time column; a number in ${mapping.time.unit} is expected`);
    } else key = v;
    if (!Number.isFinite(key)) continue;
    if (Number.isFinite(prev)) {
      if (key === prev) fail(i, mapping.time.index, `duplicate timestamp: the same time as row ${prevRow}`);
      else if (key < prev) fail(i, mapping.time.index, `time goes backwards: earlier than row ${prevRow}`);
    }
    prev = key;
    prevRow = table.rowNumbers[i];
  }
  const channels: ReadingsInput['channels'] = {};
  const perChannel: ImportSummary['perChannel'] = {};
  for (const c of mapping.columns) {
    const col = table.columns[c.index];
    const values: Array<number | null> = new Array(n);
    let min = Infinity;
    let max = -Infinity;
    for (let i = 0; i < n; i++) {
      const v = col[i];
      if (v === null) values[i] = null;
      else if (typeof v === 'number') {
        values[i] = v;
        if (v < min) min = v;
        if (v > max) max = v;
      } else {
        values[i] = null;
        fail(i, c.index, `text "${show(v)}" in a numeric column (${c.channel}, ${unitSymbol(c.unit)})`);
      }
    }
    const decimals = table.decimals?.[c.index];
    channels[c.channel] = {
      unit: c.unit, values, ...(c.reference ? { reference: c.reference } : {}), ...(c.instrumentId !== undefined ? { instrumentId: c.instrumentId } : {}),
      ...(typeof decimals === 'number' ? { decimals } : {}),
    };
    if (min <= max) perChannel[c.channel] = { min, max, unit: c.unit };
  }
  const first = timeValues[0];
  const last = timeValues[n - 1];
  const seconds = (a: number | string, b: number | string) =>
    iso ? (Date.parse(String(b)) - Date.parse(String(a))) / 1000 : (Number(b) - Number(a)) * { ms: 0.001, s: 1, min: 60, h: 3600, iso: 1 }[mapping.time.unit];
  const span = n > 0 ? seconds(first, last) : NaN;
  return {
    errors,
    errorCount,
    // Milliseconds are stored as seconds (the run's time unit becomes s): the engine reads s, min, h and date-times.
    input: mapping.time.unit === 'ms'
      ? { time: { unit: 's', values: timeValues.map((v) => (typeof v === 'number' ? v / 1000 : v)) }, channels }
      : { time: { unit: mapping.time.unit, values: timeValues }, channels },
    summary: { rows: n, timeSpan: Number.isFinite(span) ? { from: first, to: last, unit: mapping.time.unit, seconds: span } : null, perChannel },
  };
}
