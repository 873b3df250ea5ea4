import { and, inArray, isNull, lt } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { imports, uploads } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';

/**
 * Deletes uploads that never became part of a run (previewed, then left) once they are older than
 * the retention period (QWELL_UPLOAD_RETENTION_DAYS, default 30), with their previews. An upload
 * committed into a run is part of that run's record and is kept. One transaction, one audit event.
 */
export async function purgeStaleUploads(db: Database, retentionDays: number, now = new Date()): Promise<number> {
  const cutoff = new Date(now.getTime() - retentionDays * 24 * 3600 * 1000);
  return db.transaction(async (tx) => {
    const stale = await tx.select({ id: uploads.id, sha256: uploads.sha256 }).from(uploads)
      .where(and(isNull(uploads.runId), lt(uploads.createdAt, cutoff)));
    if (stale.length === 0) return 0;
    const ids = stale.map((u) => u.id);
    await tx.delete(imports).where(inArray(imports.uploadId, ids));
    await tx.delete(uploads).where(inArray(uploads.id, ids));
    await recordAudit(tx, {
      action: 'upload.purge', entityType: 'upload',
      after: { uploads: ids.length, retentionDays, olderThan: cutoff.toISOString(), sha256: stale.map((u) => u.sha256) },
      reason: `uploads never committed into a run, older than the ${retentionDays}-day retention period`,
    });
    return ids.length;
  });
}
