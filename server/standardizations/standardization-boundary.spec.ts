// A run dated on the day of a recorded change to the apparatus belongs to the state of the apparatus it was
// measured with: made before the change when it was first entered before the change was recorded (the control
// chart's rule, madeBefore in control-chart-segments.ts). The STANDARDIZATION_DUE flag and the standardization a
// run is pinned to follow the same rule, however often and however late the run is checked again
// (ASTM D240 §8.1.1: standardize again after changing any part of the calorimeter).
import { and, desc, eq } from 'drizzle-orm';
import { apparatus, apparatusChanges, balanceResults, people, projects, runs, standardizations } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { runBalanceCheck } from '../balance/balance-check';
import { loadRunDocument } from '../runs/run-loader';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { runEnteredAt, runStandardization } from './standardization-pin';

let h: ApiHarness;
let appId: number;
let qualityId: number;
let techId: number;
let projectId: number;
const tag = `BC-B${Date.now().toString(36).toUpperCase().slice(-5)}`;
// Invented demo times: the stirrer motor was replaced on the fixture's run date, recorded at noon UTC.
const DAY = '2026-03-14';
const CHANGE_RECORDED = new Date(`${DAY}T12:00:00Z`);
const EARLY = new Date(`${DAY}T09:00:00Z`); // entered before the change was recorded: the old apparatus
const LATE = new Date(`${DAY}T15:00:00Z`); // entered after it: the changed apparatus
let s1: number;

interface Flagged { flags: { code: string; message: string }[]; standardization: { id: number } | null }

beforeAll(async () => {
  h = await startHarness();
  const db = h.handle.db;
  [{ id: appId }] = await db.insert(apparatus).values({ tag, name: 'Bath calorimeter across a same-day repair', kind: 'bath-calorimeter', heatCapacity: 4500, heatCapacityU: 4 }).returning();
  [{ id: qualityId }] = await db.select({ id: people.id }).from(people).where(eq(people.email, demoEmail('quality')));
  [{ id: techId }] = await db.select({ id: people.id }).from(people).where(eq(people.email, demoEmail('technician')));
  [{ id: projectId }] = await db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  [{ id: s1 }] = await db.insert(standardizations).values({
    apparatusId: appId, energyEquivalent: 4500, energyEquivalentU: 4, runIds: [], summary: {}, effectiveFrom: '2026-01-05',
    signerId: qualityId, meaning: 'test standardization', signedHash: 'test', signedAt: new Date('2026-01-05T10:00:00Z'),
  }).returning();
});
afterAll(() => h.close());

async function recordChange() {
  await h.handle.db.insert(apparatusChanges).values({ apparatusId: appId, description: 'stirrer motor replaced', changedOn: DAY, recordedBy: qualityId, recordedAt: CHANGE_RECORDED });
}

describe('a calorimetric run of the change\'s day, checked again after the change was recorded', () => {
  const made: Record<'early' | 'late', { id: number; version: number }> = {} as never;

  /** Checks the run's submitted version again, as a retried or swept job would, and returns the stored result. */
  async function check(which: 'early' | 'late'): Promise<Flagged> {
    const { id, version } = made[which];
    expect(await runBalanceCheck(h.handle.db, h.config, id, version)).toBe('stored');
    const [row] = await h.handle.db.select({ result: balanceResults.result }).from(balanceResults)
      .where(and(eq(balanceResults.runId, id), eq(balanceResults.current, true))).orderBy(desc(balanceResults.id)).limit(1);
    return row.result as unknown as Flagged;
  }
  const due = (r: Flagged) => r.flags.find((f) => f.code === 'STANDARDIZATION_DUE');

  beforeAll(async () => {
    const tech = await clientAs(h.app, 'technician');
    const bodies = runBodies(loadFixture('calorimetric'), projectId);
    expect(bodies.create.runDate).toBe(DAY);
    for (const [which, at] of [['early', EARLY], ['late', LATE]] as const) {
      const created = await tech.post('/api/runs', { ...bodies.create, apparatusId: appId, setup: { ...bodies.create.setup, apparatus: { name: 'Bath calorimeter across a same-day repair' } } });
      expect(created.status).toBe(201);
      const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
      const submitted = await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version });
      expect(submitted.status).toBe(202);
      // When each was entered on the change's day (the API stamps now; the lab's day is in the past here).
      await h.handle.db.update(runs).set({ createdAt: at }).where(eq(runs.id, created.body.id));
      made[which] = { id: created.body.id, version: submitted.body.version };
    }
  });

  it('is not flagged on either side before any change is recorded', async () => {
    expect(due(await check('early'))).toBeUndefined();
    expect(due(await check('late'))).toBeUndefined();
  });

  it('leaves the run entered before the change was recorded unflagged, on the standardization it was measured with', async () => {
    await recordChange();
    const early = await check('early');
    expect(due(early)).toBeUndefined();
    expect(early.standardization?.id).toBe(s1);
    // Checked again, still the same
    expect(due(await check('early'))).toBeUndefined();
  });

  it('flags the run entered after the change was recorded, saying in the lab\'s words why it counts as after', async () => {
    const flag = due(await check('late'));
    expect(flag?.message).toBe(
      `The apparatus was changed on ${DAY} ("stirrer motor replaced") and has not been standardized since: its energy equivalent may no longer hold. `
      + 'The run is dated that day and was entered after the change was recorded (12:00 UTC), so it was measured on the changed apparatus. '
      + 'Run a new standardization series and have it approved (ASTM D240 §8.1.1).',
    );
  });

  it('keeps the run before the change on the older ε once a standardization of the changed apparatus is signed that day', async () => {
    const [{ id: s2 }] = await h.handle.db.insert(standardizations).values({
      apparatusId: appId, energyEquivalent: 4620, energyEquivalentU: 5, runIds: [], summary: {}, effectiveFrom: DAY,
      signerId: qualityId, meaning: 'test standardization', signedHash: 'test', signedAt: new Date(`${DAY}T16:00:00Z`),
    }).returning();
    const early = await check('early');
    expect(early.standardization?.id).toBe(s1);
    expect(due(early)).toBeUndefined();
    const [earlyRow] = await h.handle.db.select().from(runs).where(eq(runs.id, made.early.id));
    expect((await loadRunDocument(h.handle.db, earlyRow, 'lab')).apparatus?.heatCapacity).toEqual({ value: 4500, unit: 'J/K', u: 4 });
    const late = await check('late');
    expect(late.standardization?.id).toBe(s2);
    expect(due(late)).toBeUndefined();
    const [lateRow] = await h.handle.db.select().from(runs).where(eq(runs.id, made.late.id));
    expect((await loadRunDocument(h.handle.db, lateRow, 'lab')).apparatus?.heatCapacity).toEqual({ value: 4620, unit: 'J/K', u: 5 });
  });
});

