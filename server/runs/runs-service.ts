import { and, asc, count, desc, eq, inArray, ne, sql, type SQL } from 'drizzle-orm';
import { inRoleGroup, RUN_AUTHORS } from '../../contract/roles';
import type { RunPage, RunRead } from '../../contract/api/runs';
import type { Wire } from '../../contract/wire';
import type { Database, DbOrTx } from '../../db/client';
import { apparatus, balanceResults, gases, people, projectMembers, projects, readings, runs, signatures } from '../../db/schema';
import { recordAudit, recordAuditAlone } from '../audit/audit-service';
import type { Config } from '../config';
import { badRequest, forbidden } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { sha256Canonical, validateRunDocument, type RunDocument } from '../engine';
import { buildSeries } from '../engine/series';
import type { JobQueue } from '../jobs/job-queue';
import { projectAddresses, queueMail } from '../mail/outbox';
import { actionContext, loadRunFor, loadVisibleRun, visibleProjectIds, type RunRow } from './run-access';
import { nextCode } from './run-code';
import { runHistory } from './run-history';
import { offeredActions } from './run-state-machine';
import { hashStoredReadings, insertReadingChunks, insertReadings } from './readings-bulk';
import type { ReadingsFeed } from './readings-body';
import type { ReadingRow } from './run-document-mapper';
import { overPressureFilter } from './run-filters';
import { checkRegisterInstruments, type NamedInstrument } from './register-instruments';
import { loadReadings, loadRunDocument } from './run-loader';
import type { RunSetup } from './run-setup';
import { submitProblems } from './submit-checklist';
import { runLink } from '../mail/run-link';
import type { CreateRunDto, RunListQuery, UpdateRunDto } from './runs-dto';

/** Fields of a run that the audit trail records before and after a change. */
const auditView = (r: RunRow) => ({
  title: r.title, process: r.process, runDate: r.runDate, gasId: r.gasId, apparatusId: r.apparatusId, state: r.state, version: r.version, setup: r.setup,
});

export class RunsService {
  constructor(private readonly db: Database, private readonly config: Config, private readonly queue: JobQueue | null) {}

  async list(person: SessionPerson, query: RunListQuery): Promise<Wire<RunPage>> {
    const filters: SQL[] = [];
    const projectIds = await visibleProjectIds(this.db, person);
    if (projectIds !== null) {
      if (projectIds.length === 0) return { items: [], total: 0, page: query.page, pageSize: query.pageSize };
      filters.push(inArray(runs.projectId, projectIds));
    }
    if (query.state) filters.push(eq(runs.state, query.state));
    if (query.verdict) filters.push(eq(runs.verdict, query.verdict));
    if (query.project !== undefined) filters.push(eq(runs.projectId, query.project));
    if (query.author !== undefined) filters.push(eq(runs.authorId, query.author));
    if (query.mine === 'true') filters.push(eq(runs.authorId, person.id));
    if (query.others === 'true') filters.push(ne(runs.authorId, person.id));
    if (query.safety === 'over-pressure') filters.push(overPressureFilter());
    if (query.from) filters.push(sql`${runs.runDate} >= ${query.from}`);
    if (query.to) filters.push(sql`${runs.runDate} <= ${query.to}`);
    const where = filters.length ? and(...filters) : undefined;

    const sortColumn = { updatedAt: runs.updatedAt, createdAt: runs.createdAt, runDate: runs.runDate, code: runs.code, title: runs.title, state: runs.state }[query.sort];
    const order = query.dir === 'asc' ? asc(sortColumn) : desc(sortColumn);

    const [items, [{ total }]] = await Promise.all([
      this.db
        .select({
          id: runs.id, code: runs.code, revision: runs.revision, title: runs.title, process: runs.process, state: runs.state,
          verdict: runs.verdict, runDate: runs.runDate, authorId: runs.authorId, authorName: people.name, projectId: runs.projectId,
          projectName: projects.name, updatedAt: runs.updatedAt,
        })
        .from(runs)
        .innerJoin(people, eq(people.id, runs.authorId))
        .innerJoin(projects, eq(projects.id, runs.projectId))
        .where(where)
        .orderBy(order, desc(runs.id))
        .limit(query.pageSize)
        .offset((query.page - 1) * query.pageSize),
      this.db.select({ total: count() }).from(runs).where(where),
    ]);
    return { items, total, page: query.page, pageSize: query.pageSize };
  }

