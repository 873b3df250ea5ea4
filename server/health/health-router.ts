import { Router } from 'express';
import type postgres from 'postgres';

export function healthRouter(sql: postgres.Sql): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    try {
      await sql`SELECT 1`.execute();
      res.json({ status: 'ok', db: 'ok' });
    } catch {
      res.status(503).json({ status: 'degraded', db: 'unreachable' });
    }
  });
  return router;
}
