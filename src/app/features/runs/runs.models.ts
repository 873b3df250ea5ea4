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

// ---- Run entry at the bench (create, edit, readings, submit) ----

/** Processes a run can claim. */
export type RunProcess = 'isobaric' | 'isochoric' | 'isothermal' | 'adiabatic' | 'polytropic' | 'calorimetric';

export const RUN_PROCESSES: readonly RunProcess[] = [
  'isobaric',
  'isochoric',
  'isothermal',
  'adiabatic',
  'polytropic',
  'calorimetric',
];

/** Reading channels besides time, in grid order. */
export type ReadingChannel = 'pressure' | 'volume' | 'displacement' | 'temperature' | 'voltage' | 'current' | 'power';

export const READING_CHANNELS: readonly ReadingChannel[] = [
  'pressure',
  'volume',
  'displacement',
  'temperature',
  'voltage',
  'current',
  'power',
];

/** A measured value with its unit and, optionally, its standard uncertainty in the same unit. */
export interface EnteredQuantity {
  value: number;
  unit: string;
  u?: number;
}

/** How one channel was entered (written by PUT readings). */
export interface ChannelEntry {
  unit: string;
  /** Register instrument that read it. */
  instrumentId?: number;
  /** Or an instrument described inside the run (imported run documents). */
  instrument?: string;
  reference?: 'absolute' | 'gauge';
}

export type GasSetup =
  | { model: 'species'; species: string }
  | { model: 'equipartition'; f: number }
  | { model: 'calorimeter' };

export type AmountSetup =
  | { from: 'moles'; value: number; u?: number }
  | { from: 'mass'; mass: EnteredQuantity; molarMass?: { value: number; u?: number } }
  | { from: 'initialState'; Z?: number };

/** The run's setup document (server/runs/run-setup.ts); unknown keys are kept as they are. */
export interface DraftSetup {
  gas?: GasSetup;
  amount?: AmountSetup;
  /** Polytropic index n. */
  processIndex?: number;
  ambient?: { pressure?: EnteredQuantity; temperature?: EnteredQuantity };
  apparatus?: Record<string, unknown>;
  time?: { unit: 's' | 'min' | 'h' | 'iso'; origin?: string };
  channels?: Partial<Record<ReadingChannel, ChannelEntry>>;
  [key: string]: unknown;
}

/** One of the person's projects. */
export interface Project {
  id: number;
  code: string;
  name: string;
}

/** One gas of `GET /api/gases`. */
export interface Gas {
  id: number;
  /** Species code the engine knows: N2, O2, Ar, CO2, He, air. */
  code: string;
  name: string;
  /** kg/mol. */
  molarMass: number;
}

/** One piece of apparatus of `GET /api/apparatus`; values in SI, null when not known. */
export interface ApparatusItem {
  id: number;
  tag: string;
  name: string;
  kind: string;
  /** Pa. */
  ratedPressure: number | null;
  /** m. */
  bore: number | null;
  /** m³. */
  fixedVolume: number | null;
}

export interface ItemList<T> {
  items: T[];
}

/** `GET /api/runs/:id` as run entry reads it; readings are SI columns, one value per time point. */
export interface RunDraft {
  id: number;
  code: string;
  projectId: number;
  title: string;
  process: RunProcess;
  state: RunState;
  runDate: string;
  gasId: number | null;
  apparatusId: number | null;
  version: number;
  setup: DraftSetup | null;
  readings: { count: number; time: number[] } & Record<ReadingChannel, (number | null)[]>;
}

/** Body of `POST /api/runs`. */
export interface CreateRunBody {
  projectId: number;
  title: string;
  process: RunProcess;
  runDate: string;
  gasId?: number;
  apparatusId?: number;
  setup?: DraftSetup;
}

/** Body of `PATCH /api/runs/:id`. */
export interface UpdateRunBody {
  version: number;
  title?: string;
  process?: RunProcess;
  runDate?: string;
  gasId?: number | null;
  apparatusId?: number | null;
  setup?: DraftSetup;
}

/** Body of `PUT /api/runs/:id/readings`: values in each channel's own unit; null for an empty cell. */
export interface ReadingsBody {
  version: number;
  time: { unit: 's' | 'min' | 'h'; values: number[] };
  channels: Partial<Record<ReadingChannel, ChannelEntry & { values: (number | null)[] }>>;
}

/** What the server answers to a write: the run's new version at least. */
export interface RunVersion {
  id: number;
  code?: string;
  version: number;
}

/** The run's setup as stored: channels with entered units, ambient, apparatus, gas (only what the run page reads). */
export interface RunSetup {
  gas?: { model: 'species' | 'equipartition' | 'calorimeter' | string; species?: string; f?: number };
  channels?: Record<string, { unit: string; instrument?: string; reference?: string }>;
  ambient?: { pressure?: EnteredQuantity; temperature?: EnteredQuantity };
  apparatus?: { name?: string; ratedPressure?: EnteredQuantity; [key: string]: unknown };
  [key: string]: unknown;
}

/** SI units of the readings the server returns. */
export const READING_SI_UNITS: Readonly<Record<'time' | ReadingChannel, string>> = {
  time: 's',
  pressure: 'Pa',
  volume: 'm³',
  displacement: 'm',
  temperature: 'K',
  voltage: 'V',
  current: 'A',
  power: 'W',
};

export type RunReadings = { count: number; time: number[] } & Record<ReadingChannel, (number | null)[]>;

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

/** `GET /api/runs/:id`. */
export interface RunRecord {
  id: number;
  code: string;
  revision: number;
  title: string;
  process: string;
  state: RunState;
  /** Bumped on every change; quoted back on writes. */
  version: number;
  verdict: Verdict | null;
  runDate: string;
  returnReason: string | null;
  authorId: number;
  authorName: string;
  projectName: string;
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
export interface BalanceResult {
  engineVersion: string;
  inputHash: string;
  process: { claimed: string; index: number | null };
  gas: string;
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
