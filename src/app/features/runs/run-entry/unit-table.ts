import { ReadingChannel } from '../run-entry.models';

/** Unit families the bench form offers; each channel and field belongs to one. */
export type UnitKind =
  | 'pressure'
  | 'volume'
  | 'length'
  | 'temperature'
  | 'voltage'
  | 'current'
  | 'power'
  | 'time'
  | 'mass';

/** Affine map to SI: SI = factor · value + offset (offset only for temperatures). */
interface ToSi {
  factor: number;
  offset: number;
}

const ATM = 101325;
const linear = (factor: number): ToSi => ({ factor, offset: 0 });

/**
 * Display-only copy of the engine's unit table (server/engine/units.ts, NIST SP 811 App. B), so the
 * grid can show stored SI readings in the unit they were entered in. The server does the real conversion.
 */
const UNITS: Readonly<Record<UnitKind, Readonly<Record<string, ToSi>>>> = {
  pressure: {
    Pa: linear(1),
    hPa: linear(1e2),
    kPa: linear(1e3),
    MPa: linear(1e6),
    bar: linear(1e5),
    mbar: linear(1e2),
    atm: linear(ATM),
    psi: linear(6894.757293168361),
    torr: linear(ATM / 760),
    mmHg: linear(133.322387415),
  },
  volume: { m3: linear(1), L: linear(1e-3), mL: linear(1e-6), cm3: linear(1e-6) },
  length: { m: linear(1), mm: linear(1e-3) },
  temperature: {
    K: { factor: 1, offset: 0 },
    degC: { factor: 1, offset: 273.15 },
    degF: { factor: 5 / 9, offset: 459.67 * (5 / 9) },
  },
  voltage: { V: linear(1), mV: linear(1e-3) },
  current: { A: linear(1), mA: linear(1e-3) },
  power: { W: linear(1), mW: linear(1e-3) },
  time: { ms: linear(1e-3), s: linear(1), min: linear(60), h: linear(3600) },
  mass: { kg: linear(1), g: linear(1e-3), mg: linear(1e-6) },
};

/** How people read a unit code: `degC` is °C, `m3` is m³. */
const UNIT_LABELS: Readonly<Record<string, string>> = {
  degC: '°C',
  degF: '°F',
  m3: 'm³',
  cm3: 'cm³',
};

/** The unit family of each reading channel. */
export const CHANNEL_KINDS: Readonly<Record<ReadingChannel, UnitKind>> = {
  pressure: 'pressure',
  volume: 'volume',
  displacement: 'length',
  temperature: 'temperature',
  voltage: 'voltage',
  current: 'current',
  power: 'power',
};

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

export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit;
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
