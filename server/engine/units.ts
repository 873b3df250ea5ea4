// Unit conversions to SI. The factor tables are the contract's (contract/units.ts: NIST SP 811 (2008)
// App. B.8, SI Brochure 9th ed.), shared with the client. Conversions are affine: SI = factor * value + offset.
import { LINEAR_FACTORS, TEMPERATURE_AFFINE, type TemperatureUnit, type UnitKind } from '../../contract/units';

export type {
  ConductanceUnit, CurrentUnit, EnergyUnit, HeatCapacityUnit, LengthUnit, MassUnit, PowerUnit, PressureUnit, TemperatureUnit, TimeUnit,
  UnitKind, VoltageUnit, VolumeUnit,
} from '../../contract/units';
export {
  CONDUCTANCE_FACTORS, CURRENT_FACTORS, ENERGY_FACTORS, HEAT_CAPACITY_FACTORS, LENGTH_FACTORS, MASS_FACTORS, POWER_FACTORS, PRESSURE_FACTORS,
  TEMPERATURE_AFFINE, TIME_FACTORS, VOLTAGE_FACTORS, VOLUME_FACTORS,
} from '../../contract/units';

/** Exact 2019 SI values (CODATA 2018): R = N_A·k_B terminates, so it is exact. */
export const BOLTZMANN = 1.380649e-23;
export const AVOGADRO = 6.02214076e23;
export const R_GAS = 8.31446261815324;

const LINEAR_TABLES = LINEAR_FACTORS;

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
