import { and, desc, eq } from 'drizzle-orm';
import { gzipSync } from 'node:zlib';
import { auditEvents, projects } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { OFF_THREAD_FROM_BYTES } from './readings-body';
import { sha256ReadingRows } from './readings-bulk';
import { loadReadings } from './run-loader';

// PUT /api/runs/:id/readings read as a stream (server/runs/readings-body.ts): large bodies in a worker
// thread, compressed bodies, the size limit, and the audit trail's hashes of the readings replaced.
let h: ApiHarness;
let tech: ApiClient;
let run: { id: number; version: number };

beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  const [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  const created = await tech.post('/api/runs', { ...runBodies(loadFixture('isothermal'), projectId).create, title: 'Readings stream target' });
  expect(created.status).toBe(201);
  run = { id: created.body.id, version: created.body.version };
});
afterAll(() => h.close());

/** n readings of an invented, smooth isothermal expansion, as a technician's client would send them. */
const readingsOf = (n: number, k = 1) => ({
  time: { unit: 's', values: Array.from({ length: n }, (_, i) => i * 0.25) },
  channels: {
    pressure: { unit: 'kPa', reference: 'absolute', values: Array.from({ length: n }, (_, i) => (i === 2 ? null : 150 * k - i / 1000)) },
    volume: { unit: 'L', values: Array.from({ length: n }, (_, i) => 1 + i / 1e5) },
    temperature: { unit: 'degC', values: Array.from({ length: n }, () => 26.85) },
  },
});

const put = (body: Buffer, headers: Record<string, string> = {}) => {
  let req = tech.agent.put(`/api/runs/${run.id}/readings`).set('X-XSRF-TOKEN', tech.xsrfToken).set('Content-Type', 'application/json');
  for (const [k, v] of Object.entries(headers)) req = req.set(k, v);
  // Sent as bytes: superagent would otherwise write a Buffer as JSON of its own.
  return req.serialize((b: unknown) => b as string).send(body);
};

const lastAudit = async () => (await h.handle.db.select().from(auditEvents)
  .where(and(eq(auditEvents.entityType, 'run'), eq(auditEvents.entityId, String(run.id)), eq(auditEvents.action, 'run.readings-replace')))
  .orderBy(desc(auditEvents.id)).limit(1))[0];

