// Drift fits of a calorimetric run's outer periods: a straight line per period, and Newton's law of
// cooling fitted to both periods at once.
//
// Newton's law (common practice): outside heating the calorimeter drifts as dT/dt = u + k·(T∞ − T), i.e. the
// drift is linear in temperature, g(T) = g₀ − k·(T − T_ref). Its exact solution from (τ = 0, T₀) is
//   T(τ) = T₀·e^(−kτ) + (g₀ + k·T_ref)·(1 − e^(−kτ))/k,
// which stays defined as k → 0 (a straight line of slope g₀). The fit shares k and g₀ between the fore- and
// after-period (same jacket, same stirring) and gives each period its own starting temperature. For a fixed k
// the model is linear in the other three parameters, so k is found by a golden-section search on the residual
// sum of squares (variable projection), then all four are polished by Gauss–Newton, whose Jacobian also gives
// the covariance s²·(JᵀJ)⁻¹ (least squares, common practice).

export interface LinearDrift {
  /** Slope, K/s. */
  rate: number;
  uRate: number;
  /** Mean time (s) and mean temperature (K) of the period: the line passes through them. */
  meanTime: number;
  meanTemperature: number;
  uMeanTemperature: number;
  /** Standard deviation of the residuals, K (the reading-to-reading scatter). */
  scatter: number;
  readings: number;
}

/** Least-squares straight line T = T̄ + b·(t − t̄) through readings [from, to] (inclusive). */
export function linearDrift(t: ArrayLike<number>, T: ArrayLike<number>, from: number, to: number): LinearDrift {
  const n = to - from + 1;
  let st = 0, sT = 0;
  for (let i = from; i <= to; i++) { st += t[i]; sT += T[i]; }
  const tm = st / n, Tm = sT / n;
  let sxx = 0, sxy = 0;
  for (let i = from; i <= to; i++) { sxx += (t[i] - tm) ** 2; sxy += (t[i] - tm) * (T[i] - Tm); }
  const b = sxx > 0 ? sxy / sxx : 0;
  let ssr = 0;
  for (let i = from; i <= to; i++) ssr += (T[i] - Tm - b * (t[i] - tm)) ** 2;
  const s = n > 2 ? Math.sqrt(ssr / (n - 2)) : 0;
  return { rate: b, uRate: sxx > 0 ? s / Math.sqrt(sxx) : 0, meanTime: tm, meanTemperature: Tm, uMeanTemperature: s / Math.sqrt(n), scatter: s, readings: n };
}

export interface NewtonFit {
  /** Cooling constant, 1/s. */
  k: number;
  /** Drift at T_ref, K/s. */
  g0: number;
  Tref: number;
  /** Fitted temperatures at the start of the fore- and after-period, K. */
  T0: [number, number];
  /** Covariance of [k, g0, T0_fore, T0_after]. */
  covariance: number[][];
  /** Residual standard deviation, K. */
  scatter: number;
  readings: number;
}

/** Drift at temperature T (K/s) from a Newton fit. */
export const newtonDrift = (f: Pick<NewtonFit, 'k' | 'g0' | 'Tref'>, T: number): number => f.g0 - f.k * (T - f.Tref);

interface Point { tau: number; y: number; period: 0 | 1 }

const phi = (k: number, tau: number) => (Math.abs(k * tau) < 1e-8 ? tau * (1 - 0.5 * k * tau) : -Math.expm1(-k * tau) / k);
function dPhiDk(k: number, tau: number): number {
  const x = k * tau;
  if (Math.abs(x) < 1e-4) return tau * tau * (-0.5 + x / 3 - (x * x) / 8);
  return (tau * Math.exp(-x) - phi(k, tau)) / k;
}

/** Solves A·x = b (small, dense) by Gauss–Jordan with partial pivoting; null when singular. */
export function solveDense(A: number[][], b: number[]): number[] | null {
  const n = b.length;
  const M = A.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[p][c])) p = r;
    if (!(Math.abs(M[p][c]) > 0)) return null;
    [M[c], M[p]] = [M[p], M[c]];
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = M[r][c] / M[c][c];
      for (let j = c; j <= n; j++) M[r][j] -= f * M[c][j];
    }
  }
  return M.map((row, i) => row[n] / row[i]);
}

function invert(A: number[][]): number[][] | null {
  const n = A.length;
  const cols: number[][] = [];
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0);
    e[j] = 1;
    const x = solveDense(A, e);
    if (!x) return null;
    cols.push(x);
  }
  return A.map((_, i) => cols.map((c) => c[i]));
}

/** For a fixed k: the linear parameters [g0, T0f, T0a] (temperatures relative to T_ref) and the residual sum. */
function projected(points: Point[], k: number): { p: number[]; ssr: number } | null {
  const AtA = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  const Atb = [0, 0, 0];
  for (const q of points) {
    const e = Math.exp(-k * q.tau);
    const row = [phi(k, q.tau), q.period === 0 ? e : 0, q.period === 1 ? e : 0];
    for (let a = 0; a < 3; a++) {
      Atb[a] += row[a] * q.y;
      for (let b = 0; b < 3; b++) AtA[a][b] += row[a] * row[b];
    }
  }
  const p = solveDense(AtA, Atb);
  if (!p) return null;
  let ssr = 0;
  for (const q of points) ssr += (q.y - model(q, k, p)) ** 2;
  return { p, ssr };
}

