import postgres from 'postgres';
import { startHarness, type ApiHarness } from '../../testing/api-harness';
import { recordAuditAlone } from './audit-service';
import { testAuditAction } from '../../testing/test-audit-action';

// The app's own database role (DATABASE_URL) may only append to the trail and read it: every statement
// that could change, hide or unprotect a written event is refused by PostgreSQL's privileges, before
// any trigger runs. Before the role split the app's role owned audit_events and all of these but the
// trigger-guarded UPDATE/DELETE/TRUNCATE succeeded (ALTER TABLE … DISABLE TRIGGER first, then anything).

let h: ApiHarness;
let app: postgres.Sql;
beforeAll(async () => {
  h = await startHarness();
  await recordAuditAlone(h.handle.db, { action: testAuditAction('test.runtime-role'), entityType: 'test' });
  app = postgres(process.env['DATABASE_URL']!, { onnotice: () => undefined, max: 1 });
});
afterAll(async () => {
  await app.end();
  await h.close();
});

const forbidden = [
  'UPDATE audit_events SET reason = \'edited\'',
  'DELETE FROM audit_events',
  'TRUNCATE audit_events',
  'ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_update_delete',
  'ALTER TABLE audit_events DISABLE TRIGGER ALL',
  'DROP TRIGGER audit_events_no_update_delete ON audit_events',
  'CREATE TRIGGER sneak BEFORE INSERT ON audit_events FOR EACH ROW EXECUTE FUNCTION audit_events_refuse_change()',
  'ALTER TABLE audit_events ADD COLUMN note text',
  'ALTER TABLE audit_events OWNER TO qwell',
  'DROP TABLE audit_events',
  'CREATE OR REPLACE FUNCTION audit_events_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$',
  'UPDATE audit_checkpoints SET head_hash = \'x\'',
  'DELETE FROM audit_checkpoints',
  'TRUNCATE audit_checkpoints',
  'ALTER TABLE audit_checkpoints DISABLE TRIGGER ALL',
  'DROP TABLE audit_checkpoints',
  'SELECT * FROM drizzle.__drizzle_migrations',
  'SET ROLE qwell_owner',
  'CREATE TABLE public.shadow (id int)',
  'CREATE SCHEMA shadow',
  'TRUNCATE runs',
];

describe('the runtime role (the one the app connects as)', () => {
  it('is not the owner role', async () => {
    const [me] = await app<{ user: string; owner: string }[]>`
      SELECT current_user AS user, pg_get_userbyid(c.relowner) AS owner FROM pg_class c WHERE c.relname = 'audit_events'`;
    expect(me.owner).not.toBe(me.user);
  });

  it.each(forbidden)('is refused: %s', async (statement) => {
    const outcome = await app.begin(async (tx) => tx.unsafe(statement)).then(
      () => 'allowed',
      (e: postgres.PostgresError) => `${e.code} ${e.message}`,
    );
    // 42501 is insufficient_privilege: "permission denied for …" or "must be owner of …".
    expect(outcome).toMatch(/^42501 (permission denied|must be owner)/);
  });

  it('holds no right on the trail but SELECT and INSERT (so it cannot grant any either)', async () => {
    const rights = await app<{ privilege: string; has: boolean }[]>`
      SELECT p AS privilege, has_table_privilege(current_user, t, p) AS has
      FROM unnest(ARRAY['SELECT', 'INSERT', 'UPDATE', 'DELETE', 'TRUNCATE', 'REFERENCES', 'TRIGGER']) AS p,
           unnest(ARRAY['audit_events', 'audit_checkpoints']) AS t`;
    expect(rights.filter((r) => r.has).map((r) => r.privilege).sort()).toEqual(['INSERT', 'INSERT', 'SELECT', 'SELECT']);
  });

  it('may still append to the trail and read it', async () => {
    const before = await app`SELECT count(*)::int AS n FROM audit_events`;
    await recordAuditAlone(h.handle.db, { action: testAuditAction('test.runtime-role'), entityType: 'test' });
    const after = await app`SELECT count(*)::int AS n FROM audit_events`;
    expect(after[0].n).toBe(before[0].n + 1);
  });
});
