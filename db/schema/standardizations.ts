import { date, doublePrecision, index, integer, jsonb, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';
import { apparatus } from './equipment';
import { people } from './people';

/**
 * An approved standardization of a calorimeter: the mean energy equivalent ε of selected standardization runs,
 * signed by a quality officer. From `effectiveFrom` on, runs on the apparatus use its ε and u(ε).
 */
export const standardizations = pgTable(
  'standardizations',
  {
    id: serial('id').primaryKey(),
    apparatusId: integer('apparatus_id').notNull().references(() => apparatus.id),
    /** Mean ε of the runs, J/K, and its standard uncertainty (GUM: s/√n with the runs' own u in quadrature). */
    energyEquivalent: doublePrecision('energy_equivalent').notNull(),
    energyEquivalentU: doublePrecision('energy_equivalent_u').notNull(),
    /** Mean heat-loss coefficient fitted to the runs' drifts, W/K (null when no run gave one). */
    heatLossCoefficient: doublePrecision('heat_loss_coefficient'),
    heatLossCoefficientU: doublePrecision('heat_loss_coefficient_u'),
    runIds: integer('run_ids').array().notNull(),
    /** n, sd, rsd, days and the chart at approval. */
    summary: jsonb('summary').$type<Record<string, unknown>>().notNull(),
    effectiveFrom: date('effective_from').notNull(),
    signerId: integer('signer_id').notNull().references(() => people.id),
    meaning: text('meaning').notNull(),
    reason: text('reason'),
    /** SHA-256 of the runs and results that were signed. */
    signedHash: text('signed_hash').notNull(),
    signedAt: timestamp('signed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('standardizations_apparatus_idx').on(t.apparatusId, t.effectiveFrom)],
);

/** A change to an apparatus (a part replaced, a repair): it makes a new standardization due. */
export const apparatusChanges = pgTable(
  'apparatus_changes',
  {
    id: serial('id').primaryKey(),
    apparatusId: integer('apparatus_id').notNull().references(() => apparatus.id),
    description: text('description').notNull(),
    changedOn: date('changed_on').notNull(),
    recordedBy: integer('recorded_by').notNull().references(() => people.id),
    recordedAt: timestamp('recorded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('apparatus_changes_apparatus_idx').on(t.apparatusId, t.recordedAt)],
);
