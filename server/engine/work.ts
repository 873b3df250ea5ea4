// Boundary work of the gas, W = ∫P dV (first law sign convention: work done BY the gas is positive).
import type { RunProcess } from '../../contract/runs';
import { R_GAS } from './units';

export type ArrayLike64 = ArrayLike<number>;

/** Trapezoidal rule over readings in time order: Σ (P_i + P_{i+1})/2 · (V_{i+1} − V_i). */
export function trapezoidWork(P: ArrayLike64, V: ArrayLike64): number {
  let w = 0;
  for (let i = 0; i + 1 < P.length; i++) w += 0.5 * (P[i] + P[i + 1]) * (V[i + 1] - V[i]);
  return w;
}

/** Shoelace formula: signed area enclosed by a closed polygon (clockwise in P–V is positive work). */
export function shoelaceArea(P: ArrayLike64, V: ArrayLike64): number {
  let a = 0;
  const n = P.length;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    a += V[i] * P[j] - V[j] * P[i];
  }
  return -a / 2;
}

/** 'free-form': a path that follows no named process (loops, free paths); no model work and no claim flags. */
export type ClaimedProcess = RunProcess;

export interface ModelWorkInput {
  process: ClaimedProcess;
  P1: number;
  V1: number;
  P2: number;
  V2: number;
  /** Mean pressure, the best estimate of the constant pressure of an isobaric run. */
  Pmean: number;
  n: number;
  T1: number;
  gamma?: number;
  index?: number;
}

/** Ideal-process work for the claimed process; null when the model does not apply. */
export function modelWork(m: ModelWorkInput): { value: number | null; formula: string } {
  switch (m.process) {
    case 'isobaric': // W = P·ΔV
      return { value: m.Pmean * (m.V2 - m.V1), formula: 'P·(V2 − V1), P = mean measured pressure' };
    case 'isochoric': // dV = 0
      return { value: 0, formula: '0 (no volume change)' };
    case 'isothermal': // ideal gas: W = nRT ln(V2/V1)
      return { value: m.n * R_GAS * m.T1 * Math.log(m.V2 / m.V1), formula: 'n·R·T1·ln(V2/V1)' };
    case 'adiabatic': // reversible adiabat P V^γ = const: W = (P1V1 − P2V2)/(γ − 1)
      return m.gamma === undefined
        ? { value: null, formula: 'adiabatic model needs γ of a gas' }
        : { value: (m.P1 * m.V1 - m.P2 * m.V2) / (m.gamma - 1), formula: '(P1·V1 − P2·V2)/(γ − 1)' };
    case 'polytropic': // P V^n = const: W = (P1V1 − P2V2)/(n − 1); n = 1 is the isotherm
      if (m.index === undefined) return { value: null, formula: 'polytropic model needs the claimed index n' };
      if (Math.abs(m.index - 1) < 1e-12) return { value: m.P1 * m.V1 * Math.log(m.V2 / m.V1), formula: 'P1·V1·ln(V2/V1) (n = 1)' };
      return { value: (m.P1 * m.V1 - m.P2 * m.V2) / (m.index - 1), formula: '(P1·V1 − P2·V2)/(n − 1)' };
    case 'calorimetric':
      return { value: null, formula: 'no gas work modelled for a calorimetric run' };
    case 'free-form':
      return { value: null, formula: 'no model work: the run claims no named process' };
  }
}
