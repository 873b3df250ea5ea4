import { eq, or, sql, type SQL } from 'drizzle-orm';
import { notFound } from '../core/problem';
import type { DbOrTx } from '../../db/client';
import { auditEvents, runs } from '../../db/schema';
import type { SessionPerson } from '../core/session';
import { loadVisibleRun } from '../runs/run-access';
import type { AuditQuery } from './audit-dto';

export const INVESTIGATOR_SCOPE = 'runs, signatures and projects of your projects, and your own actions';

/**
 * Which events a person may read, exactly like run reads: the quality officer sees the whole trail;
 * an investigator sees the events of runs (and their signatures) in projects they are a member of,
 * of those projects themselves, and their own actions. A run filter for a run they may not read
 * answers as the run would (404 or 403). Returns undefined for "everything".
 */
export async function auditScope(db: DbOrTx, person: SessionPerson, q: Pick<AuditQuery, 'run'>): Promise<SQL | undefined> {
  if (q.run !== undefined && q.run !== '') {
    // A run id, or a code that covers every revision (they share one project).
    const run = String(q.run);
    if (/^\d+$/.test(run)) await loadVisibleRun(db, person, Number(run));
    else {
      const [first] = await db.select({ id: runs.id }).from(runs).where(eq(runs.code, run.toUpperCase())).limit(1);
      if (!first) throw notFound(`There is no run with code ${run}.`);
      await loadVisibleRun(db, person, first.id);
    }
  }
  if (person.role === 'quality') return undefined;
  const me = person.id;
  return or(
    eq(auditEvents.actorId, me),
    sql`(${auditEvents.entityType} = 'run' AND ${auditEvents.entityId} IN (
      SELECT r.id::text FROM runs r JOIN project_members m ON m.project_id = r.project_id WHERE m.person_id = ${me}))`,
    sql`(${auditEvents.entityType} = 'signature' AND ${auditEvents.entityId} IN (
      SELECT s.id::text FROM signatures s JOIN runs r ON r.id = s.run_id JOIN project_members m ON m.project_id = r.project_id WHERE m.person_id = ${me}))`,
    sql`(${auditEvents.entityType} = 'project' AND ${auditEvents.entityId} IN (
      SELECT m.project_id::text FROM project_members m WHERE m.person_id = ${me}))`,
  );
}
