import fc from 'fast-check';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../testing/api-harness';
import { fuzzOnce, fuzzParams, fuzzTargets, payload } from './fuzz-writes';

let h: ApiHarness;
const clients = new Map<string, ApiClient>();
let ids: Record<string, number>;

beforeAll(async () => {
  h = await startHarness();
  for (const role of new Set(fuzzTargets.map((t) => t.role))) clients.set(role, await clientAs(h.app, role));
  ids = await fuzzParams(h.handle.db);
});
afterAll(() => h.close());

// A small count here; tools/fuzz runs ≥ 10 000 cases.
const RUNS_PER_ROUTE = 15;

describe('fuzzing the write routes', () => {
  it.each(fuzzTargets.map((t) => [`${t.method} ${t.path}`, t] as const))('%s never answers 5xx nor writes on refusal', async (_name, target) => {
    const url = target.path.replace(/:[a-z]+/g, (p) => String(ids[p]));
    const statuses = new Set<number>();
    await fc.assert(
      fc.asyncProperty(payload, async (body) => {
        const failure = await fuzzOnce(h.handle.db, clients.get(target.role)!, target.method, url, body, statuses);
        if (failure) throw new Error(`fuzz failure: ${JSON.stringify(failure)}`);
      }),
      { numRuns: RUNS_PER_ROUTE, seed: 20261201 },
    );
    // The payloads reached validation (400), not a gate that refuses everything.
    expect([...statuses].some((s) => s === 400 || s === 409 || s === 404)).toBe(true);
    expect([...statuses].every((s) => s < 500)).toBe(true);
  });
});
