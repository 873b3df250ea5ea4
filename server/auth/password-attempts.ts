import bcrypt from 'bcryptjs';
import { and, eq, isNull, lte, or, sql } from 'drizzle-orm';
import type { Database, Tx } from '../../db/client';
import { people } from '../../db/schema';
import { HttpProblem } from '../core/problem';

/** The bcrypt cost of every stored password, and of the stand-in compared for unknown addresses. */
export const BCRYPT_COST = 12;

let dummyHash: string | null = null;
/** A hash of the same cost as real ones, so an unknown address takes as long as a wrong password. */
export function dummyPasswordHash(): string {
  dummyHash ??= bcrypt.hashSync('qwell-no-such-person', BCRYPT_COST);
  return dummyHash;
}

export interface LockoutSettings {
  lockoutAttempts: number;
  lockoutMinutes: number;
}

/** Five failed attempts in a row lock an account for 15 minutes (the Config defaults). */
export const DEFAULT_LOCKOUT: LockoutSettings = { lockoutAttempts: 5, lockoutMinutes: 15 };

/** What the database said when a password attempt was asked for. */
export type Reservation =
  | { kind: 'reserved'; attempt: number }
  | { kind: 'locked'; until: Date; lockedNow: boolean };

const notLocked = or(isNull(people.lockedUntil), lte(people.lockedUntil, sql`now()`));

/** "Try again after 14:05 UTC (in 15 minutes)": the real wait, in the lab's words. */
export function waitText(until: Date, now = new Date()): string {
  const seconds = Math.max(1, Math.ceil((until.getTime() - now.getTime()) / 1000));
  const span = seconds < 120 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`;
  return `after ${until.toISOString().slice(11, 16)} UTC (in ${span})`;
}

export function lockedProblem(until: Date): HttpProblem {
  return new HttpProblem(
    423,
    'Account locked',
    `This account is locked after too many failed password attempts. Try again ${waitText(until)}, or ask an administrator to unlock it.`,
    undefined,
    { lockedUntil: until.toISOString() },
  );
}

/**
 * Password attempts (sign-in and signatures alike) are counted in the database before the password is
 * compared, in one statement, so parallel guesses cannot all slip in under the limit:
 * - a locked account is refused without comparing anything;
 * - otherwise the attempt takes the next number; an attempt beyond the limit (more guesses in flight
 *   than the limit allows) locks the account at once and is refused;
 * - a wrong password that was the limit-th locks the account; a right one clears the count, but only
 *   if the account is not locked by then (parallel wrong guesses lose the race for the right one).
 */
export async function reserveAttempt(db: Database, personId: number, s: LockoutSettings): Promise<Reservation | null> {
  const [row] = await db.update(people).set({
    failedAttempts: sql`CASE WHEN ${people.failedAttempts} >= ${s.lockoutAttempts} THEN 0 ELSE ${people.failedAttempts} + 1 END`,
    lockedUntil: sql`CASE WHEN ${people.failedAttempts} >= ${s.lockoutAttempts} THEN now() + make_interval(mins => ${s.lockoutMinutes}) ELSE ${people.lockedUntil} END`,
  }).where(and(eq(people.id, personId), notLocked))
    .returning({ failedAttempts: people.failedAttempts, lockedUntil: people.lockedUntil, lockedNow: sql<boolean>`${people.lockedUntil} IS NOT NULL AND ${people.lockedUntil} > now()` });
  if (row) {
    if (row.lockedNow && row.lockedUntil) return { kind: 'locked', until: row.lockedUntil, lockedNow: true };
    return { kind: 'reserved', attempt: row.failedAttempts };
  }
  const [current] = await db.select({ lockedUntil: people.lockedUntil }).from(people).where(eq(people.id, personId));
  if (!current) return null;
  return { kind: 'locked', until: current.lockedUntil ?? new Date(), lockedNow: false };
}

/** A wrong password: the limit-th locks the account. Returns the lock's end when this attempt locked it. */
export async function settleFailure(tx: Tx, personId: number, attempt: number, s: LockoutSettings): Promise<Date | null> {
  if (attempt < s.lockoutAttempts) return null;
  const [row] = await tx.update(people)
    .set({ failedAttempts: 0, lockedUntil: sql`now() + make_interval(mins => ${s.lockoutMinutes})` })
    .where(and(eq(people.id, personId), notLocked))
    .returning({ lockedUntil: people.lockedUntil });
  return row?.lockedUntil ?? null;
}

/** A right password: clears the count unless the account got locked meanwhile (then the lock's end). */
export async function settleSuccess(tx: Tx, personId: number): Promise<Date | null> {
  const [row] = await tx.update(people).set({ failedAttempts: 0, lockedUntil: null })
    .where(and(eq(people.id, personId), notLocked)).returning({ id: people.id });
  if (row) return null;
  const [current] = await tx.select({ lockedUntil: people.lockedUntil }).from(people).where(eq(people.id, personId));
  return current?.lockedUntil ?? new Date();
}
