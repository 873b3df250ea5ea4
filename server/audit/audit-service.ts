import { and, asc, count, desc, eq, gt, notInArray, sql, type SQL } from 'drizzle-orm';
import { isIP } from 'node:net';
import type { Database, DbOrTx, Tx } from '../../db/client';
import { auditEvents, people, runs } from '../../db/schema';
import type { SessionPerson } from '../core/session';
import { eventHash, GENESIS_HASH, type ChainedFields } from './audit-chain';
import type { AuditQuery } from './audit-dto';
import { readableEvents } from './audit-names';
import { SIGN_IN_ACTIONS, type AuditAction } from '../../contract/audit';
import { auditScope } from './audit-scope';

export interface AuditInput {
  actorId?: number | null;
  actorEmail?: string | null;
  /** One of the contract's codes, so every event the server writes has its words on every screen. */
  action: AuditAction;
  entityType: string;
  entityId?: string | number | null;
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  ip?: string | null;
}

// Serialises writers so that each event links to the one before it.
export const CHAIN_LOCK = 7_004_311;

/** True for the handle Drizzle passes inside `db.transaction(…)` (it can roll back; a pool cannot). */
function isTransaction(handle: DbOrTx): handle is Tx {
  return typeof (handle as Partial<Tx>).rollback === 'function';
}

/**
 * Appends one event to the trail. Call it with the transaction of the change it records, so that the
 * change and its event commit or roll back together. Only a transaction can hold the chain's lock
 * until its commit; outside one the lock would be released at once and two writers could link to
 * the same predecessor (a fork), so a pool handle is refused.
 */
export async function recordAudit(tx: Tx, input: AuditInput): Promise<void> {
  if (!isTransaction(tx)) throw new Error('recordAudit needs a transaction: use recordAuditAlone for an event that records no other change');
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
    // Only a well-formed address is kept: never header text a client chose.
    ip: input.ip && isIP(input.ip) ? input.ip : null,
    prevHash: last?.hash ?? GENESIS_HASH,
  };
  await tx.insert(auditEvents).values({ ...fields, hash: eventHash(fields) });
}

/** An event that records no other change (a refused sign-in, say), in a transaction of its own. */
export async function recordAuditAlone(db: Database, input: AuditInput): Promise<void> {
  await db.transaction((tx) => recordAudit(tx, input));
}

export interface ChainBreak {
  id: number;
  reason: string;
}

/** How the trail compares with the latest signed checkpoint of its head (audit-checkpoint.ts). */
export interface CheckpointCheck {
  id: number;
  takenAt: string;
  eventCount: number;
  headId: number;
  headHash: string;
  keyId: string;
  /** Ed25519 signature (base64) over the checkpoint's statement (audit-checkpoint.ts). */
  signature: string;
  /** Where the checkpoint was read: the database's table, or the file kept outside it. */
  source: 'database' | 'file';
  holds: boolean;
  reason?: string;
}

export interface ChainCheck {
  valid: boolean;
  checked: number;
  /** The newest event's id and hash (absent for an empty trail). */
  head?: { id: number; hash: string };
  /** The first event whose link does not hold, and why. */
  firstBroken?: ChainBreak;
  /** How many events' links or contents do not hold. */
  brokenCount: number;
  /** The first MAX_LISTED of them, in id order. */
  broken: ChainBreak[];
  /** The latest checkpoint and whether the trail still reaches it; absent when none was taken yet. */
  checkpoint?: CheckpointCheck;
}

export const MAX_LISTED_BREAKS = 100;

const LINK_BROKEN = 'its link to the previous event does not match: an event before it was removed or altered, or two events were written on the same predecessor';
const CONTENT_ALTERED = 'its content does not match its hash: the event was altered after it was written';

/**
 * Walks the whole chain in id order, in pages, recomputing every hash, and names every break (not
 * only the first: a later tampered event stays visible behind an earlier one).
 */
