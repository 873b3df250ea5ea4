import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAudit, recordAuditAlone } from '../audit/audit-service';
import type { Config } from '../config';
import { HttpProblem } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { dummyPasswordHash, lockedProblem, reserveAttempt, settleFailure, settleSuccess } from './password-attempts';


/**
 * The one answer to an unknown address, an inactive account and a wrong password alike, so the answer
 * never tells whether an address has an account. Only a locked account answers otherwise (423).
 */
export function signInFailedText(s: Pick<Config, 'lockoutAttempts' | 'lockoutMinutes'>): string {
  return `The email or password is not right. After ${s.lockoutAttempts} failed attempts in a row an account locks for ${s.lockoutMinutes} minutes.`;
}

export class AuthService {
  constructor(private readonly db: Database, private readonly config: Config) {}

  private wrongCredentials(): HttpProblem {
    return new HttpProblem(401, 'Sign-in failed', signInFailedText(this.config));
  }

  async signIn(emailInput: string, password: string, ip: string | null): Promise<SessionPerson> {
    const email = emailInput.trim().toLowerCase();
    const [person] = await this.db.select().from(people).where(eq(people.email, email));

    if (!person || !person.active) {
      // The same bcrypt cost as a real hash, so the time taken does not tell either.
      await bcrypt.compare(password, dummyPasswordHash());
      await recordAuditAlone(this.db, {
        actorId: person?.id ?? null, actorEmail: email, action: 'auth.sign-in-failed', entityType: 'person', entityId: person?.id ?? null,
        reason: person ? 'inactive account' : 'unknown address', ip,
      });
      throw this.wrongCredentials();
    }

    // Counted before the password is compared; a locked account's password is never compared.
    const reservation = await reserveAttempt(this.db, person.id, this.config);
    if (!reservation || reservation.kind === 'locked') {
      const until = reservation?.until ?? new Date();
      await this.db.transaction(async (tx) => {
        if (reservation?.lockedNow) {
          await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.account-locked', entityType: 'person', entityId: person.id, after: { lockedUntil: until }, reason: 'more password attempts at once than the limit', ip });
        }
        await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in-refused', entityType: 'person', entityId: person.id, reason: 'account locked', ip });
      });
      throw lockedProblem(until);
    }

    if (!(await bcrypt.compare(password, person.passwordHash))) {
      const lockedUntil = await this.db.transaction(async (tx) => {
        const locked = await settleFailure(tx, person.id, reservation.attempt, this.config);
        await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in-failed', entityType: 'person', entityId: person.id, reason: 'wrong password', ip });
        if (locked) {
          await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.account-locked', entityType: 'person', entityId: person.id, after: { lockedUntil: locked }, reason: `${this.config.lockoutAttempts} failed password attempts`, ip });
        }
        return locked;
      });
      throw lockedUntil ? lockedProblem(lockedUntil) : this.wrongCredentials();
    }

    const lockedMeanwhile = await this.db.transaction(async (tx) => {
      const locked = await settleSuccess(tx, person.id);
      if (locked) {
        await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in-refused', entityType: 'person', entityId: person.id, reason: 'account locked while the password was checked', ip });
        return locked;
      }
      await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in', entityType: 'person', entityId: person.id, ip });
      return null;
    });
    if (lockedMeanwhile) throw lockedProblem(lockedMeanwhile);
    return { id: person.id, email: person.email, name: person.name, role: person.role };
  }

  /** Ends every session of the person: tokens issued until now are refused from here on. */
  async signOut(person: SessionPerson, ip: string | null): Promise<void> {
    await this.db.transaction(async (tx) => {
      await tx.update(people).set({ sessionsValidAfter: sql`now()` }).where(eq(people.id, person.id));
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'auth.sign-out', entityType: 'person', entityId: person.id, ip });
    });
  }
}
