import { Router } from 'express';
import type { Database } from '../../db/client';
import { roles } from '../../db/schema';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { ApparatusDto } from './apparatus-dto';
import { ApparatusService } from './apparatus-service';

/**
 * The apparatus register: everyone reads it, quality officers keep it. Standardizations and
 * changes of one apparatus (/api/apparatus/:id/…) are the standardization router's.
 */
export function apparatusRouter(db: Database): Router {
  const service = new ApparatusService(db);
  const router = Router();
  router.get('/', requireRole(...roles), async (_req, res) => {
    res.json({ items: await service.list() });
  });
  router.post('/', requireRole('quality'), async (req, res) => {
    const body = await validateBody(ApparatusDto, req.body);
    const row = await service.create(req.person!, body, req.ip ?? null);
    res.status(201).location(`/api/apparatus/${row.id}`).json(row);
  });
  router.put('/:id', requireRole('quality'), async (req, res) => {
    const id = idParam(req.params['id'], 'apparatus');
    const body = await validateBody(ApparatusDto, req.body);
    res.json(await service.update(req.person!, id, body, req.ip ?? null));
  });
  return router;
}
