import { Router } from 'express';
import type { Database } from '../../db/client';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { CreatePersonDto, UpdatePersonDto } from './people-dto';
import { PeopleService } from './people-service';

/** Accounts are the administrator's alone. */
export function peopleRouter(db: Database): Router {
  const service = new PeopleService(db);
  const router = Router();
  router.get('/', requireRole('admin'), async (_req, res) => {
    res.json({ items: await service.list() });
  });
  router.post('/', requireRole('admin'), async (req, res) => {
    const body = await validateBody(CreatePersonDto, req.body);
    const row = await service.create(req.person!, body, req.ip ?? null);
    res.status(201).location(`/api/people/${row.id}`).json(row);
  });
  router.patch('/:id', requireRole('admin'), async (req, res) => {
    const id = idParam(req.params['id'], 'person');
    const body = await validateBody(UpdatePersonDto, req.body);
    res.json(await service.update(req.person!, id, body, req.ip ?? null));
  });
  return router;
}
