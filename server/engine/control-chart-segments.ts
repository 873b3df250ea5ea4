// A standardization series split at recorded changes to the apparatus: after a change the control chart starts
// again, its centre line and limits computed from the runs after the change alone (ASTM D240 §8.1.1: standardize
// again after changing any part of the calorimeter; ISO 7870-2: limits describe one stable process). Earlier runs
// stay on the chart as previous segments, each judged against its own limits.
import { summariseSeries, type AcceptanceRule, type SeriesPoint, type SeriesSummary } from './control-chart';

export interface SeriesChange {
  /** ISO date the change was made: runs dated after it belong to the new segment, runs dated before it to the old one. */
  date: string;
  description: string;
  /** When the change was recorded (ISO timestamp): a run of the same day entered before it was made on the old apparatus. */
  recordedAt?: string;
}

/**
 * A point of the series; `at` is when the run was first entered (ISO timestamp; a revision keeps its first
 * revision's), for runs on the day of a change. The balance check's STANDARDIZATION_DUE flag uses the same rule.
 */
export type SegmentPoint = SeriesPoint & { at?: string };

/** Whether a run was made before a change: an earlier day, or the same day and entered before the change was recorded. */
export function madeBefore(p: Pick<SegmentPoint, 'date' | 'at'>, change: Pick<SeriesChange, 'date' | 'recordedAt'>): boolean {
  const day = p.date.slice(0, 10);
  if (day !== change.date) return day < change.date;
  return p.at !== undefined && change.recordedAt !== undefined && Date.parse(p.at) < Date.parse(change.recordedAt);
}

export interface Segment {
  /** The change that opened the segment; null for the first. */
  change: SeriesChange | null;
  /** Indices into the points, [start, end). */
  start: number;
  end: number;
  summary: SeriesSummary;
  /** The last segment: the one a new standardization is made from. */
  current: boolean;
}

/**
 * Splits points in date order (same-day points in the order they were entered) at the changes (any order) and
 * summarises each segment. Segments left empty by two
 * changes with no run between them are dropped, except the current one, which is always returned (it may be empty
 * right after a change).
 */
export function segmentByChanges(points: readonly SegmentPoint[], changes: readonly SeriesChange[], rule: AcceptanceRule): Segment[] {
  const sorted = [...changes].sort((a, b) => a.date.localeCompare(b.date) || (a.recordedAt ?? '').localeCompare(b.recordedAt ?? ''));
  const segments: Segment[] = [];
  let start = 0;
  const close = (change: SeriesChange | null, end: number, current: boolean) => {
    if (end > start || current) segments.push({ change, start, end, summary: summariseSeries(points.slice(start, end), rule), current });
    start = end;
  };
  let opening: SeriesChange | null = null;
  for (const change of sorted) {
    let end = start;
    while (end < points.length && madeBefore(points[end], change)) end++;
    close(opening, end, false);
    opening = change;
  }
  close(opening, points.length, true);
  return segments;
}
