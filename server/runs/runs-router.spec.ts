import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('GET /api/runs', () => {
  it('pages and filters the runs a person may see', async () => {
    const tech = await clientAs(h.app, 'technician');
    const res = await tech.get('/api/runs?pageSize=2&sort=code&dir=asc');
    expect(res.status).toBe(200);
    expect(res.body.items).toHaveLength(2);
    expect(res.body.total).toBeGreaterThanOrEqual(7);
    expect(res.body.items[0].code < res.body.items[1].code).toBe(true);
    const submitted = await tech.get('/api/runs?state=submitted&verdict=breaks');
    expect(submitted.body.items.length).toBeGreaterThan(0);
    expect(submitted.body.items.every((r: { state: string; verdict: string }) => r.state === 'submitted' && r.verdict === 'breaks')).toBe(true);
  });

  it('treats an empty filter from a form as no filter', async () => {
    const tech = await clientAs(h.app, 'technician');
    const all = await tech.get('/api/runs');
    const empty = await tech.get('/api/runs?state=&verdict=&project=');
    expect(empty.status).toBe(200);
    expect(empty.body.total).toBe(all.body.total);
  });

  it('answers 400 for a bad filter or sort key, 401 without a session, 403 for an administrator', async () => {
    const tech = await clientAs(h.app, 'technician');
    const bad = await tech.get('/api/runs?state=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('state');
    expect((await tech.get('/api/runs?sort=password_hash')).status).toBe(400);
    expect((await tech.get('/api/runs?state=draft&state=submitted')).status).toBe(400);
    expect((await (await clientAs(h.app, null)).get('/api/runs')).status).toBe(401);
    expect((await (await clientAs(h.app, 'admin')).get('/api/runs')).status).toBe(403);
  });
});

describe('POST /api/runs and GET /api/runs/:id', () => {
  it('creates a draft with a code, readable by the project', async () => {
    const [gx] = await h.handle.db.select().from(projects).where(eq(projects.code, 'GX'));
    const tech = await clientAs(h.app, 'technician');
    const res = await tech.post('/api/runs', { projectId: gx.id, title: 'Compression of argon', process: 'isothermal', runDate: '2026-05-02' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ state: 'draft', version: 1, title: 'Compression of argon' });
    expect(res.body.code).toMatch(/^R-2026-\d{4}$/);
    const read = await (await clientAs(h.app, 'investigator')).get(`/api/runs/${res.body.id}`);
    expect(read.status).toBe(200);
    expect(read.body.readings.count).toBe(0);
  });

  it('answers 400 naming each bad field, 403 for a quality officer, 404 for an unknown run', async () => {
    const tech = await clientAs(h.app, 'technician');
    const bad = await tech.post('/api/runs', { projectId: 1, title: 'x', process: 'boiling', runDate: '14/03/2026' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['process', 'runDate', 'title']);
    const unknownField = await tech.post('/api/runs', { projectId: 1, title: 'Fine title', process: 'isobaric', runDate: '2026-03-14', state: 'approved' });
    expect(unknownField.status).toBe(400);
    expect((await (await clientAs(h.app, 'quality')).post('/api/runs', { projectId: 1, title: 'Fine title', process: 'isobaric', runDate: '2026-03-14' })).status).toBe(403);
    expect((await tech.get('/api/runs/987654')).status).toBe(404);
  });

  it('refuses readings whose channels disagree in length, naming the channel, and keeps the old readings', async () => {
    const tech = await clientAs(h.app, 'technician');
    const list = await tech.get('/api/runs?state=draft&mine=true');
    const draft = list.body.items.find((r: { title: string }) => r.title !== 'Compression of argon') ?? list.body.items[0];
    const before = await tech.get(`/api/runs/${draft.id}`);
    const res = await tech.put(`/api/runs/${draft.id}/readings`, {
      version: before.body.version,
      time: { unit: 's', values: [0, 1, 2] },
      channels: { pressure: { unit: 'kPa', values: [100, 99] }, temperature: { unit: 'degC', values: [20, 20, 'warm'] } },
    });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual(expect.arrayContaining([
      expect.objectContaining({ field: 'pressure.values' }),
      expect.objectContaining({ field: 'temperature.values[2]', message: expect.stringContaining('reading 3') }),
    ]));
    const after = await tech.get(`/api/runs/${draft.id}`);
    expect(after.body.readings.count).toBe(before.body.readings.count);
    expect(after.body.version).toBe(before.body.version);
  });
});
