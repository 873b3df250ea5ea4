import { eq } from 'drizzle-orm';
import { runs } from '../../db/schema';
import { TEXT_LIMITS } from '../../contract/text-limits';
import { startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { fuzzClients, fuzzParams, fuzzTargets, nextFuzzUrl, pathsOf, rowCounts, sendOnce, setAt, type FuzzIds } from '../../testing/fuzz-writes';

// Issue 16: every free-text field of every write route has a length limit, and a longer text gets a
// 400 that names the field and its limit. The database columns are `text`: these checks are the only bound.

let h: ApiHarness;
let clients: Record<string, ApiClient>;
let ids: FuzzIds;

beforeAll(async () => {
  h = await startHarness();
  ids = await fuzzParams(h.handle.db);
  clients = await fuzzClients(h.app, h.handle.db, ids);
});
afterAll(() => h.close());

const KIB_64 = 'x'.repeat(65_536);

describe('64 KiB of text in place of any value of any write route', () => {
  // Before the limits, 13 of these were answered 200: the run document's id, title, lab, operator,
  // apparatus name and instrument names (POST /api/balance), and each channel's instrument in PUT readings (stored).
  it.each(fuzzTargets.map((t) => [`${t.method} ${t.path}`, t] as const))('%s refuses it, storing nothing', async (_name, target) => {
    const template = target.valid(ids);
    const accepted: string[] = [];
    for (const path of pathsOf(template)) {
      const before = await rowCounts(h.handle.db);
      const url = await nextFuzzUrl(h.handle.db, target, ids);
      const res = await sendOnce(h.handle.db, clients[target.actor], target.method, url, setAt(template, path, KIB_64));
      if (res.status !== 400) accepted.push(`${path.join('.')} → ${res.status}`);
      else if (!target.renew) expect(await rowCounts(h.handle.db)).toEqual(before);
    }
    expect(accepted).toEqual([]);
  });
});

type Case = [route: string, actor: string, build: (text: string, version: number) => Record<string, unknown>, field: string, limit: number];

const draftVersion = async () => (await h.handle.db.select({ v: runs.version }).from(runs).where(eq(runs.id, ids[':draft'])))[0].v;
const valid = (method: string, path: string) => fuzzTargets.find((t) => t.method === method && t.path === path)!.valid(ids);
const withSetup = (extra: Record<string, unknown>) => ({ ...(valid('POST', '/api/runs')['setup'] as object), ...extra });
const readings = (instrument: string, version: number) => {
  const body = valid('PUT', '/api/runs/:draft/readings') as { channels: Record<string, object> };
  return { ...body, version, channels: { ...body.channels, pressure: { ...body.channels['pressure'], instrument } } };
};
const doc = () => valid('POST', '/api/balance') as Record<string, unknown> & { instruments: object[]; apparatus: object };

/** Fields whose limit a form shows, each one character over (refused) and, where the route can be sent again, right at it (accepted). */
const cases: Case[] = [
  ['POST /api/balance', 'fuzzTechnician', (t) => ({ ...doc(), title: t }), 'title', TEXT_LIMITS.title],
  ['POST /api/balance', 'fuzzTechnician', (t) => ({ ...doc(), id: t }), 'id', TEXT_LIMITS.code],
  ['POST /api/balance', 'fuzzTechnician', (t) => ({ ...doc(), operator: t }), 'operator', TEXT_LIMITS.name],
  ['POST /api/balance', 'fuzzTechnician', (t) => ({ ...doc(), apparatus: { ...doc().apparatus, name: t } }), 'apparatus.name', TEXT_LIMITS.name],
  ['POST /api/balance', 'fuzzTechnician', (t) => ({ ...doc(), instruments: [{ ...doc().instruments[0], name: t }, ...doc().instruments.slice(1)] }), 'instruments[0].name', TEXT_LIMITS.name],
  ['PUT /api/runs/:draft/readings', 'fuzzTechnician', (t, v) => readings(t, v), 'channels.pressure.instrument', TEXT_LIMITS.instrumentId],
  ['PATCH /api/runs/:draft', 'fuzzTechnician', (t, v) => ({ version: v, title: t }), 'title', TEXT_LIMITS.title],
  ['PATCH /api/runs/:draft', 'fuzzTechnician', (t, v) => ({ version: v, setup: withSetup({ notes: t }) }), 'setup.notes', TEXT_LIMITS.runNotes],
  ['PUT /api/apparatus/:apparatus', 'quality', (t) => ({ ...valid('PUT', '/api/apparatus/:apparatus'), notes: t }), 'notes', TEXT_LIMITS.reason],
  ['PATCH /api/people/:person', 'admin', (t) => ({ name: t }), 'name', TEXT_LIMITS.name],
  ['POST /api/projects', 'admin', (t) => ({ ...valid('POST', '/api/projects'), description: t }), 'description', TEXT_LIMITS.reason],
  ['POST /api/people', 'admin', (t) => ({ ...valid('POST', '/api/people'), email: `${t.slice(10)}@fuzz.test` }), 'email', TEXT_LIMITS.email],
  ['POST /api/instruments', 'quality', (t) => ({ ...valid('POST', '/api/instruments'), manufacturer: t }), 'manufacturer', TEXT_LIMITS.name],
  ['POST /api/instruments/:instrument/calibrations', 'quality', (t) => ({ ...valid('POST', '/api/instruments/:instrument/calibrations'), notes: t }), 'notes', TEXT_LIMITS.reason],
  ['POST /api/runs/:approved/revisions', 'fuzzTechnician', (t) => ({ reason: t }), 'reason', TEXT_LIMITS.reason],
  ['POST /api/runs/:submitted/return', 'fuzzInvestigator', (t, v) => ({ ...valid('POST', '/api/runs/:submitted/return'), version: v, reason: t }), 'reason', TEXT_LIMITS.signatureReason],
  ['POST /api/apparatus/:apparatus/changes', 'quality', (t) => ({ description: t }), 'description', TEXT_LIMITS.reason],
  ['POST /api/imports/column-maps', 'fuzzTechnician', (t) => ({ ...valid('POST', '/api/imports/column-maps'), name: t }), 'name', 120],
];

/** Routes whose accepted request changes what the next one can do (a revision, a return, a new person or project). */
const ONCE = new Set(['POST /api/runs/:approved/revisions', 'POST /api/runs/:submitted/return', 'POST /api/people', 'POST /api/projects', 'POST /api/imports/column-maps', 'POST /api/instruments']);

async function send(route: string, actor: string, body: Record<string, unknown>) {
  const [method, path] = route.split(' ');
  const url = path.replace(/:[a-z]+/g, (p) => String(ids[p]));
  const client = clients[actor];
  return method === 'POST' ? client.post(url, body) : method === 'PUT' ? client.put(url, body) : client.patch(url, body);
}

describe('each limit: one character over is a 400 naming the field and the limit', () => {
  it.each(cases.map(([route, actor, build, field, limit]) => ({ route, actor, build, field, limit })))('$route: $field', async ({ route, actor, build, field, limit }) => {
    const before = await rowCounts(h.handle.db);
    const body = build('y'.repeat(limit + 1), await draftVersion());
    const res = await send(route, actor, body);
    expect(res.status).toBe(400);
    const named = (res.body.errors as Array<{ field: string; message: string }>).filter((e) => e.field === field);
    expect(named.length).toBeGreaterThan(0);
    expect(named.some((e) => `${e.message} ${res.body.detail}`.includes(String(limit)))).toBe(true);
    expect(await rowCounts(h.handle.db)).toEqual(before);
  });

  it.each(cases.filter(([route]) => !ONCE.has(route)).map(([route, actor, build, field, limit]) => ({ route, actor, build, field, limit })))('$route: $field at its limit is accepted', async ({ route, actor, build, limit }) => {
    const res = await send(route, actor, build('y'.repeat(limit), await draftVersion()));
    expect([200, 201]).toContain(res.status);
  });
});
