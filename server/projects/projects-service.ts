import { asc, eq, inArray } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people, projectMembers, projects } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import type { CreateProjectDto, MembersDto } from './projects-dto';

export class ProjectsService {
  constructor(private readonly db: Database) {}

  /** Projects with their members; authors and investigators see their own, quality and admin all. */
  async list(person: SessionPerson) {
    const all = person.role === 'quality' || person.role === 'admin';
    const mine = all ? null : (await this.db.select({ id: projectMembers.projectId }).from(projectMembers).where(eq(projectMembers.personId, person.id))).map((r) => r.id);
    const rows = await this.db.select().from(projects).where(mine ? inArray(projects.id, mine.length ? mine : [-1]) : undefined).orderBy(asc(projects.code));
    const members = rows.length
      ? await this.db.select({ projectId: projectMembers.projectId, id: people.id, name: people.name, role: people.role })
          .from(projectMembers).innerJoin(people, eq(people.id, projectMembers.personId)).where(inArray(projectMembers.projectId, rows.map((p) => p.id)))
      : [];
    return rows.map((p) => ({ ...p, members: members.filter((m) => m.projectId === p.id).map(({ projectId: _p, ...m }) => m) }));
  }

  async create(person: SessionPerson, body: CreateProjectDto, ip: string | null) {
    return this.db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: projects.id }).from(projects).where(eq(projects.code, body.code));
      if (existing) throw conflict(`A project with code ${body.code} exists already.`);
      const [created] = await tx.insert(projects).values({ code: body.code, name: body.name, description: body.description }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'project.create', entityType: 'project', entityId: created.id, after: created, ip });
      return created;
    });
  }

  /**
   * Replaces a project's members in one transaction, the audit row with them. The body carries no version:
   * the same list sent again (a double click, a retry) is the same request, so each answers 200 and only a
   * real change is stored and audited. The project's row is locked first, so that requests at once take
   * turns: each reads the members the one before it left (without the lock, two deletes saw the same rows
   * and the second insert collided with the first on the membership key, a 409).
   */
  async replaceMembers(person: SessionPerson, id: number, body: MembersDto, ip: string | null) {
    const ids = [...new Set(body.personIds)];
    const sorted = [...ids].sort((a, b) => a - b);
    return this.db.transaction(async (tx) => {
      const [project] = await tx.select({ id: projects.id }).from(projects).where(eq(projects.id, id)).for('update');
      if (!project) throw notFound(`There is no project with id ${id}.`);
      const found = ids.length ? await tx.select({ id: people.id }).from(people).where(inArray(people.id, ids)) : [];
      const missing = ids.filter((p) => !found.some((f) => f.id === p));
      if (missing.length) throw badRequest(`No person with id ${missing.join(', ')}.`, [{ field: 'personIds', message: 'unknown person' }]);
      const before = (await tx.select({ id: projectMembers.personId }).from(projectMembers).where(eq(projectMembers.projectId, id))).map((r) => r.id).sort((a, b) => a - b);
      if (before.length === sorted.length && before.every((p, i) => p === sorted[i])) return { id, members: ids };
      await tx.delete(projectMembers).where(eq(projectMembers.projectId, id));
      if (ids.length) await tx.insert(projectMembers).values(ids.map((personId) => ({ projectId: id, personId })));
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'project.members', entityType: 'project', entityId: id, before: { members: before }, after: { members: sorted }, ip });
      return { id, members: ids };
    });
  }
}
