import { Router } from 'express';
import type { Database } from '../../db/client';
import { roles } from '../../db/schema';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { CreateProjectDto, MembersDto } from './projects-dto';
import { ProjectsService } from './projects-service';

export function projectsRouter(db: Database): Router {
  const service = new ProjectsService(db);
  const router = Router();
  router.get('/', requireRole(...roles), async (req, res) => {
    res.json({ items: await service.list(req.person!) });
  });
  router.post('/', requireRole('admin'), async (req, res) => {
    const body = await validateBody(CreateProjectDto, req.body);
    const row = await service.create(req.person!, body, req.ip ?? null);
    res.status(201).location(`/api/projects/${row.id}`).json(row);
  });
  router.put('/:id/members', requireRole('admin'), async (req, res) => {
    const id = idParam(req.params['id'], 'project');
    const body = await validateBody(MembersDto, req.body);
    res.json(await service.replaceMembers(req.person!, id, body, req.ip ?? null));
  });
  return router;
}
