import { asc } from 'drizzle-orm';
import { Router } from 'express';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { requireRole } from '../core/session';

export function peopleRouter(db: Database): Router {
  const router = Router();
  router.get('/', requireRole('admin'), async (_req, res) => {
    const items = await db
      .select({ id: people.id, email: people.email, name: people.name, role: people.role, active: people.active, lockedUntil: people.lockedUntil })
      .from(people)
      .orderBy(asc(people.name));
    res.json({ items });
  });
  return router;
}
