// Standardization series of a calorimeter, their approval with an electronic signature, and changes to the
// apparatus that make a new standardization due.
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { DueApparatus, StandardizationOverview } from '../../contract/api/standardizations';
import type { Wire } from '../../contract/wire';
import type { Database, DbOrTx } from '../../db/client';
import { apparatus, apparatusChanges, people, standardizations } from '../../db/schema';
import { recordAudit } from '../audit/audit-service';
import { badRequest, conflict, notFound } from '../core/problem';
import type { SessionPerson } from '../core/session';
import { sha256Canonical } from '../engine';
import type { AcceptanceRule, ChartLimits, SeriesSummary } from '../engine/control-chart';
import { segmentByChanges, type SeriesChange } from '../engine/control-chart-segments';
import { checkSignerPassword } from '../runs/signer-password';
import { standardizationFigures } from './standardization-figures';
import type { ApparatusChangeDto, ApproveStandardizationDto } from './standardization-dto';
import { standardizationMeanings } from './standardization-dto';
import { changeUncovered, latestChange, type StandardizationRow } from './standardization-pin';

export interface SeriesRun {
  runId: number;
  code: string;
  runDate: string;
  state: string;
  energyEquivalent: { value: number; u: number };
  heatLoss: { value: number; u: number } | null;
  inputHash: string;
  accepted: boolean;
  outOfControl: boolean;
  rule: string | null;
  /** Index of the run's chart segment (a recorded change to the apparatus starts a new one), and whether it is the current one. */
  segment: number;
  current: boolean;
}

export interface SegmentOut {
  index: number;
  /** The change that started it (null for the first). */
  change: SeriesChange | null;
  n: number;
  chart: ChartLimits | null;
  current: boolean;
}

type RawRun = { id: number; code: string; run_date: string; entered_at: string; state: string; ee: { value: number; u: number }; h: { value: number; u: number } | null; input_hash: string };

const round = (x: number) => (Number.isFinite(x) ? x : null);

export class StandardizationService {
  /** @param useFittedHeatLoss the lab setting QWELL_USE_FITTED_HEAT_LOSS, shown on the apparatus page. */
  constructor(private readonly db: Database, private readonly rule: AcceptanceRule, private readonly useFittedHeatLoss = false) {}

  private async apparatusRow(db: DbOrTx, id: number) {
    const [row] = await db.select().from(apparatus).where(eq(apparatus.id, id));
    if (!row) throw notFound(`There is no apparatus with id ${id}.`);
    return row;
  }

  /**
   * Standardization runs of the apparatus (submitted or approved, latest revision) with a computed ε, in date order,
   * in chart segments split at recorded changes; `summary` is the current segment's (ASTM D240 §8.1.1).
   */
  async series(db: DbOrTx, apparatusId: number): Promise<{ runs: SeriesRun[]; summary: SeriesSummary; segments: SegmentOut[] }> {
    const rows = [...await db.execute<RawRun>(sql`
      SELECT r.id, r.code, r.run_date::text AS run_date, to_json(e.entered_at) #>> '{}' AS entered_at, r.state, b.result->'energyEquivalent' AS ee,
             b.result->'heatLeakFit'->'h' AS h, b.input_hash
      FROM runs r JOIN balance_results b ON b.run_id = r.id AND b.current
      -- When the run was first entered (runEnteredAt): a revision stays on the side of a same-day change its measurement was.
      CROSS JOIN LATERAL (SELECT min(f.created_at) AS entered_at FROM runs f WHERE f.code = r.code) e
      WHERE r.apparatus_id = ${apparatusId} AND r.setup->>'purpose' = 'standardization'
        AND r.state IN ('submitted', 'approved')
        AND jsonb_typeof(b.result->'energyEquivalent') = 'object'
        AND NOT EXISTS (SELECT 1 FROM runs n WHERE n.previous_revision_id = r.id)
      ORDER BY r.run_date, e.entered_at, r.id`)];
    const changes = (await db.select({ date: apparatusChanges.changedOn, description: apparatusChanges.description, recordedAt: apparatusChanges.recordedAt }).from(apparatusChanges).where(eq(apparatusChanges.apparatusId, apparatusId)))
      .map((c) => ({ ...c, recordedAt: c.recordedAt.toISOString() }));
    const segments = segmentByChanges(rows.map((r) => ({ date: r.run_date, at: r.entered_at, value: r.ee.value })), changes, this.rule);
    const runs = segments.flatMap((seg, index) => rows.slice(seg.start, seg.end).map((r, j) => {
      const b = seg.summary.breaks[j];
      return {
        runId: r.id, code: r.code, runDate: r.run_date, state: r.state,
        energyEquivalent: { value: r.ee.value, u: r.ee.u }, heatLoss: r.h ? { value: r.h.value, u: r.h.u } : null, inputHash: r.input_hash,
        accepted: b === null && seg.current, outOfControl: b !== null, rule: b ? `test ${b.test}: ${b.rule}` : null, segment: index, current: seg.current,
      };
    }));
    const current = segments[segments.length - 1];
    return {
      runs, summary: current.summary,
      segments: segments.map((seg, index) => ({ index, change: seg.change && { date: seg.change.date, description: seg.change.description }, n: seg.end - seg.start, chart: seg.summary.chart, current: seg.current })),
    };
  }

