import { and, count, eq, sql } from 'drizzle-orm';
import { auditEvents, balanceResults, imports, projects } from '../../db/schema';
import { csv, importCounts, uploadFile } from '../../testing/import-spec-support';
import { verifyAuditChain } from '../audit/audit-checkpoint';
import { ApiClient, eventually, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { startQwellProcess, type QwellProcess } from '../../testing/qwell-process';
import { demoEmail } from '../../db/seed/demo-lab';

let h: ApiHarness;
const processes: QwellProcess[] = [];
let projectId: number;

beforeAll(async () => {
  h = await startHarness();
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(async () => {
  await Promise.all(processes.map((p) => p.stop('SIGKILL')));
  await h.close();
});

async function start(env: Record<string, string>, port?: number) {
  const p = await startQwellProcess({ DATABASE_URL: process.env['DATABASE_URL']!, ...env }, port);
  processes.push(p);
  return p;
}

async function signedIn(url: string, role: 'technician' | 'investigator') {
  const client = new ApiClient(url);
  expect((await client.signIn(demoEmail(role))).status).toBe(200);
  return client;
}

async function submitFixture(client: ApiClient, fixture: string) {
  const bodies = runBodies(loadFixture(fixture), projectId);
  const created = await client.post('/api/runs', bodies.create);
  const put = await client.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  const submitted = await client.post(`/api/runs/${created.body.id}/submit`, { version: put.body.version });
  expect(submitted.status).toBe(202);
  return created.body.id as number;
}

const results = async (runId: number) => (await h.handle.db.select({ n: count() }).from(balanceResults).where(eq(balanceResults.runId, runId)))[0].n;

describe('several processes on one database', () => {
  it('checks a run submitted through one API process in a separate worker, visible through the other', async () => {
    const a = await start({ QWELL_WORKER: '0' });
    const b = await start({ QWELL_WORKER: '0' });
    const worker = await start({ QWELL_API: '0', QWELL_MC_DRAWS: '2000' });
    const tech = await signedIn(a.url, 'technician');
    const runId = await submitFixture(tech, 'isochoric');
    const investigator = await signedIn(b.url, 'investigator');
    const res = await eventually(async () => {
      const r = await investigator.get(`/api/runs/${runId}/balance`);
      return r.status === 200 ? r : undefined;
    }, 45_000, 'the result through the second API process');
    expect(res.body.result.verdict).toBe('closes');
    expect(await results(runId)).toBe(1);
    await worker.stop();
  });

  it('runs a check again after its worker is killed with SIGKILL mid-check, storing one result and a valid chain', async () => {
    const api = await start({ QWELL_WORKER: '0' });
    // Many Monte Carlo draws keep the check busy long enough to kill it in the middle.
    const slow = { QWELL_API: '0', QWELL_MC_DRAWS: '5000000', QWELL_JOB_EXPIRE_SECONDS: '4', QWELL_QUEUE_MAINTENANCE_SECONDS: '1' };
    const first = await start(slow);
    const tech = await signedIn(api.url, 'technician');
    const runId = await submitFixture(tech, 'isothermal');
    await eventually(async () => {
      const rows = await h.handle.db.execute<{ state: string }>(sql`SELECT state FROM pgboss.job WHERE name = 'balance-check' AND data->>'runId' = ${String(runId)}`);
      return [...rows].some((r) => r.state === 'active') ? true : undefined;
    }, 60_000, 'the check to become active');
    await first.stop('SIGKILL');
    expect(await results(runId)).toBe(0);
    await start({ ...slow, QWELL_MC_DRAWS: '2000' });
    await eventually(async () => ((await results(runId)) > 0 ? true : undefined), 60_000, 'the retried check');
    expect(await results(runId)).toBe(1);
    const checked = await h.handle.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'run.checked'), eq(auditEvents.entityId, String(runId))));
    expect(checked).toHaveLength(1);
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
  });

  it('leaves no partial run when the API process is killed with SIGKILL in the middle of an import commit', async () => {
    const api = await start({ QWELL_WORKER: '0' });
    const tech = await signedIn(api.url, 'technician');
    const N = 100_000;
    const lines = ['Time (s),P (kPa),T (degC)', ...Array.from({ length: N }, (_, i) => `${i},${(100 + i * 1e-4).toFixed(4)},25.00`)];
    const upload = await uploadFile(tech, 'long-logger.csv', csv(lines));
    expect(upload.status).toBe(201);
    const importId = upload.body.importId as number;
    const mapping = { ...upload.body.mapping, columns: upload.body.mapping.columns.map((c: { channel: string }) => (c.channel === 'pressure' ? { ...c, reference: 'absolute' } : c)) };
    const target = { newRun: { projectId, title: 'Logger file cut off by a crash', process: 'isothermal', runDate: '2026-05-01' } };
    const before = await importCounts(h.handle.db);
    const commit = tech.post(`/api/imports/${importId}/commit`, { mapping, target }).then((r) => r.status, () => 'connection lost');
    await new Promise((r) => setTimeout(r, 300));
    await api.stop('SIGKILL');
    await commit;
    // All or nothing: either the whole import landed, or nothing of it.
    const after = await importCounts(h.handle.db);
    const [imp] = await h.handle.db.select().from(imports).where(eq(imports.id, importId));
    if (imp.status === 'committed') {
      expect([after.runs - before.runs, after.readings - before.readings]).toEqual([1, N]);
    } else {
      expect(after).toEqual(before);
      // After a restart the same import commits whole.
      const again = await start({ QWELL_WORKER: '0' });
      const client = await signedIn(again.url, 'technician');
      const res = await client.post(`/api/imports/${importId}/commit`, { mapping, target });
      expect(res.status).toBe(201);
      expect(res.body.readings).toBe(N);
    }
    expect((await verifyAuditChain(h.handle.db, h.config)).valid).toBe(true);
  });
});
