import type { RunSort as ServerSort, RunState, Verdict } from '@contract';

// Run states, their labels and the list's rows are the contract's (contract/runs.ts, contract/api/runs.ts).
export { RUN_STATES, RUN_STATE_LABELS } from '@contract';
export type { RunPage, RunState, RunSummary } from '@contract';

/** Columns the run list offers to sort by (the server takes a few more). */
export type RunSort = Extract<ServerSort, 'code' | 'title' | 'state' | 'updatedAt'>;

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
