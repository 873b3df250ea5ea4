// A standardization series: mean energy equivalent, its spread, an individuals control chart and the lab's
// acceptance rule.
// Individuals chart (ISO 7870-2, Shewhart control charts; common practice): centre line = mean of the values,
// σ estimated from the average moving range of consecutive values, σ = MR̄/d₂ with d₂ = 1.128 for ranges of two
// (ISO 7870-2 table of constants, from memory), limits = centre ± 3σ.
// Tests for special causes (the eight run rules ISO 7870-2 lists, from memory), each flagging the point that
// completes the pattern; zones are A (2σ–3σ), B (1σ–2σ), C (within 1σ).
// Acceptance: at least six runs spread over at least three days (ASTM D240 §8.1), and a relative standard
// deviation no larger than the lab's limit (a lab setting).

/** d₂ for moving ranges of two consecutive values (ISO 7870-2, from memory). */
export const D2 = 1.128;

/** ASTM D240 §8.1: the average of not less than six tests spread over not less than three days. */
export const ASTM_D240_MIN_RUNS = 6;
export const ASTM_D240_MIN_DAYS = 3;

export interface AcceptanceRule {
  minRuns: number;
  minDays: number;
  /** Largest relative standard deviation accepted, as a fraction (0.002 = 0.2 %). */
  maxRsd: number;
}

export interface SeriesPoint {
  /** ISO date of the run. */
  date: string;
  value: number;
}

export interface RuleBreak {
  test: number;
  rule: string;
}

export interface ChartLimits {
  centre: number;
  sigma: number;
  lower: number;
  upper: number;
}

export interface SeriesSummary {
  n: number;
  days: number;
  mean: number;
  /** Sample standard deviation (n − 1), J/K. */
  sd: number;
  /** Standard uncertainty of the mean, s/√n. */
  uMean: number;
  /** sd / mean. */
  rsd: number;
  chart: ChartLimits | null;
  /** Per point, in the order given: the first rule it breaks, or null. */
  breaks: Array<RuleBreak | null>;
  acceptance: { ok: boolean; reasons: string[] };
}

export const RUN_RULES: Readonly<Record<number, string>> = {
  1: 'outside the 3σ control limits',
  2: 'nine points in a row on one side of the centre line',
  3: 'six points in a row steadily increasing or decreasing',
  4: 'fourteen points in a row alternating up and down',
  5: 'two of three points in a row beyond 2σ on one side',
  6: 'four of five points in a row beyond 1σ on one side',
  7: 'fifteen points in a row within 1σ of the centre line',
  8: 'eight points in a row beyond 1σ on either side',
};

/** Individuals-chart limits from the values in order; null with fewer than two values. */
export function individualsLimits(values: readonly number[]): ChartLimits | null {
  if (values.length < 2) return null;
  const centre = values.reduce((s, v) => s + v, 0) / values.length;
  let mr = 0;
  for (let i = 1; i < values.length; i++) mr += Math.abs(values[i] - values[i - 1]);
  const sigma = mr / (values.length - 1) / D2;
  return { centre, sigma, lower: centre - 3 * sigma, upper: centre + 3 * sigma };
}

/** The first run rule each point completes (tests 1–8), or null. */
export function runRuleBreaks(values: readonly number[], L: ChartLimits): Array<RuleBreak | null> {
  const z = values.map((v) => (L.sigma > 0 ? (v - L.centre) / L.sigma : 0));
  const side = (x: number) => (x > 0 ? 1 : x < 0 ? -1 : 0);
  const window = (i: number, len: number) => (i + 1 >= len ? z.slice(i + 1 - len, i + 1) : null);
  const tests: Array<(i: number) => boolean> = [
    (i) => L.sigma > 0 && Math.abs(z[i]) > 3,
    (i) => { const w = window(i, 9); return !!w && (w.every((x) => x > 0) || w.every((x) => x < 0)); },
    (i) => {
      const w = window(i, 6);
      if (!w) return false;
      const d = w.slice(1).map((x, j) => x - w[j]);
      return d.every((x) => x > 0) || d.every((x) => x < 0);
    },
    (i) => {
      const w = window(i, 14);
      if (!w) return false;
      const d = w.slice(1).map((x, j) => side(x - w[j]));
      return d.every((s, j) => s !== 0 && (j === 0 || s === -d[j - 1]));
    },
    (i) => { const w = window(i, 3); return !!w && [1, -1].some((s) => w.filter((x) => s * x > 2).length >= 2 && s * z[i] > 2); },
    (i) => { const w = window(i, 5); return !!w && [1, -1].some((s) => w.filter((x) => s * x > 1).length >= 4 && s * z[i] > 1); },
    (i) => { const w = window(i, 15); return !!w && L.sigma > 0 && w.every((x) => Math.abs(x) < 1); },
    (i) => { const w = window(i, 8); return !!w && w.every((x) => Math.abs(x) > 1) && w.some((x) => x > 0) && w.some((x) => x < 0); },
  ];
  return z.map((_, i) => {
    const t = tests.findIndex((test) => test(i));
    return t < 0 ? null : { test: t + 1, rule: RUN_RULES[t + 1] };
  });
}

/** Summary, chart and acceptance of a series given in date order. */
export function summariseSeries(points: readonly SeriesPoint[], rule: AcceptanceRule): SeriesSummary {
  const values = points.map((p) => p.value);
  const n = values.length;
  const mean = n ? values.reduce((s, v) => s + v, 0) / n : NaN;
  const sd = n > 1 ? Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1)) : NaN;
  const days = new Set(points.map((p) => p.date.slice(0, 10))).size;
  const chart = individualsLimits(values);
  const breaks = chart ? runRuleBreaks(values, chart) : values.map(() => null);
  const rsd = sd / mean;
  const reasons: string[] = [];
  if (n < rule.minRuns) reasons.push(`${n} run(s); the lab's rule asks for at least ${rule.minRuns}`);
  if (days < rule.minDays) reasons.push(`runs on ${days} day(s); the lab's rule asks for at least ${rule.minDays}`);
  if (n > 1 && !(Math.abs(rsd) <= rule.maxRsd)) reasons.push(`relative standard deviation ${(100 * rsd).toFixed(3)} % is above the lab's limit of ${(100 * rule.maxRsd).toFixed(3)} %`);
  const broken = breaks.filter((b) => b !== null).length;
  if (broken > 0) reasons.push(`${broken} run(s) break a control-chart rule`);
  return { n, days, mean, sd, uMean: n > 1 ? sd / Math.sqrt(n) : NaN, rsd, chart, breaks, acceptance: { ok: reasons.length === 0, reasons } };
}
