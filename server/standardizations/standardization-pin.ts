// Which approved standardization a run uses, and whether its apparatus was changed since (ASTM D240 §8.1.1:
// standardize again after changing any part of the calorimeter).
import { and, desc, eq, lte } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { apparatusChanges, people, standardizations } from '../../db/schema';
import type { Flag } from '../engine';
import { pinnedHeatLossApplies } from '../runs/run-document-mapper';
import type { RunSetup } from '../runs/run-setup';

export type StandardizationRow = typeof standardizations.$inferSelect;
export type ChangeRow = typeof apparatusChanges.$inferSelect;

/** The standardization in force on a day: the latest one effective on or before it. */
export async function standardizationInForce(db: DbOrTx, apparatusId: number, day: string): Promise<StandardizationRow | null> {
  const [row] = await db.select().from(standardizations)
    .where(and(eq(standardizations.apparatusId, apparatusId), lte(standardizations.effectiveFrom, day)))
    .orderBy(desc(standardizations.effectiveFrom), desc(standardizations.signedAt), desc(standardizations.id)).limit(1);
  return row ?? null;
}

/** The latest change made on or before a day (or ever, without a day). */
export async function latestChange(db: DbOrTx, apparatusId: number, day?: string): Promise<ChangeRow | null> {
  const where = day ? and(eq(apparatusChanges.apparatusId, apparatusId), lte(apparatusChanges.changedOn, day)) : eq(apparatusChanges.apparatusId, apparatusId);
  const [row] = await db.select().from(apparatusChanges).where(where).orderBy(desc(apparatusChanges.changedOn), desc(apparatusChanges.recordedAt), desc(apparatusChanges.id)).limit(1);
  return row ?? null;
}

/** A change is covered once a standardization was signed after it was recorded. */
export const changeUncovered = (change: ChangeRow | null, std: StandardizationRow | null): change is ChangeRow =>
  !!change && (!std || std.signedAt.getTime() < change.recordedAt.getTime());

export interface RunStandardization {
  /** What the stored result records. */
  standardization: {
    id: number; energyEquivalent: { value: number; u: number }; effectiveFrom: string; signedBy: string; signedAt: string;
    /** The standardization's mean fitted h, W/K, and whether this run's balance used it (QWELL_USE_FITTED_HEAT_LOSS). */
    heatLossCoefficient: { value: number; u: number } | null;
    heatLossApplied: boolean;
  } | null;
  flag: Flag | null;
}

/**
 * The standardization a run on this apparatus and day uses, and the flag when a change left it out of date.
 * `heatLossApplied` says whether the run's document took the standardization's fitted h (see pinnedHeatLossApplies).
 */
export async function runStandardization(db: DbOrTx, apparatusId: number | null, runDate: string, opts: { useFittedHeatLoss?: boolean; setup?: RunSetup } = {}): Promise<RunStandardization> {
  if (apparatusId === null) return { standardization: null, flag: null };
  const std = await standardizationInForce(db, apparatusId, runDate);
  const change = await latestChange(db, apparatusId, runDate);
  let signedBy = '';
  if (std) [{ name: signedBy }] = await db.select({ name: people.name }).from(people).where(eq(people.id, std.signerId));
  const flag: Flag | null = changeUncovered(change, std)
    ? {
      code: 'STANDARDIZATION_DUE', reading: null,
      message: `The apparatus was changed on ${change.changedOn} ("${change.description}") and has not been standardized since: its energy equivalent may no longer hold. Run a new standardization series and have it approved (ASTM D240 §8.1.1).`,
    }
    : null;
  return {
    standardization: std ? {
      id: std.id, energyEquivalent: { value: std.energyEquivalent, u: std.energyEquivalentU }, effectiveFrom: std.effectiveFrom, signedBy, signedAt: std.signedAt.toISOString(),
      heatLossCoefficient: std.heatLossCoefficient === null ? null : { value: std.heatLossCoefficient, u: std.heatLossCoefficientU ?? 0 },
      heatLossApplied: pinnedHeatLossApplies(opts.setup ?? {}, { ...std, applyHeatLoss: opts.useFittedHeatLoss === true }),
    } : null,
    flag,
  };
}
