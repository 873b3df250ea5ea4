// Amount of gas n, in mol.
import { R_GAS } from './units';

/** From mass and molar mass: n = m/M (SI: kg and kg/mol). */
export function amountFromMass(massKg: number, molarMassKgPerMol: number): number {
  return massKg / molarMassKgPerMol;
}

/** From the initial state, PV = Z·nRT, so n = P1·V1/(Z·R·T1); Z = 1 for an ideal gas. */
export function amountFromState(P1: number, V1: number, T1: number, Z = 1): number {
  return (P1 * V1) / (Z * R_GAS * T1);
}
