import { demoGases } from '../../db/seed/demo-lab';
import { clientAs, startHarness, type ApiHarness } from '../../testing/api-harness';

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('GET /api/gases', () => {
  it('lists the demo lab\'s gases by code, with molar mass and model, for every role', async () => {
    for (const role of ['technician', 'assistant', 'investigator', 'quality', 'admin'] as const) {
      const res = await (await clientAs(h.app, role)).get('/api/gases');
      expect(res.status).toBe(200);
      const codes: string[] = res.body.items.map((g: { code: string }) => g.code);
      expect([...codes]).toEqual([...codes].sort());
      for (const gas of demoGases) {
        expect(res.body.items.find((g: { code: string }) => g.code === gas.code)).toMatchObject(gas);
      }
    }
  });

  it('answers 401 without a session, and 404 for a path the table does not have', async () => {
    expect((await (await clientAs(h.app, null)).get('/api/gases')).status).toBe(401);
    const technician = await clientAs(h.app, 'technician');
    expect((await technician.get('/api/gases/N2')).status).toBe(404);
    // Gases are read-only through the API: a write is not a route at all.
    expect((await technician.post('/api/gases', { code: 'Xe', name: 'Xenon', molarMass: 0.131293, model: 'monatomic' })).status).toBe(404);
  });
});
