import { asc, desc, gt, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { auditEvents } from '../../db/schema';
import { eventHash, GENESIS_HASH, type ChainedFields } from './audit-chain';

export interface AuditInput {
  actorId?: number | null;
  actorEmail?: string | null;
  action: string;
  entityType: string;
  entityId?: string | number | null;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  ip?: string | null;
}

// Serialises writers so that each event links to the one before it.
const CHAIN_LOCK = 7_004_311;

/**
 * Appends one event to the trail. Call it with the transaction of the change it records, so that the
 * change and its event commit or roll back together.
 */
export async function recordAudit(tx: DbOrTx, input: AuditInput): Promise<void> {
  await tx.execute(sql`SELECT pg_advisory_xact_lock(${CHAIN_LOCK})`);
  const [last] = await tx.select({ hash: auditEvents.hash }).from(auditEvents).orderBy(desc(auditEvents.id)).limit(1);
  const fields: ChainedFields = {
    occurredAt: new Date(),
    actorId: input.actorId ?? null,
    actorEmail: input.actorEmail ?? null,
    action: input.action,
    entityType: input.entityType,
    entityId: input.entityId === undefined || input.entityId === null ? null : String(input.entityId),
    before: input.before ?? null,
    after: input.after ?? null,
    reason: input.reason ?? null,
    ip: input.ip ?? null,
    prevHash: last?.hash ?? GENESIS_HASH,
  };
  await tx.insert(auditEvents).values({ ...fields, hash: eventHash(fields) });
}

export interface ChainCheck {
  valid: boolean;
  checked: number;
  /** The first event whose link does not hold, and why. */
  firstBroken?: { id: number; reason: string };
}

/** Walks the whole chain in id order, in pages, recomputing every hash. */
export async function verifyAuditChain(db: DbOrTx, pageSize = 5000): Promise<ChainCheck> {
  let prev = GENESIS_HASH;
  let afterId = 0;
  let checked = 0;
  for (;;) {
    const page = await db.select().from(auditEvents).where(gt(auditEvents.id, afterId)).orderBy(asc(auditEvents.id)).limit(pageSize);
    if (page.length === 0) return { valid: true, checked };
    for (const row of page) {
      if (row.prevHash !== prev) {
        return { valid: false, checked, firstBroken: { id: row.id, reason: 'its link to the previous event does not match: an event before it was removed or altered' } };
      }
      const expected = eventHash({
        occurredAt: row.occurredAt, actorId: row.actorId, actorEmail: row.actorEmail, action: row.action,
        entityType: row.entityType, entityId: row.entityId, before: row.before, after: row.after,
        reason: row.reason, ip: row.ip, prevHash: row.prevHash,
      });
      if (row.hash !== expected) {
        return { valid: false, checked, firstBroken: { id: row.id, reason: 'its content does not match its hash: the event was altered after it was written' } };
      }
      prev = row.hash;
      afterId = row.id;
      checked += 1;
    }
  }
}
