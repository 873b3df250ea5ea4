import { and, eq } from 'drizzle-orm';
import { balanceResults, mailOutbox, projects, runs } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, eventually, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { queueMail } from '../mail/outbox';
import { balanceMailKey, runBalanceCheck } from './balance-check';

// "The energy balance breaks" goes to the project's investigators and the run's author once per run
// version: the queue delivers a job at least once (a retry, the sweep), and two checks of one version
// may run at once in two worker processes. The outbox's unique key, not the caller's care, keeps it one.
let h: ApiHarness;
let tech: ApiClient;
let investigator: ApiClient;
let projectId: number;

beforeAll(async () => {
  h = await startHarness({}, { worker: true });
  [tech, investigator] = await Promise.all([clientAs(h.app, 'technician'), clientAs(h.app, 'investigator')]);
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

/** The calorimetric run whose heat leak was left out: its balance breaks (see runs-workflow.spec.ts). */
async function submitBreakingRun() {
  const bodies = runBodies(loadFixture('calorimetric-heat-leak-forgotten'), projectId);
  const created = await tech.post('/api/runs', bodies.create);
  expect(created.status).toBe(201);
  const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  expect(put.status).toBe(200);
  expect((await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version })).status).toBe(202);
  const id = created.body.id as number;
  const stored = await eventually(async () => {
    const res = await investigator.get(`/api/runs/${id}/balance`);
    return res.status === 200 ? res.body : undefined;
  }, 30_000, `the balance result of run ${id}`);
  expect(stored.result.verdict).toBe('breaks');
  const [row] = await h.handle.db.select({ version: runs.version }).from(runs).where(eq(runs.id, id));
  return { id, code: created.body.code as string, version: row.version };
}

const breakMails = (code: string) =>
  h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, `Run ${code}: the energy balance breaks`));

describe('the "balance breaks" mail of one run version', () => {
  let run: Awaited<ReturnType<typeof submitBreakingRun>>;
  let first: Awaited<ReturnType<typeof breakMails>>;
  beforeAll(async () => {
    run = await submitBreakingRun();
    first = await breakMails(run.code);
  });

  it('goes once to each investigator of the project and to the author, keyed by run, version and verdict', () => {
    const to = first.map((m) => m.recipient);
    expect(to).toEqual(expect.arrayContaining([demoEmail('investigator'), demoEmail('technician')]));
    expect(new Set(to).size).toBe(to.length);
    expect(first.every((m) => m.dedupeKey === balanceMailKey(run.id, run.version, 'breaks'))).toBe(true);
  });

  it('is not queued again when the same version is checked again (a retried or swept job)', async () => {
    expect(await runBalanceCheck(h.handle.db, h.config, run.id, run.version)).toBe('stored');
    expect((await breakMails(run.code)).map((m) => m.id)).toEqual(first.map((m) => m.id));
  });

  it('is not queued again by three checks of the same version at once, though each stores its result', async () => {
    const before = await h.handle.db.select({ id: balanceResults.id }).from(balanceResults)
      .where(and(eq(balanceResults.runId, run.id), eq(balanceResults.runVersion, run.version)));
    const outcomes = await Promise.all([1, 2, 3].map(() => runBalanceCheck(h.handle.db, h.config, run.id, run.version)));
    expect(outcomes).toEqual(['stored', 'stored', 'stored']);
    const after = await h.handle.db.select({ id: balanceResults.id }).from(balanceResults)
      .where(and(eq(balanceResults.runId, run.id), eq(balanceResults.runVersion, run.version)));
    expect(after.length).toBe(before.length + 3);
    expect((await breakMails(run.code)).map((m) => m.id)).toEqual(first.map((m) => m.id));
  });
});

describe('the outbox\'s key', () => {
  it('keeps one mail per key and address when two transactions queue it at once, and lets other addresses and unkeyed mail through', async () => {
    const dedupeKey = `spec:${Date.now()}:${Math.random()}`;
    const mail = { to: 'one@harrowgate.example', subject: `Spec key ${dedupeKey}`, body: 'once', dedupeKey };
    const queued = await Promise.all([1, 2].map(() => h.handle.db.transaction((tx) => queueMail(tx, [mail]))));
    expect(queued.sort()).toEqual([0, 1]);
    await h.handle.db.transaction((tx) => queueMail(tx, [{ ...mail, to: 'two@harrowgate.example' }, { ...mail, dedupeKey: undefined }, { ...mail, dedupeKey: undefined }]));
    const rows = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, mail.subject));
    expect(rows.filter((r) => r.dedupeKey === dedupeKey).map((r) => r.recipient).sort()).toEqual(['one@harrowgate.example', 'two@harrowgate.example']);
    expect(rows.filter((r) => r.dedupeKey === null)).toHaveLength(2);
  });
});
