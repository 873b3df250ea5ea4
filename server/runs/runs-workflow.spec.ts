import { and, count, eq } from 'drizzle-orm';
import { readdirSync, readFileSync } from 'node:fs';
import { auditEvents, balanceResults, mailOutbox, projects, readings, runs, signatures } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { checkRunDocument } from '../engine';
import { clientAs, eventually, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { approvalMeanings, returnMeanings } from './review-dto';

let h: ApiHarness;
let tech: ApiClient;
let investigator: ApiClient;
let projectId: number;

beforeAll(async () => {
  h = await startHarness({}, { worker: true });
  tech = await clientAs(h.app, 'technician');
  investigator = await clientAs(h.app, 'investigator');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

async function createRun(fixture: string, client = tech) {
  const bodies = runBodies(loadFixture(fixture), projectId);
  const created = await client.post('/api/runs', bodies.create);
  expect(created.status).toBe(201);
  const put = await client.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  expect(put.status).toBe(200);
  return { id: created.body.id as number, version: put.body.version as number, code: created.body.code as string };
}

const waitForResult = (id: number) =>
  eventually(async () => {
    const res = await investigator.get(`/api/runs/${id}/balance`);
    return res.status === 200 ? res.body : undefined;
  }, 30_000, `the balance result of run ${id}`);

const mailFiles = () => readdirSync(h.mailDir).map((f) => readFileSync(`${h.mailDir}/${f}`, 'utf8'));

describe('a run from draft to approved', () => {
  it('creates, fills, submits, is checked by the queue, and is approved with a signature; the trail shows every step', async () => {
    const run = await createRun('isothermal');
    const submitted = await tech.post(`/api/runs/${run.id}/submit`, { version: run.version });
    expect(submitted.status).toBe(202);
    expect(submitted.body.state).toBe('submitted');

    const stored = await waitForResult(run.id);
    // The stored run rebuilds the same document: its verdict and work match the fixture checked directly.
    const direct = checkRunDocument(loadFixture('isothermal'), { draws: 2000 });
    if (!direct.ok) throw new Error('fixture invalid');
    expect(stored.result.verdict).toBe(direct.result.verdict);
    expect(stored.result.work.measured).toBeCloseTo(direct.result.work.measured, 6);
    expect(stored.result.heat.total).toBeCloseTo(direct.result.heat.total, 6);
    expect(stored.stale).toBe(false);

    const current = await tech.get(`/api/runs/${run.id}`);
    expect(current.body.verdict).toBe('closes');
    const approve = await investigator.post(`/api/runs/${run.id}/approve`, { version: current.body.version, password: 'qwell-demo-lab', meaning: approvalMeanings[0] });
    expect(approve.status).toBe(200);
    expect(approve.body.run.state).toBe('approved');
    expect(approve.body.signature.signedHash).toMatch(/^[0-9a-f]{64}$/);

    const trail = await h.handle.db.select({ action: auditEvents.action }).from(auditEvents)
      .where(and(eq(auditEvents.entityType, 'run'), eq(auditEvents.entityId, String(run.id)))).orderBy(auditEvents.id);
    expect(trail.map((e) => e.action)).toEqual(['run.create', 'run.readings-replace', 'run.submit', 'run.checked', 'run.approve']);
    const verify = await investigator.get('/api/audit/verify');
    expect(verify.body.valid).toBe(true);

    // Mail: the investigators heard of the submission, the author of the approval.
    const mails = await eventually(async () => {
      await h.mail!.flush();
      const all = mailFiles();
      const both = all.some((m) => m.includes(`Run ${run.code} approved`)) && all.some((m) => m.includes(`Run ${run.code} submitted for review`));
      return both ? all : undefined;
    }, 20_000, 'the submission and approval mails');
    // Every investigator of the project hears of it (other spec files add throwaway ones to GX).
    const submitMails = mails.filter((m) => m.includes(`Run ${run.code} submitted for review`));
    expect(submitMails.filter((m) => m.includes(`X-Qwell-Envelope-To: ${demoEmail('investigator')}`))).toHaveLength(1);
    const approvalMail = mails.find((m) => m.includes(`Run ${run.code} approved`))!;
    expect(approvalMail).toContain(`X-Qwell-Envelope-To: ${demoEmail('technician')}`);
    // Plain words and a link to the run at the lab's public address.
    expect(approvalMail).toContain(`/runs/${run.id}`);
  });

  it('locks an approved run; a correction makes a new revision and leaves the old one readable', async () => {
    const run = await createRun('isobaric');
    await tech.post(`/api/runs/${run.id}/submit`, { version: run.version });
    await waitForResult(run.id);
    const v = (await tech.get(`/api/runs/${run.id}`)).body.version;
    expect((await investigator.post(`/api/runs/${run.id}/approve`, { version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0] })).status).toBe(200);

    const edit = await tech.patch(`/api/runs/${run.id}`, { version: v + 1, title: 'Changed after approval' });
    expect(edit.status).toBe(409);
    expect(edit.body.detail).toMatch(/approved/);

    const noReason = await tech.post(`/api/runs/${run.id}/revisions`, {});
    expect(noReason.status).toBe(400);
    const revision = await tech.post(`/api/runs/${run.id}/revisions`, { reason: 'Barometer reading was transcribed wrongly' });
    expect(revision.status).toBe(201);
    expect(revision.body).toMatchObject({ code: run.code, revision: 2, state: 'draft', previousRevisionId: run.id });
    const [{ n: copied }] = await h.handle.db.select({ n: count() }).from(readings).where(eq(readings.runId, revision.body.id));
    const [{ n: original }] = await h.handle.db.select({ n: count() }).from(readings).where(eq(readings.runId, run.id));
    expect(copied).toBe(original);
    const old = await tech.get(`/api/runs/${run.id}`);
    expect(old.body.state).toBe('approved');
    expect(old.body.revisions.map((r: { revision: number }) => r.revision)).toEqual([1, 2]);
    // The old revision can no longer be corrected a second time; the latest one is the one to work on.
    expect((await tech.post(`/api/runs/${run.id}/revisions`, { reason: 'second try' })).status).toBe(409);
  });
});

describe('review rules', () => {
  it('requires a written justification to approve a breaking balance, and mails the investigators that it breaks', async () => {
    const run = await createRun('calorimetric-heat-leak-forgotten');
    await tech.post(`/api/runs/${run.id}/submit`, { version: run.version });
    const stored = await waitForResult(run.id);
    expect(stored.result.verdict).toBe('breaks');
    const v = (await tech.get(`/api/runs/${run.id}`)).body.version;
    const bare = await investigator.post(`/api/runs/${run.id}/approve`, { version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0] });
    expect(bare.status).toBe(400);
    expect(bare.body.detail).toMatch(/justification/);
    expect(stored.why).toMatch(/^No heat leak was accounted for: a heat-loss coefficient h ≈ [\d.]+ W\/K would close the balance\.$/);
    const justified = await investigator.post(`/api/runs/${run.id}/approve`, {
      version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0], reason: 'Heat leak is corrected in the report by the bath model; the raw balance is kept as recorded.',
    });
    expect(justified.status).toBe(200);
    const breakMails = await h.handle.db.select().from(mailOutbox).where(eq(mailOutbox.subject, `Run ${run.code}: the energy balance breaks`));
    expect(breakMails.map((m) => m.recipient)).toContain(demoEmail('investigator'));
    const breakMail = breakMails.find((m) => m.recipient === demoEmail('investigator'))!;
    expect(breakMail.body).toContain(`Why: ${stored.why}`);
    expect(breakMail.body).toMatch(new RegExp(`Open the run to see the flags and hints: http://\\S+/runs/${run.id}$`));
  });

  it('requires a written justification to approve an indeterminate check, and says why it is indeterminate', async () => {
    const doc = loadFixture('isobaric');
    doc.apparatus!.heatLossCoefficient!.u = 0.003; // u(h) so wide the balance says nothing
    const bodies = runBodies(doc, projectId);
    const created = await tech.post('/api/runs', bodies.create);
    const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
    const id = created.body.id as number;
    await tech.post(`/api/runs/${id}/submit`, { version: put.body.version });
    const stored = await waitForResult(id);
    expect(stored.result.verdict).toBe('indeterminate');
    expect(stored.why).toMatch(/^U\(r\) = .* J is wider than the lab's limit of .* J, mostly from heat-loss coefficient \(\d+ % of u²\(r\)\)/);
    const v = (await tech.get(`/api/runs/${id}`)).body.version;
    const short = await investigator.post(`/api/runs/${id}/approve`, { version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0], reason: 'fine' });
    expect(short.status).toBe(400);
    expect(short.body.detail).toMatch(/indeterminate.*justification of at least 20 characters/);
    expect(short.body.errors[0].field).toBe('reason');
    const [{ n: unsigned }] = await h.handle.db.select({ n: count() }).from(signatures).where(eq(signatures.runId, id));
    expect(unsigned).toBe(0);
    const justified = await investigator.post(`/api/runs/${id}/approve`, {
      version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0], reason: 'Heat-loss coefficient is re-measured next week; the run is kept for the teaching set only.',
    });
    expect(justified.status).toBe(200);
  });

  it('refuses a signature with the wrong password and signs nothing', async () => {
    const run = await createRun('adiabatic');
    await tech.post(`/api/runs/${run.id}/submit`, { version: run.version });
    await waitForResult(run.id);
    const v = (await tech.get(`/api/runs/${run.id}`)).body.version;
    const res = await investigator.post(`/api/runs/${run.id}/approve`, { version: v, password: 'not-my-password', meaning: approvalMeanings[0] });
    expect(res.status).toBe(401);
    const [{ n }] = await h.handle.db.select({ n: count() }).from(signatures).where(eq(signatures.runId, run.id));
    expect(n).toBe(0);
    const returned = await investigator.post(`/api/runs/${run.id}/return`, { version: v, password: 'qwell-demo-lab', meaning: returnMeanings[0], reason: 'Please add the dead volume measurement.' });
    expect(returned.status).toBe(200);
    const back = await tech.get(`/api/runs/${run.id}`);
    expect(back.body).toMatchObject({ state: 'returned', returnReason: 'Please add the dead volume measurement.' });
    // Returned runs are editable again by their author.
    expect((await tech.patch(`/api/runs/${run.id}`, { version: back.body.version, title: 'Adiabatic expansion, dead volume added' })).status).toBe(200);
  });

  it('gives exactly one signature when two approvals arrive at the same moment', async () => {
    const run = await createRun('polytropic');
    await tech.post(`/api/runs/${run.id}/submit`, { version: run.version });
    await waitForResult(run.id);
    const v = (await tech.get(`/api/runs/${run.id}`)).body.version;
    const second = await clientAs(h.app, 'investigator');
    const body = { version: v, password: 'qwell-demo-lab', meaning: approvalMeanings[0] };
    const answers = await Promise.all([investigator.post(`/api/runs/${run.id}/approve`, body), second.post(`/api/runs/${run.id}/approve`, body)]);
    expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
    const [{ n }] = await h.handle.db.select({ n: count() }).from(signatures).where(eq(signatures.runId, run.id));
    expect(n).toBe(1);
  });

  it('answers 409 with what to do when the run changed since it was read', async () => {
    const run = await createRun('isochoric');
    expect((await tech.patch(`/api/runs/${run.id}`, { version: run.version, title: 'First edit' })).status).toBe(200);
    const stale = await tech.patch(`/api/runs/${run.id}`, { version: run.version, title: 'Second edit from an old tab' });
    expect(stale.status).toBe(409);
    expect(stale.body.detail).toMatch(/Reload the run/);
    expect(stale.body.currentVersion).toBe(run.version + 1);
    const [row] = await h.handle.db.select().from(runs).where(eq(runs.id, run.id));
    expect(row.title).toBe('First edit');
  });

  it('refuses to submit an incomplete run, naming each problem, and changes nothing', async () => {
    const created = await tech.post('/api/runs', { projectId, title: 'Empty run', process: 'isothermal', runDate: '2026-04-01' });
    const res = await tech.post(`/api/runs/${created.body.id}/submit`, { version: created.body.version });
    expect(res.status).toBe(400);
    expect(res.body.errors.length).toBeGreaterThan(0);
    expect(res.body.errors[0]).toHaveProperty('field');
    const [row] = await h.handle.db.select().from(runs).where(eq(runs.id, created.body.id));
    expect(row.state).toBe('draft');
    const [{ n }] = await h.handle.db.select({ n: count() }).from(balanceResults).where(eq(balanceResults.runId, created.body.id));
    expect(n).toBe(0);
  });
  it('refuses to submit a run whose volume channel names no instrument, naming the channel (issue 12)', async () => {
    const doc = loadFixture('isobaric');
    delete (doc.readings.volume as { instrument?: string }).instrument;
    const bodies = runBodies(doc, projectId);
    const created = await tech.post('/api/runs', bodies.create);
    const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
    const res = await tech.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ field: 'readings.volume.instrument', message: expect.stringMatching(/volume channel names no instrument/) }]);
    const [row] = await h.handle.db.select().from(runs).where(eq(runs.id, created.body.id));
    expect(row.state).toBe('draft');
  });
});
