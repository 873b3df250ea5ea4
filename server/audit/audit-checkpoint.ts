import { asc, count, desc, eq, lte, max, sql } from 'drizzle-orm';
import { createHash, createPrivateKey, createPublicKey, sign, verify, type KeyObject } from 'node:crypto';
import { appendFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Database, DbOrTx } from '../../db/client';
import { auditCheckpoints, auditEvents } from '../../db/schema';
import { canonicalJson } from '../core/canonical-json';
import { CHAIN_LOCK, walkAuditChain, type ChainCheck, type CheckpointCheck } from './audit-service';

/**
 * Signed checkpoints anchor the head of the audit trail outside its table. The chain alone shows an
 * event altered or removed in the middle, but not events removed from the end: the shorter chain is
 * still a valid chain. A checkpoint states how many events there were and the newest one's hash,
 * signed (Ed25519) with a key the database does not hold; it is stored in audit_checkpoints and also
 * appended to a file outside the database. Verifying compares the trail with the latest of them.
 */
export interface AnchorSettings {
  auditSigningKey: string;
  auditAnchorDir: string;
}

export interface CheckpointKey {
  privateKey: KeyObject;
  publicKey: KeyObject;
  keyId: string;
}

const keys = new Map<string, CheckpointKey>();

export function checkpointKey(settings: AnchorSettings): CheckpointKey {
  const cached = keys.get(settings.auditSigningKey);
  if (cached) return cached;
  const privateKey = createPrivateKey(settings.auditSigningKey);
  if (privateKey.asymmetricKeyType !== 'ed25519') throw new Error('The audit signing key must be an Ed25519 private key (PKCS#8 PEM).');
  const publicKey = createPublicKey(privateKey);
  const keyId = createHash('sha256').update(publicKey.export({ type: 'spki', format: 'der' })).digest('hex').slice(0, 16);
  const key = { privateKey, publicKey, keyId };
  keys.set(settings.auditSigningKey, key);
  return key;
}

export interface Checkpoint {
  id: number;
  takenAt: string;
  eventCount: number;
  headId: number;
  headHash: string;
  reason: string;
  keyId: string;
  signature: string;
}

/** The signed text: a fixed label and the canonical JSON of what the checkpoint states. */
function signedText(c: Pick<Checkpoint, 'takenAt' | 'eventCount' | 'headId' | 'headHash'>): Buffer {
  return Buffer.from(`qwell-audit-checkpoint-v1\n${canonicalJson({ takenAt: c.takenAt, eventCount: c.eventCount, headId: c.headId, headHash: c.headHash })}`);
}

export function signatureHolds(c: Checkpoint, key: CheckpointKey): boolean {
  if (c.keyId !== key.keyId) return false;
  try {
    return verify(null, signedText(c), key.publicKey, Buffer.from(c.signature, 'base64'));
  } catch {
    return false;
  }
}

/** The anchor file of one trail, named by its first event's hash (a fresh database starts a new file). */
async function anchorFile(db: DbOrTx, dir: string): Promise<string | null> {
  const [first] = await db.select({ hash: auditEvents.hash }).from(auditEvents).orderBy(asc(auditEvents.id)).limit(1);
  return first ? join(dir, `trail-${first.hash.slice(0, 16)}.jsonl`) : null;
}

/** Takes a checkpoint of the trail's head now (under the chain's lock, so no event is half-written). */
export async function takeCheckpoint(db: Database, settings: AnchorSettings, reason: 'schedule' | 'export' | 'manual'): Promise<Checkpoint | null> {
  const key = checkpointKey(settings);
  const taken = await db.transaction(async (tx) => {
    await tx.execute(sql`SELECT pg_advisory_xact_lock(${CHAIN_LOCK})`);
    const [head] = await tx.select({ id: auditEvents.id, hash: auditEvents.hash }).from(auditEvents).orderBy(desc(auditEvents.id)).limit(1);
    if (!head) return null;
    const [{ n }] = await tx.select({ n: count() }).from(auditEvents);
    const stated = { takenAt: new Date().toISOString(), eventCount: Number(n), headId: head.id, headHash: head.hash };
    const signature = sign(null, signedText(stated), key.privateKey).toString('base64');
    const [row] = await tx.insert(auditCheckpoints).values({ ...stated, takenAt: new Date(stated.takenAt), reason, keyId: key.keyId, signature }).returning();
    return { ...stated, id: row.id, reason, keyId: key.keyId, signature } satisfies Checkpoint;
  });
  if (taken) {
    const file = await anchorFile(db, settings.auditAnchorDir);
    if (file) {
      mkdirSync(settings.auditAnchorDir, { recursive: true });
      appendFileSync(file, `${JSON.stringify(taken)}\n`, { mode: 0o600 });
    }
  }
  return taken;
}

