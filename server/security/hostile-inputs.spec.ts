import { eq } from 'drizzle-orm';
import { people, projects, runs } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { rowCounts } from '../../testing/fuzz-writes';

// Each case answered 5xx, or was stored and broke later reads, before the input hygiene
// (server/core/input-hygiene.ts), the setup check (server/runs/setup-validation.ts) and the SI range checks.
let h: ApiHarness;
let tech: ApiClient;
let admin: ApiClient;
let investigator: ApiClient;
let projectId: number;
let draft: { id: number; version: number };
const fixture = loadFixture('isothermal');

beforeAll(async () => {
  h = await startHarness();
  [tech, admin, investigator] = await Promise.all([clientAs(h.app, 'technician'), clientAs(h.app, 'admin'), clientAs(h.app, 'investigator')]);
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  const bodies = runBodies(fixture, projectId);
  const created = await tech.post('/api/runs', { ...bodies.create, title: 'Hostile input target' });
  expect(created.status).toBe(201);
  const put = await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  expect(put.status).toBe(200);
  draft = { id: created.body.id, version: put.body.version };
});
afterAll(() => h.close());

const fields = (res: { body: { errors?: Array<{ field: string }> } }) => (res.body.errors ?? []).map((e) => e.field);

describe('control characters are refused with 400 naming the field, nothing stored', () => {
  it('a NUL in a new run title', async () => {
    const before = await rowCounts(h.handle.db);
    const res = await tech.post('/api/runs', { ...runBodies(fixture, projectId).create, title: 'Expansion\u0000 run' });
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(fields(res)).toEqual(['title']);
    expect(res.body.detail).toContain('NUL');
    expect(await rowCounts(h.handle.db)).toEqual(before);
  });

  it("a NUL in a person's name", async () => {
    const [person] = await h.handle.db.select().from(people).where(eq(people.email, demoEmail('assistant')));
    const res = await admin.patch(`/api/people/${person.id}`, { name: 'Ana\u0000 Rivers' });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['name']);
    const [after] = await h.handle.db.select().from(people).where(eq(people.id, person.id));
    expect(after.name).toBe(person.name);
  });

  it('a NUL in a signature reason, and a bell character in a nested field', async () => {
    const res = await investigator.post(`/api/runs/${draft.id}/return`, { version: 1, password: 'x', meaning: 'm', reason: 'bad\u0000reason' });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['reason']);
    const nested = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup: { notes: 'ok', apparatus: { name: 'cell\u0007' } } });
    expect(nested.status).toBe(400);
    expect(fields(nested)).toEqual(['setup.apparatus.name']);
  });

  it('a NUL in the sign-in e-mail, with no account: 400, not 500', async () => {
    const anonymous = await clientAs(h.app, null);
    const res = await anonymous.post('/api/auth/sign-in', { email: 'someone\u0000@example.org', password: 'whatever it is' });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['email']);
  });

  it('line breaks and tabs in a reason stay allowed (notes keep their lines)', async () => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup: { ...runBodies(fixture, projectId).create.setup, notes: 'line one\n\tline two\r\n' } });
    expect(res.status).toBe(200);
    draft.version = res.body.version;
  });
});

describe('JSON shape limits before class-transformer', () => {
  it('a body nested 10 000 deep answers 400, not a stack overflow', async () => {
    const deep = `{"version":1,"title":${'['.repeat(10_000)}${']'.repeat(10_000)}}`;
    const res = await tech.agent.patch(`/api/runs/${draft.id}`).set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json').send(deep);
    expect(res.status).toBe(400);
    expect(res.body.detail).toMatch(/nested more than 32 levels/);
  });

  it.each(['__proto__', 'constructor', 'prototype'])('a "%s" key is refused wherever it is', async (key) => {
    const raw = `{"version":${draft.version},"setup":{"gas":{"model":"species","species":"N2"},"${key}":{"polluted":true}}}`;
    const res = await tech.agent.patch(`/api/runs/${draft.id}`).set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json').send(raw);
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual([`setup.${key}`]);
  });
});

