/** Limits of the spreadsheet import, read from the environment when the router is built. */
export interface ImportLimits {
  /** Largest upload in bytes (QWELL_UPLOAD_MAX_MB, default 25). */
  maxBytes: number;
  /** Most data rows in one file (QWELL_IMPORT_MAX_ROWS, default 200 000). */
  maxRows: number;
  /** An archive may expand to at most this many times its size … */
  maxExpansionRatio: number;
  /** … when it also expands beyond this many bytes (a small workbook may compress well). */
  maxExpandedBytes: number;
  /** Most seconds spent reading one file, inspection and parse together (QWELL_IMPORT_MAX_SECONDS, default 20). */
  maxSeconds: number;
}

const positive = (name: string, fallback: number): number => {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`${name} must be a positive number, got "${raw}"`);
  return value;
};

export function importLimitsFromEnv(): ImportLimits {
  return {
    maxBytes: Math.round(positive('QWELL_UPLOAD_MAX_MB', 25) * 1024 * 1024),
    maxRows: Math.round(positive('QWELL_IMPORT_MAX_ROWS', 200_000)),
    maxExpansionRatio: 100,
    maxExpandedBytes: 200 * 1024 * 1024,
    maxSeconds: positive('QWELL_IMPORT_MAX_SECONDS', 20),
  };
}
