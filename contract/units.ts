// Units the lab enters, their factors to SI and how people read their codes. The engine converts with
// these factors; the client uses the same table to show stored SI readings in the unit they were
// entered in. Every factor is exact by definition (NIST SP 811 (2008) App. B.8, SI Brochure 9th ed.).
// Conversions are affine: SI = factor * value + offset.

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

/** A family of units that convert into each other. */
export type UnitKind =
  | 'pressure' | 'volume' | 'length' | 'temperature' | 'energy' | 'heatCapacity'
  | 'voltage' | 'current' | 'power' | 'time' | 'mass' | 'conductance';

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

/** The factor tables of the unit kinds that convert without an offset (all but temperature). */
export const LINEAR_FACTORS: Readonly<Record<Exclude<UnitKind, 'temperature'>, Readonly<Record<string, number>>>> = {
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

/**
 * How people read a unit code where it differs from the code: `degC` is °C, `m3` is m³; `iso` (a
 * time column of date-times) reads as words. Any other code is its own symbol.
 */
export const UNIT_SYMBOLS: Readonly<Record<string, string>> = {
  degC: '°C',
  degF: '°F',
  m3: 'm³',
  cm3: 'cm³',
  iso: 'date-time (ISO)',
};

/** A unit code as people read it. */
export function unitSymbol(unit: string): string {
  return UNIT_SYMBOLS[unit] ?? unit;
}
