// Straight-line least squares and the polytropic index from ln P against ln V.
import { mean, sampleCorrelation, sampleCovariance, sampleVariance } from 'simple-statistics';
import type { ArrayLike64 } from './work';

export interface LineFit {
  intercept: number;
  slope: number;
  uIntercept: number;
  uSlope: number;
  /** Covariance of (intercept, slope), from s²·(XᵀX)⁻¹. */
  covariance: number;
  /** Residual standard deviation with ν = N − 2 (GUM H.3.3). */
  s: number;
  dof: number;
  rSquared: number;
  points: number;
}

// simple-statistics only indexes its inputs, so typed arrays pass without copying.
const asArray = (a: ArrayLike64) => a as unknown as number[];

/** Ordinary least squares y = a + b·x with GUM H.3 uncertainties. */
export function fitLine(x: ArrayLike64, y: ArrayLike64): LineFit {
  const N = x.length;
  if (N < 3) throw new Error('a straight-line fit with uncertainties needs at least 3 points');
  const xs = asArray(x);
  const ys = asArray(y);
  const xBar = mean(xs);
  const yBar = mean(ys);
  const sxx = sampleVariance(xs) * (N - 1);
  const slope = sampleCovariance(xs, ys) / sampleVariance(xs);
  const intercept = yBar - slope * xBar;
  let sse = 0;
  for (let i = 0; i < N; i++) {
    const e = y[i] - intercept - slope * x[i];
    sse += e * e;
  }
  const dof = N - 2;
  const s2 = sse / dof;
  const r = sxx > 0 ? sampleCorrelation(xs, ys) : NaN;
  return {
    intercept,
    slope,
    uIntercept: Math.sqrt(s2 * (1 / N + (xBar * xBar) / sxx)),
    uSlope: Math.sqrt(s2 / sxx),
    covariance: (-xBar * s2) / sxx,
    s: Math.sqrt(s2),
    dof,
    rSquared: r * r,
    points: N,
  };
}

export interface PolytropicFit {
  /** Fitted index n in P·V^n = const (the negative slope of ln P on ln V). */
  index: number;
  uIndex: number;
  rSquared: number;
  points: number;
}

/** P·V^n = const ⇒ ln P = c − n·ln V; null when V does not vary (the index is then undefined). */
export function polytropicFit(P: ArrayLike64, V: ArrayLike64): PolytropicFit | null {
  const N = P.length;
  if (N < 3) return null;
  const lnP = new Float64Array(N);
  const lnV = new Float64Array(N);
  let vMin = Infinity;
  let vMax = -Infinity;
  for (let i = 0; i < N; i++) {
    if (!(P[i] > 0 && V[i] > 0)) return null;
    lnP[i] = Math.log(P[i]);
    lnV[i] = Math.log(V[i]);
    if (lnV[i] < vMin) vMin = lnV[i];
    if (lnV[i] > vMax) vMax = lnV[i];
  }
  if (vMax - vMin < 1e-9) return null;
  const fit = fitLine(lnV, lnP);
  return { index: -fit.slope, uIndex: fit.uSlope, rSquared: fit.rSquared, points: N };
}

/** The index the claimed process implies: isobaric 0, isothermal 1, adiabatic γ, isochoric ∞. */
export function claimedIndex(process: string, gamma: number | undefined, index: number | undefined): number | null {
  switch (process) {
    case 'isobaric':
      return 0;
    case 'isothermal':
      return 1;
    case 'adiabatic':
      return gamma ?? null;
    case 'polytropic':
      return index ?? null;
    case 'isochoric':
      return Infinity;
    default:
      return null;
  }
}

/**
 * ∂n/∂b for an offset b common to every pressure reading and to every volume reading (Pa⁻¹, m⁻³), from the
 * least-squares slope b = Sxy/Sxx of y = ln P on x = ln V: an offset moves y_i by b/P_i (or x_i by b/V_i), and
 * d(slope) = (dSxy − slope·dSxx)/Sxx. Gains move every ln P (ln V) alike and leave the slope unchanged.
 */
export function indexOffsetSensitivity(P: ArrayLike64, V: ArrayLike64): { dP: number; dV: number } | null {
  const N = P.length;
  if (N < 3) return null;
  let sx = 0, sy = 0, sp = 0, sv = 0;
  for (let i = 0; i < N; i++) {
    if (!(P[i] > 0 && V[i] > 0)) return null;
    sx += Math.log(V[i]); sy += Math.log(P[i]); sp += 1 / P[i]; sv += 1 / V[i];
  }
  const xb = sx / N, yb = sy / N, pb = sp / N, vb = sv / N;
  let sxx = 0, sxy = 0, dSxyP = 0, dSxyV = 0, dSxxV = 0;
  for (let i = 0; i < N; i++) {
    const dx = Math.log(V[i]) - xb, dy = Math.log(P[i]) - yb;
    const ep = 1 / P[i] - pb, ev = 1 / V[i] - vb;
    sxx += dx * dx; sxy += dx * dy;
    dSxyP += dx * ep; dSxyV += ev * dy; dSxxV += 2 * dx * ev;
  }
  if (!(sxx > 0)) return null;
  const slope = sxy / sxx;
  return { dP: -dSxyP / sxx, dV: -(dSxyV - slope * dSxxV) / sxx }; // n = −slope
}
