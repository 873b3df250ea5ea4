import { RunSetup } from '../run-entry.models';
import { BalanceResult } from '../run-detail.models';

/** A point of the P–V diagram: V in L, P in kPa. */
export interface PvPoint {
  x: number;
  y: number;
}

const MONATOMIC = new Set(['He', 'Ne', 'Ar', 'Kr', 'Xe']);

/**
 * γ = Cp/(Cp − R) at 298.15 K for results stored before the engine kept its own γ (REFERENCES §2b, from the
 * NASA Glenn polynomials; the engine's value at the run's mean temperature is used whenever it is there).
 */
const GAMMA_298: Readonly<Record<string, number>> = { N2: 1.39955, O2: 1.39465, CO2: 1.28854, air: 1.39999 };

/** The heat-capacity ratio for the ideal adiabat, and where it came from (shown beside the curve). */
export interface GammaChoice {
  gamma: number;
  source: string;
}

/**
 * γ of the run's own gas: the engine's γ of its gas model at the run's mean temperature when the result has it;
 * otherwise the claimed adiabat's index, the equipartition value (f + 2)/f, 5/3 for a monatomic gas, or the
 * species' γ at 298.15 K. Null when no gas is modelled (a calorimeter): no adiabat can be drawn then.
 */
export function gammaFor(setup: RunSetup, result: BalanceResult | null): GammaChoice | null {
  if (typeof result?.gamma === 'number' && result.gamma > 1) {
    return { gamma: result.gamma, source: `${result.gas} at the run's mean temperature` };
  }
  const claimed = result?.polytropicFit?.claimedIndex;
  if (result?.process.claimed === 'adiabatic' && typeof claimed === 'number' && claimed > 1) {
    return { gamma: claimed, source: 'from the gas model' };
  }
  const gas = setup.gas;
  if (gas?.model === 'equipartition' && typeof gas.f === 'number' && gas.f > 0) {
    return { gamma: (gas.f + 2) / gas.f, source: `f = ${gas.f}` };
  }
  if (gas?.model === 'species' && gas.species && MONATOMIC.has(gas.species)) {
    return { gamma: 5 / 3, source: `${gas.species}, monatomic` };
  }
  if (gas?.model === 'species' && gas.species && GAMMA_298[gas.species]) {
    return { gamma: GAMMA_298[gas.species], source: `${gas.species} at 298.15 K` };
  }
  return null;
}

/** The curve of the claimed process through the first state, with its legend label. */
export interface ClaimedCurve {
  label: string;
  points: PvPoint[];
}

/**
 * The claimed process drawn through the first reading over the path's span: isobar P = P₁, isochore V = V₁,
 * isotherm P·V = const, adiabat P·V^γ = const with the gas's own γ, polytrope P·V^n = const with the claimed
 * index (the fitted one when none was claimed). Null when the claim has no curve (free-form, calorimetric) or
 * what it needs is missing.
 */
export function claimedCurve(
  process: string,
  path: readonly PvPoint[],
  gamma: GammaChoice | null,
  claimedIndex: number | null,
  fittedIndex: number | null,
): ClaimedCurve | null {
  if (path.length < 2 || !(path[0].x > 0)) {
    return null;
  }
  const first = path[0];
  const xs = path.map((point) => point.x);
  const ys = path.map((point) => point.y);
  const vMin = Math.min(...xs);
  const vMax = Math.max(...xs);
  const spansV = vMax > vMin;
  switch (process) {
    case 'isobaric':
      return spansV ? { label: 'Claimed isobar (P = P₁)', points: [{ x: vMin, y: first.y }, { x: vMax, y: first.y }] } : null;
    case 'isochoric':
      return { label: 'Claimed isochore (V = V₁)', points: [{ x: first.x, y: Math.min(...ys) }, { x: first.x, y: Math.max(...ys) }] };
    case 'isothermal':
      return spansV ? { label: 'Claimed isotherm (P·V = const)', points: idealCurve(first, vMin, vMax, 1) } : null;
    case 'adiabatic':
      return spansV && gamma
        ? { label: `Claimed adiabat (P·V^γ = const, γ = ${gamma.gamma.toFixed(3)})`, points: idealCurve(first, vMin, vMax, gamma.gamma) }
        : null;
    case 'polytropic': {
      const n = claimedIndex ?? fittedIndex;
      if (!spansV || n === null || !Number.isFinite(n)) {
        return null;
      }
      const which = claimedIndex !== null ? 'claimed' : 'fitted';
      return { label: `Claimed polytrope (P·V^n = const, ${which} n = ${n.toFixed(3)})`, points: idealCurve(first, vMin, vMax, n) };
    }
    default:
      return null;
  }
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
