import { Router } from 'express';
import type { Database } from '../../db/client';
import { roles } from '../../db/schema';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { CreateCalibrationDto, CreateInstrumentDto } from './instruments-dto';
import { InstrumentsService } from './instruments-service';

export function instrumentsRouter(db: Database): Router {
  const service = new InstrumentsService(db);
  const router = Router();
  // Everyone reads the register: technicians pick instruments, investigators check them.
  router.get('/', requireRole(...roles), async (_req, res) => {
    res.json({ items: await service.list() });
  });
  router.get('/:id', requireRole(...roles), async (req, res) => {
    res.json(await service.get(idParam(req.params['id'], 'instrument')));
  });
  router.post('/', requireRole('quality'), async (req, res) => {
    const body = await validateBody(CreateInstrumentDto, req.body);
    const row = await service.create(req.person!, body, req.ip ?? null);
    res.status(201).location(`/api/instruments/${row.id}`).json(row);
  });
  router.post('/:id/calibrations', requireRole('quality'), async (req, res) => {
    const body = await validateBody(CreateCalibrationDto, req.body);
    res.status(201).json(await service.addCalibration(req.person!, idParam(req.params['id'], 'instrument'), body, req.ip ?? null));
  });
  return router;
}
