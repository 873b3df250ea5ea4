import bcrypt from 'bcryptjs';
import { asc, eq, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { BCRYPT_COST } from '../auth/password-attempts';
import { badRequest, conflict, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import type { CreatePersonDto, UpdatePersonDto } from './people-dto';

/** What the API shows of a person: never the password hash, attempt counts or session cut-offs. */
const publicColumns = { id: people.id, email: people.email, name: people.name, role: people.role, active: people.active, lockedUntil: people.lockedUntil, createdAt: people.createdAt };

export class PeopleService {
  constructor(private readonly db: Database) {}

  list() {
    return this.db.select(publicColumns).from(people).orderBy(asc(people.name));
  }

  async create(actor: SessionPerson, body: CreatePersonDto, ip: string | null) {
    const email = body.email.trim().toLowerCase();
    const hash = await bcrypt.hash(body.password, BCRYPT_COST);
    return this.db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: people.id }).from(people).where(eq(people.email, email));
      if (existing) throw conflict(`${email} already has an account.`);
      const [created] = await tx.insert(people).values({ email, name: body.name.trim(), role: body.role, passwordHash: hash }).returning(publicColumns);
      await recordAudit(tx, { actorId: actor.id, actorEmail: actor.email, action: 'person.create', entityType: 'person', entityId: created.id, after: created, ip });
      return created;
    });
  }

  async update(actor: SessionPerson, id: number, body: UpdatePersonDto, ip: string | null) {
    if (id === actor.id && (body.role !== undefined && body.role !== 'admin' || body.active === false)) {
      throw badRequest('You cannot remove your own administrator access; ask another administrator.');
    }
    const hash = body.password ? await bcrypt.hash(body.password, BCRYPT_COST) : undefined;
    return this.db.transaction(async (tx) => {
      const [before] = await tx.select(publicColumns).from(people).where(eq(people.id, id)).for('update');
      if (!before) throw notFound(`There is no person with id ${id}.`);
      const [after] = await tx.update(people).set({
        ...(body.name !== undefined ? { name: body.name.trim() } : {}),
        ...(body.role !== undefined ? { role: body.role } : {}),
        ...(body.active !== undefined ? { active: body.active } : {}),
        ...(body.unlock ? { lockedUntil: null, failedAttempts: 0 } : {}),
        // A new password or a deactivation ends the person's open sessions.
        ...(hash ? { passwordHash: hash, sessionsValidAfter: sql`now()` } : {}),
        ...(body.active === false ? { sessionsValidAfter: sql`now()` } : {}),
        updatedAt: sql`now()`,
      }).where(eq(people.id, id)).returning(publicColumns);
      // The audit trail records that a password changed, never the password or its hash.
      await recordAudit(tx, { actorId: actor.id, actorEmail: actor.email, action: 'person.update', entityType: 'person', entityId: id, before, after: { ...after, ...(hash ? { passwordChanged: true } : {}) }, ip });
      return after;
    });
  }
}
