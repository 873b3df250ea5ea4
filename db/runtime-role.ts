import PgBoss from 'pg-boss';
import type postgres from 'postgres';

/**
 * The rights of the runtime role, the one the app connects as (docs/SECURITY.md, "database roles").
 * Run by the owner role after every migration, so a new table gets its grants at once:
 * - the audit trail and its checkpoints: SELECT and INSERT only (no UPDATE, DELETE, TRUNCATE,
 *   REFERENCES or TRIGGER; not the owner, so no ALTER, no DISABLE TRIGGER, no DROP);
 * - every other table in public: SELECT, INSERT, UPDATE, DELETE (no TRUNCATE, no DDL);
 * - sequences: USAGE and SELECT (bigserial ids);
 * - drizzle's migration table: nothing;
 * - pg-boss's schema: owned by the runtime role, since pg-boss makes a table per queue as it runs.
 *   The owner installs it once under the runtime role's name, lending CREATE on the database for the
 *   length of that one transaction.
 */
export const APPEND_ONLY_TABLES = ['audit_events', 'audit_checkpoints'] as const;

const ident = (name: string) => `"${name.replace(/"/g, '""')}"`;

export async function grantRuntimeRights(sql: postgres.Sql, runtimeRole: string): Promise<void> {
  const role = ident(runtimeRole);
  const [{ db, me }] = await sql<{ db: string; me: string }[]>`SELECT current_database() AS db, current_user AS me`;
  if (me === runtimeRole) throw new Error(`Migrations must run as the owner role, not as the runtime role ${runtimeRole} (set DATABASE_OWNER_URL; see DEVELOPERS.md).`);
  await sql.begin(async (tx) => {
    await tx.unsafe(`REVOKE ALL ON SCHEMA public FROM ${role}`);
    await tx.unsafe(`GRANT USAGE ON SCHEMA public TO ${role}`);
    await tx.unsafe(`REVOKE ALL ON ALL TABLES IN SCHEMA public FROM ${role}`);
    await tx.unsafe(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${role}`);
    for (const table of APPEND_ONLY_TABLES) {
      await tx.unsafe(`REVOKE ALL ON ${ident(table)} FROM ${role}`);
      await tx.unsafe(`GRANT SELECT, INSERT ON ${ident(table)} TO ${role}`);
    }
    await tx.unsafe(`REVOKE ALL ON ALL SEQUENCES IN SCHEMA public FROM ${role}`);
    await tx.unsafe(`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${role}`);
    await tx.unsafe(`REVOKE ALL ON ALL FUNCTIONS IN SCHEMA public FROM PUBLIC`);
    await tx.unsafe(`GRANT EXECUTE ON ALL FUNCTIONS IN SCHEMA public TO ${role}`);
    await tx.unsafe(`REVOKE CREATE ON DATABASE ${ident(db)} FROM ${role}`);
  });
  await installJobQueueSchema(sql, runtimeRole, db);
}

/** pg-boss's schema, installed once and owned by the runtime role; a schema left with the owner (a
 * restored backup, a cluster from before the role split) is handed back to the runtime role. */
async function installJobQueueSchema(sql: postgres.Sql, runtimeRole: string, db: string): Promise<void> {
  const role = ident(runtimeRole);
  const [installed] = await sql<{ owner: string }[]>`
    SELECT pg_get_userbyid(n.nspowner) AS owner FROM pg_namespace n WHERE n.nspname = 'pgboss' AND to_regclass('pgboss.version') IS NOT NULL`;
  if (!installed) {
    const plan = PgBoss.getConstructionPlans('pgboss');
    const lent = plan
      .replace('BEGIN;', `BEGIN; GRANT CREATE ON DATABASE ${ident(db)} TO ${role}; SET LOCAL ROLE ${role};`)
      .replace(/COMMIT;\s*$/, `RESET ROLE; REVOKE CREATE ON DATABASE ${ident(db)} FROM ${role}; COMMIT;`);
    await sql.unsafe(lent);
    return;
  }
  if (installed.owner === runtimeRole) return;
  await sql.begin(async (tx) => {
    await tx.unsafe(`ALTER SCHEMA pgboss OWNER TO ${role}`);
    const relations = await tx<{ name: string; kind: string }[]>`
      SELECT c.relname AS name, c.relkind AS kind FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
      WHERE n.nspname = 'pgboss' AND c.relkind IN ('r', 'p', 'v', 'm', 'S')
        -- A sequence owned by a column follows its table; tables and partitions are each handed over.
        AND NOT (c.relkind = 'S' AND EXISTS (SELECT 1 FROM pg_depend d WHERE d.objid = c.oid AND d.classid = 'pg_class'::regclass AND d.deptype IN ('a', 'i')))`;
    for (const r of relations) {
      const kind = r.kind === 'S' ? 'SEQUENCE' : r.kind === 'v' ? 'VIEW' : r.kind === 'm' ? 'MATERIALIZED VIEW' : 'TABLE';
      await tx.unsafe(`ALTER ${kind} pgboss.${ident(r.name)} OWNER TO ${role}`);
    }
    const functions = await tx<{ signature: string }[]>`
      SELECT p.oid::regprocedure::text AS signature FROM pg_proc p JOIN pg_namespace n ON n.oid = p.pronamespace WHERE n.nspname = 'pgboss'`;
    for (const f of functions) await tx.unsafe(`ALTER ROUTINE ${f.signature} OWNER TO ${role}`);
    const types = await tx<{ name: string }[]>`
      SELECT t.typname AS name FROM pg_type t JOIN pg_namespace n ON n.oid = t.typnamespace
      WHERE n.nspname = 'pgboss' AND t.typtype IN ('e', 'd') `;
    for (const t of types) await tx.unsafe(`ALTER TYPE pgboss.${ident(t.name)} OWNER TO ${role}`);
  });
}
