import { and, asc, eq, inArray } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { auditEvents, people, runs } from '../../db/schema';
import type { SessionPerson } from '../core/session';
import { loadVisibleRun } from './run-access';

/** A run's audit history across all its revisions, oldest first (the run page and the run report). */
export async function runHistory(db: DbOrTx, person: SessionPerson, id: number) {
  const run = await loadVisibleRun(db, person, id);
  const revisionIds = (await db.select({ id: runs.id }).from(runs).where(eq(runs.code, run.code))).map((r) => String(r.id));
  const items = await db
    .select({ id: auditEvents.id, occurredAt: auditEvents.occurredAt, actorEmail: auditEvents.actorEmail, actorName: people.name, action: auditEvents.action, entityId: auditEvents.entityId, before: auditEvents.before, after: auditEvents.after, reason: auditEvents.reason })
    .from(auditEvents)
    .leftJoin(people, eq(people.id, auditEvents.actorId))
    .where(and(eq(auditEvents.entityType, 'run'), inArray(auditEvents.entityId, revisionIds)))
    .orderBy(asc(auditEvents.id));
  // The trail stores objects (or nothing) before and after; jsonb reads back untyped.
  type Snapshot = Record<string, unknown> | null;
  return { items: items.map((e) => ({ ...e, before: e.before as Snapshot, after: e.after as Snapshot })) };
}
