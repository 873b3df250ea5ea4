import type { PressureReference, ReadingChannel } from '../channels';
import type { ReviewAction, RunAction, RunProcess, RunState, Verdict } from '../runs';

// Requests and responses of /api/runs.

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
  reference?: PressureReference;
  /** Decimals the readings were typed or imported with (0–12), so that 3.000 V is shown back as 3.000 V. */
  decimals?: number;
}

export type GasSetup =
  | { model: 'species'; species: string }
  | { model: 'equipartition'; f: number }
  | { model: 'calorimeter' };

export type AmountSetup =
  | { from: 'moles'; value: number; u?: number }
  | { from: 'mass'; mass: EnteredQuantity; molarMass?: { value: number; u?: number } }
  | { from: 'initialState'; Z?: number };

/** Units a run's time column may be entered in; 'iso' is a column of date-times. */
export type RunTimeUnit = 'ms' | 's' | 'min' | 'h' | 'iso';

/**
 * The run's setup document as the API carries it (runs.setup; the server checks each key in
 * server/runs/setup-validation.ts). Keys this type does not name are kept as they are.
 */
export interface RunSetupBody {
  gas?: GasSetup;
  amount?: AmountSetup;
  /** Polytropic index n. */
  processIndex?: number;
  /** pressure.instrumentId: the register barometer that read it. */
  ambient?: { pressure?: EnteredQuantity & { instrumentId?: number; instrument?: string }; temperature?: EnteredQuantity };
  /** Apparatus values of this run (they take precedence over the register). */
  apparatus?: { name?: string; ratedPressure?: EnteredQuantity; [key: string]: unknown };
  time?: { unit: RunTimeUnit; origin?: string };
  channels?: Partial<Record<ReadingChannel, ChannelEntry>>;
  [key: string]: unknown;
}

/** The readings of `GET /api/runs/:id`: SI columns, one value per time point, null for an empty cell. */
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
  id: number;
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

/** `GET /api/runs/:id`: the run, its readings, current result summary, signatures and revisions. */
export interface RunRead {
  id: number;
  /** People-facing reference, e.g. R-2026-0007; revisions share it. */
  code: string;
  revision: number;
  previousRevisionId: number | null;
  revisionReason: string | null;
  projectId: number;
  projectName: string;
  authorId: number;
  authorName: string;
  title: string;
  process: RunProcess;
  gasId: number | null;
  apparatusId: number | null;
  runDate: string;
  state: RunState;
  /** Bumped on every change; quoted back on writes. */
  version: number;
  setup: RunSetupBody;
  verdict: Verdict | null;
  returnReason: string | null;
  submittedAt: string | null;
  decidedAt: string | null;
  editedAt: string;
  createdAt: string;
  updatedAt: string;
  readings: RunReadings;
  series: RunSeries | null;
  balance: BalanceSummary | null;
  signatures: RunSignature[];
  revisions: RunRevision[];
  /** What the signed-in person may do to this run now, by the server's workflow table. */
  actions: RunAction[];
  /**
   * Why an investigator of the project is not offered the review of this submitted run yet (they
   * wrote it, or its check has not stored a result for this version); null otherwise.
   */
  reviewNote: string | null;
}

/** One row of `GET /api/runs`. */
export interface RunSummary {
  id: number;
  /** Lab's short reference, e.g. `R-2025-0042`. */
  code: string;
  revision: number;
  title: string;
  process: RunProcess;
  state: RunState;
  /** Latest balance verdict; null before the first check. */
  verdict: Verdict | null;
  runDate: string;
  authorId: number;
  authorName: string;
  projectId: number;
  projectName: string;
  /** ISO 8601 timestamp of the last change. */
  updatedAt: string;
}

/** Columns `GET /api/runs` sorts by. */
export const RUN_SORTS = ['updatedAt', 'createdAt', 'runDate', 'code', 'title', 'state'] as const;
export type RunSort = (typeof RUN_SORTS)[number];

/** A page of `GET /api/runs`; page is 1-based. */
export interface RunPage {
  items: RunSummary[];
  total: number;
  page: number;
  pageSize: number;
}

/** Body of `POST /api/runs`. */
export interface CreateRunBody {
  projectId: number;
  title: string;
  process: RunProcess;
  runDate: string;
  gasId?: number;
  apparatusId?: number;
  setup?: RunSetupBody;
}

/** Body of `PATCH /api/runs/:id`. */
export interface UpdateRunBody {
  version: number;
  title?: string;
  process?: RunProcess;
  runDate?: string;
  gasId?: number | null;
  apparatusId?: number | null;
  setup?: RunSetupBody;
}

/** Body of `PUT /api/runs/:id/readings`: values in each channel's own unit; null for an empty cell. */
export interface ReadingsBody {
  version: number;
  time: { unit: Exclude<RunTimeUnit, 'iso'>; values: number[] };
  channels: Partial<Record<ReadingChannel, ChannelEntry & { values: (number | null)[] }>>;
}

/** Answer of `PUT /api/runs/:id/readings`. */
export interface ReadingsReplaced {
  id: number;
  version: number;
  readings: number;
}

/** Body of `POST /api/runs/:id/{approve,return,reject}`: an electronic signature. */
export interface SignatureRequest {
  version: number;
  password: string;
  /** One of SIGNATURE_MEANINGS[action], word for word. */
  meaning: string;
  reason?: string;
}

/** One thing a draft still lacks before submit, in the form's words. */
export interface ChecklistItem {
  field: string;
  label: string;
  message: string;
}

/** `GET /api/runs/:id/checklist`: what a draft still lacks before submit; changes nothing. */
export interface RunChecklistResponse {
  runId: number;
  version: number;
  complete: boolean;
  missing: ChecklistItem[];
}

/** One audit event of the run or its revisions. */
export interface HistoryEvent {
  id: number;
  occurredAt: string;
  actorName: string | null;
  actorEmail: string | null;
  action: string;
  /** The run id (as text) of the revision the event belongs to. */
  entityId: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  reason: string | null;
}

/** `GET /api/runs/:id/history`. */
export interface HistoryPage {
  items: HistoryEvent[];
}
