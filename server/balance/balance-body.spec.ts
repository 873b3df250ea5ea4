import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture } from '../../testing/fixture-runs';
import { BalanceService, OFF_THREAD_FROM_BYTES } from './balance-service';

// POST /api/balance reads its own body (server/balance/balance-body.ts): a large document is parsed,
// cleaned and checked in a worker thread, with the same answers as the inline path.
let h: ApiHarness;
let tech: ApiClient;
beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
});
afterAll(() => h.close());

/** The isothermal fixture on n time points (each channel repeated in turn: still a valid run document). */
function large(n: number) {
  const doc = loadFixture('isothermal') as unknown as { readings: Record<string, { values: number[] }> };
  const t = doc.readings['time'].values;
  const span = t[t.length - 1] - t[0];
  for (const [name, channel] of Object.entries(doc.readings)) {
    const base = channel.values;
    channel.values = Array.from({ length: n }, (_, k) => (name === 'time' ? t[0] + (span * k) / (n - 1) : base[Math.floor((k * (base.length - 1)) / (n - 1))]));
  }
  return doc;
}

describe('POST /api/balance with a large document', () => {
  it('answers exactly what the inline check gives, from a worker thread', async () => {
    const doc = large(12_000);
    expect(JSON.stringify(doc).length).toBeGreaterThan(OFF_THREAD_FROM_BYTES);
    const res = await tech.post('/api/balance', doc);
    expect(res.status).toBe(200);
    const inline = await new BalanceService(h.config.balance).check(JSON.parse(JSON.stringify(doc)));
    expect(res.body).toEqual(JSON.parse(JSON.stringify(inline)));
  }, 120_000);

  it('refuses from the worker what the inline path refuses: broken JSON, a NUL, a reading out of range (400)', async () => {
    const text = JSON.stringify(large(12_000));
    const send = (body: string) => tech.agent.post('/api/balance').set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json').send(body);
    const broken = await send(`${text.slice(0, -1)},}`);
    expect(broken.status).toBe(400);
    expect(broken.body.detail).toBe('The request body is not valid JSON.');
    const nul = await send(text.replace('"title":"', '"title":"\\u0000'));
    expect(nul.status).toBe(400);
    expect(nul.body.errors.map((e: { field: string }) => e.field)).toEqual(['title']);
    const doc = large(12_000);
    doc.readings['pressure'].values[7] = 1e306;
    (doc.readings['pressure'] as unknown as { unit: string }).unit = 'bar';
    const far = await tech.post('/api/balance', doc);
    expect(far.status).toBe(400);
    expect(far.body.errors.map((e: { field: string }) => e.field)).toEqual(['readings.pressure.values[7]']);
    expect((await (await clientAs(h.app, null)).post('/api/balance', doc)).status).toBe(401);
  }, 120_000);
});
