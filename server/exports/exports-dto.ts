import { IsIn } from 'class-validator';
import { AuditQuery } from '../audit/audit-dto';

export const auditExportFormats = ['xlsx', 'csv', 'pdf'] as const;
export type AuditExportFormat = (typeof auditExportFormats)[number];

/** GET /api/audit/export: the filters of GET /api/audit plus the file format. */
export class AuditExportQuery extends AuditQuery {
  @IsIn(auditExportFormats, { message: 'format must be one of xlsx, csv, pdf' })
  format!: AuditExportFormat;
}

/** The filters a person actually set, for the header block and the export's own audit event. */
export function setFilters(q: AuditQuery): Record<string, string | number> {
  const out: Record<string, string | number> = {};
  for (const key of ['run', 'person', 'action', 'entityType', 'signIns', 'from', 'to'] as const) {
    const v = q[key];
    if (v !== undefined && v !== '') out[key] = v;
  }
  return out;
}
