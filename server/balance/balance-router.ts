import express, { Router } from 'express';
import { roles } from '../../db/schema';
import type { Config } from '../config';
import { requireRole } from '../core/session';
import { BALANCE_BODY_LIMIT } from './balance-body';
import { BalanceService } from './balance-service';

/** POST /api/balance: a stateless check of a run document; stores nothing. */
export function balanceRouter(config: Config): Router {
  const service = new BalanceService(config.balance);
  const router = Router();
  // The body is read here, after the sign-in check, as bytes: a large document is parsed in a worker.
  router.post('/', requireRole(...roles), express.raw({ type: 'application/json', limit: BALANCE_BODY_LIMIT }), async (req, res) => {
    res.json(await (Buffer.isBuffer(req.body) ? service.checkBytes(req.body) : service.check(undefined)));
  });
  return router;
}
