import { Router } from 'express';
import { roles } from '../../db/schema';
import type { Config } from '../config';
import { HttpProblem } from '../core/problem';
import { requireRole } from '../core/session';
import { checkDocument } from './check-off-thread';
import { documentRangeProblems } from './document-ranges';

/** POST /api/balance: a stateless check of a run document; stores nothing. */
export function balanceRouter(config: Config): Router {
  const router = Router();
  router.post('/', requireRole(...roles), async (req, res) => {
    const outOfRange = documentRangeProblems(req.body);
    if (outOfRange.length > 0) {
      throw new HttpProblem(400, 'Invalid run document', `${outOfRange.length} reading(s) are out of range: ${outOfRange.slice(0, 3).map((e) => e.message).join('; ')}`, outOfRange);
    }
    const checked = await checkDocument(req.body, config.balance);
    if (!checked.ok) {
      throw new HttpProblem(400, 'Invalid run document',
        `The run document has ${checked.errors.length} problem(s): ${checked.errors.slice(0, 5).map((e) => `${e.path || '(document)'}: ${e.message}`).join('; ')}`,
        checked.errors.map((e) => ({ field: e.path, message: e.message })));
    }
    res.json(checked.result);
  });
  return router;
}
