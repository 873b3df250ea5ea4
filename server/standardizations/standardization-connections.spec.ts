import type { Express } from 'express';
import { createDb, type DbHandle } from '../../db/client';
import { standardizations } from '../../db/schema';
import { startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { fuzzClients, fuzzParams, fuzzTargets, fuzzUrl, type FuzzIds } from '../../testing/fuzz-writes';
import { createApp } from '../app';
import { eq } from 'drizzle-orm';

// Eight identical signings at once (issue 16's parallel fuzzing) hung the test server for good: the
// transaction that held the apparatus lock asked the pool for a second connection to read the
// signer's name, while the other signings held every other connection waiting for that lock. With a
// pool of one connection the same wait happens on a single request, every time; the signing must
// finish on the connection it holds.

let h: ApiHarness;
let one: DbHandle;
let app: Express;
let ids: FuzzIds;
let quality: ApiClient;
const target = fuzzTargets.find((t) => t.path === '/api/apparatus/:apparatus/standardizations')!;

beforeAll(async () => {
  h = await startHarness();
  ids = await fuzzParams(h.handle.db);
  one = createDb(h.config.databaseUrl, 1);
  app = createApp(h.config, one, null);
  // A throwaway quality officer with six in-control standardization runs of a throwaway apparatus (testing/fuzz-writes.ts).
  quality = (await fuzzClients(app, one.db, ids)).fuzzQuality;
});
afterAll(async () => {
  await one.close();
  await h.close();
});

it('signs a standardization on an app whose pool has one connection, and names the signer', async () => {
  const res = await quality.post(fuzzUrl(target, ids), target.valid(ids));
  expect(res.status).toBe(201);
  expect(res.body.signedBy).toBe('Fuzz quality');
  const stored = await h.handle.db.select({ id: standardizations.id }).from(standardizations).where(eq(standardizations.apparatusId, ids[':apparatus']));
  expect(stored.map((s) => s.id)).toEqual([res.body.id]);
});
