import type { Database } from '../../db/client';
import { recordAudit } from '../audit/audit-service';
import type { Config } from '../config';
import type { SessionPerson } from '../core/session';
import { fileSha256 } from './export-hash';
import { loadRunReport } from './run-report-data';
import { writeRunReportPdf } from './run-report-pdf';

/** Builds the run report into `path`, then records it as an audit event in its own transaction. */
export async function buildRunReport(db: Database, config: Config, person: SessionPerson, id: number, path: string, ip: string | null) {
  const data = await loadRunReport(db, config, person, id);
  const at = new Date();
  const pages = await writeRunReportPdf(path, data, person, at);
  const sha256 = await fileSha256(path);
  await db.transaction(async (tx) => {
    await recordAudit(tx, {
      actorId: person.id, actorEmail: person.email, action: 'run.report', entityType: 'run', entityId: id, ip,
      after: { format: 'pdf', code: data.run.code, revision: data.run.revision, version: data.run.version, resultId: data.result?.id ?? null, pages, sha256: sha256.hex },
    });
  });
  return { name: `${data.run.code}-r${data.run.revision}-report.pdf`, type: 'application/pdf', sha256, pages };
}
