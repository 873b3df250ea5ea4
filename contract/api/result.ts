import type { AppliedCorrection } from '../corrections';
import type { Verdict } from '../runs';
import type { ValueU } from '../wire';

// The engine's balance result as the API returns it (`GET /api/runs/:id/balance`): energies in J,
// u standard, U expanded; calorimetry in K, s, J/K, W/K (docs/run-document.md).

export interface DriftLine {
  /** K/s */
  rate: number;
  u: number;
  meanTemperature: number;
  meanTime: number;
  readings: number;
}

export type RiseMethod = 'regnault-pfaundler' | 'dickinson';

export interface TemperatureRise {
  observed: number;
  corrected: ValueU;
  method: RiseMethod;
  alternative: ValueU & { method: RiseMethod };
  periods: { source: 'document' | 'detected'; mainStart: number; mainEnd: number; startReading: number; endReading: number; foreReadings: number; afterReadings: number; dickinsonTime: number };
  drift: { fore: DriftLine; after: DriftLine };
  /** Parts of u(corrected): the drift fits and reading scatter, and the thermometer's gain (K); absent in results before engine 2.1. */
  uncertainty?: { fit: number; thermometerGain: number; thermometer: string | null };
}

/** Calorimetry fields of a balance result. */
export interface CalorimetryResult {
  purpose?: 'measurement' | 'standardization';
  temperatureRise?: TemperatureRise | null;
  heatLeakFit?: { k: ValueU; convergenceTemperature: ValueU; h: ValueU | null; heatCapacity: (ValueU & { source: string }) | null } | null;
  energyEquivalent?: (ValueU & { knownHeat: { value: number; u: number; description: string } }) | null;
  /** The approved standardization whose ε the run used (stored results only). */
  standardization?: {
    id: number; energyEquivalent: ValueU; effectiveFrom: string; signedBy: string; signedAt: string;
    /** The standardization's mean fitted h, and whether the run used it (the lab setting QWELL_USE_FITTED_HEAT_LOSS). */
    heatLossCoefficient?: ValueU | null; heatLossApplied?: boolean;
  } | null;
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

/** The Monte Carlo draws of r, binned by the engine. */
export interface McHistogram {
  start: number;
  width: number;
  counts: number[];
  outside: number;
}

/** The engine's balance result. */
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
  /**
   * Certificate corrections the check applied to the readings (reading × gain + offset); empty when none.
   * Absent in results stored before engine 2.3, which read every reading as entered.
   */
  corrections?: AppliedCorrection[];
}

/** `GET /api/runs/:id/balance`: the stored result, saying whether it still describes the run. */
export interface BalanceResponse {
  id: number;
  runId: number;
  runVersion: number;
  currentRunVersion: number;
  /** Computed before the run's content last changed. */
  stale: boolean;
  computedAt: string;
  result: BalanceResult;
  /** One sentence of why beside a verdict that breaks or is indeterminate (server-built); null when it closes. */
  why: string | null;
}
