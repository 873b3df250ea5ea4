import type { Database } from '../../db/client';
import { and } from 'drizzle-orm';
import { takeCheckpoint, verifyAuditChain } from '../audit/audit-checkpoint';
import { auditScope, INVESTIGATOR_SCOPE } from '../audit/audit-scope';
import { auditFilters, recordAudit } from '../audit/audit-service';
import type { Config } from '../config';
import type { SessionPerson } from '../core/session';
import { writeAuditCsv } from './audit-csv';
import { eventPages, withReadable, type AuditExportHeader } from './audit-export-data';
import { writeAuditPdf } from './audit-pdf';
import { writeAuditXlsx } from './audit-xlsx';
import { fileSha256, RowsHasher } from './export-hash';
import { setFilters, type AuditExportFormat, type AuditExportQuery } from './exports-dto';

export const AUDIT_MEDIA_TYPES: Record<AuditExportFormat, string> = {
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  csv: 'text/csv; charset=utf-8',
  pdf: 'application/pdf',
};

export interface BuiltExport {
  name: string;
  type: string;
  sha256: { hex: string; base64: string };
  rows: number;
  rowsSha256: string;
}

/** File name of an export, e.g. qwell-audit-trail-20261201T223515Z.xlsx. */
export function auditFileName(at: Date, format: AuditExportFormat): string {
  return `qwell-audit-trail-${at.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z')}.${format}`;
}

/**
 * Builds the audit export into `path`. Everything is read in one read-only REPEATABLE READ snapshot:
 * the chain check of the whole trail, a first pass over the filtered rows for their SHA-256 (the header
 * states it before the rows), and a second pass that writes them, so the header and the rows agree
 * however many events are written meanwhile. Then the export records itself, in its own transaction.
 */
export async function buildAuditExport(db: Database, config: Config, person: SessionPerson, q: AuditExportQuery, path: string, ip: string | null): Promise<BuiltExport> {
  // Scoped exactly like GET /api/audit (and run reads): an investigator exports their projects' events.
  const scope = await auditScope(db, person, q);
  const where = and(auditFilters(q), scope);
  const filters = setFilters(q);
  if (scope) filters['scope'] = INVESTIGATOR_SCOPE;
  // Every export anchors the head first; the snapshot below compares the trail with that checkpoint.
  await takeCheckpoint(db, config, 'export');
  const generatedAt = new Date();
  const header = await db.transaction(async (tx) => {
    const chain = await verifyAuditChain(tx, config);
    const hasher = new RowsHasher();
    for await (const page of eventPages(tx, where)) for (const row of page) hasher.add(row);
    const head: AuditExportHeader = {
      lab: config.labName, filters, generatedAt, generatedBy: { name: person.name, email: person.email, role: person.role },
      chain, rows: hasher.rows, rowsSha256: hasher.digest(),
    };
    const writer = { xlsx: writeAuditXlsx, csv: writeAuditCsv, pdf: writeAuditPdf }[q.format];
    await writer(path, head, withReadable(tx, eventPages(tx, where)));
    return head;
  }, { isolationLevel: 'repeatable read', accessMode: 'read only' });

  const sha256 = await fileSha256(path);
  await db.transaction(async (tx) => {
    await recordAudit(tx, {
      actorId: person.id, actorEmail: person.email, action: 'audit.export', entityType: 'audit', ip,
      after: {
        format: q.format, filters, rows: header.rows, rowsSha256: header.rowsSha256, sha256: sha256.hex,
        chainValid: header.chain.valid, chainChecked: header.chain.checked, ...(header.chain.firstBroken ? { firstBroken: header.chain.firstBroken.id, brokenCount: header.chain.brokenCount } : {}),
        ...(header.chain.checkpoint ? { checkpoint: header.chain.checkpoint.id, checkpointHolds: header.chain.checkpoint.holds } : {}),
      },
    });
  });
  return { name: auditFileName(generatedAt, q.format), type: AUDIT_MEDIA_TYPES[q.format], sha256, rows: header.rows, rowsSha256: header.rowsSha256 };
}
