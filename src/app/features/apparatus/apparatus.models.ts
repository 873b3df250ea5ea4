/** One piece of apparatus, as `GET /api/apparatus` returns it; every quantity in SI units. */
export interface Apparatus {
  id: number;
  /** Lab's tag, e.g. `PC-3`. */
  tag: string;
  name: string;
  /** What it is: piston-cell, vessel, bath-calorimeter, … */
  kind: string;
  /** Heat capacity of the apparatus itself, J/K, and its standard uncertainty. */
  heatCapacity: number | null;
  heatCapacityU: number | null;
  /** Heat-loss coefficient to the surroundings, W/K, and its standard uncertainty. */
  heatLossCoefficient: number | null;
  heatLossCoefficientU: number | null;
  /** Highest working pressure the vessel is rated for, Pa. */
  ratedPressure: number | null;
  /** Whether the rating is absolute or gauge (above the barometric pressure of each run). */
  ratedPressureReference: 'absolute' | 'gauge';
  /** Piston bore, m. */
  bore: number | null;
  /** Fixed internal volume, m³. */
  fixedVolume: number | null;
  notes: string;
}

export interface ApparatusList {
  items: Apparatus[];
}

/** Body of `POST /api/apparatus` and `PUT /api/apparatus/:id`. */
export type ApparatusBody = Omit<Apparatus, 'id'>;
