/** How an instrument's latest calibration stands on a given day. */
export type CalibrationStatus = 'valid' | 'due-soon' | 'expired' | 'none';

export const DUE_SOON_DAYS = 30;

/** Dates are ISO calendar days (YYYY-MM-DD), compared as text, which orders them correctly. */
export function calibrationStatus(dueOn: string | null, today: string, dueSoonDays = DUE_SOON_DAYS): CalibrationStatus {
  if (!dueOn) return 'none';
  if (dueOn < today) return 'expired';
  return dueOn <= addDays(today, dueSoonDays) ? 'due-soon' : 'valid';
}

export function addDays(isoDay: string, days: number): string {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

export const todayIso = (now = new Date()) => now.toISOString().slice(0, 10);
