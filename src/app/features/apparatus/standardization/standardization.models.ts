/** `GET /api/apparatus/:id/standardizations`: the series, its chart and the signed standardizations. */
export interface ValueU {
  value: number;
  u: number;
}

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

export interface Standardization {
  id: number;
  energyEquivalent: ValueU;
  heatLossCoefficient: ValueU | null;
  runIds: number[];
  effectiveFrom: string;
  signedBy: string;
  meaning: string;
  reason: string | null;
  signedHash: string;
  signedAt: string;
}

export interface ApparatusChange {
  id: number;
  description: string;
  changedOn: string;
  recordedAt: string;
  recordedBy: string;
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
  rule: { minRuns: number; minDays: number; maxRsd: number };
  history: Standardization[];
  changes: ApparatusChange[];
}

export interface DueApparatus {
  id: number;
  tag: string;
  name: string;
  since: string;
  description: string;
}

/** The one meaning a standardization signature can have (the server's list). */
export const STANDARDIZATION_MEANINGS = ['I have reviewed these standardization runs and approve the energy equivalent'] as const;
