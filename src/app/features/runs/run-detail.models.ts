import type { CalorimetryResult } from './calorimetry.models';
import type { Verdict } from '../../shared/verdict-display/verdict-display';
import type { RunProcess, RunReadings, RunSetup } from './run-entry.models';
import type { RunState } from './runs.models';

// The run page: the run record, its balance result, history, signatures and review.
/** The engine's SI series for diagrams: P in Pa absolute, V in m³, T in K, power in W. */
export interface RunSeries {
  t: number[];
  P: number[] | null;
  V: number[] | null;
  T: number[] | null;
  power: number[] | null;
}

/** Summary of the current balance result on `GET /api/runs/:id`. */
export interface BalanceSummary {
  id: number;
  runVersion: number;
  verdict: Verdict;
  en: number | null;
  computedAt: string;
  /** The run changed after this result was computed. */
  stale: boolean;
}

/** An electronic signature on a run. */
export interface RunSignature {
  action: ReviewAction;
  meaning: string;
  reason: string | null;
  /** SHA-256 of what was signed. */
  signedHash: string;
  signedAt: string;
  signerName: string;
}

/** One revision of the same run code. */
export interface RunRevision {
  id: number;
  revision: number;
  state: RunState;
  revisionReason: string | null;
  createdAt: string;
}

/** `GET /api/runs/:id`: the run page and run entry both read it; readings are SI columns, one value per time point. */
export interface RunRecord {
  id: number;
  code: string;
  revision: number;
  projectId: number;
  projectName: string;
  authorId: number;
  authorName: string;
  title: string;
  process: RunProcess;
  state: RunState;
  /** Bumped on every change; quoted back on writes. */
  version: number;
  verdict: Verdict | null;
  runDate: string;
  gasId: number | null;
  apparatusId: number | null;
  /** The reviewer's reason, while the run is returned for correction. */
  returnReason: string | null;
  setup: RunSetup;
  readings: RunReadings;
  series: RunSeries | null;
  balance: BalanceSummary | null;
  signatures: RunSignature[];
  revisions: RunRevision[];
}

/** One line of the uncertainty budget. */
export interface BudgetEntry {
  source: string;
  group: string;
  kind: string;
  distribution: 'normal' | 'rectangular';
  unit: string;
  /** Standard uncertainty in `unit`. */
  u: number;
  /** ∂r/∂x in J per `unit`. */
  sensitivity: number;
  /** c²u² in J². */
  contribution: number;
  /** Share of u²(r), 0..1. */
  share: number;
}

/** A data-quality flag; `reading` is 1-based, null for the whole run. */
export interface QualityFlag {
  code: string;
  reading: number | null;
  message: string;
  /** On the closing line of a code listed only in part: how many more readings raise it. */
  more?: number;
}

/** A diagnostic hint from the engine. */
export interface DiagnosticHint {
  code: string;
  message: string;
  alteredEn?: number;
  alteredResidual?: number;
  value?: number;
}

/** The engine's balance result (energies in J, u standard, U expanded). */
export interface BalanceResult extends CalorimetryResult {
  engineVersion: string;
  inputHash: string;
  process: { claimed: string; index: number | null };
  gas: string;
  /** γ = Cp/Cv of the gas at the run's mean temperature; absent in results stored before the engine kept it. */
  gamma?: number | null;
  amount: { n: number | null; source: string };
  temperatures: { T1: number; T2: number };
  work: { measured: number; u: number; U: number; model: number | null; modelFormula: string; gap: number | null };
  heat: { electrical: number; leak: number; wall: number; total: number; u: number; U: number };
  internalEnergy: { value: number; u: number; U: number; method: string };
  residual: { r: number; u: number; U: number; k: number };
  correlations?: { W_Q: number; W_dU: number; Q_dU: number };
  En: number | null;
  verdict: Verdict;
  /** U(r) above this (J) makes the verdict indeterminate. */
  indeterminateLimit: number;
  budget: BudgetEntry[];
  monteCarlo: {
    draws: number;
    mean: number;
    sd: number;
    low: number;
    high: number;
    coverage: number;
    agreesWithLinear: boolean;
    note: string;
    /** Absent in results stored before the engine kept one. */
    histogram?: McHistogram;
  } | null;
  polytropicFit: { index: number; uIndex: number; rSquared: number; claimedIndex: number | 'infinite' | null } | null;
  flags: QualityFlag[];
  hints: DiagnosticHint[];
}

/** `GET /api/runs/:id/balance`. */
export interface BalanceResponse {
  runVersion: number;
  currentRunVersion: number;
  stale: boolean;
  computedAt: string;
  result: BalanceResult;
  /** One sentence of why beside a verdict that breaks or is indeterminate (server-built); null when it closes. */
  why: string | null;
}

/** One audit event of the run or its revisions. */
export interface HistoryEvent {
  id: number;
  occurredAt: string;
  actorName: string | null;
  actorEmail: string | null;
  action: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  reason: string | null;
}

/** `GET /api/runs/:id/history`. */
export interface HistoryPage {
  items: HistoryEvent[];
}

/** The three review decisions an investigator signs. */
export type ReviewAction = 'approve' | 'return' | 'reject';

/** What a signature may mean, per action; mirrors server/runs/review-dto.ts word for word. */
export const REVIEW_MEANINGS: Readonly<Record<ReviewAction, readonly string[]>> = {
  approve: ['I have reviewed this run and approve its results', 'I approve this run for release from the lab'],
  return: ['I have reviewed this run and return it for correction'],
  reject: ['I have reviewed this run and reject its results'],
};

/** Body of `POST /api/runs/:id/{approve,return,reject}`. */
export interface SignatureRequest {
  version: number;
  password: string;
  meaning: string;
  reason?: string;
}

/** Roles that write runs: the new-run and edit pages let them in. */
export const RUN_AUTHORS = ['technician', 'assistant', 'investigator'] as const;

/** The Monte Carlo draws of r, binned by the engine. */
export interface McHistogram {
  start: number;
  width: number;
  counts: number[];
  outside: number;
}