describe('numbers that overflow once converted to SI', () => {
  const readings = () => JSON.parse(JSON.stringify(runBodies(fixture, projectId).readings)) as { time: { unit: string; values: number[] }; channels: Record<string, { unit: string; values: number[] }> };

  it('1e306 bar in the pressure readings: 400 naming the reading', async () => {
    const body = readings();
    body.channels['pressure'] = { ...body.channels['pressure'], unit: 'bar' };
    body.channels['pressure'].values[3] = 1e306;
    const res = await tech.put(`/api/runs/${draft.id}/readings`, { version: draft.version, ...body });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['pressure.values[3]']);
  });

  it('1e308 h of time: 400 naming the reading', async () => {
    const body = readings();
    body.time = { unit: 'h', values: body.time.values.map((v, i) => (i === 5 ? 1e308 : v / 3600)) };
    const res = await tech.put(`/api/runs/${draft.id}/readings`, { version: draft.version, ...body });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['time.values[5]']);
  });

  it('1e306 bar in a run document sent to the stateless check: 400, not 500', async () => {
    const doc = JSON.parse(JSON.stringify(fixture));
    doc.readings.pressure.unit = 'bar';
    doc.readings.pressure.values[0] = 1e306;
    const res = await tech.post('/api/balance', doc);
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['readings.pressure.values[0]']);
  });

  it('an ambient pressure of 1e306 bar in the setup: 400', async () => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup: { ambient: { pressure: { value: 1e306, unit: 'bar' } } } });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['setup.ambient.pressure.value']);
  });
});

describe('setup shapes are checked as strictly as bodies', () => {
  it.each([
    [{ instruments: 5 }, 'setup.instruments'],
    [{ channels: { pressure: { unit: 'kPa', instrumentId: 2 ** 31 } } }, 'setup.channels.pressure.instrumentId'],
    [{ channels: { pressure: 'kPa' } }, 'setup.channels.pressure'],
    [{ channels: { humidity: { unit: '%' } } }, 'setup.channels.humidity'],
    [{ gas: { model: 'species', species: 'unobtainium' } }, 'setup.gas.species'],
    [{ time: { unit: 'fortnight' } }, 'setup.time.unit'],
    [{ surprise: true }, 'setup.surprise'],
  ])('PATCH setup %j is refused naming %s, and the run still reads', async (setup, field) => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup });
    expect(res.status).toBe(400);
    expect(fields(res)).toContain(field);
    const read = await tech.get(`/api/runs/${draft.id}`);
    expect(read.status).toBe(200);
    expect(read.body.version).toBe(draft.version);
  });
});

describe('blank text and caching', () => {
  it('a title of spaces is refused, not stored empty', async () => {
    const created = await tech.post('/api/runs', { ...runBodies(fixture, projectId).create, title: '      ' });
    expect(created.status).toBe(400);
    expect(fields(created)).toEqual(['title']);
    const patched = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, title: ' \t ' });
    expect(patched.status).toBe(400);
    const [run] = await h.handle.db.select({ title: runs.title }).from(runs).where(eq(runs.id, draft.id));
    expect(run.title).toBe('Hostile input target');
  });

  it('a title with spaces around it is stored trimmed', async () => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, title: '  Hostile input target  ' });
    expect(res.status).toBe(200);
    expect(res.body.title).toBe('Hostile input target');
    draft.version = res.body.version;
  });

  it('API answers carry Cache-Control: no-store, errors too', async () => {
    expect((await tech.get('/api/runs')).headers['cache-control']).toBe('no-store');
    expect((await tech.get(`/api/runs/${draft.id}`)).headers['cache-control']).toBe('no-store');
    expect((await tech.get('/api/no-such-route')).headers['cache-control']).toBe('no-store');
  });
});
