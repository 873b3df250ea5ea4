import { bigint, bigserial, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * Signed checkpoints of the audit trail's head: how many events there were, the newest one's id and
 * hash, and an Ed25519 signature made with a key the database does not hold (server/audit/
 * audit-checkpoint.ts). Append-only like the trail. Verifying the trail against the latest checkpoint
 * names events removed from its end, which the chain alone cannot show.
 */
export const auditCheckpoints = pgTable('audit_checkpoints', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  takenAt: timestamp('taken_at', { withTimezone: true, precision: 3 }).notNull(),
  eventCount: bigint('event_count', { mode: 'number' }).notNull(),
  headId: bigint('head_id', { mode: 'number' }).notNull(),
  headHash: text('head_hash').notNull(),
  /** What prompted it: "schedule", "export" or "manual". */
  reason: text('reason').notNull(),
  /** First 16 hex digits of the SHA-256 of the signing key's public half (SPKI DER). */
  keyId: text('key_id').notNull(),
  signature: text('signature').notNull(),
});
