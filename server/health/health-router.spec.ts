import { and, eq, like } from 'drizzle-orm';
import request from 'supertest';
import { people } from '../../db/schema';
import { DEMO_DOMAIN } from '../../db/seed/demo-lab';
import { startHarness, type ApiHarness } from '../../testing/api-harness';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('GET /api/health', () => {
  it('reports the database as answering', async () => {
    const res = await request(h.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok', demoLab: true });
  });

  it('says whether the demo lab is loaded: false once none of its people is active', async () => {
    const demo = and(like(people.email, `%@${DEMO_DOMAIN}`), eq(people.active, true));
    const active = await h.handle.db.select({ id: people.id }).from(people).where(demo);
    expect(active.length).toBeGreaterThan(0);
    // Spec files run one at a time; the demo people are switched back on before the next one starts.
    await h.handle.db.update(people).set({ active: false }).where(demo);
    try {
      expect((await request(h.app).get('/api/health')).body).toEqual({ status: 'ok', db: 'ok', demoLab: false });
    } finally {
      for (const { id } of active) await h.handle.db.update(people).set({ active: true }).where(eq(people.id, id));
    }
    expect((await request(h.app).get('/api/health')).body.demoLab).toBe(true);
  });

  it('sends the helmet security headers', async () => {
    const res = await request(h.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('errors', () => {
  it('answers an unknown API route with a 404 problem', async () => {
    const res = await request(h.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.detail).toBe('There is no API route GET /api/no-such-thing.');
  });
});
