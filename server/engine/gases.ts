// Ideal-gas heat capacities: Shomate fits (NIST Chemistry WebBook, SRD 69, from Chase, NIST-JANAF 4th ed. 1998),
// ideal monatomic He, dry air as a mole-fraction mixture, or equipartition.
import { R_GAS } from './units';

export type Species = 'N2' | 'O2' | 'Ar' | 'CO2' | 'He' | 'air';
export const SPECIES: readonly Species[] = ['N2', 'O2', 'Ar', 'CO2', 'He', 'air'];

/** Molar masses in g/mol (IUPAC standard atomic weights, common practice values). */
export const MOLAR_MASS_G: Readonly<Record<Species, number>> = {
  N2: 28.0134, O2: 31.9988, Ar: 39.948, CO2: 44.0095, He: 4.002602, air: 28.9647,
};

interface ShomateRange {
  tMin: number;
  tMax: number;
  /** A..E in J/(mol·K) with t = T/1000 K. */
  c: readonly [number, number, number, number, number];
}

// NIST WebBook Shomate coefficients (A, B, C, D, E) with their published temperature ranges in K.
const SHOMATE: Readonly<Record<'N2' | 'O2' | 'Ar' | 'CO2', readonly ShomateRange[]>> = {
  N2: [
    { tMin: 100, tMax: 500, c: [28.98641, 1.853978, -9.647459, 16.63537, 0.000117] },
    { tMin: 500, tMax: 2000, c: [19.50583, 19.88705, -8.598535, 1.369784, 0.527601] },
    { tMin: 2000, tMax: 6000, c: [35.51872, 1.128728, -0.196103, 0.014662, -4.55376] },
  ],
  O2: [
    { tMin: 100, tMax: 700, c: [31.32234, -20.23531, 57.86644, -36.50624, -0.007374] },
    { tMin: 700, tMax: 2000, c: [30.03235, 8.772972, -3.988133, 0.788313, -0.741599] },
    { tMin: 2000, tMax: 6000, c: [20.91111, 10.72071, -2.020498, 0.146449, 9.245722] },
  ],
  CO2: [
    { tMin: 298, tMax: 1200, c: [24.99735, 55.18696, -33.69137, 7.948387, -0.136638] },
    { tMin: 1200, tMax: 6000, c: [58.16639, 2.720074, -0.492289, 0.038844, -6.447293] },
  ],
  Ar: [{ tMin: 298, tMax: 6000, c: [20.786, 2.825911e-7, -1.464191e-7, 1.092131e-8, -3.661371e-8] }],
};

// Dry-air composition by mole fraction (REFERENCES §2b mixture: N2 0.7812, O2 0.2096, Ar 0.0092).
const AIR = { N2: 0.7812, O2: 0.2096, Ar: 0.0092 } as const;

/** A heat-capacity model: Cp(T) and ∫Cp dT in J/mol, with a valid temperature range. */
export interface HeatCapacityModel {
  label: string;
  tMin: number;
  tMax: number;
  cp(T: number): number;
  /** ∫_{T1}^{T2} Cp dT, J/mol. */
  cpIntegral(T1: number, T2: number): number;
}

function shomateCp(c: ShomateRange['c'], T: number): number {
  const t = T / 1000; // Shomate equation: Cp = A + Bt + Ct² + Dt³ + E/t²
  return c[0] + c[1] * t + c[2] * t * t + c[3] * t * t * t + c[4] / (t * t);
}

function shomateH(c: ShomateRange['c'], T: number): number {
  const t = T / 1000; // Shomate enthalpy: H = At + Bt²/2 + Ct³/3 + Dt⁴/4 − E/t (kJ/mol → ×1000 J/mol)
  return 1000 * (c[0] * t + (c[1] * t * t) / 2 + (c[2] * t ** 3) / 3 + (c[3] * t ** 4) / 4 - c[4] / t);
}

function pickRange(ranges: readonly ShomateRange[], T: number): ShomateRange {
  for (const r of ranges) if (T <= r.tMax) return r;
  return ranges[ranges.length - 1];
}

