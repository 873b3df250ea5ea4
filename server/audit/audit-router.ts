import { and, count, desc, eq, notInArray, sql, type SQL } from 'drizzle-orm';
import { Router } from 'express';
import type { Database } from '../../db/client';
import { auditEvents, people, runs } from '../../db/schema';
import { requireRole } from '../core/session';
import { validateQuery } from '../core/validate-query';
import { AuditQuery } from './audit-dto';
import type { Config } from '../config';
import { verifyAuditChain } from './audit-checkpoint';
import { readableEvents } from './audit-names';
import { SIGN_IN_ACTIONS } from './audit-readable';
import { auditScope } from './audit-scope';

export function auditFilters(q: AuditQuery): SQL | undefined {
  const filters: SQL[] = [];
  if (q.run !== undefined) {
    // A code covers every revision of the run; digits alone are a run id.
    const ids = /^\d+$/.test(q.run) ? sql`(${q.run})` : sql`(SELECT ${runs.id}::text FROM ${runs} WHERE ${runs.code} = ${q.run.toUpperCase()})`;
    filters.push(and(eq(auditEvents.entityType, 'run'), sql`${auditEvents.entityId} IN ${ids}`)!);
  }
  if (q.signIns === 'hide') filters.push(notInArray(auditEvents.action, [...SIGN_IN_ACTIONS]));
  if (q.person !== undefined) filters.push(eq(auditEvents.actorId, q.person));
  if (q.action) filters.push(eq(auditEvents.action, q.action));
  if (q.entityType) filters.push(eq(auditEvents.entityType, q.entityType));
  if (q.from) filters.push(sql`${auditEvents.occurredAt} >= ${q.from}::date`);
  if (q.to) filters.push(sql`${auditEvents.occurredAt} < (${q.to}::date + 1)`);
  return filters.length ? and(...filters) : undefined;
}

export function auditRouter(db: Database, config: Config): Router {
  const router = Router();
  const readers = requireRole('quality', 'investigator');

  router.get('/', readers, async (req, res) => {
    const q = await validateQuery(AuditQuery, req.query);
    const where = and(auditFilters(q), await auditScope(db, req.person!, q));
    const [items, [{ total }]] = await Promise.all([
      db.select().from(auditEvents).where(where).orderBy(desc(auditEvents.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
      db.select({ total: count() }).from(auditEvents).where(where),
    ]);
    res.json({ items: await readableEvents(db, items), total, page: q.page, pageSize: q.pageSize });
  });

  /** People who appear in the trail, so readers can filter by name without the admin-only people list. */
  router.get('/actors', readers, async (req, res) => {
    const items = await db.selectDistinct({ id: people.id, name: people.name, email: people.email })
      .from(auditEvents).innerJoin(people, eq(people.id, auditEvents.actorId)).where(await auditScope(db, req.person!, {})).orderBy(people.name);
    res.json({ items });
  });

  router.get('/verify', readers, async (_req, res) => {
    res.json(await verifyAuditChain(db, config));
  });

  return router;
}