  /** The run, its readings as columns, its current result summary, signatures and revisions. */
  async get(person: SessionPerson, id: number): Promise<Wire<RunRead>> {
    const run = await loadVisibleRun(this.db, person, id);
    const [rows, [result], sigs, revisions, [author], [project], context] = await Promise.all([
      loadReadings(this.db, id),
      this.db.select({ id: balanceResults.id, runVersion: balanceResults.runVersion, verdict: balanceResults.verdict, en: balanceResults.en, computedAt: balanceResults.computedAt })
        .from(balanceResults).where(and(eq(balanceResults.runId, id), eq(balanceResults.current, true))),
      this.db.select({ id: signatures.id, action: signatures.action, meaning: signatures.meaning, reason: signatures.reason, signedHash: signatures.signedHash, signedAt: signatures.signedAt, signerName: people.name })
        .from(signatures).innerJoin(people, eq(people.id, signatures.signerId)).where(eq(signatures.runId, id)).orderBy(asc(signatures.signedAt)),
      this.db.select({ id: runs.id, revision: runs.revision, state: runs.state, revisionReason: runs.revisionReason, createdAt: runs.createdAt })
        .from(runs).where(eq(runs.code, run.code)).orderBy(asc(runs.revision)),
      this.db.select({ name: people.name }).from(people).where(eq(people.id, run.authorId)),
      this.db.select({ name: projects.name }).from(projects).where(eq(projects.id, run.projectId)),
      actionContext(this.db, person, run),
    ]);
    const column = (key: keyof ReadingRow) => rows.map((r) => r[key]);
    // The engine's own SI series (absolute pressure, volume from displacement) for the diagrams.
    let series: { t: number[]; P: number[] | null; V: number[] | null; T: number[]; power: number[] | null } | null = null;
    const doc = validateRunDocument(await loadRunDocument(this.db, run, this.config.labName));
    if (doc.ok) {
      try {
        const s = buildSeries(doc.doc);
        const power = s.Pw ? Array.from(s.Pw.si) : s.U && s.I ? Array.from(s.U.si, (u, i) => u * s.I!.si[i]) : null;
        series = { t: Array.from(s.t), P: s.P ? Array.from(s.P.si) : null, V: s.V ? Array.from(s.V.si) : null, T: Array.from(s.T.si), power };
      } catch {
        series = null; // a draft the engine cannot read yet has no diagram
      }
    }
    return {
      ...run,
      authorName: author?.name,
      projectName: project?.name,
      readings: {
        count: rows.length,
        time: rows.map((r) => r.time), pressure: column('pressure'), volume: column('volume'), displacement: column('displacement'),
        temperature: column('temperature'), voltage: column('voltage'), current: column('current'), power: column('power'),
      },
      series,
      balance: result ? { ...result, stale: result.computedAt < run.editedAt } : null,
      signatures: sigs,
      revisions,
      ...offeredActions(context, result !== undefined && result.runVersion === run.version),
    };
  }

