import { Verdict } from '../../shared/verdict-display/verdict-display';

/** Where a run is in its workflow. */
export type RunState = 'draft' | 'submitted' | 'approved' | 'returned' | 'rejected';

export const RUN_STATES: readonly RunState[] = ['draft', 'submitted', 'approved', 'returned', 'rejected'];

export const RUN_STATE_LABELS: Readonly<Record<RunState, string>> = {
  draft: 'Draft',
  submitted: 'Submitted',
  approved: 'Approved',
  returned: 'Returned',
  rejected: 'Rejected',
};

/** Columns the server sorts by. */
export type RunSort = 'code' | 'title' | 'state' | 'updatedAt';

/** One row of `GET /api/runs`. */
export interface RunSummary {
  id: number;
  /** Lab's short reference, e.g. `R-2025-0042`. */
  code: string;
  title: string;
  /** Process the run claims (isobaric, isothermal, …). */
  process: string;
  state: RunState;
  /** Latest balance verdict; null before the first check. */
  verdict: Verdict | null;
  authorName: string;
  projectName: string;
  /** ISO 8601 timestamp of the last change. */
  updatedAt: string;
}

/** Query of `GET /api/runs`; page is 1-based. */
export interface RunQuery {
  page: number;
  pageSize: number;
  state: RunState | null;
  verdict: Verdict | null;
  project: number | null;
  author: number | null;
  /** Only the signed-in person's own runs. */
  mine: boolean;
  /** Only runs written by others (a reviewer's queue). */
  others: boolean;
  /** Only runs whose readings went above the vessel's rated pressure. */
  safety: 'over-pressure' | null;
  /** Run dates, YYYY-MM-DD, inclusive. */
  from: string | null;
  to: string | null;
  sort: RunSort;
  dir: 'asc' | 'desc';
}

/** A page of runs. */
export interface RunPage {
  items: RunSummary[];
  total: number;
  page: number;
  pageSize: number;
}
