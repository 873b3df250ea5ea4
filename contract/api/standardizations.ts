import type { ValueU } from '../wire';

// `GET /api/apparatus/:id/standardizations` and `GET /api/standardizations/due`.

/** A standardization run of the series, with its ε and what the control chart says of it. */
export interface SeriesRun {
  runId: number;
  code: string;
  runDate: string;
  state: string;
  /** ε of the run, J/K. */
  energyEquivalent: ValueU;
  accepted: boolean;
  outOfControl: boolean;
  /** The control-chart rule the run breaks, in words. */
  rule: string | null;
  /** Chart segment: a recorded change to the apparatus starts a new one (ASTM D240 §8.1.1). */
  segment: number;
  /** In the current segment: the runs a new standardization is made from. */
  current: boolean;
}

export interface ChartLimits {
  centre: number;
  sigma: number;
  lower: number;
  upper: number;
}

export interface ChartSegment {
  index: number;
  /** The change that started the segment; null for the first. */
  change: { date: string; description: string } | null;
  n: number;
  chart: ChartLimits | null;
  current: boolean;
}

/** A signed standardization: the apparatus's energy equivalent from a set of accepted runs. */
export interface Standardization {
  id: number;
  energyEquivalent: ValueU;
  /** The mean heat-loss coefficient of the runs, W/K; its u is null when the runs gave none. */
  heatLossCoefficient: { value: number; u: number | null } | null;
  runIds: number[];
  effectiveFrom: string;
  signedBy: string;
  meaning: string;
  reason: string | null;
  signedHash: string;
  signedAt: string;
}

/** A recorded change to the apparatus that makes a new standardization due. */
export interface ApparatusChange {
  id: number;
  description: string;
  changedOn: string;
  recordedAt: string;
  recordedBy: string;
}

/** The acceptance rule of a standardization series. */
export interface AcceptanceRule {
  minRuns: number;
  minDays: number;
  maxRsd: number;
}

export interface StandardizationOverview {
  apparatus: { id: number; tag: string; name: string; kind: string };
  current: Standardization | null;
  due: { since: string; description: string } | null;
  series: SeriesRun[];
  /** The current segment's limits (after the latest change). */
  chart: ChartLimits | null;
  segments: ChartSegment[];
  summary: { n: number; days: number; mean: number | null; sd: number | null; uMean: number | null; rsd: number | null; acceptance: { ok: boolean; reasons: string[] } };
  rule: AcceptanceRule;
  /** The lab setting QWELL_USE_FITTED_HEAT_LOSS: runs use the standardization's fitted h (else the register's). */
  useFittedHeatLoss: boolean;
  history: Standardization[];
  changes: ApparatusChange[];
}

/** One apparatus whose standardization is due after a change. */
export interface DueApparatus {
  id: number;
  tag: string;
  name: string;
  since: string;
  description: string;
}
