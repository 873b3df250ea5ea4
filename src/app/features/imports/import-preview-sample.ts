import { ImportPreview } from './imports.models';

/** A preview as the server answers it for a small logger export. */
export const SAMPLE_PREVIEW: ImportPreview = {
  importId: 12,
  filename: 'pc3.xlsx',
  sha256: 'a'.repeat(64),
  sheet: 'Logger',
  headerRow: 3,
  columns: [
    { index: 0, header: 'Time (s)', guess: { channel: 'time', unit: 's' }, confidence: 0.95 },
    { index: 1, header: 'p_gauge (psi)', guess: { channel: 'pressure', unit: 'psi', reference: 'gauge' }, confidence: 0.95 },
    { index: 2, header: 'T/°C', guess: { channel: 'temperature', unit: 'degC' }, confidence: 0.95 },
    { index: 3, header: 'Notes', guess: { channel: null, unit: null }, confidence: 0 },
  ],
  rows: [
    { row: 4, cells: [0, 14.2, 25.1, 'start'] },
    { row: 5, cells: [10, 14.9, 'warm', null] },
  ],
  mapping: {
    time: { index: 0, unit: 's' },
    columns: [{ index: 1, channel: 'pressure', unit: 'psi', reference: 'gauge' }, { index: 2, channel: 'temperature', unit: 'degC' }],
  },
  summary: { rows: 2, timeSpan: { from: 0, to: 10, unit: 's', seconds: 10 }, perChannel: { pressure: { min: 14.2, max: 14.9, unit: 'psi' } } },
  errors: [{ row: 5, column: 'T/°C', index: 2, message: 'text "warm" in a numeric column (temperature, degC)' }],
  errorCount: 1,
  notes: ['formulas: cached values used (1 cell); the file\'s stored results were read, not recalculated'],
};
