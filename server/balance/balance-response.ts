import type { BalanceResponse, BalanceResult } from '../../contract/api/result';
import type { Wire } from '../../contract/wire';
import type { balanceResults } from '../../db/schema';
import { notFound } from '../core/problem';
import type { RunRow } from '../runs/run-access';
import { whySentence, type WhyInput } from './why-sentence';

/** The stored result of a run, saying whether it still describes the run's current version. */
export function balanceResponse(run: RunRow, row: typeof balanceResults.$inferSelect | undefined): Wire<BalanceResponse> {
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
    // What the engine stored; results stored before a field existed lack only the optional ones.
    result: row.result as unknown as BalanceResult,
    /** One sentence of why beside a verdict that breaks or is indeterminate; null when it closes. */
    why: storedWhy(row.result),
  };
}

/** The why-sentence of a stored result, tolerating results stored before a field existed. */
export function storedWhy(result: unknown): string | null {
  const r = result as Partial<WhyInput> | null;
  if (!r?.verdict || !r.residual) return null;
  return whySentence({ ...r, budget: r.budget ?? [], hints: r.hints ?? [], indeterminateLimit: r.indeterminateLimit ?? 0 } as WhyInput);
}
