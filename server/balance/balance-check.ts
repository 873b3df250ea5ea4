import { and, eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { balanceResults, people, runs } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import type { Config } from '../config';
import { checkRunDocument } from '../engine';
import { projectAddresses, queueMail, roleAddresses } from '../mail/outbox';
import { loadRunDocument } from '../runs/run-loader';
import type { RunSetup } from '../runs/run-setup';
import { runEnteredAt, runStandardization } from '../standardizations/standardization-pin';
import { runLink } from '../mail/run-link';
import { plainProblem } from '../runs/submit-checklist';
import { overPressureMail, overPressureOf } from './over-pressure';
import { whySentence } from './why-sentence';

export type CheckOutcome = 'stored' | 'stale' | 'invalid';

/**
 * The queued balance check of one run version: engine, stored result, verdict on the run, audit
 * event and mail, all in one transaction. A run edited since it was queued is left alone.
 */
export async function runBalanceCheck(db: Database, config: Config, runId: number, version: number): Promise<CheckOutcome> {
  const [run] = await db.select().from(runs).where(eq(runs.id, runId));
  if (!run || run.version !== version || run.state !== 'submitted') return 'stale';
  const doc = await loadRunDocument(db, run, config.labName, { useFittedHeatLoss: config.useFittedHeatLoss });
  // Engine work happens outside the transaction: it can take a second on a large run.
  const checked = checkRunDocument(doc, config.balance);

  return db.transaction(async (tx) => {
    const [locked] = await tx.select().from(runs).where(eq(runs.id, runId)).for('update');
    if (!locked || locked.version !== version || locked.state !== 'submitted') return 'stale';
    const [author] = await tx.select({ email: people.email }).from(people).where(eq(people.id, locked.authorId));
    if (!checked.ok) {
      // The document passed validation at submit; a register change since can still make it unreadable.
      // The run goes back to its author rather than waiting for a check that cannot succeed.
      const reason = `The balance check could not read the run: ${checked.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`;
      await tx.update(runs).set({ state: 'returned', returnReason: reason.slice(0, 2000), version: locked.version + 1, updatedAt: sql`now()` }).where(eq(runs.id, runId));
      await recordAudit(tx, { action: 'run.check-failed', entityType: 'run', entityId: runId, before: { state: 'submitted' }, after: { state: 'returned', errors: checked.errors }, reason: 'the engine could not read the run' });
      const hasGas = Boolean((locked.setup as { gas?: unknown } | null)?.gas || locked.gasId);
      const problems = checked.errors.map((e) => `- ${plainProblem(e.path, e.message, hasGas, doc.readings.time?.values?.length ?? 0).message}`);
      await queueMail(tx, [{
        to: author.email, subject: `Run ${locked.code}: the balance check could not run`,
        body: `The balance check could not read run ${locked.code} "${locked.title}", so it is back with you for correction:\n${problems.join('\n')}\nOpen the run: ${runLink(config.publicUrl, runId)}`,
        dedupeKey: balanceMailKey(runId, version, 'unreadable'),
      }]);
      return 'invalid';
    }
    // A check of a version already checked (the queue delivers at least once; a lost job is swept up again)
    // must not mail the same safety event twice: was it already found, and so mailed, for this version?
    const [mailedBefore] = await tx.select({ id: balanceResults.id }).from(balanceResults)
      .where(and(eq(balanceResults.runId, runId), eq(balanceResults.runVersion, version), sql`${balanceResults.result}->'flags' @> '[{"code":"ABOVE_RATED_PRESSURE"}]'::jsonb`))
      .limit(1);
    const pin = await runStandardization(tx, { apparatusId: locked.apparatusId, runDate: locked.runDate, enteredAt: await runEnteredAt(tx, locked.code) }, { useFittedHeatLoss: config.useFittedHeatLoss, setup: (locked.setup ?? {}) as RunSetup });
    const result = { ...checked.result, standardization: pin.standardization, flags: pin.flag ? [...checked.result.flags, pin.flag] : checked.result.flags };
    await tx.update(balanceResults).set({ current: false }).where(and(eq(balanceResults.runId, runId), eq(balanceResults.current, true)));
    const [stored] = await tx.insert(balanceResults).values({
      runId, runVersion: version, engineVersion: result.engineVersion, inputHash: result.inputHash, verdict: result.verdict,
      en: result.En, residual: result.residual.r, expandedUncertainty: result.residual.U, result: result as unknown as Record<string, unknown>,
    }).returning({ id: balanceResults.id });
    await tx.update(runs).set({ verdict: result.verdict, updatedAt: sql`now()` }).where(eq(runs.id, runId));
    await recordAudit(tx, {
      action: 'run.checked', entityType: 'run', entityId: runId,
      after: { resultId: stored.id, verdict: result.verdict, En: result.En, inputHash: result.inputHash, engineVersion: result.engineVersion },
    });
    if (result.verdict === 'breaks') {
      const investigators = await projectAddresses(tx, locked.projectId, 'investigator');
      const body = `Run ${locked.code} "${locked.title}" does not close its energy balance: En = ${result.En?.toFixed(2)} (> 1).\nr = ΔU − (Q − W) = ${result.residual.r.toPrecision(4)} J, U(r) = ${result.residual.U.toPrecision(2)} J (k = ${result.residual.k}).\nWhy: ${whySentence(result)}\nOpen the run to see the flags and hints: ${runLink(config.publicUrl, runId)}`;
      // Once per run version and verdict, to each address: a retried job, a second check of the same
      // version or two checks at once queue no second mail (the outbox's unique key drops repeats).
      const dedupeKey = balanceMailKey(runId, version, result.verdict);
      await queueMail(tx, [...new Set([...investigators, author.email])].map((to) => ({ to, subject: `Run ${locked.code}: the energy balance breaks`, body, dedupeKey })));
    }
    const over = overPressureOf(result);
    if (over && !mailedBefore) {
      // A safety event, whatever the verdict: the project's investigators and every quality officer hear of it, once per run version.
      const to = new Set([...(await projectAddresses(tx, locked.projectId, 'investigator')), ...(await roleAddresses(tx, ['quality']))]);
      const mail = overPressureMail(locked, over, runLink(config.publicUrl, runId));
      await queueMail(tx, [...to].map((address) => ({ to: address, ...mail, dedupeKey: balanceMailKey(runId, version, 'over-pressure') })));
    }
    return 'stored';
  });
}

/** The outbox key of a mail about one run version's check: one mail per run, version and finding. */
export function balanceMailKey(runId: number, version: number, finding: string): string {
  return `balance:${runId}:${version}:${finding}`;
}

/** Re-queues checks that a crash may have lost: submitted runs with no result for their version. */
export async function submittedWithoutResult(db: Database): Promise<{ runId: number; version: number }[]> {
  const rows = await db.execute<{ id: number; version: number }>(sql`
    SELECT r.id, r.version FROM runs r
    WHERE r.state = 'submitted'
      AND NOT EXISTS (SELECT 1 FROM balance_results b WHERE b.run_id = r.id AND b.run_version = r.version)`);
  return [...rows].map((r) => ({ runId: r.id, version: r.version }));
}
