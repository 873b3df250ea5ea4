// Parallel-writers drill for the audit trail (docs/BENCHMARKS.md): 10 000 mixed audited writes from 64
// concurrent clients on a fresh loopback database, then the whole chain verified. Prints forks (events
// sharing a predecessor), validity, and writes per second; then the same writes without the chain's
// lock (into an unchained copy of the table) to show what serialising the chain costs.
//   npm run drill:audit [-- WRITES CLIENTS]   (tools/drill-audit makes and drops qwell_drill)
import { eq, sql } from 'drizzle-orm';
import { createHash } from 'node:crypto';
import { createDb, type Database, type Tx } from '../db/client';
import { DEFAULT_DEMO_PASSWORD } from '../db/seed/demo-lab';
import { seedDemoLab } from '../db/seed/seed';
import { people } from '../db/schema';
import { takeCheckpoint, verifyAuditChain } from '../server/audit/audit-checkpoint';
import { recordAudit, recordAuditAlone, walkAuditChain, type AuditInput } from '../server/audit/audit-service';
import { loadConfig, ownerDatabaseUrl } from '../server/config';

const WRITES = Math.min(100_000, Number(process.argv[2] ?? 10_000));
const CLIENTS = Math.min(150, Number(process.argv[3] ?? 64));

type Write = (db: Database, i: number, personId: number) => Promise<void>;

/** The shapes of audited writes Qwell makes: alone (refused sign-ins), with one change, with two events. */
const kinds: [string, (append: (tx: Tx, input: AuditInput) => Promise<void>) => Write][] = [
  ['failed sign-in, unknown address (event alone)', (append) => async (db, i) => {
    await db.transaction((tx) => append(tx, { actorEmail: `nobody-${i}@drill.test`, action: 'auth.sign-in-failed', entityType: 'person', reason: 'unknown address', ip: '127.0.0.1' }));
  }],
  ['wrong password (counter and event)', (append) => async (db, i, personId) => {
    await db.transaction(async (tx) => {
      await tx.update(people).set({ failedAttempts: sql`(${people.failedAttempts} + 1) % 4` }).where(eq(people.id, personId));
      await append(tx, { actorId: personId, action: 'auth.sign-in-failed', entityType: 'person', entityId: personId, reason: 'wrong password', ip: '127.0.0.1', after: { i } });
    });
  }],
  ['sign-out (change and event)', (append) => async (db, i, personId) => {
    await db.transaction(async (tx) => {
      await tx.update(people).set({ sessionsValidAfter: sql`now()` }).where(eq(people.id, personId));
      await append(tx, { actorId: personId, action: 'auth.sign-out', entityType: 'person', entityId: personId, ip: '127.0.0.1', after: { i } });
    });
  }],
  ['decision (two events in one transaction)', (append) => async (db, i, personId) => {
    await db.transaction(async (tx) => {
      await append(tx, { actorId: personId, action: 'run.return', entityType: 'run', entityId: i, before: { state: 'submitted' }, after: { state: 'returned' }, reason: 'drill' });
      await append(tx, { actorId: personId, action: 'signature.create', entityType: 'signature', entityId: i, after: { runId: i } });
    });
  }],
];

async function drive(db: Database, personIds: number[], write: (i: number) => Write): Promise<number> {
  let next = 0;
  const started = process.hrtime.bigint();
  await Promise.all(Array.from({ length: CLIENTS }, async (_, c) => {
    for (let i = next++; i < WRITES; i = next++) await write(i)(db, i, personIds[(i + c) % personIds.length]);
  }));
  return Number(process.hrtime.bigint() - started) / 1e9;
}

async function main(): Promise<void> {
  const config = loadConfig();
  const host = new URL(config.databaseUrl).hostname;
  if (!['127.0.0.1', 'localhost', '::1', '[::1]'].includes(host)) throw new Error(`the drill runs on loopback only, not on ${host}`);
  const handle = createDb(config.databaseUrl, CLIENTS);
  const owner = createDb(ownerDatabaseUrl(), CLIENTS);
  try {
    await seedDemoLab(handle.db, DEFAULT_DEMO_PASSWORD);
    const personIds = (await handle.db.select({ id: people.id }).from(people)).map((p) => p.id);
    console.log(`drill: ${WRITES} audited writes, ${CLIENTS} concurrent clients, ${kinds.length} kinds (${kinds.map((k) => k[0]).join('; ')})`);

    // 1. The real thing: recordAudit under the chain's lock.
    const chained = await drive(handle.db, personIds, (i) => kinds[i % kinds.length][1](recordAudit));
    await recordAuditAlone(handle.db, { action: 'drill.end', entityType: 'drill', after: { writes: WRITES, clients: CLIENTS } });
    await takeCheckpoint(handle.db, config, 'manual');
    const forks = await handle.db.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM (SELECT prev_hash FROM audit_events GROUP BY prev_hash HAVING count(*) > 1) f`);
    const walk = await walkAuditChain(handle.db);
    const check = await verifyAuditChain(handle.db, config);
    const events = walk.checked;

    // 2. The same writes appending to an unchained copy of the table: no lock, no predecessor read.
    await owner.db.execute(sql`CREATE TABLE IF NOT EXISTS drill_unchained (LIKE audit_events INCLUDING DEFAULTS)`);
    await owner.db.execute(sql`GRANT SELECT, INSERT ON drill_unchained TO ${sql.raw(new URL(config.databaseUrl).username || 'qwell')}`);
    const unlocked = async (tx: Tx, input: AuditInput) => {
      const body = JSON.stringify(input);
      await tx.execute(sql`INSERT INTO drill_unchained (occurred_at, actor_id, actor_email, action, entity_type, entity_id, before, after, reason, ip, prev_hash, hash)
        VALUES (now(), ${input.actorId ?? null}, ${input.actorEmail ?? null}, ${input.action}, ${input.entityType}, ${input.entityId === undefined || input.entityId === null ? null : String(input.entityId)},
                ${input.before === undefined ? null : JSON.stringify(input.before)}::jsonb, ${input.after === undefined ? null : JSON.stringify(input.after)}::jsonb, ${input.reason ?? null}, ${input.ip ?? null},
                '-', ${createHash('sha256').update(body).digest('hex')})`);
    };
    const free = await drive(handle.db, personIds, (i) => kinds[i % kinds.length][1](unlocked));

    const rate = (s: number) => Math.round(WRITES / s);
    console.log(`chained:   ${WRITES} writes (${events} events in the trail) in ${chained.toFixed(1)} s = ${rate(chained)} writes/s`);
    console.log(`forks: ${forks[0].n}`);
    console.log(`verify: valid ${check.valid}, ${check.checked} events checked, ${check.brokenCount} breaks, checkpoint ${check.checkpoint ? (check.checkpoint.holds ? 'holds' : `does not hold: ${check.checkpoint.reason}`) : 'none'}`);
    console.log(`unchained: ${WRITES} writes in ${free.toFixed(1)} s = ${rate(free)} writes/s`);
    console.log(`cost of serialising the chain: ${rate(free) - rate(chained)} writes/s (${(100 * (1 - rate(chained) / rate(free))).toFixed(0)} % fewer)`);
    if (forks[0].n !== 0 || !check.valid) process.exitCode = 1;
  } finally {
    await handle.close();
    await owner.close();
  }
}

main().catch((error: unknown) => {
  console.error('[drill] failed:', error instanceof Error ? error.message : error);
  process.exit(1);
});
