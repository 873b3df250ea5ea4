import { createHash } from 'node:crypto';
import { canonicalJson } from '../core/canonical-json';

/** The first link's predecessor: 64 zeros. */
export const GENESIS_HASH = '0'.repeat(64);

/** The fields of an audit event that its hash covers (everything but the id and the hash itself). */
export interface ChainedFields {
  occurredAt: Date;
  actorId: number | null;
  actorEmail: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
  reason: string | null;
  ip: string | null;
  prevHash: string;
}

/** SHA-256 over the previous hash and the event's canonical JSON. */
export function eventHash(fields: ChainedFields): string {
  const body = canonicalJson({ ...fields, occurredAt: fields.occurredAt.toISOString() });
  return createHash('sha256').update(fields.prevHash).update('\n').update(body).digest('hex');
}
