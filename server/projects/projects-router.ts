import { and, asc, eq, inArray } from 'drizzle-orm';
import { Router } from 'express';
import { IsArray, IsInt, IsString, Length, Matches } from 'class-validator';
import type { Database } from '../../db/client';
import { people, projectMembers, projects, roles } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict, notFound } from '../core/problem';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';

export class CreateProjectDto {
  @IsString() @Matches(/^[A-Z0-9]{1,12}$/, { message: 'code must be 1 to 12 capitals or digits (e.g. GX)' })
  code!: string;

  @IsString() @Length(3, 200, { message: 'name must be 3 to 200 characters' })
  name!: string;

  @IsString() @Length(0, 2000)
  description = '';
}

export class MembersDto {
  @IsArray({ message: 'personIds must be a list of person ids' }) @IsInt({ each: true, message: 'personIds must be whole numbers' })
  personIds!: number[];
}

export function projectsRouter(db: Database): Router {
  const router = Router();

  /** Projects with their members; authors and investigators see their own, quality and admin all. */
  router.get('/', requireRole(...roles), async (req, res) => {
    const person = req.person!;
    const all = person.role === 'quality' || person.role === 'admin';
    const mine = all ? null : (await db.select({ id: projectMembers.projectId }).from(projectMembers).where(eq(projectMembers.personId, person.id))).map((r) => r.id);
    const rows = await db.select().from(projects).where(mine ? inArray(projects.id, mine.length ? mine : [-1]) : undefined).orderBy(asc(projects.code));
    const members = rows.length
      ? await db.select({ projectId: projectMembers.projectId, id: people.id, name: people.name, role: people.role })
          .from(projectMembers).innerJoin(people, eq(people.id, projectMembers.personId)).where(inArray(projectMembers.projectId, rows.map((p) => p.id)))
      : [];
    res.json({ items: rows.map((p) => ({ ...p, members: members.filter((m) => m.projectId === p.id).map(({ projectId: _p, ...m }) => m) })) });
  });

  router.post('/', requireRole('admin'), async (req, res) => {
    const body = await validateBody(CreateProjectDto, req.body);
    const row = await db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: projects.id }).from(projects).where(eq(projects.code, body.code));
      if (existing) throw conflict(`A project with code ${body.code} exists already.`);
      const [created] = await tx.insert(projects).values(body).returning();
      await recordAudit(tx, { actorId: req.person!.id, actorEmail: req.person!.email, action: 'project.create', entityType: 'project', entityId: created.id, after: created, ip: req.ip });
      return created;
    });
    res.status(201).json(row);
  });

  /** Replaces a project's members in one transaction. */
  router.put('/:id/members', requireRole('admin'), async (req, res) => {
    const id = idParam(req.params['id'], 'project');
    const body = await validateBody(MembersDto, req.body);
    const ids = [...new Set(body.personIds)];
    const result = await db.transaction(async (tx) => {
      const [project] = await tx.select().from(projects).where(eq(projects.id, id));
      if (!project) throw notFound(`There is no project with id ${id}.`);
      const found = ids.length ? await tx.select({ id: people.id }).from(people).where(inArray(people.id, ids)) : [];
      const missing = ids.filter((p) => !found.some((f) => f.id === p));
      if (missing.length) throw badRequest(`No person with id ${missing.join(', ')}.`, [{ field: 'personIds', message: 'unknown person' }]);
      const before = (await tx.select({ id: projectMembers.personId }).from(projectMembers).where(eq(projectMembers.projectId, id))).map((r) => r.id);
      await tx.delete(projectMembers).where(and(eq(projectMembers.projectId, id)));
      if (ids.length) await tx.insert(projectMembers).values(ids.map((personId) => ({ projectId: id, personId })));
      await recordAudit(tx, { actorId: req.person!.id, actorEmail: req.person!.email, action: 'project.members', entityType: 'project', entityId: id, before: { members: before.sort() }, after: { members: [...ids].sort() }, ip: req.ip });
      return { id, members: ids };
    });
    res.json(result);
  });

  return router;
}
