import { and, eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import type { Config } from '../config';
import { balanceResults, people, runs, signatures } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { queueMail } from '../mail/outbox';
import { runLink } from '../mail/run-link';
import { loadRunFor } from './run-access';
import { loadReadings } from './run-loader';
import { MIN_JUSTIFICATION, MIN_REVIEW_REASON } from '../../contract/runs';
import { meaningsAccepted } from './signature-meanings';
import type { ReviewAction, SignatureDto } from './review-dto';
import { nextState } from './run-state-machine';
import { signedHash } from './signature-hash';
import { checkSignerPassword } from './signer-password';
import { insertReadings } from './readings-bulk';

const pastTense: Record<ReviewAction, string> = { approve: 'approved', return: 'returned for correction', reject: 'rejected' };

export class ReviewService {
  constructor(private readonly db: Database, private readonly config: Config) {}

  /**
   * Approve, return or reject with an electronic signature: the password again, the meaning, and for
   * some cases a reason. The signature names the SHA-256 of the run and result that were on screen.
   */
  async decide(person: SessionPerson, id: number, action: ReviewAction, body: SignatureDto, ip: string | null) {
    if (!meaningsAccepted(action).includes(body.meaning)) {
      throw badRequest(`meaning must be one of: ${meaningsAccepted(action).map((m) => `"${m}"`).join(', ')}.`, [{ field: 'meaning', message: 'not a meaning for this action' }]);
    }
    const reason = body.reason?.trim() ?? '';
    if ((action === 'return' || action === 'reject') && reason.length < MIN_REVIEW_REASON) {
      throw badRequest(`Say why the run is ${pastTense[action]} (reason, at least ${MIN_REVIEW_REASON} characters).`, [{ field: 'reason', message: 'required' }]);
    }
    // The run must exist and be the signer's to decide before the password is compared, so a guess at
    // a run that is not there (or not theirs) learns nothing about the password.
    await loadRunFor(this.db, person, id, action, body.version);
    await checkSignerPassword(this.db, person, body.password, { type: 'run', id }, ip, this.config);

    const outcome = await this.db.transaction(async (tx) => {
      // The row lock makes two simultaneous decisions queue up: the second finds the run decided.
      const run = await loadRunFor(tx, person, id, action, body.version);
      const [result] = await tx.select().from(balanceResults).where(and(eq(balanceResults.runId, id), eq(balanceResults.current, true)));
      if (action === 'approve') {
        if (!result || result.runVersion !== run.version) throw conflict(`Run ${run.code} has no balance result for its current version yet; wait for the check to finish, then approve.`);
        if (result.verdict === 'breaks' && reason.length < MIN_JUSTIFICATION) {
          throw badRequest(`The energy balance of run ${run.code} breaks (En = ${result.en?.toFixed(2)}). Approving it needs a written justification of at least ${MIN_JUSTIFICATION} characters in reason.`, [{ field: 'reason', message: `Write at least ${MIN_JUSTIFICATION} characters saying why this run may be approved although its balance breaks.` }]);
        }
        // An indeterminate check proved nothing either way, so approving one is a judgement that must be written down too.
        if (result.verdict === 'indeterminate' && reason.length < MIN_JUSTIFICATION) {
          throw badRequest(`The check of run ${run.code} is indeterminate: its uncertainty is too wide to tell whether the balance closes. Approving it needs a written justification of at least ${MIN_JUSTIFICATION} characters in reason.`, [{ field: 'reason', message: `Write at least ${MIN_JUSTIFICATION} characters saying why this run may be approved although its check is indeterminate.` }]);
        }
      }
      const rows = await loadReadings(tx, id);
      const hash = signedHash(run, rows, result);
      const state = nextState[action]!;
      const [after] = await tx.update(runs).set({
        state, version: run.version + 1, decidedAt: sql`now()`, updatedAt: sql`now()`, returnReason: action === 'return' ? reason : run.returnReason,
      }).where(eq(runs.id, id)).returning();
      const [signature] = await tx.insert(signatures).values({ runId: id, signerId: person.id, action, meaning: body.meaning, reason: reason || null, signedHash: hash }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: `run.${action}`, entityType: 'run', entityId: id, before: { state: run.state, version: run.version }, after: { state, version: after.version }, reason: reason || null, ip });
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'signature.create', entityType: 'signature', entityId: signature.id, after: { runId: id, action, meaning: body.meaning, signedHash: hash }, reason: reason || null, ip });
      const [author] = await tx.select({ email: people.email }).from(people).where(eq(people.id, run.authorId));
      await queueMail(tx, [{
        to: author.email,
        subject: `Run ${run.code} ${pastTense[action]}`,
        body: `${person.name} ${pastTense[action]} run ${run.code} "${run.title}".${reason ? `\nReason: ${reason}` : ''}\nSignature: ${body.meaning} (SHA-256 ${hash}).${this.config.publicUrl ? `\nOpen the run: ${runLink(this.config.publicUrl, id)}` : ''}`,
      }]);
      return { run: after, signature };
    });
    return outcome;
  }

  /** A correction of an approved run: a new revision (a draft copy) with a stated reason; the old stays readable. */
  async revise(person: SessionPerson, id: number, reasonInput: string, ip: string | null) {
    const reason = reasonInput.trim();
    return this.db.transaction(async (tx) => {
      const old = await loadRunFor(tx, person, id, 'correct');
      const rows = await loadReadings(tx, id);
      const [revision] = await tx.insert(runs).values({
        code: old.code, revision: old.revision + 1, previousRevisionId: old.id, revisionReason: reason, projectId: old.projectId,
        authorId: person.id, title: old.title, process: old.process, gasId: old.gasId, apparatusId: old.apparatusId, runDate: old.runDate,
        setup: old.setup,
      }).returning();
      await insertReadings(tx, revision.id, rows);
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'run.revise', entityType: 'run', entityId: revision.id, before: { runId: old.id, revision: old.revision }, after: { runId: revision.id, revision: revision.revision, state: 'draft' }, reason, ip });
      return revision;
    });
  }
}
