// Heat into the system: electrical heat less Newtonian heat leak less wall uptake.
import type { ArrayLike64 } from './work';

/** Trapezoid weights w_i so that ∫f dt ≈ Σ w_i f_i; the per-reading sensitivities reuse them. */
export function trapezoidWeights(t: ArrayLike64): Float64Array {
  const n = t.length;
  const w = new Float64Array(n);
  for (let i = 0; i + 1 < n; i++) {
    const h = 0.5 * (t[i + 1] - t[i]);
    w[i] += h;
    w[i + 1] += h;
  }
  return w;
}

/** ∫f dt by the trapezoidal rule. */
export function trapezoidIntegral(t: ArrayLike64, f: ArrayLike64): number {
  let s = 0;
  for (let i = 0; i + 1 < t.length; i++) s += 0.5 * (f[i] + f[i + 1]) * (t[i + 1] - t[i]);
  return s;
}

/** Electrical heat Q_el = ∫U·I dt (Joule heating), trapezoid on the product at each reading. */
export function electricalHeat(t: ArrayLike64, U: ArrayLike64, I: ArrayLike64): number {
  let s = 0;
  for (let i = 0; i + 1 < t.length; i++) s += 0.5 * (U[i] * I[i] + U[i + 1] * I[i + 1]) * (t[i + 1] - t[i]);
  return s;
}

/** Newtonian heat leak out of the system: ∫h·(T − T_ambient) dt. */
export function heatLeak(t: ArrayLike64, T: ArrayLike64, h: number, Tambient: number): number {
  let s = 0;
  for (let i = 0; i + 1 < t.length; i++) s += 0.5 * (T[i] + T[i + 1] - 2 * Tambient) * (t[i + 1] - t[i]);
  return h * s;
}

/** Q = Q_el − Q_leak − Q_wall (DESIGN §2, heat). */
export function netHeat(electrical: number, leak: number, wall: number): number {
  return electrical - leak - wall;
}
