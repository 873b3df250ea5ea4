// Normalized error and the balance verdict.

import type { Verdict } from '../../contract/runs';

export type { Verdict };

/**
 * Relative slack at En = 1: a residual exactly at its expanded uncertainty in decimal arithmetic can land a
 * few ulps above 1 in float64 (10.05 − 10.00 over √(0.04² + 0.03²) gives 1.0000000000000142), and
 * ISO/IEC 17043 counts En = 1 as satisfactory, so En ≤ 1 + 1e-9 closes.
 */
export const EN_EPSILON = 1e-9;

/** E_n = |x − X| / U (ISO/IEC 17043:2010 Annex B); here x − X is the residual r and U = U(r). */
export function normalizedError(r: number, Ur: number): number {
  if (Ur > 0) return Math.abs(r) / Ur;
  return r === 0 ? 0 : Infinity;
}

/** E_n for two results with their own expanded uncertainties (ISO 13528:2015 §9.7 form, absolute). */
export function normalizedErrorPair(x: number, X: number, Ux: number, UX: number): number {
  return normalizedError(x - X, Math.sqrt(Ux * Ux + UX * UX));
}

export function closesAt(En: number): boolean {
  return En <= 1 + EN_EPSILON;
}

/**
 * Indeterminate first: when U(r) exceeds the lab's fraction of the largest energy term, "closing" would say
 * nothing about the run (DESIGN §2). Otherwise En ≤ 1 closes (ISO/IEC 17043) and En > 1 breaks.
 */
export function verdictOf(r: number, Ur: number, scale: number, indeterminateFraction: number): { En: number; verdict: Verdict; limit: number } {
  const En = normalizedError(r, Ur);
  const limit = indeterminateFraction * scale;
  if (Ur > limit) return { En, verdict: 'indeterminate', limit };
  return { En, verdict: closesAt(En) ? 'closes' : 'breaks', limit };
}