describe('the control chart and the flag on either side of the change', () => {
  let chartApp: number;
  // Codes after the demo lab's R-… in the run list's default order, where other specs look for checked runs.
  const code = `SB-${tag}`;

  async function standardizationRun(suffix: string, runDate: string, enteredAt: Date, value: number, revisionOf?: { id: number; code: string }) {
    const [run] = await h.handle.db.insert(runs).values({
      code: revisionOf?.code ?? `${code}-${suffix}`, revision: revisionOf ? 2 : 1, previousRevisionId: revisionOf?.id ?? null,
      projectId, authorId: techId, title: `Standardization ${suffix}`, process: 'calorimetric', runDate, state: 'submitted', apparatusId: chartApp,
      setup: { gas: { model: 'calorimeter' }, purpose: 'standardization', heatSource: { kind: 'electrical' } }, createdAt: enteredAt,
    }).returning();
    await h.handle.db.insert(balanceResults).values({
      runId: run.id, runVersion: run.version, engineVersion: 'spec', inputHash: `${code}-${suffix}`, verdict: 'closes', en: 0.1, residual: 0, expandedUncertainty: 1,
      result: { energyEquivalent: { value, u: 3 } },
    });
    return run;
  }

  it('puts each run in the segment whose flag it gets: before the change unflagged, after it flagged; a revision keeps its first entry', async () => {
    [{ id: chartApp }] = await h.handle.db.insert(apparatus).values({ tag: `${tag}C`, name: 'Bath calorimeter for the chart boundary', kind: 'bath-calorimeter', heatCapacity: 4850, heatCapacityU: 5 }).returning();
    await h.handle.db.insert(standardizations).values({
      apparatusId: chartApp, energyEquivalent: 4850, energyEquivalentU: 3, runIds: [], summary: {}, effectiveFrom: '2026-01-05',
      signerId: qualityId, meaning: 'test standardization', signedHash: 'test', signedAt: new Date('2026-01-05T10:00:00Z'),
    });
    // Invented demo values: ε ≈ 4850 J/K before the repair, ≈ 4905 J/K after it.
    const dayBefore = await standardizationRun('A', '2026-03-13', new Date('2026-03-13T10:00:00Z'), 4850.4);
    const early = await standardizationRun('B', DAY, EARLY, 4851.1);
    const late = await standardizationRun('C', DAY, LATE, 4904.7);
    const dayAfter = await standardizationRun('D', '2026-03-15', new Date('2026-03-15T08:00:00Z'), 4905.2);
    // The early run corrected two days later: a new row entered after the change, the same measurement.
    const revised = await standardizationRun('B2', DAY, new Date('2026-03-16T09:00:00Z'), 4851.3, early);
    await h.handle.db.insert(apparatusChanges).values({ apparatusId: chartApp, description: 'stirrer motor replaced', changedOn: DAY, recordedBy: qualityId, recordedAt: CHANGE_RECORDED });
    expect(await runEnteredAt(h.handle.db, early.code)).toEqual(EARLY);

    const res = await (await clientAs(h.app, 'investigator')).get(`/api/apparatus/${chartApp}/standardizations`);
    expect(res.status).toBe(200);
    const segmentOf = new Map((res.body.series as { runId: number; segment: number }[]).map((s) => [s.runId, s.segment]));
    expect([...segmentOf.keys()]).not.toContain(early.id); // replaced by its revision
    expect([dayBefore, revised, late, dayAfter].map((r) => segmentOf.get(r.id))).toEqual([0, 0, 1, 1]);

    for (const [run, segment] of [[dayBefore, 0], [revised, 0], [late, 1], [dayAfter, 1]] as const) {
      const pin = await runStandardization(h.handle.db, { apparatusId: chartApp, runDate: run.runDate, enteredAt: await runEnteredAt(h.handle.db, run.code) });
      expect({ code: run.code, flagged: pin.flag?.code === 'STANDARDIZATION_DUE' }).toEqual({ code: run.code, flagged: segment === 1 });
    }
  });
});
