import { and, asc, eq } from 'drizzle-orm';
import { auditEvents } from '../../db/schema';
import { demoEmail } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';

let h: ApiHarness;
let quality: ApiClient;
beforeAll(async () => {
  h = await startHarness();
  quality = await clientAs(h.app, 'quality');
});
afterAll(() => h.close());

const uniqueTag = (prefix: string) => `${prefix}-${Date.now().toString(36).toUpperCase().slice(-5)}${Math.floor(Math.random() * 1296).toString(36).toUpperCase()}`;
const cell = (tag: string) => ({ tag, name: 'Spare piston cell', kind: 'piston-cell', bore: 0.05, ratedPressure: 1.0e6, heatLossCoefficient: 0.05, heatLossCoefficientU: 0.01 });

function auditRows(id: number) {
  return h.handle.db.select().from(auditEvents)
    .where(and(eq(auditEvents.entityType, 'apparatus'), eq(auditEvents.entityId, String(id))))
    .orderBy(asc(auditEvents.id));
}

describe('GET /api/apparatus', () => {
  it('lists the register by tag, quantities in SI units, for every role', async () => {
    for (const role of ['technician', 'assistant', 'investigator', 'quality', 'admin'] as const) {
      const res = await (await clientAs(h.app, role)).get('/api/apparatus');
      expect(res.status).toBe(200);
      const tags: string[] = res.body.items.map((a: { tag: string }) => a.tag);
      expect(tags).toEqual([...tags].sort());
    }
    const items = (await quality.get('/api/apparatus')).body.items;
    // Demo lab values (db/seed/demo-lab.ts): a 5 cm bore cell rated 1 MPa, a 4850 J/K bath.
    expect(items.find((a: { tag: string }) => a.tag === 'PC-3')).toMatchObject({ kind: 'piston-cell', bore: 0.05, ratedPressure: 1.0e6 });
    expect(items.find((a: { tag: string }) => a.tag === 'BC-1')).toMatchObject({ kind: 'bath-calorimeter', heatCapacity: 4850, heatCapacityU: 12 });
  });

  it('answers 401 without a session', async () => {
    expect((await (await clientAs(h.app, null)).get('/api/apparatus')).status).toBe(401);
  });
});

describe('POST /api/apparatus', () => {
  it('lets a quality officer register apparatus, audited in the same step', async () => {
    const tag = uniqueTag('PC');
    const res = await quality.post('/api/apparatus', cell(tag));
    expect(res.status).toBe(201);
    expect(res.headers['location']).toBe(`/api/apparatus/${res.body.id}`);
    expect(res.body).toMatchObject({ ...cell(tag), notes: '', heatCapacity: null, fixedVolume: null });
    const [event] = await auditRows(res.body.id);
    expect(event).toMatchObject({ action: 'apparatus.create', actorEmail: demoEmail('quality') });
    expect(event.after).toMatchObject({ tag, bore: 0.05 });
  });

  it('answers 400 naming the field, 409 for a tag in the register, 403 to other roles, 401 without a session', async () => {
    const lower = await quality.post('/api/apparatus', cell('pc-lower'));
    expect(lower.status).toBe(400);
    expect(lower.body.errors.map((e: { field: string }) => e.field)).toEqual(['tag']);
    const negative = await quality.post('/api/apparatus', { ...cell(uniqueTag('PC')), bore: -0.05 });
    expect(negative.status).toBe(400);
    expect(negative.body.errors.map((e: { field: string }) => e.field)).toEqual(['bore']);
    const text = await quality.post('/api/apparatus', { ...cell(uniqueTag('PC')), ratedPressure: '10 bar' });
    expect(text.status).toBe(400);
    expect(text.body.detail).toContain('ratedPressure must be a number (Pa)');

    const dup = await quality.post('/api/apparatus', cell('PC-3'));
    expect(dup.status).toBe(409);
    expect(dup.body.detail).toContain('PC-3');

    for (const role of ['technician', 'assistant', 'investigator', 'admin'] as const) {
      expect((await (await clientAs(h.app, role)).post('/api/apparatus', cell(uniqueTag('PC')))).status).toBe(403);
    }
    expect((await (await clientAs(h.app, null)).post('/api/apparatus', cell(uniqueTag('PC')))).status).toBe(401);
  });
});

describe('PUT /api/apparatus/:id', () => {
  it('replaces the entry, keeps notes that were left out, and audits before and after', async () => {
    const tag = uniqueTag('VS');
    const created = (await quality.post('/api/apparatus', { tag, name: 'Spare vessel', kind: 'vessel', fixedVolume: 0.001, notes: 'Relief valve at 800 kPa.' })).body;
    const res = await quality.put(`/api/apparatus/${created.id}`, { tag, name: 'Spare vessel, re-measured', kind: 'vessel', fixedVolume: 0.00102 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: created.id, name: 'Spare vessel, re-measured', fixedVolume: 0.00102, notes: 'Relief valve at 800 kPa.' });
    const [, event] = await auditRows(created.id);
    expect(event.action).toBe('apparatus.update');
    expect(event.before).toMatchObject({ name: 'Spare vessel', fixedVolume: 0.001 });
    expect(event.after).toMatchObject({ name: 'Spare vessel, re-measured', fixedVolume: 0.00102 });
  });

  it('answers 409 when renamed onto another tag, 400 for a bad body, 404 for unknown apparatus, changing nothing', async () => {
    const tag = uniqueTag('VS');
    const created = (await quality.post('/api/apparatus', { tag, name: 'Clash probe', kind: 'vessel' })).body;
    expect((await quality.put(`/api/apparatus/${created.id}`, { tag: 'BC-1', name: 'Clash probe', kind: 'vessel' })).status).toBe(409);
    const bad = await quality.put(`/api/apparatus/${created.id}`, { tag, name: 'x', kind: 'vessel' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].field).toBe('name');
    expect((await auditRows(created.id)).map((e) => e.action)).toEqual(['apparatus.create']);

    expect((await quality.put('/api/apparatus/999999999', { tag: uniqueTag('VS'), name: 'Nowhere', kind: 'vessel' })).status).toBe(404);
    expect((await quality.put('/api/apparatus/abc', { tag: uniqueTag('VS'), name: 'Nowhere', kind: 'vessel' })).status).toBe(404);
    expect((await (await clientAs(h.app, 'technician')).put(`/api/apparatus/${created.id}`, { tag, name: 'Not theirs', kind: 'vessel' })).status).toBe(403);
    expect((await (await clientAs(h.app, null)).put(`/api/apparatus/${created.id}`, { tag, name: 'Not theirs', kind: 'vessel' })).status).toBe(401);
  });
});
