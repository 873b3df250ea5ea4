import { and, eq } from 'drizzle-orm';
import type { Express } from 'express';
import { createDb, type DbHandle } from '../../db/client';
import { balanceResults, runs } from '../../db/schema';
import { startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { fuzzClients, fuzzParams, fuzzTargets, nextFuzzUrl, sendOnce, type FuzzIds } from '../../testing/fuzz-writes';
import { createApp } from '../app';
import { runBalanceCheck } from '../balance/balance-check';

// A request that holds a transaction (and its locks) and then asks the pool for a second connection
// waits for itself once the pool is spent: eight identical standardization signings at once hung the
// test server for good that way, because signing read the signer's name outside its transaction. With
// a pool of ONE connection the same wait happens on a single request, every time, so every write
// route's valid request is sent here to an app whose pool has one connection: each must answer (a
// route that waits on the pool never does, and the test's timeout reports it) and none with a 5xx.
// Once a route has hung, the one connection stays taken and the routes after it time out too: the
// first failure names the culprit.

let h: ApiHarness;
let one: DbHandle;
let app: Express;
let ids: FuzzIds;
let clients: Record<string, ApiClient>;

beforeAll(async () => {
  h = await startHarness();
  ids = await fuzzParams(h.handle.db);
  // The submitted fuzz run gets a result for its version, so that approval runs its whole signing path.
  const [submitted] = await h.handle.db.select({ version: runs.version }).from(runs).where(eq(runs.id, ids[':submitted']));
  await h.handle.db.insert(balanceResults).values({
    runId: ids[':submitted'], runVersion: submitted.version, engineVersion: 'one-connection', inputHash: `one-connection-${ids[':submitted']}`,
    verdict: 'closes', en: 0.1, residual: 0, expandedUncertainty: 1, result: {},
  });
  one = createDb(h.config.databaseUrl, 1);
  app = createApp(h.config, one, null);
  clients = await fuzzClients(app, one.db, ids);
});
afterAll(async () => {
  await one.close();
  await h.close();
});

/**
 * Routes whose valid request meets a state an earlier route in the table changed: the approval before
 * it signed the submitted run off (the return is the same signing path), and the draft's readings.
 */
const ORDER_DEPENDENT = new Set(['POST /api/runs/:submitted/return', 'POST /api/runs/:draft/submit']);

it.each(fuzzTargets.map((t) => [`${t.method} ${t.path}`, t] as const))('%s answers on a one-connection pool', async (name, target) => {
  const url = await nextFuzzUrl(one.db, target, ids);
  const res = await sendOnce(one.db, clients[target.actor], target.method, url, target.valid(ids));
  expect({ route: name, status: res.status < 500 ? 'answered' : res.status, body: res.status < 500 ? null : res.body })
    .toEqual({ route: name, status: 'answered', body: null });
  // The valid payload is accepted (not merely answered), so the route's whole write path ran on the one connection.
  if (!ORDER_DEPENDENT.has(name)) expect({ route: name, accepted: [200, 201].includes(res.status) || res.status }).toEqual({ route: name, accepted: true });
  // Signing answers with the signer's name, read inside the signing transaction.
  if (name === 'POST /api/apparatus/:apparatus/standardizations') expect((res.body as { signedBy: string }).signedBy).toBe('Fuzz quality');
}, 20_000);

it('runs the queued balance check of the submitted draft on the one connection', async () => {
  // The table above put readings on the draft and submitted it; the job the queue would run checks it.
  const [draft] = await one.db.select({ version: runs.version, state: runs.state }).from(runs).where(eq(runs.id, ids[':draft']));
  expect(draft.state).toBe('submitted');
  expect(await runBalanceCheck(one.db, h.config, ids[':draft'], draft.version)).toBe('stored');
  const stored = await one.db.select({ verdict: balanceResults.verdict }).from(balanceResults)
    .where(and(eq(balanceResults.runId, ids[':draft']), eq(balanceResults.current, true)));
  expect(stored).toHaveLength(1);
}, 20_000);
