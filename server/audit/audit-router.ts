import { and, count, desc, eq, sql, type SQL } from 'drizzle-orm';
import { Router } from 'express';
import type { Database } from '../../db/client';
import { auditEvents, people } from '../../db/schema';
import { requireRole } from '../core/session';
import { validateQuery } from '../core/validate-query';
import { AuditQuery } from './audit-dto';
import { verifyAuditChain } from './audit-service';

export function auditFilters(q: AuditQuery): SQL | undefined {
  const filters: SQL[] = [];
  if (q.run !== undefined) filters.push(and(eq(auditEvents.entityType, 'run'), eq(auditEvents.entityId, String(q.run)))!);
  if (q.person !== undefined) filters.push(eq(auditEvents.actorId, q.person));
  if (q.action) filters.push(eq(auditEvents.action, q.action));
  if (q.entityType) filters.push(eq(auditEvents.entityType, q.entityType));
  if (q.from) filters.push(sql`${auditEvents.occurredAt} >= ${q.from}::date`);
  if (q.to) filters.push(sql`${auditEvents.occurredAt} < (${q.to}::date + 1)`);
  return filters.length ? and(...filters) : undefined;
}

export function auditRouter(db: Database): Router {
  const router = Router();
  const readers = requireRole('quality', 'investigator');

  router.get('/', readers, async (req, res) => {
    const q = await validateQuery(AuditQuery, req.query);
    const where = auditFilters(q);
    const [items, [{ total }]] = await Promise.all([
      db.select().from(auditEvents).where(where).orderBy(desc(auditEvents.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
      db.select({ total: count() }).from(auditEvents).where(where),
    ]);
    res.json({ items, total, page: q.page, pageSize: q.pageSize });
  });

  /** People who appear in the trail, so readers can filter by name without the admin-only people list. */
  router.get('/actors', readers, async (_req, res) => {
    const items = await db.selectDistinct({ id: people.id, name: people.name, email: people.email })
      .from(auditEvents).innerJoin(people, eq(people.id, auditEvents.actorId)).orderBy(people.name);
    res.json({ items });
  });

  router.get('/verify', readers, async (_req, res) => {
    res.json(await verifyAuditChain(db));
  });

  return router;
}
