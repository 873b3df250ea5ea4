import fc from 'fast-check';
import { startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { eq } from 'drizzle-orm';
import { runs } from '../../db/schema';
import { fuzzClients, fuzzOnce, fuzzParams, fuzzTargets, hostileFamilies, nextFuzzUrl, payloadsFor, rowCounts, sendOnce, type FuzzIds } from '../../testing/fuzz-writes';
import { listRoutes } from '../../testing/route-list';

let h: ApiHarness;
let clients: Record<string, ApiClient>;
let ids: FuzzIds;

beforeAll(async () => {
  h = await startHarness();
  ids = await fuzzParams(h.handle.db);
  clients = await fuzzClients(h.app, h.handle.db, ids);
});
afterAll(() => h.close());

// A small count here; tools/fuzz runs ≥ 10 000 cases.
const RUNS_PER_ROUTE = 15;

/** Write routes the fuzzer leaves out, each with where its hostile input is tested instead. */
const NOT_FUZZED: Record<string, string> = {
  'POST /api/auth/sign-in': 'server/auth: sign-in hardening (rate limits, lockout, bad bodies)',
  'POST /api/auth/sign-out': 'takes no body',
  'POST /api/imports': 'multipart upload: server/imports (zip inspection, limits, hostile workbooks)',
};

describe('the fuzz table', () => {
  it('has a target for every write route the app answers, or a stated reason to leave it out', () => {
    // A route's ":param" segment matches any segment of a target (POST /api/runs/:id/:action is fuzzed as approve and return).
    const covers = (routePath: string, targetPath: string) => {
      const r = routePath.split('/'), t = targetPath.split('/');
      return r.length === t.length && r.every((seg, i) => seg.startsWith(':') ? true : seg === t[i]);
    };
    const writes = listRoutes(h.app).filter((r) => r.path.startsWith('/api') && ['POST', 'PUT', 'PATCH', 'DELETE'].includes(r.method));
    const uncovered = writes
      .map((r) => `${r.method} ${r.path}`)
      .filter((key) => !(key in NOT_FUZZED))
      .filter((key) => { const [method, path] = key.split(' '); return !fuzzTargets.some((t) => t.method === method && covers(path, t.path)); });
    expect(uncovered).toEqual([]);
    expect(fuzzTargets.map((t) => `${t.method} ${t.path}`)).toEqual(expect.arrayContaining([
      'POST /api/apparatus/:apparatus/standardizations', 'POST /api/apparatus/:apparatus/changes',
      'POST /api/imports/column-maps', 'POST /api/imports/:import/check', 'POST /api/imports/:import/commit',
    ]));
  });
});

describe('fuzzing the write routes', () => {
  it.each(fuzzTargets.map((t) => [`${t.method} ${t.path}`, t] as const))('%s never answers 5xx nor writes on refusal', async (_name, target) => {
    const statuses = new Set<number>();
    await fc.assert(
      fc.asyncProperty(payloadsFor(target, ids), async (body) => {
        const url = await nextFuzzUrl(h.handle.db, target, ids);
        const failure = await fuzzOnce(h.handle.db, clients[target.actor], target.method, url, body, statuses);
        if (failure) throw new Error(`fuzz failure: ${JSON.stringify(failure)}`);
      }),
      { numRuns: RUNS_PER_ROUTE, seed: 20261201 },
    );
    // The payloads got past the role gate: validation or the route's own checks answered.
    expect([...statuses].some((s) => s === 400 || s === 409 || s === 404 || s === 422)).toBe(true);
    expect([...statuses].every((s) => s < 500)).toBe(true);
  });

  it('the valid payload of each route is accepted on fresh records, so near-misses start from a real request', async () => {
    const fresh = await fuzzParams(h.handle.db);
    const freshClients = await fuzzClients(h.app, h.handle.db, fresh);
    const answers: Record<string, number> = {};
    for (const target of fuzzTargets) {
      const statuses = new Set<number>();
      await fuzzOnce(h.handle.db, freshClients[target.actor], target.method, await nextFuzzUrl(h.handle.db, target, fresh), target.valid(fresh), statuses);
      answers[`${target.method} ${target.path}`] = [...statuses][0];
    }
    // Approval also needs the queued balance check's result, which this harness does not run: a
    // conflict (409) there is the route's own state check, past validation.
    expect(Object.fromEntries(Object.entries(answers).filter(([, status]) => status >= 300))).toEqual({ 'POST /api/runs/:submitted/approve': 409 });
  });
});

describe('the hostile families of issue 16, sent in parallel', () => {
  // A few of each family per route here; tools/fuzz runs a tenth of its cases again as these.
  const PER_FAMILY = 3;
  it.each(fuzzTargets.map((t) => [`${t.method} ${t.path}`, t] as const))('%s answers no 5xx to control characters, deep nesting, overflow, wrong nested types, prototype keys, huge strings', async (_name, target) => {
    const sends: Array<Promise<{ family: string; status: number; sent: string }>> = [];
    for (const [family, arbitrary] of Object.entries(hostileFamilies(target.valid(ids)))) {
      for (const body of fc.sample(arbitrary, { numRuns: PER_FAMILY, seed: 16 })) {
        const url = await nextFuzzUrl(h.handle.db, target, ids);
        sends.push(sendOnce(h.handle.db, clients[target.actor], target.method, url, body).then((r) => ({ family, status: r.status, sent: r.sent })));
      }
    }
    const answers = await Promise.all(sends);
    expect(answers.filter((a) => a.status >= 500)).toEqual([]);
    // Every deep, prototype-key and control-character payload is refused (these are never valid), and so is
    // 64 KiB or more of text in place of any value: no text field takes that much (server/security/text-limits.spec.ts).
    expect(answers.filter((a) => ['deep nesting', 'prototype key', 'control character', 'huge string'].includes(a.family) && a.status < 400)).toEqual([]);
  });
});

describe('identical requests at once (a double click, a client that retries)', () => {
  it('the valid payload of every route, sent 8 times at once on fresh records, answers no 5xx', async () => {
    const fresh = await fuzzParams(h.handle.db);
    const freshClients = await fuzzClients(h.app, h.handle.db, fresh);
    const answers: Array<{ route: string; status: number }> = [];
    for (const target of fuzzTargets) {
      const url = await nextFuzzUrl(h.handle.db, target, fresh);
      const sent = await Promise.all(Array.from({ length: 8 }, () => sendOnce(h.handle.db, freshClients[target.actor], target.method, url, target.valid(fresh))));
      answers.push(...sent.map((r) => ({ route: `${target.method} ${target.path}`, status: r.status })));
    }
    expect(answers.filter((a) => a.status >= 500)).toEqual([]);
    // An import commits once: one run, the seven others are told it was committed already (server/imports/import-parallel.spec.ts counts the rows).
    expect(answers.filter((a) => a.route === 'POST /api/imports/:import/commit').map((a) => a.status).sort()).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    // A member list carries no version: the same PUT again is the same request (server/projects/members-parallel.spec.ts).
    expect(answers.filter((a) => a.route === 'PUT /api/projects/:project/members').map((a) => a.status)).toEqual([200, 200, 200, 200, 200, 200, 200, 200]);
  });
});

describe('payloads the large fuzz run found', () => {
  // Each answered 500 before: a null for a column that cannot be empty, and a day that does not exist.
  const draftVersion = async () => (await h.handle.db.select({ v: runs.version }).from(runs).where(eq(runs.id, ids[':draft'])))[0].v;
  it.each([
    ['PATCH', '/api/runs/:draft', 'fuzzTechnician', { title: 'Fuzzed title', runDate: null }, 'runDate'],
    ['PATCH', '/api/runs/:draft', 'fuzzTechnician', { title: null }, 'title'],
    ['POST', '/api/instruments/:instrument/calibrations', 'quality', { calibratedOn: '2026-01-10', dueOn: '2026-02-30', certificate: 'FZ-CERT-1', expandedUncertainty: 0.2 }, 'dueOn'],
    ['PATCH', '/api/people/:person', 'admin', { name: null, role: 'assistant' }, 'name'],
    ['PATCH', '/api/people/:person', 'admin', { name: 'Fuzz target renamed', role: null }, 'role'],
  ] as const)('%s %s with %j answers 400 naming %s, changing nothing', async (method, path, actor, body, field) => {
    const url = path.replace(/:[a-z]+/g, (p) => String(ids[p]));
    const sent = path.startsWith('/api/runs') ? { ...body, version: await draftVersion() } : body;
    const before = await rowCounts(h.handle.db);
    const res = method === 'PATCH' ? await clients[actor].patch(url, sent) : await clients[actor].post(url, sent);
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
    expect(await rowCounts(h.handle.db)).toEqual(before);
  });
});