function shomateModel(name: string, ranges: readonly ShomateRange[]): HeatCapacityModel {
  const tMin = ranges[0].tMin;
  const tMax = ranges[ranges.length - 1].tMax;
  return {
    label: `${name} (Shomate, NIST WebBook)`,
    tMin,
    tMax,
    cp: (T) => shomateCp(pickRange(ranges, T).c, T),
    cpIntegral: (T1, T2) => {
      // Piecewise over the published ranges; each piece integrates its own fit exactly.
      const sign = T2 >= T1 ? 1 : -1;
      const lo = Math.min(T1, T2);
      const hi = Math.max(T1, T2);
      let sum = 0;
      for (const r of ranges) {
        const a = Math.max(lo, r === ranges[0] ? -Infinity : r.tMin);
        const b = Math.min(hi, r === ranges[ranges.length - 1] ? Infinity : r.tMax);
        if (b > a) sum += shomateH(r.c, b) - shomateH(r.c, a);
      }
      return sign * sum;
    },
  };
}

function constantCp(label: string, cp: number): HeatCapacityModel {
  return { label, tMin: 0, tMax: Infinity, cp: () => cp, cpIntegral: (T1, T2) => cp * (T2 - T1) };
}

/** He: ideal monatomic gas, Cp = 5R/2 exactly (kinetic theory, common practice). */
const HELIUM = constantCp('He (ideal monatomic, Cp = 5R/2)', 2.5 * R_GAS);

function airModel(): HeatCapacityModel {
  const n2 = shomateModel('N2', SHOMATE.N2);
  const o2 = shomateModel('O2', SHOMATE.O2);
  // Ar's fit starts at 298 K but is constant to 1e-5; 5R/2 lets the mixture reach N2/O2's 100 K limit.
  const ar = 2.5 * R_GAS;
  return {
    label: 'air (0.7812 N2 + 0.2096 O2 + 0.0092 Ar, Shomate)',
    tMin: 100,
    tMax: 2000,
    cp: (T) => AIR.N2 * n2.cp(T) + AIR.O2 * o2.cp(T) + AIR.Ar * ar,
    cpIntegral: (T1, T2) => AIR.N2 * n2.cpIntegral(T1, T2) + AIR.O2 * o2.cpIntegral(T1, T2) + AIR.Ar * ar * (T2 - T1),
  };
}

export function speciesModel(species: Species): HeatCapacityModel {
  switch (species) {
    case 'He':
      return HELIUM;
    case 'air':
      return airModel();
    default:
      return shomateModel(species, SHOMATE[species]);
  }
}

/** Equipartition: Cv = (f/2)R, so Cp = (f/2 + 1)R and γ = 1 + 2/f. */
export function equipartitionModel(f: number): HeatCapacityModel {
  return constantCp(`equipartition (f = ${f})`, (f / 2 + 1) * R_GAS);
}

/** Refuses a temperature outside the fit's published range with a sentence a person can act on. */
export function checkRange(model: HeatCapacityModel, T: number): string | null {
  if (!(T >= model.tMin && T <= model.tMax)) {
    return `${model.label} is valid from ${model.tMin} K to ${model.tMax} K; ${T.toFixed(2)} K is outside it`;
  }
  return null;
}

/** Mayer's relation for an ideal gas: Cv = Cp − R. */
export function cv(model: HeatCapacityModel, T: number): number {
  return model.cp(T) - R_GAS;
}

/** γ = Cp/Cv = Cp/(Cp − R). */
export function gamma(model: HeatCapacityModel, T: number): number {
  const cp = model.cp(T);
  return cp / (cp - R_GAS);
}

/** ∫Cv dT = ∫Cp dT − R·ΔT, J/mol. */
export function cvIntegral(model: HeatCapacityModel, T1: number, T2: number): number {
  return model.cpIntegral(T1, T2) - R_GAS * (T2 - T1);
}
