import { and, asc, desc, eq, inArray, lte } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { apparatus, calibrations, gases, instruments, people, readings } from '../../db/schema';
import type { RunDocument } from '../engine';
import { runEnteredAt, standardizationForRun } from '../standardizations/standardization-pin';
import type { RunRow } from './run-access';
import { storageToDocument, type DocumentContext, type ReadingRow } from './run-document-mapper';
import type { RunSetup } from './run-setup';

export async function loadReadings(db: DbOrTx, runId: number): Promise<ReadingRow[]> {
  const rows = await db.select().from(readings).where(eq(readings.runId, runId)).orderBy(asc(readings.seq));
  return rows.map(({ runId: _r, ...row }) => row);
}

/** Register instruments with the calibration valid on a day: the latest one made on or before it. */
export async function instrumentsOnDay(db: DbOrTx, ids: number[], day: string): Promise<DocumentContext['register']> {
  const map = new Map<number, DocumentContext['register'] extends ReadonlyMap<number, infer V> ? V : never>();
  if (ids.length === 0) return map;
  const rows = await db.select().from(instruments).where(inArray(instruments.id, ids));
  for (const inst of rows) {
    const [cal] = await db.select().from(calibrations)
      .where(and(eq(calibrations.instrumentId, inst.id), lte(calibrations.calibratedOn, day)))
      .orderBy(desc(calibrations.calibratedOn), desc(calibrations.id)).limit(1);
    map.set(inst.id, { ...inst, calibration: cal ?? null });
  }
  return map;
}

/**
 * The run document of a stored run, with register instruments and apparatus as they were on the run date, and the
 * standardization in force (its ε; its fitted h too when `useFittedHeatLoss`, the lab setting).
 */
export async function loadRunDocument(db: DbOrTx, run: RunRow, labName: string, opts: { useFittedHeatLoss?: boolean } = {}): Promise<RunDocument> {
  const setup = (run.setup ?? {}) as RunSetup;
  const ids = Object.values(setup.channels ?? {}).flatMap((c) => (c?.instrumentId !== undefined ? [c.instrumentId] : []));
  if (setup.ambient?.pressure?.instrumentId !== undefined) ids.push(setup.ambient.pressure.instrumentId);
  const [rows, register, [gas], [app], [author]] = await Promise.all([
    loadReadings(db, run.id),
    instrumentsOnDay(db, ids, run.runDate),
    run.gasId ? db.select().from(gases).where(eq(gases.id, run.gasId)) : Promise.resolve([]),
    run.apparatusId ? db.select().from(apparatus).where(eq(apparatus.id, run.apparatusId)) : Promise.resolve([]),
    db.select({ name: people.name }).from(people).where(eq(people.id, run.authorId)),
  ]);
  const std = run.apparatusId
    ? await standardizationForRun(db, { apparatusId: run.apparatusId, runDate: run.runDate, enteredAt: await runEnteredAt(db, run.code) })
    : null;
  const standardization = std ? { ...std, applyHeatLoss: opts.useFittedHeatLoss === true } : null;
  return storageToDocument({
    run, rows, register, gasCode: gas?.code ?? null, apparatus: app ?? null, lab: labName, operator: author?.name ?? '', standardization,
  });
}