  private async checkReferences(tx: DbOrTx, person: SessionPerson, body: { projectId?: number; gasId?: number | null; apparatusId?: number | null; setup?: unknown }) {
    await checkRegisterInstruments(tx, boundInstruments((body.setup as RunSetup | undefined)?.channels, 'setup.channels'));
    if (body.projectId !== undefined) {
      const [member] = await tx.select().from(projectMembers).where(and(eq(projectMembers.projectId, body.projectId), eq(projectMembers.personId, person.id)));
      if (!member) throw forbidden(`You are not a member of project ${body.projectId}; runs are created in one of your own projects.`);
    }
    if (body.gasId !== undefined && body.gasId !== null) {
      const [gas] = await tx.select({ id: gases.id }).from(gases).where(eq(gases.id, body.gasId));
      if (!gas) throw badRequest(`There is no gas with id ${body.gasId}.`, [{ field: 'gasId', message: 'unknown gas' }]);
    }
    if (body.apparatusId !== undefined && body.apparatusId !== null) {
      const [app] = await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.id, body.apparatusId));
      if (!app) throw badRequest(`There is no apparatus with id ${body.apparatusId}.`, [{ field: 'apparatusId', message: 'unknown apparatus' }]);
    }
  }

  async create(person: SessionPerson, body: CreateRunDto, rows: readonly ReadingRow[] = [], ip: string | null = null) {
    if (!inRoleGroup(RUN_AUTHORS, person.role)) throw forbidden('Runs are written by technicians, assistants and investigators.');
    return this.db.transaction(async (tx) => {
      await this.checkReferences(tx, person, body);
      const code = await nextCode(tx, body.runDate);
      const [run] = await tx.insert(runs).values({
        code, projectId: body.projectId, authorId: person.id, title: body.title.trim(), process: body.process, runDate: body.runDate,
        gasId: body.gasId ?? null, apparatusId: body.apparatusId ?? null, setup: (body.setup ?? {}) as Record<string, unknown>,
      }).returning();
      await insertReadings(tx, run.id, rows);
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'run.create', entityType: 'run', entityId: run.id, after: { ...auditView(run), code, readings: rows.length }, ip });
      return run;
    });
  }

  async update(person: SessionPerson, id: number, body: UpdateRunDto, ip: string | null) {
    return this.db.transaction(async (tx) => {
      const before = await loadRunFor(tx, person, id, 'edit', body.version);
      await this.checkReferences(tx, person, body);
      const changes = {
        ...(body.title !== undefined ? { title: body.title.trim() } : {}),
        ...(body.process !== undefined ? { process: body.process } : {}),
        ...(body.runDate !== undefined ? { runDate: body.runDate } : {}),
        ...(body.gasId !== undefined ? { gasId: body.gasId } : {}),
        ...(body.apparatusId !== undefined ? { apparatusId: body.apparatusId } : {}),
        ...(body.setup !== undefined ? { setup: body.setup as Record<string, unknown> } : {}),
      };
      const [after] = await tx.update(runs).set({ ...changes, version: before.version + 1, updatedAt: sql`now()`, editedAt: sql`now()` }).where(eq(runs.id, id)).returning();
      const keys = Object.keys(changes) as (keyof ReturnType<typeof auditView>)[];
      const pick = (r: RunRow) => Object.fromEntries(keys.map((k) => [k, auditView(r)[k]]));
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'run.update', entityType: 'run', entityId: id, before: { ...pick(before), version: before.version }, after: { ...pick(after), version: after.version }, ip });
      return after;
    });
  }

  /**
   * Replaces a run's readings from a readings body as it is prepared (readings-body.ts): a refused body
   * stops here before any database work; then, in one transaction, the old readings' hash, the delete,
   * one INSERT per chunk as each arrives, the setup and the audit row.
   */
  async replaceReadings(person: SessionPerson, id: number, feed: ReadingsFeed, ip: string | null) {
    try {
      const header = await feed.header();
      const { time, channels } = header;
      return await this.db.transaction(async (tx) => {
        const before = await loadRunFor(tx, person, id, 'edit', header.version);
        await checkRegisterInstruments(tx, boundInstruments(channels, 'channels'));
        const old = await hashStoredReadings(tx, id);
        await tx.delete(readings).where(eq(readings.runId, id));
        await insertReadingChunks(tx, id, header, feed.chunks());
        const sha256 = await feed.sha256();
        const setup: RunSetup = { ...((before.setup ?? {}) as RunSetup), time, channels };
        const [after] = await tx.update(runs).set({ setup: setup as Record<string, unknown>, version: before.version + 1, updatedAt: sql`now()`, editedAt: sql`now()` }).where(eq(runs.id, id)).returning();
        await recordAudit(tx, {
          actorId: person.id, actorEmail: person.email, action: 'run.readings-replace', entityType: 'run', entityId: id,
          before: { readings: old.readings, sha256: old.sha256, version: before.version },
          after: { readings: header.readings, sha256, version: after.version, channels: Object.keys(channels ?? {}) },
          ip,
        });
        return { id, version: after.version, readings: header.readings };
      });
    } finally {
      feed.stop();
    }
  }

  /** Submits a run: it must read as a complete run document; the check itself is queued. */
  async submit(person: SessionPerson, id: number, version: number, ip: string | null) {
    const result = await this.db.transaction(async (tx) => {
      const before = await loadRunFor(tx, person, id, 'submit', version);
      const [{ n }] = await tx.select({ n: count() }).from(readings).where(eq(readings.runId, id));
      const missing = await submitProblems(tx, before, this.config.labName, n);
      if (missing.length) {
        throw badRequest(`Run ${before.code} is not complete enough to check: ${missing.length === 1 ? 'one thing is' : `${missing.length} things are`} still missing. Nothing was changed.`,
          missing.map((e) => ({ field: e.field, label: e.label, message: e.message })));
      }
      const unstated = channelsWithoutInstrument(await loadRunDocument(tx, before, this.config.labName));
      if (unstated.length > 0) {
        throw badRequest(`Run ${before.code} has ${unstated.length} channel(s) with no instrument, whose readings would add no uncertainty: choose the instrument that read each. Nothing was changed.`,
          unstated.map((name) => ({ field: `readings.${name}.instrument`, message: `the ${name} channel names no instrument; choose the one that read it so its uncertainty enters the budget` })));
      }
      const [after] = await tx.update(runs)
        .set({ state: 'submitted', version: before.version + 1, submittedAt: sql`now()`, updatedAt: sql`now()`, verdict: null, returnReason: null })
        .where(eq(runs.id, id)).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'run.submit', entityType: 'run', entityId: id, before: { state: before.state, version: before.version }, after: { state: after.state, version: after.version }, ip });
      const investigators = await projectAddresses(tx, after.projectId, 'investigator');
      await queueMail(tx, investigators.filter((e) => e !== person.email).map((to) => ({
        to, subject: `Run ${after.code} submitted for review`,
        body: `${person.name} submitted run ${after.code} "${after.title}" (${after.process}, ${after.runDate}).\nThe energy-balance check is running; open the run to review it once it has finished: ${runLink(this.config.publicUrl, after.id)}`,
      })));
      return after;
    });
    // Queued after commit; the sweep re-queues it if this process dies first.
    await this.queue?.enqueueBalanceCheck({ runId: result.id, version: result.version });
    return result;
  }

  /** The audit events of a run and of its other revisions, oldest first: its history as people see it. */
  history(person: SessionPerson, id: number) {
    return runHistory(this.db, person, id);
  }

  /** The run as a run document (the export that POST /api/balance and the CLI read back). */
  async document(person: SessionPerson, id: number) {
    const run = await loadVisibleRun(this.db, person, id);
    const doc = await loadRunDocument(this.db, run, this.config.labName, { useFittedHeatLoss: this.config.useFittedHeatLoss });
    await recordAuditAlone(this.db, { actorId: person.id, actorEmail: person.email, action: 'run.export', entityType: 'run', entityId: id, after: { format: 'qwell.run', sha256: sha256Canonical(doc) } });
    return doc;
  }

  async latestResult(person: SessionPerson, id: number) {
    const run = await loadVisibleRun(this.db, person, id);
    const [row] = await this.db.select().from(balanceResults)
      .where(and(eq(balanceResults.runId, id), eq(balanceResults.current, true)));
    return { run, row };
  }
}

/** The reading channels (time aside) that name no instrument: they would enter the budget with no uncertainty. */
function channelsWithoutInstrument(doc: RunDocument): string[] {
  return Object.entries(doc.readings)
    .filter(([name, ch]) => name !== 'time' && ch && !(ch as { instrument?: string }).instrument)
    .map(([name]) => name);
}

/** The register instruments a setup's channels are bound to, with the field of each (`<prefix>.<channel>.instrumentId`). */
function boundInstruments(channels: RunSetup['channels'] | undefined, prefix: string): NamedInstrument[] {
  return Object.entries(channels ?? {}).flatMap(([channel, c]) => (c?.instrumentId !== undefined ? [{ channel, id: c.instrumentId, field: `${prefix}.${channel}.instrumentId` }] : []));
}
