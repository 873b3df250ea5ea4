import { and, eq, sql } from 'drizzle-orm';
import type { Database, DbOrTx } from '../../db/client';
import { apparatus, gases, imports, projectMembers, readings, runs, uploads } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict, forbidden, HttpProblem, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { loadRunFor } from '../runs/run-access';
import { readingsToRows } from '../runs/run-document-mapper';
import { loadReadings } from '../runs/run-loader';
import type { RunSetup } from '../runs/run-setup';
import { sha256ReadingRows } from '../runs/readings-bulk';
import { insertReadings } from '../runs/readings-bulk';
import { checkRegisterInstruments } from '../runs/register-instruments';
import { nextCode } from '../runs/run-code';
import type { CommitBody } from './imports-dto';
import { checkMapping, checkRows, ROW_ERROR_CAP } from './row-validation';
import type { ParsedTable } from './table-builder';

/** Loads and locks an import of this person; a committed one cannot be committed again. */
export async function loadOwnImport(tx: DbOrTx, person: SessionPerson, id: number, lock = false) {
  const query = tx.select({ imp: imports, sha256: uploads.sha256, filename: uploads.filename })
    .from(imports).innerJoin(uploads, eq(uploads.id, imports.uploadId)).where(eq(imports.id, id));
  const [row] = lock ? await query.for('update', { of: imports }) : await query;
  if (!row) throw notFound(`There is no import with id ${id}.`);
  if (row.imp.createdBy !== person.id) throw forbidden(`Import ${id} was uploaded by someone else; upload the file yourself to import it.`);
  return row;
}

async function checkNewRunReferences(tx: DbOrTx, person: SessionPerson, body: { projectId: number; gasId?: number; apparatusId?: number }) {
  const [member] = await tx.select().from(projectMembers).where(and(eq(projectMembers.projectId, body.projectId), eq(projectMembers.personId, person.id)));
  if (!member) throw forbidden(`You are not a member of project ${body.projectId}; runs are created in one of your own projects.`);
  if (body.gasId !== undefined) {
    const [gas] = await tx.select({ id: gases.id }).from(gases).where(eq(gases.id, body.gasId));
    if (!gas) throw badRequest(`There is no gas with id ${body.gasId}.`, [{ field: 'target.newRun.gasId', message: 'unknown gas' }]);
  }
  if (body.apparatusId !== undefined) {
    const [app] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.id, body.apparatusId));
    if (!app) throw badRequest(`There is no apparatus with id ${body.apparatusId}.`, [{ field: 'target.newRun.apparatusId', message: 'unknown apparatus' }]);
  }
}


/**
 * Commits an import all-or-nothing: every row is checked again against the mapping, then the run is created
 * (or the draft's readings replaced), the upload linked and the audit events written, in one transaction.
 */
export async function commitImport(db: Database, person: SessionPerson, id: number, body: CommitBody, ip: string | null) {
  return db.transaction(async (tx) => {
    const { imp, sha256, filename } = await loadOwnImport(tx, person, id, true);
    if (imp.status === 'committed') {
      throw conflict(`Import ${id} ("${filename}") was committed already${imp.runId ? ` into run ${imp.runId}` : ''}; upload the file again to import it once more.`, { runId: imp.runId });
    }
    const table = imp.parsed as unknown as ParsedTable;
    checkMapping(table, body.mapping);
    const check = checkRows(table, body.mapping);
    if (check.errorCount > 0) {
      throw new HttpProblem(400, 'Bad request',
        `${check.errorCount} problem(s) in the rows of "${filename}"; nothing was imported. Fix them in the file or change the mapping.`,
        check.errors.slice(0, 100).map((e) => ({ field: `row ${e.row}, column "${e.column}"`, message: e.message })),
        { rowErrors: check.errors, errorCount: check.errorCount, errorCap: ROW_ERROR_CAP });
    }
    await checkRegisterInstruments(tx, body.mapping.columns.flatMap((c) => (c.instrumentId !== undefined ? [{ channel: c.channel, id: c.instrumentId, field: `mapping.columns.${c.channel}.instrumentId` }] : [])));
    const { rows, time, channels } = readingsToRows(check.input);
    let runId: number;
    let version: number;
    if ('newRun' in body.target) {
      const nr = body.target.newRun;
      await checkNewRunReferences(tx, person, nr);
      const code = await nextCode(tx, nr.runDate);
      const setup: RunSetup = { ...(nr.setup ?? {}), time, channels };
      const [run] = await tx.insert(runs).values({
        code, projectId: nr.projectId, authorId: person.id, title: nr.title.trim(), process: nr.process, runDate: nr.runDate,
        gasId: nr.gasId ?? null, apparatusId: nr.apparatusId ?? null, setup: setup as Record<string, unknown>,
      }).returning();
      await insertReadings(tx, run.id, rows);
      await recordAudit(tx, {
        actorId: person.id, actorEmail: person.email, action: 'run.create', entityType: 'run', entityId: run.id,
        after: { title: run.title, process: run.process, runDate: run.runDate, gasId: run.gasId, apparatusId: run.apparatusId, state: run.state, version: run.version, setup, code, readings: rows.length, importId: id },
        ip,
      });
      runId = run.id;
      version = run.version;
    } else {
      const before = await loadRunFor(tx, person, body.target.runId, 'edit', body.target.version);
      const oldRows = await loadReadings(tx, before.id);
      await tx.delete(readings).where(eq(readings.runId, before.id));
      await insertReadings(tx, before.id, rows);
      const setup: RunSetup = { ...((before.setup ?? {}) as RunSetup), time, channels };
      const [after] = await tx.update(runs).set({ setup: setup as Record<string, unknown>, version: before.version + 1, updatedAt: sql`now()`, editedAt: sql`now()` })
        .where(eq(runs.id, before.id)).returning();
      await recordAudit(tx, {
        actorId: person.id, actorEmail: person.email, action: 'run.readings-replace', entityType: 'run', entityId: before.id,
        before: { readings: oldRows.length, sha256: sha256ReadingRows(oldRows), version: before.version },
        after: { readings: rows.length, sha256: sha256ReadingRows(rows), version: after.version, channels: Object.keys(channels ?? {}), importId: id },
        ip,
      });
      runId = before.id;
      version = after.version;
    }
    await tx.update(uploads).set({ runId }).where(eq(uploads.id, imp.uploadId));
    await tx.update(imports).set({ status: 'committed', runId, committedAt: sql`now()`, mapping: body.mapping as unknown as Record<string, unknown> }).where(eq(imports.id, id));
    await recordAudit(tx, {
      actorId: person.id, actorEmail: person.email, action: 'import.commit', entityType: 'import', entityId: id,
      after: { uploadId: imp.uploadId, filename, sha256, runId, readings: rows.length, target: 'newRun' in body.target ? 'new run' : 'replace readings' },
      ip,
    });
    return { importId: id, runId, version, readings: rows.length };
  });
}
