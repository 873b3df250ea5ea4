import { asc, desc, eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { calibrations, instruments } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { CHANNELS } from '../runs/run-setup';
import { isUnit } from '../engine/units';
import { calibrationStatus, todayIso } from './calibration-status';
import type { CreateCalibrationDto, CreateInstrumentDto } from './instruments-dto';

export class InstrumentsService {
  constructor(private readonly db: Database) {}

  /** The register with each instrument's latest calibration (with the corrections its certificate states) and its status today. */
  async list(today = todayIso()) {
    const latest = this.db
      .selectDistinctOn([calibrations.instrumentId])
      .from(calibrations)
      .orderBy(calibrations.instrumentId, desc(calibrations.calibratedOn), desc(calibrations.id))
      .as('latest');
    const rows = await this.db
      .select({
        instrument: instruments,
        calibration: {
          id: latest.id, calibratedOn: latest.calibratedOn, dueOn: latest.dueOn, certificate: latest.certificate,
          expandedUncertainty: latest.expandedUncertainty, coverageFactor: latest.coverageFactor, corrections: latest.corrections,
        },
      })
      .from(instruments)
      .leftJoin(latest, eq(latest.instrumentId, instruments.id))
      .orderBy(asc(instruments.tag));
    return rows.map(({ instrument, calibration }) => ({
      ...instrument,
      calibration: calibration
        ? {
            ...calibration,
            status: calibrationStatus(calibration.dueOn, today),
          }
        : null,
    }));
  }

  async get(id: number) {
    const [instrument] = await this.db.select().from(instruments).where(eq(instruments.id, id));
    if (!instrument) throw notFound(`There is no instrument with id ${id}.`);
    const history = await this.db.select().from(calibrations).where(eq(calibrations.instrumentId, id)).orderBy(desc(calibrations.calibratedOn), desc(calibrations.id));
    const today = todayIso();
    return { ...instrument, calibrations: history.map((c) => ({ ...c, status: calibrationStatus(c.dueOn, today) })) };
  }

  async create(person: SessionPerson, body: CreateInstrumentDto, ip: string | null) {
    if (body.kind !== 'time' && !isUnit(CHANNELS[body.kind], body.unit)) {
      throw badRequest(`"${body.unit}" is not a ${body.kind} unit Qwell knows.`, [{ field: 'unit', message: 'unknown unit' }]);
    }
    if (body.rangeMin !== undefined && body.rangeMax !== undefined && body.rangeMin >= body.rangeMax) {
      throw badRequest('rangeMin must be below rangeMax.', [{ field: 'rangeMax', message: 'must be above rangeMin' }]);
    }
    return this.db.transaction(async (tx) => {
      const [existing] = await tx.select({ id: instruments.id }).from(instruments).where(eq(instruments.tag, body.tag));
      if (existing) throw conflict(`An instrument tagged ${body.tag} is already in the register (id ${existing.id}).`);
      const [row] = await tx.insert(instruments).values({
        tag: body.tag, name: body.name, kind: body.kind, unit: body.unit, manufacturer: body.manufacturer ?? '', serialNumber: body.serialNumber ?? '',
        rangeMin: body.rangeMin ?? null, rangeMax: body.rangeMax ?? null, spec: { ...(body.spec ?? {}) },
      }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'instrument.create', entityType: 'instrument', entityId: row.id, after: row, ip });
      return row;
    });
  }

  async addCalibration(person: SessionPerson, instrumentId: number, body: CreateCalibrationDto, ip: string | null) {
    if (body.dueOn <= body.calibratedOn) throw badRequest('dueOn must be after calibratedOn.', [{ field: 'dueOn', message: 'must be after calibratedOn' }]);
    return this.db.transaction(async (tx) => {
      const [instrument] = await tx.select({ id: instruments.id, tag: instruments.tag }).from(instruments).where(eq(instruments.id, instrumentId));
      if (!instrument) throw notFound(`There is no instrument with id ${instrumentId}.`);
      const [row] = await tx.insert(calibrations).values({
        instrumentId, calibratedOn: body.calibratedOn, dueOn: body.dueOn, certificate: body.certificate, expandedUncertainty: body.expandedUncertainty,
        coverageFactor: body.coverageFactor ?? 2, corrections: statedCorrections(body.corrections), notes: body.notes ?? '', createdBy: person.id,
      }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'calibration.create', entityType: 'instrument', entityId: instrumentId, after: row, ip });
      return row;
    });
  }
}

/**
 * The corrections as stored: only the numbers the certificate states. A null (a form's empty field) means
 * "not stated" and is left out, so that no run reads "gain null" from the register (which made the check
 * unable to read every run bound to the instrument).
 */
export function statedCorrections(body: { offset?: number | null; gain?: number | null } | undefined): { offset?: number; gain?: number } {
  return {
    ...(typeof body?.gain === 'number' ? { gain: body.gain } : {}),
    ...(typeof body?.offset === 'number' ? { offset: body.offset } : {}),
  };
}
