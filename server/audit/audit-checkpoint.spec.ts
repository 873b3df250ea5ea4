import { desc, eq, gt } from 'drizzle-orm';
import { existsSync, readdirSync } from 'node:fs';
import postgres from 'postgres';
import { auditCheckpoints, auditEvents } from '../../db/schema';
import { ownerDatabaseUrl } from '../config';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { takeCheckpoint, verifyAuditChain } from './audit-checkpoint';
import { recordAuditAlone } from './audit-service';
import { testAuditAction } from '../../testing/test-audit-action';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

type EventRow = typeof auditEvents.$inferSelect;
type CheckpointRow = typeof auditCheckpoints.$inferSelect;

/** The owner role steps behind the trigger, as someone holding it could; every test puts the rows back. */
async function behindTrigger(work: (tx: postgres.TransactionSql) => Promise<unknown>): Promise<void> {
  const su = postgres(ownerDatabaseUrl(), { onnotice: () => undefined, max: 1 });
  try {
    await su.begin(async (tx) => {
      await tx`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete`;
      await tx`ALTER TABLE audit_checkpoints DISABLE TRIGGER audit_checkpoints_no_update_delete`;
      await work(tx);
      await tx`ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete`;
      await tx`ALTER TABLE audit_checkpoints ENABLE TRIGGER audit_checkpoints_no_update_delete`;
    });
  } finally {
    await su.end();
  }
}

const putBack = (tx: postgres.TransactionSql, a: EventRow) => tx`
  INSERT INTO audit_events (id, occurred_at, actor_id, actor_email, action, entity_type, entity_id, before, after, reason, ip, prev_hash, hash)
  VALUES (${a.id}, ${a.occurredAt}, ${a.actorId}, ${a.actorEmail}, ${a.action}, ${a.entityType}, ${a.entityId}, ${a.before as never}, ${a.after as never}, ${a.reason}, ${a.ip}, ${a.prevHash}, ${a.hash})`;
const putBackCheckpoint = (tx: postgres.TransactionSql, c: CheckpointRow) => tx`
  INSERT INTO audit_checkpoints (id, taken_at, event_count, head_id, head_hash, reason, key_id, signature)
  VALUES (${c.id}, ${c.takenAt}, ${c.eventCount}, ${c.headId}, ${c.headHash}, ${c.reason}, ${c.keyId}, ${c.signature})`;

