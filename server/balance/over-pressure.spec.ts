import { and, eq } from 'drizzle-orm';
import { balanceResults, mailOutbox, projects, runs } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, eventually, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { runBalanceCheck } from './balance-check';
import { overPressureOf } from './over-pressure';

// Over the rated pressure is a safety event: a gauge rating read above the run's barometer, a mail to the
// project's investigators and the quality officers, and a home tile whose count is the list it links to.
let h: ApiHarness;
let tech: ApiClient;
let investigator: ApiClient;
let quality: ApiClient;
let projectId: number;

beforeAll(async () => {
  h = await startHarness({}, { worker: true });
  [tech, investigator, quality] = await Promise.all([clientAs(h.app, 'technician'), clientAs(h.app, 'investigator'), clientAs(h.app, 'quality')]);
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

const tag = () => `OP-${Date.now().toString(36).toUpperCase()}${Math.floor(Math.random() * 1000)}`;

async function registerVessel(ratedPressure: number, ratedPressureReference: 'absolute' | 'gauge') {
  const res = await quality.post('/api/apparatus', { tag: tag(), name: 'Spec rigid vessel', kind: 'vessel', ratedPressure, ratedPressureReference, fixedVolume: 0.0015 });
  expect(res.status).toBe(201);
  return res.body as { id: number; ratedPressureReference: string };
}

/** The isochoric demo run (peak ≈ 109.8 kPa absolute, barometer 760.2 mmHg ≈ 101.35 kPa) on a vessel of the register. */
async function submitOn(apparatusId: number) {
  const doc = loadFixture('isochoric');
  const { ratedPressure: _typed, ...apparatus } = doc.apparatus;
  const bodies = runBodies({ ...doc, apparatus }, projectId);
  const created = await tech.post('/api/runs', { ...bodies.create, apparatusId });
  expect(created.status).toBe(201);
  const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  expect(put.status).toBe(200);
  expect((await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version })).status).toBe(202);
  const stored = await eventually(async () => {
    const res = await investigator.get(`/api/runs/${created.body.id}/balance`);
    return res.status === 200 ? res.body : undefined;
  }, 30_000, 'the balance result');
  return { id: created.body.id as number, code: created.body.code as string, result: stored.result };
}

describe('the rated pressure\'s reference on the apparatus', () => {
  it('is stored as sent, absolute by default, and refused when it is neither', async () => {
    expect((await registerVessel(2e5, 'gauge')).ratedPressureReference).toBe('gauge');
    const plain = await quality.post('/api/apparatus', { tag: tag(), name: 'Spec plain vessel', kind: 'vessel', ratedPressure: 2e5 });
    expect(plain.body.ratedPressureReference).toBe('absolute');
    const bad = await quality.post('/api/apparatus', { tag: tag(), name: 'Spec odd vessel', kind: 'vessel', ratedPressure: 2e5, ratedPressureReference: 'sealed' });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toContain('ratedPressureReference');
  });
});

describe('a run above a gauge rating', () => {
  let run: Awaited<ReturnType<typeof submitOn>>;
  beforeAll(async () => {
    // 5 kPa gauge ≈ 106.35 kPa absolute on this run's barometer: the later readings (to ≈ 109.8 kPa) pass it.
    run = await submitOn((await registerVessel(5000, 'gauge')).id);
  });

  it('is flagged in kPa gauge, from the register\'s rating above the barometric pressure', () => {
    const over = overPressureOf(run.result);
    expect(over).not.toBeNull();
    expect(over!.first).toMatch(/^Reading \d+ reaches [\d.]+ kPa gauge, above the vessel's rated 5 kPa gauge\.$/);
    expect(over!.readings).toBeGreaterThan(0);
  });

  it('mails the project\'s investigators and the quality officers, in kPa and plain words, with a link', async () => {
    const mails = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, `Safety: run ${run.code} went above its vessel's rated pressure`));
    const to = mails.map((m) => m.recipient);
    expect(to).toEqual(expect.arrayContaining([demoEmail('investigator'), demoEmail('quality')]));
    expect(new Set(to).size).toBe(to.length);
    const body = mails[0].body;
    expect(body).toContain('kPa gauge');
    expect(body).not.toMatch(/\d Pa\b/);
    expect(body).toContain('Local codes and the lab\'s licensed safety practice take precedence');
    expect(body).toContain(`/runs/${run.id}`);
  });

  it('mails once per run version: a second check of the same version stores its result but queues no second safety mail', async () => {
    const subject = `Safety: run ${run.code} went above its vessel's rated pressure`;
    const before = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, subject));
    expect(before.length).toBeGreaterThan(0);
    const [row] = await h.handle.db.select({ version: runs.version }).from(runs).where(eq(runs.id, run.id));
    // The queue delivers at least once: the same job again, as a retry or the sweep would.
    expect(await runBalanceCheck(h.handle.db, h.config, run.id, row.version)).toBe('stored');
    const results = await h.handle.db.select({ id: balanceResults.id }).from(balanceResults).where(and(eq(balanceResults.runId, run.id), eq(balanceResults.runVersion, row.version)));
    expect(results.length).toBe(2);
    const after = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, subject));
    expect(after.map((m) => m.id)).toEqual(before.map((m) => m.id));
  });

  it('counts on the investigator\'s and the quality officer\'s home tile exactly what the tile\'s list shows', async () => {
    for (const client of [investigator, quality]) {
      const tile = (await client.get('/api/home')).body.queues.find((q: { key: string }) => q.key === 'over-pressure');
      expect(tile).toMatchObject({ link: '/runs', queryParams: { safety: 'over-pressure' } });
      const list = await client.get('/api/runs').query({ ...tile.queryParams, pageSize: 200 });
      expect(list.status).toBe(200);
      expect(list.body.total).toBe(tile.count);
      expect(list.body.items.map((r: { id: number }) => r.id)).toContain(run.id);
    }
  });
});

describe('a run within an absolute rating', () => {
  it('raises no alert, sends no safety mail and stays off the safety list', async () => {
    const run = await submitOn((await registerVessel(2e5, 'absolute')).id);
    expect(overPressureOf(run.result)).toBeNull();
    expect(await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, `Safety: run ${run.code} went above its vessel's rated pressure`))).toHaveLength(0);
    const list = await quality.get('/api/runs').query({ safety: 'over-pressure', pageSize: 200 });
    expect(list.body.items.map((r: { id: number }) => r.id)).not.toContain(run.id);
    expect((await quality.get('/api/runs').query({ safety: 'hot' })).status).toBe(400);
  });
});

describe("the investigator's Runs to review tile", () => {
  it('counts the list it links to: submitted runs of the projects, written by others', async () => {
    const queues = (await investigator.get('/api/home')).body.queues as { key: string; count: number; queryParams: Record<string, string> }[];
    for (const key of ['runs-to-review', 'breaking-balances']) {
      const tile = queues.find((q) => q.key === key)!;
      expect(tile.queryParams['others']).toBe('true');
      const list = await investigator.get('/api/runs').query({ ...tile.queryParams, pageSize: 200 });
      expect(list.body.total).toBe(tile.count);
    }
    // The investigator's own submitted run is on the plain list but not on the tile's.
    const mine = await investigator.get('/api/runs').query({ state: 'submitted', mine: 'true', pageSize: 200 });
    const others = await investigator.get('/api/runs').query({ state: 'submitted', others: 'true', pageSize: 200 });
    const all = await investigator.get('/api/runs').query({ state: 'submitted', pageSize: 200 });
    expect(others.body.total + mine.body.total).toBe(all.body.total);
  });
});
