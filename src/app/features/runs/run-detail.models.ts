// The run page: the run record, its balance result, history, signatures and review. Every shape here is
// the contract's (contract/api/runs.ts, contract/api/result.ts), shared with the server.
import type { RunRead } from '@contract';

export type {
  AppliedCorrection,
  BalanceResponse,
  BalanceResult,
  BalanceSummary,
  BudgetEntry,
  DiagnosticHint,
  HistoryEvent,
  HistoryPage,
  McHistogram,
  QualityFlag,
  ReviewAction,
  RunAction,
  RunRevision,
  RunSeries,
  RunSignature,
  SignatureRequest,
} from '@contract';
export { RUN_AUTHORS, SIGNATURE_MEANINGS } from '@contract';

/** `GET /api/runs/:id` as the run page reads it. */
export type RunRecord = RunRead;