const model = (q: Point, k: number, p: number[]) => p[1 + q.period] * Math.exp(-k * q.tau) + p[0] * phi(k, q.tau);

/**
 * Fits Newton's law to the fore-period readings [0, foreEnd] and the after-period readings [afterStart, N − 1].
 * Returns null when the periods hold too few readings (at least 3 each).
 */
export function fitNewton(t: ArrayLike<number>, T: ArrayLike<number>, foreEnd: number, afterStart: number): NewtonFit | null {
  const N = T.length;
  if (foreEnd + 1 < 3 || N - afterStart < 3) return null;
  let Tref = 0;
  for (let i = 0; i <= foreEnd; i++) Tref += T[i];
  Tref /= foreEnd + 1;
  const points: Point[] = [];
  for (let i = 0; i <= foreEnd; i++) points.push({ tau: t[i] - t[0], y: T[i] - Tref, period: 0 });
  for (let i = afterStart; i < N; i++) points.push({ tau: t[i] - t[afterStart], y: T[i] - Tref, period: 1 });
  const span = t[N - 1] - t[0];
  if (!(span > 0)) return null;

  // Golden-section search for k over a wide physical bracket (time constants from span/50 to "none").
  let lo = -1 / span, hi = 50 / span;
  const gr = (Math.sqrt(5) - 1) / 2;
  const f = (k: number) => projected(points, k)?.ssr ?? Infinity;
  let x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
  let f1 = f(x1), f2 = f(x2);
  for (let it = 0; it < 200 && hi - lo > 1e-14 / span; it++) {
    if (f1 <= f2) { hi = x2; x2 = x1; f2 = f1; x1 = hi - gr * (hi - lo); f1 = f(x1); }
    else { lo = x1; x1 = x2; f1 = f2; x2 = lo + gr * (hi - lo); f2 = f(x2); }
  }
  let k = 0.5 * (lo + hi);
  const start = projected(points, k);
  if (!start) return null;
  let p = start.p; // [g0, T0f, T0a]

  // Gauss–Newton polish over θ = [k, g0, T0f, T0a].
  const jac = (q: Point, kk: number, pp: number[]) => {
    const e = Math.exp(-kk * q.tau);
    return [-q.tau * e * pp[1 + q.period] + pp[0] * dPhiDk(kk, q.tau), phi(kk, q.tau), q.period === 0 ? e : 0, q.period === 1 ? e : 0];
  };
  let ssr = start.ssr;
  for (let it = 0; it < 20; it++) {
    const JtJ = [0, 1, 2, 3].map(() => [0, 0, 0, 0]);
    const Jtr = [0, 0, 0, 0];
    for (const q of points) {
      const row = jac(q, k, p);
      const r = q.y - model(q, k, p);
      for (let a = 0; a < 4; a++) {
        Jtr[a] += row[a] * r;
        for (let b = 0; b < 4; b++) JtJ[a][b] += row[a] * row[b];
      }
    }
    const step = solveDense(JtJ, Jtr);
    if (!step) break;
    const kNew = k + step[0];
    const pNew = [p[0] + step[1], p[1] + step[2], p[2] + step[3]];
    let ssrNew = 0;
    for (const q of points) ssrNew += (q.y - model(q, kNew, pNew)) ** 2;
    if (!(ssrNew <= ssr)) break;
    const done = Math.abs(step[0]) <= 1e-15 * Math.max(Math.abs(k), 1 / span);
    k = kNew; p = pNew; ssr = ssrNew;
    if (done) break;
  }

  const n = points.length;
  const s2 = n > 4 ? ssr / (n - 4) : 0;
  const JtJ = [0, 1, 2, 3].map(() => [0, 0, 0, 0]);
  for (const q of points) {
    const row = jac(q, k, p);
    for (let a = 0; a < 4; a++) for (let b = 0; b < 4; b++) JtJ[a][b] += row[a] * row[b];
  }
  const inv = invert(JtJ);
  const covariance = inv ? inv.map((row) => row.map((v) => v * s2)) : [0, 1, 2, 3].map(() => [Infinity, Infinity, Infinity, Infinity]);
  return { k, g0: p[0], Tref, T0: [p[1] + Tref, p[2] + Tref], covariance, scatter: Math.sqrt(s2), readings: n };
}

/** Convergence temperature T∞ + u/k = T_ref + g₀/k, where the drift is zero, with its standard uncertainty. */
export function convergenceTemperature(f: NewtonFit): { value: number; u: number } {
  const { k, g0, covariance: c } = f;
  const value = f.Tref + g0 / k;
  // ∂/∂k = −g₀/k², ∂/∂g₀ = 1/k (GUM 5.2.2 with the fit's covariance)
  const a = -g0 / (k * k), b = 1 / k;
  const u2 = a * a * c[0][0] + b * b * c[1][1] + 2 * a * b * c[0][1];
  return { value, u: Math.sqrt(Math.max(0, u2)) };
}
