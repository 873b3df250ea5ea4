/**
 * The units the apparatus form takes, and their exact factors to the SI units the API stores
 * (SI Brochure, 9th edition: 1 bar = 10⁵ Pa, 1 L = 10⁻³ m³).
 */
export type PressureUnit = 'kPa' | 'bar';

export const PRESSURE_UNITS: readonly PressureUnit[] = ['kPa', 'bar'];

const PASCALS_PER: Readonly<Record<PressureUnit, number>> = { kPa: 1e3, bar: 1e5 };

/** Drops binary noise from a scaled value (0.05 × 1000 → 50, not 50.00000000000001). */
function tidy(value: number): number {
  return Number(value.toPrecision(12));
}

export function pressureToPascal(value: number, unit: PressureUnit): number {
  return tidy(value * PASCALS_PER[unit]);
}

export function pascalTo(value: number, unit: PressureUnit): number {
  return tidy(value / PASCALS_PER[unit]);
}

export function millimetresToMetres(value: number): number {
  return tidy(value / 1e3);
}

export function metresToMillimetres(value: number): number {
  return tidy(value * 1e3);
}

export function litresToCubicMetres(value: number): number {
  return tidy(value / 1e3);
}

export function cubicMetresToLitres(value: number): number {
  return tidy(value * 1e3);
}
