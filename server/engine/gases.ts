// Ideal-gas heat capacities: NASA Glenn polynomials (McBride, Zehe & Gordon, "NASA Glenn Coefficients for
// Calculating Thermodynamic Properties of Individual Species", NASA/TP-2002-211556, 2002), ideal monatomic He,
// dry air as a mole-fraction mixture, or equipartition.
import { R_GAS } from './units';

export type Species = 'N2' | 'O2' | 'Ar' | 'CO2' | 'He' | 'air';
export const SPECIES: readonly Species[] = ['N2', 'O2', 'Ar', 'CO2', 'He', 'air'];

/** Molar masses in g/mol (IUPAC standard atomic weights, common practice values). */
export const MOLAR_MASS_G: Readonly<Record<Species, number>> = {
  N2: 28.0134, O2: 31.9988, Ar: 39.948, CO2: 44.0095, He: 4.002602, air: 28.9647,
};

interface NasaRange {
  tMin: number;
  tMax: number;
  /** a1..a7 of Cp°/R = a1·T⁻² + a2·T⁻¹ + a3 + a4·T + a5·T² + a6·T³ + a7·T⁴ (T in K). */
  a: readonly [number, number, number, number, number, number, number];
}

// The seven Cp coefficients of each species' record in the NASA Glenn database (thermo.inp, whose format and
// provenance NASA/TP-2002-211556 documents), with the published ranges 200–1000 K and 1000–6000 K. Typed from
// memory and checked against copies of thermo.inp quoted in several public repositories (identical digits).
// The integration constants b1, b2 are not needed: ΔU only takes differences of H.
const NASA: Readonly<Record<'N2' | 'O2' | 'CO2' | 'Ar' | 'He', readonly NasaRange[]>> = {
  N2: [
    { tMin: 200, tMax: 1000, a: [2.210371497e4, -3.81846182e2, 6.08273836, -8.53091441e-3, 1.384646189e-5, -9.62579362e-9, 2.519705809e-12] },
    { tMin: 1000, tMax: 6000, a: [5.87712406e5, -2.239249073e3, 6.06694922, -6.1396855e-4, 1.491806679e-7, -1.923105485e-11, 1.061954386e-15] },
  ],
  O2: [
    { tMin: 200, tMax: 1000, a: [-3.42556342e4, 4.84700097e2, 1.119010961, 4.29388924e-3, -6.83630052e-7, -2.0233727e-9, 1.039040018e-12] },
    { tMin: 1000, tMax: 6000, a: [-1.037939022e6, 2.344830282e3, 1.819732036, 1.267847582e-3, -2.188067988e-7, 2.053719572e-11, -8.19346705e-16] },
  ],
  CO2: [
    { tMin: 200, tMax: 1000, a: [4.94365054e4, -6.26411601e2, 5.30172524, 2.503813816e-3, -2.127308728e-7, -7.68998878e-10, 2.849677801e-13] },
    { tMin: 1000, tMax: 6000, a: [1.176962419e5, -1.788791477e3, 8.29152319, -9.22315678e-5, 4.86367688e-9, -1.891053312e-12, 6.33003659e-16] },
  ],
  // Monatomic gases: the NASA Glenn records carry a3 = 2.5 and zeros elsewhere (Cp = 5R/2).
  Ar: [{ tMin: 200, tMax: 6000, a: [0, 0, 2.5, 0, 0, 0, 0] }],
  He: [{ tMin: 200, tMax: 6000, a: [0, 0, 2.5, 0, 0, 0, 0] }],
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

function nasaCp(a: NasaRange['a'], T: number): number {
  // Cp°/R = a1/T² + a2/T + a3 + a4 T + a5 T² + a6 T³ + a7 T⁴ (NASA/TP-2002-211556, eq. 1)
  return R_GAS * (a[0] / (T * T) + a[1] / T + a[2] + T * (a[3] + T * (a[4] + T * (a[5] + T * a[6]))));
}

function nasaH(a: NasaRange['a'], T: number): number {
  // ∫Cp dT without its constant: R·(−a1/T + a2·ln T + a3 T + a4 T²/2 + a5 T³/3 + a6 T⁴/4 + a7 T⁵/5)
  const log = a[1] === 0 ? 0 : a[1] * Math.log(T);
  return R_GAS * (-a[0] / T + log + T * (a[2] + T * (a[3] / 2 + T * (a[4] / 3 + T * (a[5] / 4 + T * (a[6] / 5))))));
}

function pickRange(ranges: readonly NasaRange[], T: number): NasaRange {
  for (const r of ranges) if (T <= r.tMax) return r;
  return ranges[ranges.length - 1];
}

function nasaModel(label: string, ranges: readonly NasaRange[]): HeatCapacityModel {
  if (ranges.length === 1 && ranges[0].a.every((c, i) => (i === 2 ? true : c === 0))) {
    // A constant Cp: skip the polynomial (this is evaluated for every Monte Carlo draw).
    const cp = R_GAS * ranges[0].a[2];
    return { label, tMin: ranges[0].tMin, tMax: ranges[0].tMax, cp: () => cp, cpIntegral: (T1, T2) => cp * (T2 - T1) };
  }
  return {
    label,
    tMin: ranges[0].tMin,
    tMax: ranges[ranges.length - 1].tMax,
    cp: (T) => nasaCp(pickRange(ranges, T).a, T),
    cpIntegral: (T1, T2) => {
      const r1 = pickRange(ranges, T1);
      if (r1 === pickRange(ranges, T2)) return nasaH(r1.a, T2) - nasaH(r1.a, T1); // the usual case: one range
      // Piecewise over the published ranges; each piece integrates its own fit exactly.
      const sign = T2 >= T1 ? 1 : -1;
      const lo = Math.min(T1, T2);
      const hi = Math.max(T1, T2);
      let sum = 0;
      for (const r of ranges) {
        const a = Math.max(lo, r === ranges[0] ? -Infinity : r.tMin);
        const b = Math.min(hi, r === ranges[ranges.length - 1] ? Infinity : r.tMax);
        if (b > a) sum += nasaH(r.a, b) - nasaH(r.a, a);
      }
      return sign * sum;
    },
  };
}

function constantCp(label: string, cp: number): HeatCapacityModel {
  return { label, tMin: 0, tMax: Infinity, cp: () => cp, cpIntegral: (T1, T2) => cp * (T2 - T1) };
}

const SOURCE = 'NASA Glenn polynomial, NASA/TP-2002-211556';

function airModel(): HeatCapacityModel {
  const n2 = nasaModel('N2', NASA.N2);
  const o2 = nasaModel('O2', NASA.O2);
  const ar = 2.5 * R_GAS;
  return {
    label: `air (0.7812 N2 + 0.2096 O2 + 0.0092 Ar, ${SOURCE})`,
    tMin: 200,
    tMax: 6000,
    cp: (T) => AIR.N2 * n2.cp(T) + AIR.O2 * o2.cp(T) + AIR.Ar * ar,
    cpIntegral: (T1, T2) => AIR.N2 * n2.cpIntegral(T1, T2) + AIR.O2 * o2.cpIntegral(T1, T2) + AIR.Ar * ar * (T2 - T1),
  };
}

const MODELS = new Map<Species, HeatCapacityModel>();

export function speciesModel(species: Species): HeatCapacityModel {
  let m = MODELS.get(species);
  if (!m) {
    m = species === 'air' ? airModel()
      : species === 'He' ? nasaModel(`He (ideal monatomic, Cp = 5R/2; ${SOURCE})`, NASA.He)
      : nasaModel(`${species} (${SOURCE})`, NASA[species]);
    MODELS.set(species, m);
  }
  return m;
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
