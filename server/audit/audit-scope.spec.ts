import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { ApiClient, clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

// Audit reads are scoped exactly like run reads. Before, an investigator outside a run's project got
// 403 on the run but 200 on GET /api/audit?run=… and in the export, with the run's title and setup.

let h: ApiHarness;
let outsider: ApiClient;
let runId: number;
beforeAll(async () => {
  h = await startHarness();
  const [cb] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'CB'));
  const [gx] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  // A run of GX with events in the trail (its creation), and an investigator who is a member of CB only.
  const tech = await clientAs(h.app, 'technician');
  const created = await tech.post('/api/runs', runBodies(loadFixture('adiabatic'), gx.id).create);
  expect(created.status).toBe(201);
  runId = created.body.id;
  const person = await makeThrowawayPerson(h.handle.db, 'outsider', 'investigator', [cb.id]);
  outsider = new ApiClient(h.app);
  expect((await outsider.signIn(person.email, person.password)).status).toBe(200);
});
afterAll(() => h.close());

describe('audit reads for an investigator outside the run\'s project', () => {
  it('answers GET /api/audit?run= as the run itself would: 403', async () => {
    expect((await outsider.get(`/api/runs/${runId}`)).status).toBe(403);
    expect((await outsider.get(`/api/audit?run=${runId}`)).status).toBe(403);
    expect((await outsider.get(`/api/audit/export?format=csv&run=${runId}`)).status).toBe(403);
    expect((await outsider.get('/api/audit?run=999999')).status).toBe(404);
  });

  it('leaves the run\'s events out of the unfiltered list and the export, which say so', async () => {
    const list = await outsider.get('/api/audit?pageSize=500&entityType=run');
    expect(list.status).toBe(200);
    expect(list.body.items.filter((e: { entityId: string }) => e.entityId === String(runId))).toEqual([]);
    const file = await outsider.get('/api/audit/export?format=csv&entityType=run').buffer(true)
      .parse((res, done) => { const chunks: Buffer[] = []; res.on('data', (c: Buffer) => chunks.push(c)); res.on('end', () => done(null, Buffer.concat(chunks))); });
    expect(file.status).toBe(200);
    const records = parse(file.body as Buffer, { bom: true, relax_column_count: true }) as string[][];
    const namesAt = records.findIndex((r) => r[0] === 'id');
    expect(records.slice(namesAt + 1).filter((r) => r[5] === String(runId))).toEqual([]);
    expect(records.find((r) => r[0] === 'Filters')?.[1]).toMatch(/scope=runs, signatures and projects of your projects/);
  });

  it('still shows the quality officer everything, and a member the run\'s events', async () => {
    const quality = await clientAs(h.app, 'quality');
    const member = await clientAs(h.app, 'investigator');
    for (const reader of [quality, member]) {
      const res = await reader.get(`/api/audit?run=${runId}`);
      expect(res.status).toBe(200);
      expect(res.body.items.length).toBeGreaterThan(0);
    }
  });
});
