import { Router } from 'express';
import type { HomeSummary } from '../../contract/api/home';
import type { Database } from '../../db/client';
import { roles } from '../../db/schema';
import { requireRole } from '../core/session';
import { HomeService } from './home-service';

export function homeRouter(db: Database): Router {
  const service = new HomeService(db);
  const router = Router();
  router.get('/', requireRole(...roles), async (req, res) => {
    res.json({ role: req.person!.role, queues: await service.queues(req.person!) } satisfies HomeSummary);
  });
  return router;
}
