import { asc, eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { apparatus } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { conflict, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import type { ApparatusDto } from './apparatus-dto';

/** The apparatus register (cells, vessels, calorimeters), kept by quality officers. */
export class ApparatusService {
  constructor(private readonly db: Database) {}

  list() {
    return this.db.select().from(apparatus).orderBy(asc(apparatus.tag));
  }

  async create(person: SessionPerson, body: ApparatusDto, ip: string | null) {
    return this.db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.tag, body.tag));
      if (existing) throw conflict(`Apparatus ${body.tag} is already in the register.`);
      const [created] = await tx.insert(apparatus).values({ ...body, notes: body.notes ?? '' }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'apparatus.create', entityType: 'apparatus', entityId: created.id, after: created, ip });
      return created;
    });
  }

  /** Replaces the entry; notes left out keep their text. */
  async update(person: SessionPerson, id: number, body: ApparatusDto, ip: string | null) {
    return this.db.transaction(async (tx) => {
      const [before] = await tx.select().from(apparatus).where(eq(apparatus.id, id)).for('update');
      if (!before) throw notFound(`There is no apparatus with id ${id}.`);
      if (body.tag !== before.tag) {
        const [clash] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.tag, body.tag));
        if (clash) throw conflict(`Apparatus ${body.tag} is already in the register.`);
      }
      const [after] = await tx.update(apparatus).set({ ...body, notes: body.notes ?? before.notes }).where(eq(apparatus.id, id)).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'apparatus.update', entityType: 'apparatus', entityId: id, before, after, ip });
      return after;
    });
  }
}
