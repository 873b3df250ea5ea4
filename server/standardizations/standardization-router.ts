import { Router } from 'express';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { roles } from '../../db/schema';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';
import { ApparatusChangeDto, ApproveStandardizationDto } from './standardization-dto';
import { StandardizationService } from './standardization-service';
import { acceptanceRuleFromEnv } from './standardization-settings';

/** Standardizations of an apparatus and changes to it: everyone reads, quality officers sign and record. */
export function standardizationRouter(db: Database, config: Pick<Config, 'useFittedHeatLoss'>): Router {
  const router = Router();
  const service = new StandardizationService(db, acceptanceRuleFromEnv(), config.useFittedHeatLoss);

  router.get('/apparatus-due', requireRole(...roles), async (_req, res) => {
    res.json({ items: await service.due() });
  });

  router.get('/apparatus/:id/standardizations', requireRole(...roles), async (req, res) => {
    res.json(await service.overview(idParam(req.params['id'], 'apparatus')));
  });

  router.post('/apparatus/:id/standardizations', requireRole('quality'), async (req, res) => {
    const id = idParam(req.params['id'], 'apparatus');
    const body = await validateBody(ApproveStandardizationDto, req.body);
    res.status(201).json(await service.approve(req.person!, id, body, req.ip ?? null));
  });

  router.post('/apparatus/:id/changes', requireRole('quality'), async (req, res) => {
    const id = idParam(req.params['id'], 'apparatus');
    const body = await validateBody(ApparatusChangeDto, req.body);
    res.status(201).json(await service.recordChange(req.person!, id, body, req.ip ?? null));
  });

  return router;
}
