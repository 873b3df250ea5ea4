// Propagation of distributions by the Monte Carlo method (JCGM 101:2008, GUM Supplement 1).
import { createRng } from './random';

export type Distribution = 'normal' | 'rectangular';

export interface McInput {
  name: string;
  value: number;
  /** Standard uncertainty; a rectangular input spans value ± √3·u (JCGM 101 §6.4.2). */
  u: number;
  distribution: Distribution;
}

export interface McResult {
  draws: number;
  seed: number | string;
  mean: number;
  sd: number;
  coverage: number;
  /** Probabilistically symmetric coverage interval (JCGM 101 §7.7). */
  low: number;
  high: number;
  /** The draws binned for a picture of the distribution (JCGM 101 §7.5: a histogram of the model values). */
  histogram: Histogram;
}

export interface Histogram {
  /** Left edge of the first bin. */
  start: number;
  width: number;
  counts: number[];
  /** Draws outside the binned range (its ends are the 0.05 % and 99.95 % quantiles). */
  outside: number;
}

export const HISTOGRAM_BINS = 40;

/** Bins sorted values between their 0.05 % and 99.95 % quantiles, so a few far draws do not flatten it. */
export function histogramOf(sorted: Float64Array, bins = HISTOGRAM_BINS): Histogram {
  const M = sorted.length;
  const lo = sorted[Math.floor(0.0005 * (M - 1))];
  const hi = sorted[Math.ceil(0.9995 * (M - 1))];
  const width = hi > lo ? (hi - lo) / bins : 1;
  const counts = new Array<number>(bins).fill(0);
  let outside = 0;
  for (let i = 0; i < M; i++) {
    const v = sorted[i];
    if (v < lo || v > hi) {
      outside += 1;
      continue;
    }
    counts[Math.min(bins - 1, Math.floor((v - lo) / width))] += 1;
  }
  return { start: lo, width, counts, outside };
}

export interface McOptions {
  draws: number;
  seed: number | string;
  coverage?: number;
}

const SQRT3 = Math.sqrt(3);

export function monteCarlo(inputs: readonly McInput[], model: (x: Float64Array) => number, options: McOptions): McResult {
  const M = Math.max(2, Math.floor(options.draws));
  const p = options.coverage ?? 0.95;
  const rng = createRng(options.seed);
  const m = inputs.length;
  const x = new Float64Array(m);
  const value = Float64Array.from(inputs.map((q) => q.value));
  const u = Float64Array.from(inputs.map((q) => q.u));
  const rect = inputs.map((q) => q.distribution === 'rectangular');
  const y = new Float64Array(M);
  let sum = 0;
  for (let d = 0; d < M; d++) {
    for (let j = 0; j < m; j++) {
      if (u[j] === 0) x[j] = value[j];
      else x[j] = value[j] + u[j] * (rect[j] ? SQRT3 * (2 * rng.uniform() - 1) : rng.normal());
    }
    const v = model(x);
    y[d] = v;
    sum += v;
  }
  const mean = sum / M;
  let ss = 0;
  for (let d = 0; d < M; d++) ss += (y[d] - mean) * (y[d] - mean);
  y.sort();
  // JCGM 101 §7.7.2: q = pM (rounded to an integer), r = (M − q)/2 (rounded up), interval [y_(r), y_(r+q)].
  const q = Number.isInteger(p * M) ? p * M : Math.floor(p * M + 0.5);
  const r = Number.isInteger((M - q) / 2) ? (M - q) / 2 : (M - q + 1) / 2;
  const low = y[Math.max(r, 1) - 1];
  const high = y[Math.min(r + q, M) - 1];
  return { draws: M, seed: options.seed, mean, sd: Math.sqrt(ss / (M - 1)), coverage: p, low, high, histogram: histogramOf(y) };
}

/** Two-sided 95 % coverage factor of the normal distribution (JCGM 101 §5.3 compares at equal coverage). */
export const K95_NORMAL = 1.959963984540054;

export interface Agreement {
  agrees: boolean;
  tolerance: number;
  dLow: number;
  dHigh: number;
}

/**
 * Validation of the linear result by the Monte Carlo one (JCGM 101 §8.2): express u(y) to two significant
 * digits, u = c·10^l, take δ = ½·10^l and accept when both interval ends differ by at most δ.
 * Both intervals are compared at the same coverage (95 %), so the linear one uses k = 1.96 here.
 * JCGM 101 assumes enough draws that the sampling noise of the interval ends is below δ; with a fixed number
 * of draws we widen δ to 3 standard errors of a 2.5 % quantile, s·√(p(1−p)/M)/φ(z_p) (asymptotic
 * order-statistic variance), so that noise alone does not report a disagreement.
 */
export function compareWithLinear(y: number, u: number, mc: McResult): Agreement {
  const l = u > 0 ? Math.floor(Math.log10(u)) - 1 : 0;
  const seQuantile = (mc.sd * Math.sqrt((0.025 * 0.975) / mc.draws)) / 0.05844094433345147; // φ(1.96)
  const tolerance = Math.max(0.5 * 10 ** l, 3 * seQuantile);
  const dLow = Math.abs(y - K95_NORMAL * u - mc.low);
  const dHigh = Math.abs(y + K95_NORMAL * u - mc.high);
  return { agrees: dLow <= tolerance && dHigh <= tolerance, tolerance, dLow, dHigh };
}
