// Real-gas internal energy: the departure of U from the ideal gas through the second virial coefficient B(T),
// from the Tsonopoulos correlation (C. Tsonopoulos, "An empirical correlation of second virial coefficients",
// AIChE J. 20 (1974) 263–272), in the form B·Pc/(R·Tc) = f⁰(Tr) + ω·f¹(Tr).
//
// With the virial equation truncated after B, Z = 1 + B·P/(R·T), the molar internal energy departs from the
// ideal gas's by U − U° = −T·(dB/dT)·P (equivalently −R·T²·(dB/dT)/V_m); common practice, any thermodynamics
// text on the virial equation (REFERENCES §8b). The term is first order in P: it holds at the few bar of a
// teaching or calibration rig, not near condensation.
import type { Species } from './gases';
import { R_GAS } from './units';

export interface CriticalConstants {
  /** Critical temperature, K. */
  Tc: number;
  /** Critical pressure, Pa. */
  Pc: number;
  /** Acentric factor ω. */
  omega: number;
}

// Critical constants and acentric factors: B. E. Poling, J. M. Prausnitz, J. P. O'Connell, "The Properties of
// Gases and Liquids", 5th ed., McGraw-Hill 2001, Appendix A (values from memory).
const CRITICAL: Readonly<Record<'N2' | 'O2' | 'Ar' | 'CO2', CriticalConstants>> = {
  N2: { Tc: 126.2, Pc: 33.98e5, omega: 0.037 },
  O2: { Tc: 154.58, Pc: 50.43e5, omega: 0.022 },
  Ar: { Tc: 150.86, Pc: 48.98e5, omega: -0.002 },
  CO2: { Tc: 304.12, Pc: 73.74e5, omega: 0.225 },
};

// Dry air as a pseudo-pure fluid: Kay's rule (mole-fraction means of Tc, Pc and ω; W. B. Kay, Ind. Eng. Chem.
// 28 (1936) 1014), composition as in gases.ts.
const AIR: CriticalConstants = {
  Tc: 0.7812 * CRITICAL.N2.Tc + 0.2096 * CRITICAL.O2.Tc + 0.0092 * CRITICAL.Ar.Tc,
  Pc: 0.7812 * CRITICAL.N2.Pc + 0.2096 * CRITICAL.O2.Pc + 0.0092 * CRITICAL.Ar.Pc,
  omega: 0.7812 * CRITICAL.N2.omega + 0.2096 * CRITICAL.O2.omega + 0.0092 * CRITICAL.Ar.omega,
};

/**
 * Relative standard uncertainty given to the departure term: 10 % of it. Our allowance, not a published figure:
 * against the reference equations of state (REFERENCES §3b, §3d) the correlation's ΔU departure is within 2–3 %
 * for N2 and CO2 at up to 5 bar; the rest covers the truncation after B at higher pressure.
 */
export const DEPARTURE_RELATIVE_U = 0.1;

export function criticalConstants(species: Species): CriticalConstants | null {
  if (species === 'He') return null; // a quantum gas: the correlation does not cover it, and its dB/dT is negligible
  return species === 'air' ? AIR : CRITICAL[species];
}

/** B(T) in m³/mol (Tsonopoulos 1974, nonpolar form). */
export function secondVirial(c: CriticalConstants, T: number): number {
  const tr = T / c.Tc;
  const t2 = tr * tr, t3 = t2 * tr, t8 = t3 * t3 * t2;
  const f0 = 0.1445 - 0.33 / tr - 0.1385 / t2 - 0.0121 / t3 - 0.000607 / t8;
  const f1 = 0.0637 + 0.331 / t2 - 0.423 / t3 - 0.008 / t8;
  return ((R_GAS * c.Tc) / c.Pc) * (f0 + c.omega * f1);
}

/** dB/dT in m³/(mol·K): the analytic derivative of the correlation. */
export function secondVirialSlope(c: CriticalConstants, T: number): number {
  const tr = T / c.Tc;
  const t2 = tr * tr, t3 = t2 * tr, t4 = t2 * t2, t9 = t4 * t4 * tr;
  const d0 = 0.33 / t2 + 0.277 / t3 + 0.0363 / t4 + 0.004856 / t9;
  const d1 = -0.662 / t3 + 1.269 / t4 + 0.064 / t9;
  return (R_GAS / c.Pc) * (d0 + c.omega * d1);
}

/** U − U° per mole at (T, P): −T·P·dB/dT, J/mol. */
export function departureAtPressure(c: CriticalConstants, T: number, P: number): number {
  return -T * P * secondVirialSlope(c, T);
}

/** U − U° per mole at (T, V_m): −R·T²·(dB/dT)/V_m, J/mol. */
export function departureAtVolume(c: CriticalConstants, T: number, Vm: number): number {
  return (-R_GAS * T * T * secondVirialSlope(c, T)) / Vm;
}
