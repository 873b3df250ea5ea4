// Unit factors to SI. One explicit table; every factor is exact by definition (NIST SP 811 (2008) App. B.8,
// SI Brochure 9th ed.). Conversions are affine: SI = factor * value + offset.

export type PressureUnit = 'Pa' | 'hPa' | 'kPa' | 'MPa' | 'bar' | 'mbar' | 'atm' | 'psi' | 'torr' | 'mmHg';
export type VolumeUnit = 'm3' | 'L' | 'mL' | 'cm3';
export type LengthUnit = 'm' | 'mm';
export type TemperatureUnit = 'K' | 'degC' | 'degF';
export type EnergyUnit = 'J' | 'kJ' | 'cal_th' | 'Wh';
export type HeatCapacityUnit = 'J/K' | 'kJ/K' | 'cal_th/K';
export type VoltageUnit = 'V' | 'mV';
export type CurrentUnit = 'A' | 'mA';
export type PowerUnit = 'W' | 'mW';
export type TimeUnit = 'ms' | 's' | 'min' | 'h';
export type MassUnit = 'kg' | 'g' | 'mg';
export type ConductanceUnit = 'W/K';

/** Exact 2019 SI values (CODATA 2018): R = N_A·k_B terminates, so it is exact. */
export const BOLTZMANN = 1.380649e-23;
export const AVOGADRO = 6.02214076e23;
export const R_GAS = 8.31446261815324;

const INCH = 0.0254; // 1959 international yard-and-pound agreement
const LBF = 0.45359237 * 9.80665; // lb × standard gravity (3rd CGPM 1901)
const ATM = 101325; // 10th CGPM (1954)

export const PRESSURE_FACTORS: Readonly<Record<PressureUnit, number>> = {
  Pa: 1,
  hPa: 1e2, // SI prefix hecto (SI Brochure 9th ed., Table 7); barometers read hPa = mbar
  kPa: 1e3,
  MPa: 1e6,
  bar: 1e5,
  mbar: 1e2,
  atm: ATM,
  // lbf/in² is a repeating decimal; computing it from its exact parts avoids a rounded literal.
  psi: LBF / (INCH * INCH),
  torr: ATM / 760,
  mmHg: 13.5951e3 * 9.80665 * 1e-3, // conventional: 13.5951 g/cm³ × g_n × 1 mm
};

export const VOLUME_FACTORS: Readonly<Record<VolumeUnit, number>> = { m3: 1, L: 1e-3, mL: 1e-6, cm3: 1e-6 };
export const LENGTH_FACTORS: Readonly<Record<LengthUnit, number>> = { m: 1, mm: 1e-3 };
export const ENERGY_FACTORS: Readonly<Record<EnergyUnit, number>> = { J: 1, kJ: 1e3, cal_th: 4.184, Wh: 3600 };
export const HEAT_CAPACITY_FACTORS: Readonly<Record<HeatCapacityUnit, number>> = { 'J/K': 1, 'kJ/K': 1e3, 'cal_th/K': 4.184 };
export const VOLTAGE_FACTORS: Readonly<Record<VoltageUnit, number>> = { V: 1, mV: 1e-3 };
export const CURRENT_FACTORS: Readonly<Record<CurrentUnit, number>> = { A: 1, mA: 1e-3 };
export const POWER_FACTORS: Readonly<Record<PowerUnit, number>> = { W: 1, mW: 1e-3 };
export const TIME_FACTORS: Readonly<Record<TimeUnit, number>> = { ms: 1e-3, s: 1, min: 60, h: 3600 };
export const MASS_FACTORS: Readonly<Record<MassUnit, number>> = { kg: 1, g: 1e-3, mg: 1e-6 };
export const CONDUCTANCE_FACTORS: Readonly<Record<ConductanceUnit, number>> = { 'W/K': 1 };