  /** The rows as the API answers them; inside a transaction pass it, so the answer needs no second connection. */
  private async withSigner(rows: StandardizationRow[], db: DbOrTx = this.db) {
    const names = new Map((await db.select({ id: people.id, name: people.name }).from(people)).map((p) => [p.id, p.name]));
    return rows.map((s) => ({
      id: s.id, energyEquivalent: { value: s.energyEquivalent, u: s.energyEquivalentU },
      heatLossCoefficient: s.heatLossCoefficient === null ? null : { value: s.heatLossCoefficient, u: s.heatLossCoefficientU },
      runIds: s.runIds, summary: s.summary, effectiveFrom: s.effectiveFrom, signedBy: names.get(s.signerId) ?? '', meaning: s.meaning,
      reason: s.reason, signedHash: s.signedHash, signedAt: s.signedAt.toISOString(),
    }));
  }

  /** GET /api/apparatus/:id/standardizations */
  async overview(apparatusId: number): Promise<Wire<StandardizationOverview>> {
    const app = await this.apparatusRow(this.db, apparatusId);
    const { runs, summary, segments } = await this.series(this.db, apparatusId);
    const history = await this.withSigner(await this.db.select().from(standardizations).where(eq(standardizations.apparatusId, apparatusId)).orderBy(desc(standardizations.signedAt), desc(standardizations.id)));
    const changes = await this.db.select({ id: apparatusChanges.id, description: apparatusChanges.description, changedOn: apparatusChanges.changedOn, recordedAt: apparatusChanges.recordedAt, recordedBy: people.name })
      .from(apparatusChanges).innerJoin(people, eq(people.id, apparatusChanges.recordedBy)).where(eq(apparatusChanges.apparatusId, apparatusId)).orderBy(desc(apparatusChanges.recordedAt));
    const today = new Date().toISOString().slice(0, 10);
    const current = history.find((s) => s.effectiveFrom <= today) ?? null;
    const latest = await latestChange(this.db, apparatusId);
    const [latestStd] = await this.db.select().from(standardizations).where(eq(standardizations.apparatusId, apparatusId)).orderBy(desc(standardizations.signedAt)).limit(1);
    const due = changeUncovered(latest, latestStd ?? null);
    return {
      apparatus: { id: app.id, tag: app.tag, name: app.name, kind: app.kind },
      current,
      due: due ? { since: latest!.changedOn, description: latest!.description } : null,
      series: runs.map(({ inputHash: _h, heatLoss: _l, ...r }) => r),
      chart: summary.chart,
      segments,
      summary: { n: summary.n, days: summary.days, mean: round(summary.mean), sd: round(summary.sd), uMean: round(summary.uMean), rsd: round(summary.rsd), acceptance: summary.acceptance },
      rule: this.rule,
      useFittedHeatLoss: this.useFittedHeatLoss,
      history,
      changes: changes.map((c) => ({ ...c, recordedAt: c.recordedAt.toISOString() })),
    };
  }

