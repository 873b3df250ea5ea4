import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import type { Config } from '../config';
import { HttpProblem } from '../core/problem';
import type { SessionPerson } from '../core/session';

// Compared against when the address is unknown, so both paths take a bcrypt's time.
const DUMMY_HASH = bcrypt.hashSync('qwell-no-such-person', 10);
export const BCRYPT_COST = 12;

const wrongCredentials = (detail: string) => new HttpProblem(401, 'Sign-in failed', detail);

function lockedProblem(until: Date): HttpProblem {
  const time = until.toISOString().slice(11, 16);
  return new HttpProblem(
    423,
    'Account locked',
    `This account is locked after too many failed sign-ins. Try again after ${time} UTC, or ask an administrator to unlock it.`,
    undefined,
    { lockedUntil: until.toISOString() },
  );
}

export class AuthService {
  constructor(private readonly db: Database, private readonly config: Config) {}

  async signIn(emailInput: string, password: string, ip: string | null): Promise<SessionPerson> {
    const email = emailInput.trim().toLowerCase();
    const [person] = await this.db.select().from(people).where(eq(people.email, email));

    if (!person || !person.active) {
      await bcrypt.compare(password, DUMMY_HASH);
      await recordAudit(this.db, { actorEmail: email, action: 'auth.sign-in-failed', entityType: 'person', reason: 'unknown or inactive address', ip });
      throw wrongCredentials('The email or password is not right.');
    }

    const now = new Date();
    if (person.lockedUntil && person.lockedUntil > now) {
      await recordAudit(this.db, { actorId: person.id, actorEmail: email, action: 'auth.sign-in-refused', entityType: 'person', entityId: person.id, reason: 'account locked', ip });
      throw lockedProblem(person.lockedUntil);
    }

    if (!(await bcrypt.compare(password, person.passwordHash))) {
      // The counter and its audit events commit first; the refusal is thrown after the transaction.
      const outcome = await this.db.transaction(async (tx) => {
        const { lockoutAttempts, lockoutMinutes } = this.config;
        // One statement, so two wrong tries at the same moment both count.
        const [after] = await tx
          .update(people)
          .set({
            failedAttempts: sql`CASE WHEN ${people.failedAttempts} + 1 >= ${lockoutAttempts} THEN 0 ELSE ${people.failedAttempts} + 1 END`,
            lockedUntil: sql`CASE WHEN ${people.failedAttempts} + 1 >= ${lockoutAttempts} THEN now() + make_interval(mins => ${lockoutMinutes}) ELSE ${people.lockedUntil} END`,
          })
          .where(eq(people.id, person.id))
          .returning({ failedAttempts: people.failedAttempts, lockedUntil: people.lockedUntil });
        const lockedNow = after.lockedUntil !== null && after.lockedUntil > now;
        await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in-failed', entityType: 'person', entityId: person.id, reason: 'wrong password', ip });
        if (lockedNow) {
          await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.account-locked', entityType: 'person', entityId: person.id, after: { lockedUntil: after.lockedUntil }, reason: `${lockoutAttempts} failed sign-ins`, ip });
          return `The email or password is not right. The account is now locked for ${lockoutMinutes} minutes.`;
        }
        const left = lockoutAttempts - after.failedAttempts;
        return `The email or password is not right. ${left} ${left === 1 ? 'attempt' : 'attempts'} left before the account locks for ${lockoutMinutes} minutes.`;
      });
      throw wrongCredentials(outcome);
    }

    await this.db.transaction(async (tx) => {
      await tx.update(people).set({ failedAttempts: 0, lockedUntil: null }).where(eq(people.id, person.id));
      await recordAudit(tx, { actorId: person.id, actorEmail: email, action: 'auth.sign-in', entityType: 'person', entityId: person.id, ip });
    });
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
