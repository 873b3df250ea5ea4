import { CHANNEL_UNIT_KINDS, LINEAR_FACTORS, TEMPERATURE_AFFINE, type UnitKind as ContractUnitKind, unitSymbol } from '@contract';

/** Unit families the bench form offers; each channel and field belongs to one. */
export type UnitKind = Extract<ContractUnitKind, 'pressure' | 'volume' | 'length' | 'temperature' | 'voltage' | 'current' | 'power' | 'time' | 'mass'>;

/** Affine map to SI: SI = factor · value + offset (offset only for temperatures). */
interface ToSi {
  factor: number;
  offset: number;
}

/**
 * The contract's unit table (contract/units.ts, NIST SP 811 App. B), the one the engine converts with,
 * so the grid shows stored SI readings in the unit they were entered in. The server does the real conversion.
 */
function table(kind: UnitKind): Readonly<Record<string, ToSi>> {
  if (kind === 'temperature') {
    return TEMPERATURE_AFFINE;
  }
  return Object.fromEntries(Object.entries(LINEAR_FACTORS[kind]).map(([unit, factor]) => [unit, { factor, offset: 0 }]));
}

const UNITS: Readonly<Record<UnitKind, Readonly<Record<string, ToSi>>>> = {
  pressure: table('pressure'),
  volume: table('volume'),
  length: table('length'),
  temperature: table('temperature'),
  voltage: table('voltage'),
  current: table('current'),
  power: table('power'),
  time: table('time'),
  mass: table('mass'),
};

/** The unit family of each reading channel (the contract's table). */
export const CHANNEL_KINDS = CHANNEL_UNIT_KINDS as Readonly<Record<keyof typeof CHANNEL_UNIT_KINDS, UnitKind>>;

/** The unit a new column starts in: what bench instruments usually show. */
export const DEFAULT_UNITS: Readonly<Record<UnitKind, string>> = {
  pressure: 'kPa',
  volume: 'mL',
  length: 'mm',
  temperature: 'degC',
  voltage: 'V',
  current: 'A',
  power: 'W',
  time: 's',
  mass: 'g',
};

export function unitsOf(kind: UnitKind): string[] {
  return Object.keys(UNITS[kind]);
}

/** How people read a unit code: `degC` is °C, `m3` is m³ (the contract's symbols). */
export function unitLabel(unit: string): string {
  return unitSymbol(unit);
}

function affine(kind: UnitKind, unit: string): ToSi {
  const entry = UNITS[kind][unit];
  if (!entry) {
    throw new Error(`"${unit}" is not a ${kind} unit`);
  }
  return entry;
}

export function toSi(kind: UnitKind, unit: string, value: number): number {
  const a = affine(kind, unit);
  return a.factor * value + a.offset;
}

export function fromSi(kind: UnitKind, unit: string, si: number): number {
  const a = affine(kind, unit);
  return (si - a.offset) / a.factor;
}

/**
 * A stored SI value as the text a person typed: 12 significant digits hide the float noise of the
 * round trip (101.325 kPa, not 101.32499999999999) while keeping every digit an instrument gives.
 */
export function displayFromSi(kind: UnitKind, unit: string, si: number | null): string {
  if (si === null || !Number.isFinite(si)) {
    return '';
  }
  return String(Number(fromSi(kind, unit, si).toPrecision(12)));
}
