import type { UnitKind } from './units';

// The reading channels of a run: their names, their headings, their unit families and the units an
// import may state for each.

/** Reading channels besides time, in grid order. */
export const READING_CHANNELS = ['pressure', 'volume', 'displacement', 'temperature', 'voltage', 'current', 'power'] as const;
export type ReadingChannel = (typeof READING_CHANNELS)[number];

/** What an imported column can hold: the time of each reading, or a reading channel. */
export const IMPORT_CHANNELS = ['time', ...READING_CHANNELS] as const;
export type ImportChannel = (typeof IMPORT_CHANNELS)[number];

/** Headings of the channels, as forms, tables and import mappings name them. */
export const CHANNEL_LABELS: Readonly<Record<ImportChannel, string>> = {
  time: 'Time',
  pressure: 'Pressure',
  volume: 'Volume',
  displacement: 'Piston displacement',
  temperature: 'Temperature',
  voltage: 'Heater voltage',
  current: 'Heater current',
  power: 'Heater power',
};

/** The unit family of each reading channel (the run document's own table). */
export const CHANNEL_UNIT_KINDS: Readonly<Record<ReadingChannel, UnitKind>> = {
  pressure: 'pressure',
  volume: 'volume',
  displacement: 'length',
  temperature: 'temperature',
  voltage: 'voltage',
  current: 'current',
  power: 'power',
};

/** SI symbols of the readings the server stores and returns (s, Pa absolute or gauge, m³, m, K, V, A, W). */
export const READING_SI_UNITS: Readonly<Record<ImportChannel, string>> = {
  time: 's',
  pressure: 'Pa',
  volume: 'm³',
  displacement: 'm',
  temperature: 'K',
  voltage: 'V',
  current: 'A',
  power: 'W',
};

/**
 * The units an imported column may state, per channel, as the engine names them (contract/units.ts);
 * `iso` is a time column of date-times. The first is the one a fresh column starts in.
 */
export const UNITS_BY_CHANNEL: Readonly<Record<ImportChannel, readonly string[]>> = {
  time: ['s', 'ms', 'min', 'h', 'iso'],
  pressure: ['Pa', 'kPa', 'MPa', 'bar', 'mbar', 'atm', 'psi', 'torr', 'mmHg'],
  volume: ['m3', 'L', 'mL', 'cm3'],
  displacement: ['m', 'mm'],
  temperature: ['K', 'degC', 'degF'],
  voltage: ['V', 'mV'],
  current: ['A', 'mA'],
  power: ['W', 'mW'],
};

/** What an instrument of the register reads: a reading channel, or time (kept last: the db enum's order). */
export const INSTRUMENT_KINDS = [...READING_CHANNELS, 'time'] as const;
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number];

/**
 * The units an instrument may read in, per kind: its channel's units; a clock reads elapsed time, not
 * date-times (the server checks a reading channel's unit against the engine's table).
 */
export const INSTRUMENT_UNITS: Readonly<Record<InstrumentKind, readonly string[]>> = {
  ...UNITS_BY_CHANNEL,
  time: UNITS_BY_CHANNEL.time.filter((unit) => unit !== 'iso'),
};

/** Whether a pressure was read against vacuum or against the room. */
export const PRESSURE_REFERENCES = ['absolute', 'gauge'] as const;
export type PressureReference = (typeof PRESSURE_REFERENCES)[number];
