import type { balanceResults } from '../../db/schema';
import { notFound } from '../core/problem';
import type { RunRow } from '../runs/run-access';

/** The stored result of a run, saying whether it still describes the run's current version. */
export function balanceResponse(run: RunRow, row: typeof balanceResults.$inferSelect | undefined) {
  if (!row) {
    throw notFound(run.state === 'submitted'
      ? `Run ${run.code} is being checked; its result appears here when the check finishes.`
      : `Run ${run.code} has no balance result yet: it is checked when it is submitted.`);
  }
  return {
    id: row.id,
    runId: row.runId,
    runVersion: row.runVersion,
    currentRunVersion: run.version,
    // A result computed before the run's content last changed never looks current.
    stale: row.computedAt < run.editedAt,
    computedAt: row.computedAt,
    result: row.result,
  };
}
