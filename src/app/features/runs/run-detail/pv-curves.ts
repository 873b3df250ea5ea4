import { BalanceResult, RunSetup } from '../runs.models';

/** A point of the P–V diagram: V in L, P in kPa. */
export interface PvPoint {
  x: number;
  y: number;
}

const MONATOMIC = new Set(['He', 'Ne', 'Ar', 'Kr', 'Xe']);

/** The heat-capacity ratio for the ideal adiabat, and where it came from (shown beside the curve). */
export interface GammaChoice {
  gamma: number;
  source: string;
}

/**
 * γ for the comparison adiabat. An adiabatic claim carries the engine's own index (γ of its gas model at T1);
 * otherwise the equipartition value: 5/3 monatomic, (f + 2)/f for a given f, 7/5 for diatomic and air.
 */
export function gammaFor(setup: RunSetup, result: BalanceResult | null): GammaChoice {
  const claimed = result?.polytropicFit?.claimedIndex;
  if (result?.process.claimed === 'adiabatic' && typeof claimed === 'number' && claimed > 1) {
    return { gamma: claimed, source: 'from the gas model' };
  }
  const gas = setup.gas;
  if (gas?.model === 'equipartition' && typeof gas.f === 'number' && gas.f > 0) {
    return { gamma: (gas.f + 2) / gas.f, source: `f = ${gas.f}` };
  }
  if (gas?.model === 'species' && gas.species && MONATOMIC.has(gas.species)) {
    return { gamma: 5 / 3, source: 'monatomic' };
  }
  return { gamma: 1.4, source: 'diatomic' };
}

/** The measured path in diagram units. */
export function measuredPath(P: readonly number[], V: readonly number[]): PvPoint[] {
  const n = Math.min(P.length, V.length);
  const points: PvPoint[] = [];
  for (let i = 0; i < n; i++) {
    points.push({ x: V[i] * 1e3, y: P[i] / 1e3 });
  }
  return points;
}

/** P·V^n = P1·V1^n over the volume span of the path (n = 1: isotherm; n = γ: adiabat). */
export function idealCurve(first: PvPoint, vMin: number, vMax: number, n: number, steps = 48): PvPoint[] {
  const constant = first.y * first.x ** n;
  const points: PvPoint[] = [];
  for (let i = 0; i <= steps; i++) {
    const x = vMin + ((vMax - vMin) * i) / steps;
    points.push({ x, y: constant / x ** n });
  }
  return points;
}

/** Every how many points an arrow goes, so that a path shows about eight of them. */
export function arrowStep(count: number): number {
  return Math.max(2, Math.round(count / 8));
}
