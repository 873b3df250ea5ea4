import { asc, eq } from 'drizzle-orm';
import { Router } from 'express';
import { IsNumber, IsOptional, IsString, Length, Matches, Min } from 'class-validator';
import type { Database } from '../../db/client';
import { apparatus, gases, roles } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { conflict, notFound } from '../core/problem';
import { idParam } from '../core/route-params';
import { requireRole } from '../core/session';
import { validateBody } from '../core/validate-body';

export class ApparatusDto {
  @IsString() @Matches(/^[A-Z0-9][A-Z0-9-]{0,31}$/, { message: 'tag must be the lab\'s tag in capitals, digits and dashes (e.g. PC-4)' })
  tag!: string;

  @IsString() @Length(3, 200, { message: 'name must be 3 to 200 characters' })
  name!: string;

  @IsString() @Length(2, 50, { message: 'kind must say what it is (e.g. piston-cell, vessel, bath-calorimeter)' })
  kind!: string;

  @IsOptional() @IsNumber({}, { message: 'heatCapacity must be a number (J/K)' }) @Min(0) heatCapacity?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatCapacityU must be a number (J/K)' }) @Min(0) heatCapacityU?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatLossCoefficient must be a number (W/K)' }) @Min(0) heatLossCoefficient?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatLossCoefficientU must be a number (W/K)' }) @Min(0) heatLossCoefficientU?: number | null;
  @IsOptional() @IsNumber({}, { message: 'ratedPressure must be a number (Pa)' }) @Min(0) ratedPressure?: number | null;
  @IsOptional() @IsNumber({}, { message: 'bore must be a number (m)' }) @Min(0) bore?: number | null;
  @IsOptional() @IsNumber({}, { message: 'fixedVolume must be a number (m³)' }) @Min(0) fixedVolume?: number | null;
  @IsOptional() @IsString() @Length(0, 2000) notes?: string;
}

/** Gases and apparatus: everyone reads them; quality officers keep the apparatus register. */
export function labRouter(db: Database): Router {
  const router = Router();

  router.get('/gases', requireRole(...roles), async (_req, res) => {
    res.json({ items: await db.select().from(gases).orderBy(asc(gases.code)) });
  });

  router.get('/apparatus', requireRole(...roles), async (_req, res) => {
    res.json({ items: await db.select().from(apparatus).orderBy(asc(apparatus.tag)) });
  });

  router.post('/apparatus', requireRole('quality'), async (req, res) => {
    const body = await validateBody(ApparatusDto, req.body);
    const row = await db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.tag, body.tag));
      if (existing) throw conflict(`Apparatus ${body.tag} is already in the register.`);
      const [created] = await tx.insert(apparatus).values({ ...body, notes: body.notes ?? '' }).returning();
      await recordAudit(tx, { actorId: req.person!.id, actorEmail: req.person!.email, action: 'apparatus.create', entityType: 'apparatus', entityId: created.id, after: created, ip: req.ip });
      return created;
    });
    res.status(201).json(row);
  });

  router.put('/apparatus/:id', requireRole('quality'), async (req, res) => {
    const id = idParam(req.params['id'], 'apparatus');
    const body = await validateBody(ApparatusDto, req.body);
    const row = await db.transaction(async (tx) => {
      const [before] = await tx.select().from(apparatus).where(eq(apparatus.id, id)).for('update');
      if (!before) throw notFound(`There is no apparatus with id ${id}.`);
      if (body.tag !== before.tag) {
        const [clash] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.tag, body.tag));
        if (clash) throw conflict(`Apparatus ${body.tag} is already in the register.`);
      }
      const [after] = await tx.update(apparatus).set({ ...body, notes: body.notes ?? before.notes }).where(eq(apparatus.id, id)).returning();
      await recordAudit(tx, { actorId: req.person!.id, actorEmail: req.person!.email, action: 'apparatus.update', entityType: 'apparatus', entityId: id, before, after, ip: req.ip });
      return after;
    });
    res.json(row);
  });

  return router;
}