/** Temperature is affine: K = factor·x + offset. °F: (x + 459.67)·5/9 (SP 811 B.9). */
export const TEMPERATURE_AFFINE: Readonly<Record<TemperatureUnit, { factor: number; offset: number }>> = {
  K: { factor: 1, offset: 0 },
  degC: { factor: 1, offset: 273.15 },
  degF: { factor: 5 / 9, offset: 459.67 * (5 / 9) },
};

export type UnitKind =
  | 'pressure' | 'volume' | 'length' | 'temperature' | 'energy' | 'heatCapacity'
  | 'voltage' | 'current' | 'power' | 'time' | 'mass' | 'conductance';

const LINEAR_TABLES: Record<Exclude<UnitKind, 'temperature'>, Readonly<Record<string, number>>> = {
  pressure: PRESSURE_FACTORS,
  volume: VOLUME_FACTORS,
  length: LENGTH_FACTORS,
  energy: ENERGY_FACTORS,
  heatCapacity: HEAT_CAPACITY_FACTORS,
  voltage: VOLTAGE_FACTORS,
  current: CURRENT_FACTORS,
  power: POWER_FACTORS,
  time: TIME_FACTORS,
  mass: MASS_FACTORS,
  conductance: CONDUCTANCE_FACTORS,
};

/** Affine map of a unit to SI; for differences (uncertainties) only `factor` applies. */
export interface AffineToSi {
  factor: number;
  offset: number;
}

export function unitsOf(kind: UnitKind): string[] {
  return kind === 'temperature' ? Object.keys(TEMPERATURE_AFFINE) : Object.keys(LINEAR_TABLES[kind]);
}

export function isUnit(kind: UnitKind, unit: unknown): boolean {
  return typeof unit === 'string' && unitsOf(kind).includes(unit);
}

export function affineToSi(kind: UnitKind, unit: string): AffineToSi {
  if (kind === 'temperature') {
    const t = TEMPERATURE_AFFINE[unit as TemperatureUnit];
    if (!t) throw new Error(`unknown temperature unit "${unit}"`);
    return t;
  }
  const factor = LINEAR_TABLES[kind][unit];
  if (factor === undefined) throw new Error(`unknown ${kind} unit "${unit}"`);
  return { factor, offset: 0 };
}

export function toSi(kind: UnitKind, unit: string, value: number): number {
  const a = affineToSi(kind, unit);
  return a.factor * value + a.offset;
}

export function fromSi(kind: UnitKind, unit: string, si: number): number {
  const a = affineToSi(kind, unit);
  return (si - a.offset) / a.factor;
}

/** Converts a difference or an uncertainty: offsets cancel. */
export function differenceToSi(kind: UnitKind, unit: string, delta: number): number {
  return affineToSi(kind, unit).factor * delta;
}

/** Gauge to absolute: P_abs = P_gauge + P_barometric (common practice). */
export function gaugeToAbsolute(gaugeSi: number, barometricSi: number | undefined): number {
  if (barometricSi === undefined || !Number.isFinite(barometricSi)) {
    throw new Error('gauge pressure needs a barometric (ambient) pressure to become absolute');
  }
  return gaugeSi + barometricSi;
}

/** Piston displacement to volume: V = V_dead + (π d²/4)·x (geometry of a cylinder). */
export function pistonArea(boreSi: number): number {
  return (Math.PI * boreSi * boreSi) / 4;
}

/** ISO 8601 timestamps to seconds after the first; Date.parse is pure for a given string. */
export function isoToSeconds(values: readonly string[]): number[] {
  const ms = values.map((v) => Date.parse(v));
  const t0 = ms[0] ?? 0;
  return ms.map((m) => (m - t0) / 1000);
}

/** Strict ISO 8601 date or date-time check (Date.parse alone accepts too much). */
export function isIsoDate(value: unknown): value is string {
  return (
    typeof value === 'string' &&
    /^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.test(value) &&
    Number.isFinite(Date.parse(value))
  );
}
