import { AUDIT_READERS } from '../../contract/roles';
import { Router } from 'express';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { requireRole } from '../core/session';
import { validateQuery } from '../core/validate-query';
import { verifyAuditChain } from './audit-checkpoint';
import { AuditQuery } from './audit-dto';
import { AuditService } from './audit-service';

/** The audit trail, read by quality officers and investigators (each within their scope). */
export function auditRouter(db: Database, config: Config): Router {
  const service = new AuditService(db);
  const router = Router();
  const readers = requireRole(...AUDIT_READERS);

  router.get('/', readers, async (req, res) => {
    res.json(await service.list(req.person!, await validateQuery(AuditQuery, req.query)));
  });
  /** People who appear in the trail, so readers can filter by name without the admin-only people list. */
  router.get('/actors', readers, async (req, res) => {
    res.json(await service.actors(req.person!));
  });
  router.get('/verify', readers, async (_req, res) => {
    res.json(await verifyAuditChain(db, config));
  });
  return router;
}