describe('PUT /api/runs/:id/readings as a stream', () => {
  it('stores a large body (read in a worker) and then a gzip-compressed one; each audit row hashes the readings before and after', async () => {
    const large = Buffer.from(JSON.stringify({ version: run.version, ...readingsOf(30_000) }));
    expect(large.length).toBeGreaterThan(OFF_THREAD_FROM_BYTES);
    const first = await put(large);
    expect(first.status).toBe(200);
    expect(first.body).toEqual({ id: run.id, version: run.version + 1, readings: 30_000 });
    const stored = await loadReadings(h.handle.db, run.id);
    expect(stored[2]).toEqual({ seq: 3, time: 0.5, pressure: null, volume: 1.00002e-3, displacement: null, temperature: 300, voltage: null, current: null, power: null });
    expect(stored[29_999].pressure).toBeCloseTo((150 - 29_999 / 1000) * 1000, 6);
    const firstAudit = await lastAudit();
    expect(firstAudit.after).toMatchObject({ readings: 30_000, sha256: sha256ReadingRows(stored), version: run.version + 1 });

    const zipped = gzipSync(Buffer.from(JSON.stringify({ version: run.version + 1, ...readingsOf(1000, 2) })));
    const second = await put(zipped, { 'Content-Encoding': 'gzip' });
    expect(second.status).toBe(200);
    expect(second.body.readings).toBe(1000);
    const again = await loadReadings(h.handle.db, run.id);
    expect(again[0].pressure).toBe(300_000);
    const secondAudit = await lastAudit();
    expect(secondAudit.before).toEqual({ readings: 30_000, sha256: (firstAudit.after as { sha256: string }).sha256, version: run.version + 1 });
    expect(secondAudit.after).toMatchObject({ readings: 1000, sha256: sha256ReadingRows(again) });
    run.version += 2;
  }, 120_000);

  it('refuses broken JSON, a body over QWELL_READINGS_MAX_MB, an unknown encoding and a stale version, and keeps the stored readings', async () => {
    const before = await loadReadings(h.handle.db, run.id);
    const broken = Buffer.from(JSON.stringify({ version: run.version, ...readingsOf(30_000) }).replace('"volume":{', '"volume":{{'));
    const bad = await put(broken);
    expect(bad.status).toBe(400);
    expect(bad.body.detail).toMatch(/not valid JSON: .* at byte \d+/);
    const saved = process.env['QWELL_READINGS_MAX_MB'];
    process.env['QWELL_READINGS_MAX_MB'] = '0.5';
    try {
      const big = await put(Buffer.from(JSON.stringify({ version: run.version, ...readingsOf(30_000) })));
      expect(big.status).toBe(413);
      expect(big.body.detail).toMatch(/larger than the server accepts \(0\.5 MB of JSON\)/);
      // Compressed, the size is only known while inflating: refused there.
      const bomb = await put(gzipSync(Buffer.from(JSON.stringify({ version: run.version, ...readingsOf(30_000) }))), { 'Content-Encoding': 'gzip' });
      expect(bomb.status).toBe(413);
    } finally {
      if (saved === undefined) delete process.env['QWELL_READINGS_MAX_MB'];
      else process.env['QWELL_READINGS_MAX_MB'] = saved;
    }
    const odd = await put(Buffer.from('{}'), { 'Content-Encoding': 'compress' });
    expect(odd.status).toBe(415);
    const stale = await put(Buffer.from(JSON.stringify({ version: run.version - 1, ...readingsOf(10) })));
    expect(stale.status).toBe(409);
    expect(await loadReadings(h.handle.db, run.id)).toEqual(before);
  }, 120_000);

  it('refuses a channel instrumentId that is no register id (2^31 made every later read of the run fail) or names no instrument, inline, in the worker and in a setup, and keeps the run readable', async () => {
    const before = await loadReadings(h.handle.db, run.id);
    const current = (await tech.get(`/api/runs/${run.id}`)).body.version as number;
    const withId = (n: number, instrumentId: unknown) => {
      const body = readingsOf(n);
      return Buffer.from(JSON.stringify({ version: current, ...body, channels: { ...body.channels, pressure: { ...body.channels.pressure, instrumentId } } }));
    };
    for (const [n, id] of [[10, 2 ** 31], [10, 0], [10, -3], [10, 1.5], [30_000, 2 ** 31], [10, 999_999], [30_000, 999_999]] as const) {
      const res = await put(withId(n, id));
      expect({ id, n, status: res.status, fields: (res.body.errors as { field: string }[] | undefined)?.map((e) => e.field) })
        .toEqual({ id, n, status: 400, fields: ['channels.pressure.instrumentId'] });
    }
    // An id no instrument of the register has: the channel would be checked without its instrument, unseen.
    const unknown = await put(withId(10, 999_999));
    expect(unknown.body.detail).toBe('There is no instrument with id 999999 in the register; choose the pressure instrument again.');
    const setup = (await tech.get(`/api/runs/${run.id}`)).body.setup;
    const patched = await tech.patch(`/api/runs/${run.id}`, { version: current, setup: { ...setup, channels: { ...setup.channels, pressure: { ...setup.channels.pressure, instrumentId: 999_999 } } } });
    expect(patched.status).toBe(400);
    expect(patched.body.errors).toEqual([{ field: 'setup.channels.pressure.instrumentId', message: 'unknown instrument 999999' }]);
    expect(await loadReadings(h.handle.db, run.id)).toEqual(before);
    const read = await tech.get(`/api/runs/${run.id}`);
    expect(read.status).toBe(200);
    expect(read.body.version).toBe(current);
  }, 120_000);
});
