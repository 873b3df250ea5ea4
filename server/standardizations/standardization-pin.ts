// Which approved standardization a run uses, and whether its apparatus was changed since (ASTM D240 §8.1.1:
// standardize again after changing any part of the calorimeter).
import { and, asc, desc, eq, lt, lte, min } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { apparatusChanges, people, runs, standardizations } from '../../db/schema';
import type { Flag } from '../engine';
import { madeBefore } from '../engine/control-chart-segments';
import { pinnedHeatLossApplies } from '../runs/run-document-mapper';
import type { RunSetup } from '../runs/run-setup';

export type StandardizationRow = typeof standardizations.$inferSelect;
export type ChangeRow = typeof apparatusChanges.$inferSelect;

/**
 * The standardization in force on a day: the latest one effective on or before it. A run made before a change
 * recorded on its own day (`signedBefore` = that change's record time) keeps the one signed before the change:
 * a standardization of the changed apparatus does not describe the state the run was measured in.
 */
export async function standardizationInForce(db: DbOrTx, apparatusId: number, day: string, signedBefore?: Date | null): Promise<StandardizationRow | null> {
  const [row] = await db.select().from(standardizations)
    .where(and(eq(standardizations.apparatusId, apparatusId), lte(standardizations.effectiveFrom, day), signedBefore ? lt(standardizations.signedAt, signedBefore) : undefined))
    .orderBy(desc(standardizations.effectiveFrom), desc(standardizations.signedAt), desc(standardizations.id)).limit(1);
  return row ?? null;
}

/** The apparatus's latest recorded change (for its "standardization due" state; a run's own is apparatusStateOf). */
export async function latestChange(db: DbOrTx, apparatusId: number): Promise<ChangeRow | null> {
  const [row] = await db.select().from(apparatusChanges).where(eq(apparatusChanges.apparatusId, apparatusId)).orderBy(desc(apparatusChanges.changedOn), desc(apparatusChanges.recordedAt), desc(apparatusChanges.id)).limit(1);
  return row ?? null;
}

/** When a run was first entered: its first revision's creation (a revision corrects the record of the same measurement). */
export async function runEnteredAt(db: DbOrTx, code: string): Promise<Date> {
  const [row] = await db.select({ at: min(runs.createdAt) }).from(runs).where(eq(runs.code, code));
  if (!row?.at) throw new Error(`no run with code ${code}`);
  return row.at;
}

/** The run a standardization is pinned for: its apparatus, date, and when it was first entered (see runEnteredAt). */
export interface PinnedRun {
  apparatusId: number | null;
  runDate: string;
  /** Without it the run counts as made after any change recorded on its day. */
  enteredAt?: Date;
}

export interface ApparatusState {
  /** The latest change the run was made after (null: none recorded). */
  since: ChangeRow | null;
  /** The first change recorded on the run's own day that the run was made before (it keeps the older standardization). */
  until: ChangeRow | null;
}

/**
 * The state of the apparatus a run was measured with, by the control chart's rule (madeBefore in
 * control-chart-segments.ts): changes of earlier days came before the run, and a change of the run's own day
 * came before it when the run was first entered after the change was recorded.
 */
export async function apparatusStateOf(db: DbOrTx, apparatusId: number, run: { runDate: string; enteredAt?: Date }): Promise<ApparatusState> {
  const rows = await db.select().from(apparatusChanges)
    .where(and(eq(apparatusChanges.apparatusId, apparatusId), lte(apparatusChanges.changedOn, run.runDate)))
    .orderBy(asc(apparatusChanges.changedOn), asc(apparatusChanges.recordedAt), asc(apparatusChanges.id));
  const point = { date: run.runDate, at: run.enteredAt?.toISOString() };
  const before = (c: ChangeRow) => madeBefore(point, { date: c.changedOn, recordedAt: c.recordedAt.toISOString() });
  return { since: rows.filter((c) => !before(c)).at(-1) ?? null, until: rows.find(before) ?? null };
}

/** The standardization whose ε a run's balance uses (the run document's, see run-loader.ts). */
export async function standardizationForRun(db: DbOrTx, run: PinnedRun & { apparatusId: number }): Promise<StandardizationRow | null> {
  const { until } = await apparatusStateOf(db, run.apparatusId, run);
  return standardizationInForce(db, run.apparatusId, run.runDate, until?.recordedAt);
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
 * The run's side of a change follows the control chart (apparatusStateOf), so a run the chart keeps in the
 * segment before a change is not flagged for it, however often it is checked again.
 * `heatLossApplied` says whether the run's document took the standardization's fitted h (see pinnedHeatLossApplies).
 */
export async function runStandardization(db: DbOrTx, run: PinnedRun, opts: { useFittedHeatLoss?: boolean; setup?: RunSetup } = {}): Promise<RunStandardization> {
  const { apparatusId, runDate } = run;
  if (apparatusId === null) return { standardization: null, flag: null };
  const { since: change, until } = await apparatusStateOf(db, apparatusId, run);
  const std = await standardizationInForce(db, apparatusId, runDate, until?.recordedAt);
  let signedBy = '';
  if (std) [{ name: signedBy }] = await db.select({ name: people.name }).from(people).where(eq(people.id, std.signerId));
  const sameDay = change && change.changedOn === runDate
    ? ` The run is dated that day and was entered after the change was recorded (${change.recordedAt.toISOString().slice(11, 16)} UTC), so it was measured on the changed apparatus.`
    : '';
  const flag: Flag | null = changeUncovered(change, std)
    ? {
      code: 'STANDARDIZATION_DUE', reading: null,
      message: `The apparatus was changed on ${change.changedOn} ("${change.description}") and has not been standardized since: its energy equivalent may no longer hold.${sameDay} Run a new standardization series and have it approved (ASTM D240 §8.1.1).`,
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
