import { Router } from 'express';
import type { Database } from '../../db/client';
import { roles } from '../../db/schema';
import { requireRole } from '../core/session';
import { GasesService } from './gases-service';

/** The gas table: everyone reads it (run set-up picks a gas); nobody writes it through the API. */
export function gasesRouter(db: Database): Router {
  const service = new GasesService(db);
  const router = Router();
  router.get('/', requireRole(...roles), async (_req, res) => {
    res.json(await service.list());
  });
  return router;
}
