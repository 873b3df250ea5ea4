import { Router } from 'express';
import { AUDIT_READERS, RUN_READERS } from '../../contract/roles';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateQuery } from '../core/validate-query';
import { buildAuditExport } from './audit-export';
import { sendExport, withTempFile } from './export-file';
import { AuditExportQuery } from './exports-dto';
import { buildRunReport } from './run-report';

/**
 * Files that leave the lab: the audit trail (.xlsx, CSV, PDF) and the printable run report. Mounted at
 * /api before the audit and runs routers. Each file is built into a temporary file, hashed, recorded
 * as an audit event and then sent with its SHA-256 in the response headers.
 */
export function exportsRouter(db: Database, config: Config): Router {
  const router = Router();

  router.get('/audit/export', requireRole(...AUDIT_READERS), async (req, res) => {
    const q = await validateQuery(AuditExportQuery, req.query);
    await withTempFile(`audit.${q.format}`, async (path) => {
      const built = await buildAuditExport(db, config, req.person!, q, path, req.ip ?? null);
      await sendExport(res, path, built);
    });
  });

  router.get('/runs/:id/report.pdf', requireRole(...RUN_READERS), async (req, res) => {
    const id = idParam(req.params['id'], 'run');
    await withTempFile('report.pdf', async (path) => {
      const built = await buildRunReport(db, config, req.person!, id, path, req.ip ?? null);
      await sendExport(res, path, built);
    });
  });

  return router;
}
