import type { PressureReference, ReadingChannel } from '../channels';
import type { RunTimeUnit } from './runs';

// The column mapping of an import (`POST /api/imports/:id/commit`, saved column maps): how the columns of
// an upload become a run's readings. The server checks every row against it (server/imports/row-validation.ts).

export interface ImportMapping {
  time: { index: number; unit: RunTimeUnit };
  columns: Array<{ index: number; channel: ReadingChannel; unit: string; reference?: PressureReference; instrumentId?: number }>;
}
