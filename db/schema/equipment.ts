import { boolean, date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';
import { people } from './people';
import { INSTRUMENT_KINDS } from '../../contract/channels';

/** A gas the lab uses; `model` says how the engine gets its heat capacity. */
export const gases = pgTable('gases', {
  id: serial('id').primaryKey(),
  /** Engine key: N2, O2, Ar, CO2, He, air. */
  code: text('code').notNull().unique(),
  name: text('name').notNull(),
  /** kg/mol */
  molarMass: doublePrecision('molar_mass').notNull(),
  model: text('model').notNull(),
  notes: text('notes').notNull().default(''),
});

/** What an instrument reads: the contract's instrument kinds (reading channels, then time: the enum's order). */
export const channelKindEnum = pgEnum('channel_kind', INSTRUMENT_KINDS);

/** The manufacturer's specification of an instrument, in the unit of `unit`. */
export interface InstrumentSpec {
  /** ± % of reading (treated as a rectangular bound). */
  percentOfReading?: number;
  /** ± % of full scale. */
  percentOfFullScale?: number;
  fullScale?: number;
  /** Smallest step the display or logger resolves. */
  resolution?: number;
}

export const instruments = pgTable('instruments', {
  id: serial('id').primaryKey(),
  /** The lab's own tag, painted on the instrument. */
  tag: text('tag').notNull().unique(),
  name: text('name').notNull(),
  kind: channelKindEnum('kind').notNull(),
  manufacturer: text('manufacturer').notNull().default(''),
  serialNumber: text('serial_number').notNull().default(''),
  /** Unit the instrument reads in, as entered (e.g. kPa, °C). */
  unit: text('unit').notNull(),
  rangeMin: doublePrecision('range_min'),
  rangeMax: doublePrecision('range_max'),
  spec: jsonb('spec').$type<InstrumentSpec>().notNull().default({}),
  active: boolean('active').notNull().default(true),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const calibrations = pgTable(
  'calibrations',
  {
    id: serial('id').primaryKey(),
    instrumentId: integer('instrument_id').notNull().references(() => instruments.id),
    calibratedOn: date('calibrated_on').notNull(),
    dueOn: date('due_on').notNull(),
    certificate: text('certificate').notNull(),
    /** Expanded uncertainty U from the certificate, in the instrument's unit. */
    expandedUncertainty: doublePrecision('expanded_uncertainty').notNull(),
    coverageFactor: doublePrecision('coverage_factor').notNull().default(2),
    /** Corrections stated on the certificate (offset and gain, instrument unit). */
    corrections: jsonb('corrections').$type<{ offset?: number; gain?: number }>().notNull().default({}),
    notes: text('notes').notNull().default(''),
    createdBy: integer('created_by').references(() => people.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('calibrations_instrument_idx').on(t.instrumentId, t.calibratedOn), index('calibrations_due_idx').on(t.dueOn)],
);

/** A piece of apparatus: its constants feed the engine. */
export const apparatus = pgTable('apparatus', {
  id: serial('id').primaryKey(),
  tag: text('tag').notNull().unique(),
  name: text('name').notNull(),
  kind: text('kind').notNull(),
  /** J/K, from an electrical calibration run; null when not a calorimeter. */
  heatCapacity: doublePrecision('heat_capacity'),
  heatCapacityU: doublePrecision('heat_capacity_u'),
  /** W/K, Newtonian heat-loss coefficient h. */
  heatLossCoefficient: doublePrecision('heat_loss_coefficient'),
  heatLossCoefficientU: doublePrecision('heat_loss_coefficient_u'),
  /** Pa, the vessel's rated (maximum allowable working) pressure. */
  ratedPressure: doublePrecision('rated_pressure'),
  /** Whether the rating is absolute or gauge (above the barometric pressure), as written on the vessel's plate. */
  ratedPressureReference: text('rated_pressure_reference', { enum: ['absolute', 'gauge'] }).notNull().default('absolute'),
  /** m, piston bore when volume comes from displacement. */
  bore: doublePrecision('bore'),
  /** m³, when the vessel volume is fixed. */
  fixedVolume: doublePrecision('fixed_volume'),
  notes: text('notes').notNull().default(''),
});