export async function walkAuditChain(db: DbOrTx, pageSize = 5000): Promise<ChainCheck> {
  let prev = GENESIS_HASH;
  let afterId = 0;
  let checked = 0;
  let head: ChainCheck['head'];
  const broken: ChainBreak[] = [];
  let brokenCount = 0;
  const note = (b: ChainBreak) => {
    brokenCount += 1;
    if (broken.length < MAX_LISTED_BREAKS) broken.push(b);
  };
  for (;;) {
    const page = await db.select().from(auditEvents).where(gt(auditEvents.id, afterId)).orderBy(asc(auditEvents.id)).limit(pageSize);
    if (page.length === 0) break;
    for (const row of page) {
      const expected = eventHash({
        occurredAt: row.occurredAt, actorId: row.actorId, actorEmail: row.actorEmail, action: row.action,
        entityType: row.entityType, entityId: row.entityId, before: row.before, after: row.after,
        reason: row.reason, ip: row.ip, prevHash: row.prevHash,
      });
      if (row.hash !== expected) note({ id: row.id, reason: CONTENT_ALTERED });
      else if (row.prevHash !== prev) note({ id: row.id, reason: LINK_BROKEN });
      // The walk goes on from the stored hash, so each later break is named on its own.
      prev = row.hash;
      afterId = row.id;
      checked += 1;
      head = { id: row.id, hash: row.hash };
    }
    if (page.length < pageSize) break;
  }
  return { valid: brokenCount === 0, checked, head, brokenCount, broken, ...(broken[0] ? { firstBroken: broken[0] } : {}) };
}

// Reading the trail: every read is limited to what the reader may see (auditScope).

/** The filters of GET /api/audit and of the audit export, as one SQL condition. */
export function auditFilters(q: AuditQuery): SQL | undefined {
  const filters: SQL[] = [];
  if (q.run !== undefined) {
    // A code covers every revision of the run; digits alone are a run id.
    const ids = /^\d+$/.test(q.run) ? sql`(${q.run})` : sql`(SELECT ${runs.id}::text FROM ${runs} WHERE ${runs.code} = ${q.run.toUpperCase()})`;
    filters.push(and(eq(auditEvents.entityType, 'run'), sql`${auditEvents.entityId} IN ${ids}`)!);
  }
  if (q.signIns === 'hide') filters.push(notInArray(auditEvents.action, [...SIGN_IN_ACTIONS]));
  if (q.person !== undefined) filters.push(eq(auditEvents.actorId, q.person));
  if (q.action) filters.push(eq(auditEvents.action, q.action));
  if (q.entityType) filters.push(eq(auditEvents.entityType, q.entityType));
  if (q.from) filters.push(sql`${auditEvents.occurredAt} >= ${q.from}::date`);
  if (q.to) filters.push(sql`${auditEvents.occurredAt} < (${q.to}::date + 1)`);
  return filters.length ? and(...filters) : undefined;
}

export class AuditService {
  constructor(private readonly db: Database) {}

  /** One page of the trail, newest first, in the lab's words. */
  async list(person: SessionPerson, q: AuditQuery) {
    const where = and(auditFilters(q), await auditScope(this.db, person, q));
    const [items, [{ total }]] = await Promise.all([
      this.db.select().from(auditEvents).where(where).orderBy(desc(auditEvents.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
      this.db.select({ total: count() }).from(auditEvents).where(where),
    ]);
    return { items: await readableEvents(this.db, items), total, page: q.page, pageSize: q.pageSize };
  }

  /** People who appear in the part of the trail the reader may see. */
  async actors(person: SessionPerson) {
    const items = await this.db.selectDistinct({ id: people.id, name: people.name, email: people.email })
      .from(auditEvents).innerJoin(people, eq(people.id, auditEvents.actorId)).where(await auditScope(this.db, person, {})).orderBy(people.name);
    return { items };
  }
}
