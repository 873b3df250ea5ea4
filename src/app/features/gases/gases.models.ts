/** How the engine gets a gas's heat capacity. */
export type GasModel = 'shomate' | 'monatomic' | 'mixture';

/** One row of `GET /api/gases` (read-only; the engine holds the coefficients). */
export interface Gas {
  id: number;
  /** Code used in run documents, e.g. `N2`, `air`. */
  code: string;
  name: string;
  /** Molar mass, kg/mol. */
  molarMass: number;
  model: GasModel;
  notes?: string;
}

export interface GasListBody {
  items: Gas[];
}

/** The heat-capacity model of each kind, in words. */
export const GAS_MODEL_WORDS: Readonly<Record<GasModel, string>> = {
  shomate: 'Shomate fit of cp(T) from the NIST Chemistry WebBook',
  monatomic: 'Ideal monatomic gas: cv = 3R/2, cp = 5R/2',
  mixture:
    'Mixture of its components by mole fraction (dry air: N2 0.7812, O2 0.2096, Ar 0.0092), each from its own model',
};
