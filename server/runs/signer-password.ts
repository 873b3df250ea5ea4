import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { HttpProblem } from '../core/problem';
import type { SessionPerson } from '../core/session';

/** An electronic signature asks for the password again; a wrong one is audited and nothing is signed (401). */
export async function checkSignerPassword(db: Database, person: SessionPerson, password: string, entity: { type: string; id: number }, ip: string | null): Promise<void> {
  const [signer] = await db.select({ hash: people.passwordHash }).from(people).where(eq(people.id, person.id));
  if (!signer || !(await bcrypt.compare(password, signer.hash))) {
    await recordAudit(db, { actorId: person.id, actorEmail: person.email, action: 'signature.refused', entityType: entity.type, entityId: entity.id, reason: 'wrong password', ip });
    throw new HttpProblem(401, 'Signature refused', 'The password is not right; nothing was signed.');
  }
}
