import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { DEFAULT_LOCKOUT, lockedProblem, reserveAttempt, settleFailure, settleSuccess, type LockoutSettings } from '../auth/password-attempts';
import { HttpProblem } from '../core/problem';
import type { SessionPerson } from '../core/session';

/**
 * An electronic signature asks for the password again; a wrong one is audited and nothing is signed
 * (401). Call it after checking that the signed thing exists and is the signer's to sign, so a guess
 * learns nothing about the password from a 404 or 403. Attempts count toward the same lockout as
 * sign-in (auth/password-attempts.ts): a locked account signs nothing and its password is not compared.
 */
export async function checkSignerPassword(
  db: Database, person: SessionPerson, password: string, entity: { type: string; id: number }, ip: string | null,
  lockout: LockoutSettings = DEFAULT_LOCKOUT,
): Promise<void> {
  const [signer] = await db.select({ hash: people.passwordHash }).from(people).where(eq(people.id, person.id));
  const reservation = signer ? await reserveAttempt(db, person.id, lockout) : null;
  const audit = { actorId: person.id, actorEmail: person.email, entityType: entity.type, entityId: entity.id, ip };
  if (!signer || !reservation || reservation.kind === 'locked') {
    const until = reservation?.kind === 'locked' ? reservation.until : new Date();
    await db.transaction(async (tx) => {
      if (reservation?.kind === 'locked' && reservation.lockedNow) {
        await recordAudit(tx, { ...audit, action: 'auth.account-locked', entityType: 'person', entityId: person.id, after: { lockedUntil: until }, reason: 'more password attempts at once than the limit' });
      }
      await recordAudit(tx, { ...audit, action: 'signature.refused', reason: 'account locked' });
    });
    throw lockedProblem(until);
  }
  if (!(await bcrypt.compare(password, signer.hash))) {
    const locked = await db.transaction(async (tx) => {
      const lockedUntil = await settleFailure(tx, person.id, reservation.attempt, lockout);
      await recordAudit(tx, { ...audit, action: 'signature.refused', reason: 'wrong password' });
      if (lockedUntil) {
        await recordAudit(tx, { ...audit, action: 'auth.account-locked', entityType: 'person', entityId: person.id, after: { lockedUntil }, reason: `${lockout.lockoutAttempts} failed password attempts` });
      }
      return lockedUntil;
    });
    if (locked) throw lockedProblem(locked);
    throw new HttpProblem(401, 'Signature refused', 'The password is not right; nothing was signed.');
  }
  const lockedMeanwhile = await db.transaction((tx) => settleSuccess(tx, person.id));
  if (lockedMeanwhile) throw lockedProblem(lockedMeanwhile);
}
