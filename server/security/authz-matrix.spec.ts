import { eq } from 'drizzle-orm';
import { instruments, runs } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { listRoutes } from '../../testing/route-list';

type Who = 'anonymous' | 'technician' | 'assistant' | 'investigator' | 'quality' | 'admin';
const everyone: Who[] = ['technician', 'assistant', 'investigator', 'quality', 'admin'];
const readers: Who[] = ['technician', 'assistant', 'investigator', 'quality'];
const authors: Who[] = ['technician', 'assistant', 'investigator'];

/**
 * The one table of who passes the role gate of each API route. Routes marked 'public' answer
 * without a session. A route the app has but this table lacks fails the test.
 */
const matrix: Record<string, Who[] | 'public'> = {
  'GET /api/health': 'public',
  'POST /api/auth/sign-in': 'public',
  'POST /api/auth/sign-out': everyone,
  'GET /api/auth/me': everyone,
  'GET /api/home': everyone,
  'POST /api/balance': everyone,
  'GET /api/runs': readers,
  'POST /api/runs': authors,
  'GET /api/runs/:id': readers,
  'PATCH /api/runs/:id': authors,
  'PUT /api/runs/:id/readings': authors,
  'POST /api/runs/:id/submit': authors,
  'GET /api/runs/:id/balance': readers,
  'GET /api/runs/:id/history': readers,
  'GET /api/runs/:id/checklist': readers,
  'GET /api/runs/:id/document': readers,
  'POST /api/runs/:id/revisions': authors,
  'POST /api/runs/:id/:action': ['investigator'],
  'GET /api/instruments': everyone,
  'GET /api/instruments/:id': everyone,
  'POST /api/instruments': ['quality'],
  'POST /api/instruments/:id/calibrations': ['quality'],
  'GET /api/audit': ['quality', 'investigator'],
  'GET /api/audit/verify': ['quality', 'investigator'],
  'GET /api/audit/export': ['quality', 'investigator'],
  'GET /api/audit/actors': ['quality', 'investigator'],
  'GET /api/runs/:id/report.pdf': readers,
  'GET /api/imports/column-maps': authors,
  'POST /api/imports/column-maps': authors,
  'POST /api/imports': authors,
  'GET /api/imports/:id': authors,
  'POST /api/imports/:id/check': authors,
  'POST /api/imports/:id/commit': authors,
  'GET /api/people': ['admin'],
  'POST /api/people': ['admin'],
  'PATCH /api/people/:id': ['admin'],
  'GET /api/projects': everyone,
  'POST /api/projects': ['admin'],
  'PUT /api/projects/:id/members': ['admin'],
  'GET /api/gases': everyone,
  'GET /api/apparatus': everyone,
  'POST /api/apparatus': ['quality'],
  'PUT /api/apparatus/:id': ['quality'],
  'GET /api/apparatus-due': everyone,
  'GET /api/apparatus/:id/standardizations': everyone,
  'POST /api/apparatus/:id/standardizations': ['quality'],
  'POST /api/apparatus/:id/changes': ['quality'],
};

let h: ApiHarness;
const clients = new Map<Who, ApiClient>();
let params: Record<string, string>;

beforeAll(async () => {
  h = await startHarness();
  for (const who of ['anonymous', ...everyone] as Who[]) clients.set(who, await clientAs(h.app, who === 'anonymous' ? null : who));
  const [run] = await h.handle.db.select({ id: runs.id }).from(runs).where(eq(runs.state, 'submitted')).orderBy(runs.id).limit(1);
  const [inst] = await h.handle.db.select({ id: instruments.id }).from(instruments).limit(1);
  params = { ':id': String(run.id), ':action': 'approve', ':instrument': String(inst.id) };
});
afterAll(() => h.close());

const apiRoutes = () => listRoutes(h.app).filter((r) => r.path.startsWith('/api'));

function send(client: ApiClient, method: string, path: string) {
  const url = path.replace(/:[a-z]+/g, (p) => params[p] ?? '1');
  // An empty body: a route that passes the role gate then answers 400, 404 or 409, never 401/403 from the gate.
  switch (method) {
    case 'GET': return client.get(url);
    case 'POST': return client.post(url, {});
    case 'PUT': return client.put(url, {});
    case 'PATCH': return client.patch(url, {});
    default: return client.delete(url);
  }
}

describe('authorisation matrix', () => {
  it('has an entry for every API route the app answers, and no stale entries', () => {
    const found = apiRoutes().map((r) => `${r.method} ${r.path}`);
    expect(found.filter((k) => !(k in matrix))).toEqual([]);
    expect(Object.keys(matrix).filter((k) => !found.includes(k))).toEqual([]);
  });

  it('lets through exactly the roles in the table, for every route (sign-out last)', async () => {
    const routes = apiRoutes().sort((a, b) => Number(a.path.endsWith('sign-out')) - Number(b.path.endsWith('sign-out')));
    const wrong: string[] = [];
    for (const route of routes) {
      const key = `${route.method} ${route.path}`;
      const allowed = matrix[key];
      if (allowed === undefined) {
        wrong.push(`${key}: no entry in the matrix`);
        continue;
      }
      for (const who of ['anonymous', ...everyone] as Who[]) {
        const res = await send(clients.get(who)!, route.method, route.path);
        const gate = res.status === 401 || (res.status === 403 && /you are signed in as/.test(res.body?.detail ?? ''));
        const expectPass = allowed === 'public' || (who !== 'anonymous' && allowed.includes(who));
        if (expectPass === gate) wrong.push(`${key} as ${who}: ${res.status} ${res.body?.detail ?? ''}`);
        if (!expectPass && who === 'anonymous' && res.status !== 401) wrong.push(`${key} as anonymous: expected 401, got ${res.status}`);
        if (res.status >= 500) wrong.push(`${key} as ${who}: server error ${res.status}`);
      }
    }
    expect(wrong).toEqual([]);
  });
});
