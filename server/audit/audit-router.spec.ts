import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';

let h: ApiHarness;
let tech: ApiClient;
let quality: ApiClient;
let run: { id: number; code: string };

beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  quality = await clientAs(h.app, 'quality');
  const [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  const bodies = runBodies(loadFixture('isobaric'), projectId);
  const created = await tech.post('/api/runs', bodies.create);
  await tech.put(`/api/runs/${created.body.id}/readings`, { version: created.body.version, ...bodies.readings });
  await tech.patch(`/api/runs/${created.body.id}`, { version: created.body.version + 1, title: 'Isobaric heating, second bath' });
  run = { id: created.body.id, code: created.body.code };
});
afterAll(() => h.close());

type Item = { action: string; actorName: string | null; actionLabel: string; recordType: string; record: string; entityType: string; changes: { field: string; before: string | null; after: string | null }[] };

describe('GET /api/audit, readable', () => {
  it('filters by run code and names people, records and changes in words', async () => {
    const res = await quality.get(`/api/audit?run=${run.code.toLowerCase()}`);
    expect(res.status).toBe(200);
    const items = res.body.items as Item[];
    expect(items.map((e) => e.action)).toEqual(['run.update', 'run.readings-replace', 'run.create']);
    expect(items.every((e) => e.entityType === 'run' && e.record === `${run.code} rev. 1` && e.recordType === 'Run')).toBe(true);
    expect(items.every((e) => e.actorName === 'Lena Okonkwo')).toBe(true);
    const update = items[0];
    expect(update.actionLabel).toBe('Changed the run');
    expect(update.changes).toContainEqual({ field: 'Title', before: expect.any(String), after: 'Isobaric heating, second bath' });
    expect(items[2].actionLabel).toBe('Created the run');
  });

  it('leaves sign-ins out on request', async () => {
    const all = await quality.get('/api/audit?pageSize=500');
    expect((all.body.items as Item[]).some((e) => e.action.startsWith('auth.'))).toBe(true);
    const res = await quality.get('/api/audit?pageSize=500&signIns=hide');
    expect(res.status).toBe(200);
    expect((res.body.items as Item[]).some((e) => e.action.startsWith('auth.'))).toBe(false);
    expect(res.body.total).toBeLessThan(all.body.total);
  });

  it('answers 400 for a run filter that is not a code', async () => {
    const res = await quality.get('/api/audit?run=DROP');
    expect(res.status).toBe(400);
    expect(res.body.detail ?? JSON.stringify(res.body.errors)).toMatch(/run code like R-2026-0007/);
  });

  it('writes the readable column into the CSV export, under the one term "record type"', async () => {
    const res = await quality.agent.get(`/api/audit/export?format=csv&run=${run.code}`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const records = parse(res.body as Buffer, { bom: true, relax_column_count: true }) as string[][];
    const names = records.find((r) => r[0] === 'id')!;
    expect(names).toContain('record type');
    expect(names.join('|')).not.toMatch(/entity/);
    const readable = names.indexOf('what happened (readable)');
    const rows = records.slice(records.indexOf(names) + 1);
    const created = rows.map((r) => r[readable]).find((text) => text.startsWith(`Lena Okonkwo · Created the run · Run ${run.code} rev. 1: `))!;
    expect(created).toContain('State: Draft');
    expect(created).toContain('Ambient pressure: 101.42 kPa (u = 0.03)');
    // Paths read as the form's labels, not as "setup gas species".
    expect(created).toContain('Gas species: N2');
    expect(created).not.toMatch(/setup |gas id/);
    expect(created).not.toContain('{');
    expect(rows.some((r) => r[readable].startsWith(`Lena Okonkwo · Changed the run · Run ${run.code} rev. 1: Title: `))).toBe(true);
  });
});

describe('GET /api/audit', () => {
  it('lists events newest first, filtered by action, for quality officers and investigators', async () => {
    const res = await quality.get('/api/audit?action=auth.sign-in&pageSize=5');
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    expect(res.body.items.every((e: { action: string }) => e.action === 'auth.sign-in')).toBe(true);
    const ids = res.body.items.map((e: { id: number }) => e.id);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
  });

  it('answers 400 for a bad filter, 401 without a session and 403 for a technician', async () => {
    expect((await quality.get('/api/audit?from=yesterday')).status).toBe(400);
    expect((await (await clientAs(h.app, null)).get('/api/audit')).status).toBe(401);
    expect((await (await clientAs(h.app, 'technician')).get('/api/audit/verify')).status).toBe(403);
  });
});

describe('GET /api/audit/actors and /api/audit/verify', () => {
  it('names the people in the reader\'s part of the trail, for quality officers and investigators', async () => {
    const res = await quality.get('/api/audit/actors');
    expect(res.status).toBe(200);
    expect(res.body.items).toContainEqual({ id: expect.any(Number), name: 'Lena Okonkwo', email: 'technician@harrowgate-thermo.test' });
    expect(res.body.items[0]).not.toHaveProperty('passwordHash');
    expect((await (await clientAs(h.app, 'investigator')).get('/api/audit/actors')).status).toBe(200);
  });

  it('walks the chain for a reader: the events counted and any breaks listed', async () => {
    const res = await quality.get('/api/audit/verify');
    expect(res.status).toBe(200);
    expect(res.body.checked).toBeGreaterThan(0);
    expect(res.body.head.id).toBeGreaterThan(0);
    // Other spec files tamper with the shared trail on purpose, so a break may be listed here: then the chain is not valid.
    expect(res.body.brokenCount).toBeGreaterThanOrEqual(res.body.broken.length);
    if (res.body.brokenCount > 0) expect(res.body.valid).toBe(false);
  });

  it('answers 403 to technicians, assistants and administrators, 401 without a session', async () => {
    for (const role of ['technician', 'assistant', 'admin'] as const) {
      const client = await clientAs(h.app, role);
      expect((await client.get('/api/audit')).status).toBe(403);
      expect((await client.get('/api/audit/actors')).status).toBe(403);
    }
    const anonymous = await clientAs(h.app, null);
    for (const path of ['/api/audit', '/api/audit/actors', '/api/audit/verify']) expect((await anonymous.get(path)).status).toBe(401);
  });

  it('answers 404 for a run code no run has', async () => {
    const res = await quality.get('/api/audit?run=R-1999-9999');
    expect(res.status).toBe(404);
    expect(res.body.detail).toContain('R-1999-9999');
  });
});
