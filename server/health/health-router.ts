import { Router } from 'express';
import type postgres from 'postgres';
import { DEMO_DOMAIN } from '../config';

/**
 * Whether the database answers, and whether the invented demo lab is loaded (any of its people still
 * active): the sign-in page points at the README's demo sign-ins only then. Public, and says nothing more.
 */
export function healthRouter(sql: postgres.Sql): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    try {
      const [{ demo }] = await sql<{ demo: boolean }[]>`
        SELECT EXISTS (SELECT 1 FROM people WHERE email LIKE ${'%@' + DEMO_DOMAIN} AND active) AS demo`;
      res.json({ status: 'ok', db: 'ok', demoLab: demo });
    } catch {
      res.status(503).json({ status: 'degraded', db: 'unreachable' });
    }
  });
  return router;
}
