// Internal-energy change of the system.
import { checkRange, cvIntegral, type HeatCapacityModel } from './gases';

/** Ideal gas: ΔU = n·∫Cv(T) dT (U depends on T only). Throws outside the fit's range. */
export function gasInternalEnergy(model: HeatCapacityModel, n: number, T1: number, T2: number): number {
  for (const T of [T1, T2]) {
    const problem = checkRange(model, T);
    if (problem) throw new RangeError(problem);
  }
  return n * cvIntegral(model, T1, T2);
}

/** Calorimeter of heat capacity C: ΔU = C·ΔT. */
export function calorimeterInternalEnergy(C: number, T1: number, T2: number): number {
  return C * (T2 - T1);
}
