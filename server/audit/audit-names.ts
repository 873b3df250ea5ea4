import { eq, inArray } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { apparatus, instruments, people, projects, runs, signatures } from '../../db/schema';
import { actionLabel, fieldChanges, recordTypeLabel, type ReadableEvent } from './audit-readable';

/** The stored fields of an event that reading it needs. */
export interface EventFields {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
}

const ids = (values: (string | number | null | undefined)[]) =>
  [...new Set(values.map(Number).filter((n) => Number.isInteger(n) && n > 0))];

/** Looks up, in one query per kind, the names of the people and the codes of the records the events touch. */
export async function readableEvents<T extends EventFields>(db: DbOrTx, events: readonly T[]): Promise<(T & ReadableEvent)[]> {
  const of = (type: string) => events.filter((e) => e.entityType === type).map((e) => e.entityId);
  const signatureIds = ids(of('signature'));
  const signatureRuns = signatureIds.length
    ? await db.select({ id: signatures.id, runId: signatures.runId }).from(signatures).where(inArray(signatures.id, signatureIds))
    : [];
  const personIds = ids([...events.map((e) => e.actorId), ...of('person')]);
  const runIds = ids([...of('run'), ...signatureRuns.map((s) => s.runId)]);
  const [peopleRows, runRows, instrumentRows, apparatusRows, projectRows] = await Promise.all([
    personIds.length ? db.select({ id: people.id, name: people.name }).from(people).where(inArray(people.id, personIds)) : [],
    runIds.length ? db.select({ id: runs.id, code: runs.code, revision: runs.revision }).from(runs).where(inArray(runs.id, runIds)) : [],
    ids(of('instrument')).length ? db.select({ id: instruments.id, code: instruments.tag }).from(instruments).where(inArray(instruments.id, ids(of('instrument')))) : [],
    ids(of('apparatus')).length ? db.select({ id: apparatus.id, code: apparatus.tag }).from(apparatus).where(inArray(apparatus.id, ids(of('apparatus')))) : [],
    ids(of('project')).length ? db.select({ id: projects.id, code: projects.code }).from(projects).where(inArray(projects.id, ids(of('project')))) : [],
  ]);
  const names = new Map(peopleRows.map((p) => [p.id, p.name]));
  const runCodes = new Map(runRows.map((r) => [r.id, `${r.code} rev. ${r.revision}`]));
  const codes: Record<string, Map<number, string>> = {
    run: runCodes,
    instrument: new Map(instrumentRows.map((r) => [r.id, r.code])),
    apparatus: new Map(apparatusRows.map((r) => [r.id, r.code])),
    project: new Map(projectRows.map((r) => [r.id, r.code])),
    person: names,
    signature: new Map(signatureRuns.map((s) => [s.id, `on run ${runCodes.get(s.runId) ?? s.runId}`])),
  };
  return events.map((e) => {
    const id = Number(e.entityId);
    const record = (Number.isInteger(id) ? codes[e.entityType]?.get(id) : undefined) ?? (e.entityId ? `#${e.entityId}` : '');
    return {
      ...e,
      actorName: e.actorId === null ? null : names.get(e.actorId) ?? null,
      actionLabel: actionLabel(e.action),
      recordType: recordTypeLabel(e.entityType),
      record,
      changes: fieldChanges(e.before, e.after),
    };
  });
}

/** All revisions of a run code ("R-2026-0007"), for the trail's run filter; empty when none. */
export async function runIdsForCode(db: DbOrTx, code: string): Promise<number[]> {
  const rows = await db.select({ id: runs.id }).from(runs).where(eq(runs.code, code.trim().toUpperCase()));
  return rows.map((r) => r.id);
}
