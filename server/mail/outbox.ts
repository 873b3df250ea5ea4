import { and, eq, inArray } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { mailOutbox, people, projectMembers } from '../../db/schema';

export interface Mail {
  to: string;
  subject: string;
  body: string;
  /**
   * What the mail is about, when it must go out once only (`balance:<run>:<version>:<verdict>`): the
   * outbox's unique index on (key, recipient) drops a repeat, also one queued by a parallel transaction.
   */
  dedupeKey?: string;
}

/**
 * Puts mail in the outbox inside the caller's transaction: a rolled-back change sends nothing.
 * Returns how many were queued; a mail whose key this address already had is left out.
 */
export async function queueMail(tx: DbOrTx, mails: Mail[]): Promise<number> {
  if (mails.length === 0) return 0;
  const queued = await tx.insert(mailOutbox)
    .values(mails.map((m) => ({ recipient: m.to, subject: m.subject, body: m.body, dedupeKey: m.dedupeKey ?? null })))
    .onConflictDoNothing()
    .returning({ id: mailOutbox.id });
  return queued.length;
}

/** Addresses of a project's active members of one role. */
export async function projectAddresses(tx: DbOrTx, projectId: number, role: 'investigator' | 'technician' | 'assistant'): Promise<string[]> {
  const rows = await tx
    .select({ email: people.email })
    .from(projectMembers)
    .innerJoin(people, eq(people.id, projectMembers.personId))
    .where(and(eq(projectMembers.projectId, projectId), eq(people.role, role), eq(people.active, true)));
  return rows.map((r) => r.email);
}

export async function roleAddresses(tx: DbOrTx, roles: ('quality' | 'admin')[]): Promise<string[]> {
  const rows = await tx.select({ email: people.email }).from(people).where(and(inArray(people.role, roles), eq(people.active, true)));
  return rows.map((r) => r.email);
}