describe('signed checkpoints of the trail\'s head', () => {
  it('names the truncation when the newest events are deleted, which the chain alone cannot show', async () => {
    for (const n of [1, 2, 3]) await recordAuditAlone(h.handle.db, { action: testAuditAction('test.tail'), entityType: 'test', entityId: n });
    const checkpoint = (await takeCheckpoint(h.handle.db, h.config, 'manual'))!;
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
    const tail = await h.handle.db.select().from(auditEvents).where(gt(auditEvents.id, checkpoint.headId - 2)).orderBy(auditEvents.id);
    expect(tail.map((e) => e.id)).toEqual([checkpoint.headId - 1, checkpoint.headId]);
    // Signed in before the tampering: a sign-in while the tail is gone would link to the shortened chain.
    const quality = await clientAs(h.app, 'quality');
    await behindTrigger((tx) => tx`DELETE FROM audit_events WHERE id >= ${checkpoint.headId - 1}`);
    try {
      const check = await verifyAuditChain(h.handle.db, h.config);
      // The shorter chain still links up: only the checkpoint shows what is missing.
      expect(check.brokenCount).toBe(0);
      expect(check.valid).toBe(false);
      expect(check.checkpoint).toMatchObject({ id: checkpoint.id, holds: false, source: 'database', headId: checkpoint.headId });
      expect(check.checkpoint!.reason).toMatch(new RegExp(`truncated: .*${checkpoint.eventCount} events ending at event ${checkpoint.headId}`));
      const res = await quality.get('/api/audit/verify');
      expect(res.body).toMatchObject({ valid: false, checkpoint: { holds: false } });
    } finally {
      await behindTrigger(async (tx) => {
        for (const e of tail) await putBack(tx, e);
      });
    }
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
  });

  it('still names it when the newest checkpoints are deleted too: the copy outside the database keeps them', async () => {
    await recordAuditAlone(h.handle.db, { action: testAuditAction('test.tail-file'), entityType: 'test' });
    const checkpoint = (await takeCheckpoint(h.handle.db, h.config, 'manual'))!;
    expect(existsSync(h.config.auditAnchorDir) && readdirSync(h.config.auditAnchorDir).length).toBeTruthy();
    const [event] = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.id, checkpoint.headId));
    const [row] = await h.handle.db.select().from(auditCheckpoints).where(eq(auditCheckpoints.id, checkpoint.id));
    await behindTrigger(async (tx) => {
      await tx`DELETE FROM audit_events WHERE id = ${checkpoint.headId}`;
      await tx`DELETE FROM audit_checkpoints WHERE id = ${checkpoint.id}`;
    });
    try {
      const check = await verifyAuditChain(h.handle.db, h.config);
      expect(check.valid).toBe(false);
      expect(check.checkpoint).toMatchObject({ source: 'file', holds: false, headId: checkpoint.headId });
    } finally {
      await behindTrigger(async (tx) => {
        await putBack(tx, event);
        await putBackCheckpoint(tx, row);
      });
    }
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
  });

  it('refuses a checkpoint that was not signed with the server\'s key', async () => {
    const real = (await takeCheckpoint(h.handle.db, h.config, 'manual'))!;
    // The runtime role may append a checkpoint, but cannot sign one: a forged one is named, not trusted.
    const [forged] = await h.handle.db.insert(auditCheckpoints).values({
      takenAt: new Date(), eventCount: real.eventCount, headId: real.headId, headHash: real.headHash, reason: 'manual', keyId: real.keyId,
      signature: Buffer.alloc(64, 7).toString('base64'),
    }).returning();
    try {
      const check = await verifyAuditChain(h.handle.db, h.config);
      expect(check.valid).toBe(false);
      expect(check.checkpoint).toMatchObject({ id: forged.id, holds: false });
      expect(check.checkpoint!.reason).toMatch(/does not carry a valid signature/);
    } finally {
      await behindTrigger((tx) => tx`DELETE FROM audit_checkpoints WHERE id = ${forged.id}`);
    }
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
  });
});

describe('verify names every break', () => {
  it('lists an altered event after a removed one, with the count', async () => {
    for (const n of [1, 2, 3, 4]) await recordAuditAlone(h.handle.db, { action: testAuditAction('test.breaks'), entityType: 'test', entityId: n, after: { n } });
    const rows = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'test.breaks')).orderBy(desc(auditEvents.id)).limit(4);
    const [fourth, third, , first] = rows;
    const quality = await clientAs(h.app, 'quality');
    await behindTrigger(async (tx) => {
      await tx`DELETE FROM audit_events WHERE id = ${first.id}`;
      await tx`UPDATE audit_events SET after = ${tx.json({ n: 99 })} WHERE id = ${fourth.id}`;
    });
    try {
      const res = await quality.get('/api/audit/verify');
      expect(res.body.valid).toBe(false);
      expect(res.body.firstBroken.id).toBe(first.id + 1);
      expect(res.body.brokenCount).toBe(2);
      expect(res.body.broken.map((b: { id: number }) => b.id)).toEqual([first.id + 1, fourth.id]);
      expect(res.body.broken[1].reason).toMatch(/altered/);
      expect(third.id).toBeLessThan(fourth.id);
    } finally {
      await behindTrigger(async (tx) => {
        await tx`UPDATE audit_events SET after = ${tx.json({ n: 4 })} WHERE id = ${fourth.id}`;
        await putBack(tx, first);
      });
    }
    const after = await verifyAuditChain(h.handle.db, h.config);
    expect(after).toMatchObject({ valid: true, brokenCount: 0 });
  });
});
