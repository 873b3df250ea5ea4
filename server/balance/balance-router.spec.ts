import { count } from 'drizzle-orm';
import { balanceResults } from '../../db/schema';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';
import { loadFixture } from '../../testing/fixture-runs';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('POST /api/balance', () => {
  it('checks a run document and stores nothing', async () => {
    const [{ n: before }] = await h.handle.db.select({ n: count() }).from(balanceResults);
    const res = await (await clientAs(h.app, 'assistant')).post('/api/balance', loadFixture('calorimetric-heat-leak-forgotten'));
    expect(res.status).toBe(200);
    expect(res.body.verdict).toBe('breaks');
    expect(res.body.inputHash).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.hints.map((hint: { code: string }) => hint.code)).toContain('FORGOTTEN_HEAT_LEAK');
    const [{ n: after }] = await h.handle.db.select({ n: count() }).from(balanceResults);
    expect(after).toBe(before);
  });

  it('answers 400 with the path of each problem, and 401 without a session', async () => {
    const doc = loadFixture('isothermal') as unknown as Record<string, unknown>;
    const res = await (await clientAs(h.app, 'technician')).post('/api/balance', { ...doc, runDate: 'last Tuesday' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'runDate' })]);
    expect((await (await clientAs(h.app, null)).post('/api/balance', doc)).status).toBe(401);
  });
});

describe('GET /api/runs/:id/balance', () => {
  it('returns the stored result of a checked run, and 404 with a reason for a draft', async () => {
    const tech = await clientAs(h.app, 'technician');
    // A checked demo run: other spec files leave submitted runs whose check never ran in this process.
    const submitted = (await tech.get('/api/runs?state=submitted&sort=code&dir=asc')).body.items.find((r: { verdict: string | null }) => r.verdict);
    const res = await tech.get(`/api/runs/${submitted.id}/balance`);
    expect(res.status).toBe(200);
    expect(res.body.result.verdict).toBe(submitted.verdict);
    expect(res.body.stale).toBe(false);
    const draft = (await tech.get('/api/runs?state=draft')).body.items[0];
    const none = await tech.get(`/api/runs/${draft.id}/balance`);
    expect(none.status).toBe(404);
    expect(none.body.detail).toMatch(/checked when it is submitted/);
  });
});

describe('run document round trip', () => {
  it('exports a stored run as a run document that POST /api/balance checks to the same numbers', async () => {
    const quality = await clientAs(h.app, 'quality');
    const submitted = (await quality.get('/api/runs?state=submitted&verdict=closes&sort=code&dir=asc')).body.items[0];
    const stored = (await quality.get(`/api/runs/${submitted.id}/balance`)).body.result;
    const exported = await quality.get(`/api/runs/${submitted.id}/document`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-disposition']).toMatch(/attachment/);
    const again = await quality.post('/api/balance', JSON.parse(exported.text));
    expect(again.status).toBe(200);
    // The linear results do not depend on the number of Monte Carlo draws (the seed run used more).
    expect(again.body.verdict).toBe(stored.verdict);
    for (const path of [['work', 'measured'], ['heat', 'total'], ['internalEnergy', 'value'], ['residual', 'r'], ['residual', 'U']] as const) {
      expect(again.body[path[0]][path[1]]).toBeCloseTo(stored[path[0]][path[1]], 9);
    }
    expect(again.body.En).toBeCloseTo(stored.En, 9);
  });
});