function toCheckpoint(r: typeof auditCheckpoints.$inferSelect): Checkpoint {
  return { id: r.id, takenAt: r.takenAt.toISOString(), eventCount: r.eventCount, headId: r.headId, headHash: r.headHash, reason: r.reason, keyId: r.keyId, signature: r.signature };
}

/** The latest checkpoint with a valid signature in the file, by event count. */
function latestInFile(file: string | null, key: CheckpointKey): Checkpoint | null {
  if (!file || !existsSync(file)) return null;
  let best: Checkpoint | null = null;
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    if (!line.trim()) continue;
    let c: Checkpoint;
    try {
      c = JSON.parse(line) as Checkpoint;
    } catch {
      continue;
    }
    if (signatureHolds(c, key) && (!best || c.eventCount > best.eventCount)) best = c;
  }
  return best;
}

/** Compares the trail as it is now with one checkpoint. */
async function compare(db: DbOrTx, c: Checkpoint, source: CheckpointCheck['source'], key: CheckpointKey): Promise<CheckpointCheck> {
  const base = { id: c.id, takenAt: c.takenAt, eventCount: c.eventCount, headId: c.headId, headHash: c.headHash, keyId: c.keyId, signature: c.signature, source };
  const when = `the checkpoint of ${c.takenAt}`;
  if (!signatureHolds(c, key)) {
    return { ...base, holds: false, reason: `${when} does not carry a valid signature of this server's key (${key.keyId}): it was not made by Qwell, or it was altered` };
  }
  const [row] = await db.select({ hash: auditEvents.hash }).from(auditEvents).where(eq(auditEvents.id, c.headId));
  if (!row) {
    const [{ last }] = await db.select({ last: max(auditEvents.id) }).from(auditEvents);
    const [{ n }] = await db.select({ n: count() }).from(auditEvents);
    return {
      ...base, holds: false,
      reason: `the trail was truncated: ${when} recorded ${c.eventCount} events ending at event ${c.headId}, but event ${c.headId} is gone (the trail now has ${n} events, the newest is ${last ?? 'none'})`,
    };
  }
  if (row.hash !== c.headHash) {
    return { ...base, holds: false, reason: `event ${c.headId} no longer has the hash ${when} recorded: the trail was rewritten up to it` };
  }
  const [{ n }] = await db.select({ n: count() }).from(auditEvents).where(lte(auditEvents.id, c.headId));
  if (Number(n) !== c.eventCount) {
    return { ...base, holds: false, reason: `${when} recorded ${c.eventCount} events up to event ${c.headId}; there are now ${n}: events were removed or inserted before it` };
  }
  return { ...base, holds: true };
}

/**
 * Walks the chain (every break named) and compares it with the latest checkpoint, from the database
 * or the file outside it, whichever states more events. Valid only when both hold.
 */
export async function verifyAuditChain(db: DbOrTx, settings: AnchorSettings): Promise<ChainCheck> {
  const key = checkpointKey(settings);
  const chain = await walkAuditChain(db);
  const [latestRow] = await db.select().from(auditCheckpoints).orderBy(desc(auditCheckpoints.id)).limit(1);
  const fromDb = latestRow ? toCheckpoint(latestRow) : null;
  const fromFile = latestInFile(await anchorFile(db, settings.auditAnchorDir), key);
  const latest = fromFile && (!fromDb || fromFile.eventCount > fromDb.eventCount) ? { c: fromFile, source: 'file' as const } : fromDb ? { c: fromDb, source: 'database' as const } : null;
  if (!latest) return chain;
  const checkpoint = await compare(db, latest.c, latest.source, key);
  return { ...chain, valid: chain.valid && checkpoint.holds, checkpoint };
}
