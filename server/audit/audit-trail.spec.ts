import { eq, sql } from 'drizzle-orm';
import postgres from 'postgres';
import { auditEvents } from '../../db/schema';
import { ownerDatabaseUrl } from '../config';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { verifyAuditChain as verifyWith } from './audit-checkpoint';
import { recordAuditAlone as recordAudit } from './audit-service';
import { testAuditAction } from '../../testing/test-audit-action';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

const verifyAuditChain = (db: ApiHarness['handle']['db']) => verifyWith(db, h.config);

/** The owner role (tools/pg owner-url): it owns the table and may step behind its trigger, as an attacker with it could. */
function superuser(): postgres.Sql {
  return postgres(ownerDatabaseUrl(), { onnotice: () => undefined, max: 1 });
}

describe('the audit trail', () => {
  it('is refused UPDATE, DELETE and TRUNCATE by the database (its trigger, for the owner too)', async () => {
    await recordAudit(h.handle.db, { action: testAuditAction('test.event'), entityType: 'test', after: { n: 1 } });
    const [last] = await h.handle.db.select().from(auditEvents).orderBy(sql`id desc`).limit(1);
    const su = superuser();
    try {
      const refusal = (q: Promise<unknown>) => q.then(() => 'allowed', (e: Error) => e.message);
      expect(await refusal(su`UPDATE audit_events SET reason = 'edited' WHERE id = ${last.id}`)).toBe('audit_events is append-only: UPDATE is refused');
      expect(await refusal(su`DELETE FROM audit_events WHERE id = ${last.id}`)).toBe('audit_events is append-only: DELETE is refused');
      expect(await refusal(su`TRUNCATE audit_events`)).toBe('audit_events is append-only: TRUNCATE is refused');
      expect(await refusal(su`TRUNCATE audit_checkpoints`)).toBe('audit_checkpoints is append-only: TRUNCATE is refused');
    } finally {
      await su.end();
    }
    const [still] = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.id, last.id));
    expect(still.reason).toBeNull();
  });

  it('names the altered event when someone tampers with a row behind the trigger\'s back', async () => {
    for (let i = 0; i < 3; i++) await recordAudit(h.handle.db, { action: testAuditAction('test.chain'), entityType: 'test', entityId: i, after: { i } });
    expect((await verifyAuditChain(h.handle.db)).valid).toBe(true);
    const rows = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'test.chain')).orderBy(auditEvents.id);
    const victim = rows[1];
    const su = superuser();
    try {
      await su.begin(async (tx) => {
        await tx`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete`;
        await tx`UPDATE audit_events SET after = ${tx.json({ i: 99 })} WHERE id = ${victim.id}`;
        await tx`ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete`;
      });
      const investigator = await clientAs(h.app, 'investigator');
      const res = await investigator.get('/api/audit/verify');
      expect(res.status).toBe(200);
      expect(res.body.valid).toBe(false);
      expect(res.body.firstBroken.id).toBe(victim.id);
      expect(res.body.firstBroken.reason).toMatch(/altered/);
    } finally {
      // Put the row back so later tests see a valid chain again.
      await su.begin(async (tx) => {
        await tx`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete`;
        await tx`UPDATE audit_events SET after = ${tx.json({ i: 1 })} WHERE id = ${victim.id}`;
        await tx`ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete`;
      });
      await su.end();
    }
    expect((await verifyAuditChain(h.handle.db)).valid).toBe(true);
  });

  it('reports a removed event as a broken link', async () => {
    await recordAudit(h.handle.db, { action: testAuditAction('test.remove'), entityType: 'test', entityId: 'a' });
    await recordAudit(h.handle.db, { action: testAuditAction('test.remove'), entityType: 'test', entityId: 'b' });
    const [a, b] = await h.handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'test.remove')).orderBy(auditEvents.id);
    const su = superuser();
    try {
      await su.begin(async (tx) => {
        await tx`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete`;
        await tx`DELETE FROM audit_events WHERE id = ${a.id}`;
        await tx`ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete`;
      });
      const check = await verifyAuditChain(h.handle.db);
      expect(check).toMatchObject({ valid: false, firstBroken: { id: b.id } });
      expect(check.firstBroken!.reason).toMatch(/removed or altered/);
    } finally {
      // Restore the removed row exactly as it was.
      await su.begin(async (tx) => {
        await tx`ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete`;
        await tx`INSERT INTO audit_events (id, occurred_at, actor_id, actor_email, action, entity_type, entity_id, before, after, reason, ip, prev_hash, hash)
                 VALUES (${a.id}, ${a.occurredAt}, ${a.actorId}, ${a.actorEmail}, ${a.action}, ${a.entityType}, ${a.entityId}, ${a.before as never}, ${a.after as never}, ${a.reason}, ${a.ip}, ${a.prevHash}, ${a.hash})`;
        await tx`ALTER TABLE audit_events ENABLE TRIGGER audit_events_no_update_delete`;
      });
      await su.end();
    }
    expect((await verifyAuditChain(h.handle.db)).valid).toBe(true);
  });
});
