import { Router } from 'express';
import { roles } from '../../db/schema';
import type { Config } from '../config';
import { requireRole } from '../core/session';
import { BalanceService } from './balance-service';

/** POST /api/balance: a stateless check of a run document; stores nothing. */
export function balanceRouter(config: Config): Router {
  const service = new BalanceService(config.balance);
  const router = Router();
  router.post('/', requireRole(...roles), async (req, res) => {
    res.json(await service.check(req.body));
  });
  return router;
}