  /** POST /api/apparatus/:id/standardizations: the quality officer signs the mean ε of selected accepted runs. */
  async approve(person: SessionPerson, apparatusId: number, body: ApproveStandardizationDto, ip: string | null) {
    if (!standardizationMeanings.includes(body.meaning)) {
      throw badRequest(`meaning must be one of: ${standardizationMeanings.map((m) => `"${m}"`).join(', ')}.`, [{ field: 'meaning', message: 'not a meaning for this approval' }]);
    }
    await this.apparatusRow(this.db, apparatusId);
    await checkSignerPassword(this.db, person, body.password, { type: 'apparatus', id: apparatusId }, ip);
    return this.db.transaction(async (tx) => {
      await tx.select({ id: apparatus.id }).from(apparatus).where(eq(apparatus.id, apparatusId)).for('update');
      const { runs } = await this.series(tx, apparatusId);
      const byId = new Map(runs.map((r) => [r.runId, r]));
      const wanted = [...new Set(body.runIds)];
      const problems = wanted.flatMap((id) => {
        const r = byId.get(id);
        if (!r) return [{ field: 'runIds', message: `run ${id} is not a submitted or approved standardization run of this apparatus with an energy equivalent` }];
        if (!r.current) return [{ field: 'runIds', message: `run ${r.code} was made before the latest recorded change to the apparatus; a new standardization takes runs made after it (ASTM D240 §8.1.1)` }];
        if (!r.accepted) return [{ field: 'runIds', message: `run ${r.code} is out of control (${r.rule}); leave it out or investigate it first` }];
        return [];
      });
      if (problems.length) throw badRequest(problems.map((p) => p.message).join('; '), problems);
      const chosen = runs.filter((r) => wanted.includes(r.runId));
      const f = standardizationFigures(chosen, this.rule);
      const s = f.summary;
      if (!s.acceptance.ok) throw badRequest(`The selected runs do not meet the lab's acceptance rule: ${s.acceptance.reasons.join('; ')}.`, s.acceptance.reasons.map((message) => ({ field: 'runIds', message })));
      const u = f.energyEquivalent.u;
      const hMean = f.heatLossCoefficient?.value ?? null;
      const hU = f.heatLossCoefficient?.u ?? null;
      const signedHash = sha256Canonical({ apparatusId, runs: chosen.map((r) => ({ id: r.runId, inputHash: r.inputHash, energyEquivalent: r.energyEquivalent })) });
      // The same runs with the same results as the standardization in force: signing them again would add a
      // second, identical signed record (eight identical requests at once stored eight); under the apparatus
      // lock the first signs and the rest are told which record already holds them.
      const [latest] = await tx.select().from(standardizations).where(eq(standardizations.apparatusId, apparatusId)).orderBy(desc(standardizations.signedAt), desc(standardizations.id)).limit(1);
      if (latest?.signedHash === signedHash) {
        const [signer] = await tx.select({ name: people.name }).from(people).where(eq(people.id, latest.signerId));
        throw conflict(`These runs, with these results, are already signed as the standardization in force (no. ${latest.id}, signed ${latest.signedAt.toISOString().slice(0, 10)} by ${signer?.name ?? 'a quality officer'}); there is nothing new to sign.`, { standardizationId: latest.id });
      }
      const today = new Date().toISOString().slice(0, 10);
      const summary = { n: s.n, days: s.days, mean: s.mean, sd: s.sd, uMean: s.uMean, rsd: s.rsd, chart: s.chart, rule: this.rule };
      const [row] = await tx.insert(standardizations).values({
        apparatusId, energyEquivalent: s.mean, energyEquivalentU: u, heatLossCoefficient: hMean, heatLossCoefficientU: hU,
        runIds: chosen.map((r) => r.runId), summary, effectiveFrom: today, signerId: person.id, meaning: body.meaning,
        reason: body.reason?.trim() || null, signedHash,
      }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'standardization.approve', entityType: 'apparatus', entityId: apparatusId, after: { standardizationId: row.id, energyEquivalent: s.mean, u, runIds: row.runIds, effectiveFrom: today }, reason: row.reason, ip });
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'signature.create', entityType: 'standardization', entityId: row.id, after: { apparatusId, meaning: body.meaning, signedHash }, reason: row.reason, ip });
      // Read through tx: a second pool connection, asked for while holding the apparatus lock, hung the
      // server once as many signings as the pool has connections were waiting for that lock.
      return (await this.withSigner([row], tx))[0];
    });
  }

  /** POST /api/apparatus/:id/changes: a part replaced or a repair; the apparatus needs a new standardization. */
  async recordChange(person: SessionPerson, apparatusId: number, body: ApparatusChangeDto, ip: string | null) {
    return this.db.transaction(async (tx) => {
      await this.apparatusRow(tx, apparatusId);
      const changedOn = body.changedOn ?? new Date().toISOString().slice(0, 10);
      const [row] = await tx.insert(apparatusChanges).values({ apparatusId, description: body.description.trim(), changedOn, recordedBy: person.id }).returning();
      await recordAudit(tx, { actorId: person.id, actorEmail: person.email, action: 'apparatus.change', entityType: 'apparatus', entityId: apparatusId, after: { changeId: row.id, description: row.description, changedOn }, ip });
      return { ...row, recordedAt: row.recordedAt.toISOString() };
    });
  }

  /** Apparatus whose latest change has no standardization signed after it (for the homes). */
  async due(): Promise<Wire<DueApparatus[]>> {
    const rows = await this.db.select().from(apparatus).orderBy(asc(apparatus.tag));
    const out = [];
    for (const a of rows) {
      const change = await latestChange(this.db, a.id);
      if (!change) continue;
      const [std] = await this.db.select().from(standardizations).where(and(eq(standardizations.apparatusId, a.id))).orderBy(desc(standardizations.signedAt)).limit(1);
      if (changeUncovered(change, std ?? null)) out.push({ id: a.id, tag: a.tag, name: a.name, since: change.changedOn, description: change.description });
    }
    return out;
  }
}
