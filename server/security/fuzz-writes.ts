import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import fc from 'fast-check';
import type { Database } from '../../db/client';
import { apparatus, instruments, people, projectMembers, projects, runs, type Role } from '../../db/schema';
import type { ApiClient } from '../testing/api-harness';

/** Write routes to fuzz, each with a role that passes its gate (so the payload reaches validation). */
export const fuzzTargets: { method: 'POST' | 'PUT' | 'PATCH'; path: string; role: Role }[] = [
  { method: 'POST', path: '/api/balance', role: 'technician' },
  { method: 'POST', path: '/api/runs', role: 'technician' },
  { method: 'PATCH', path: '/api/runs/:draft', role: 'technician' },
  { method: 'PUT', path: '/api/runs/:draft/readings', role: 'technician' },
  { method: 'POST', path: '/api/runs/:draft/submit', role: 'technician' },
  { method: 'POST', path: '/api/runs/:submitted/approve', role: 'investigator' },
  { method: 'POST', path: '/api/runs/:submitted/return', role: 'investigator' },
  { method: 'POST', path: '/api/runs/:approved/revisions', role: 'technician' },
  { method: 'POST', path: '/api/instruments', role: 'quality' },
  { method: 'POST', path: '/api/instruments/:instrument/calibrations', role: 'quality' },
  { method: 'POST', path: '/api/apparatus', role: 'quality' },
  { method: 'PUT', path: '/api/apparatus/:apparatus', role: 'quality' },
  { method: 'POST', path: '/api/people', role: 'admin' },
  { method: 'PATCH', path: '/api/people/:person', role: 'admin' },
  { method: 'POST', path: '/api/projects', role: 'admin' },
  { method: 'PUT', path: '/api/projects/:project/members', role: 'admin' },
];

// Tables whose rows a refused request must leave alone (the audit trail and mail outbox may record refusals).
const counted = ['runs', 'readings', 'people', 'projects', 'project_members', 'instruments', 'calibrations', 'apparatus', 'balance_results', 'signatures', 'uploads', 'imports'];

export async function rowCounts(db: Database): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of counted) {
    const [row] = await db.execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`));
    out[table] = row.n;
  }
  return out;
}

/** Payloads: random JSON, and near-misses built from the right field names with wrong types. */
export const payload = fc.oneof(
  fc.jsonValue(),
  fc.dictionary(
    fc.constantFrom('version', 'title', 'process', 'runDate', 'projectId', 'time', 'channels', 'password', 'meaning', 'reason', 'tag', 'name', 'kind', 'unit', 'email', 'role', 'personIds', 'calibratedOn', 'dueOn', 'certificate', 'expandedUncertainty', 'setup', 'format', 'readings', 'gas', '__proto__', 'constructor'),
    fc.oneof(fc.jsonValue(), fc.string(), fc.integer(), fc.double(), fc.constant(null), fc.array(fc.oneof(fc.double(), fc.string(), fc.constant(null)), { maxLength: 5 })),
  ),
);

export interface FuzzFailure {
  route: string;
  status: number;
  body: unknown;
  payload: unknown;
  changed?: Record<string, [number, number]>;
}

/** Sends one payload; reports a 5xx, or a refusal that changed rows. */
export async function fuzzOnce(db: Database, client: ApiClient, method: string, url: string, body: unknown, statuses?: Set<number>): Promise<FuzzFailure | null> {
  const before = await rowCounts(db);
  const req = method === 'POST' ? client.agent.post(url) : method === 'PUT' ? client.agent.put(url) : client.agent.patch(url);
  const res = await req.set('X-XSRF-TOKEN', client.xsrfToken).set('Content-Type', 'application/json').send(JSON.stringify(body));
  statuses?.add(res.status);
  if (res.status >= 500) return { route: `${method} ${url}`, status: res.status, body: res.body, payload: body };
  if (res.status >= 400) {
    const after = await rowCounts(db);
    const changed = Object.fromEntries(Object.keys(before).filter((k) => before[k] !== after[k]).map((k) => [k, [before[k], after[k]] as [number, number]]));
    if (Object.keys(changed).length) return { route: `${method} ${url}`, status: res.status, body: res.body, payload: body, changed };
  }
  return null;
}

/**
 * Ids for the fuzzed routes' parameters. The people, project and apparatus are throwaway ones made
 * here, so that a random payload that happens to be valid cannot lock out or re-role the demo people
 * other tests sign in as.
 */
export async function fuzzParams(db: Database): Promise<Record<string, number>> {
  const tag = Date.now().toString(36).toUpperCase();
  const first = async (state: 'draft' | 'submitted' | 'approved') => (await db.select({ id: runs.id }).from(runs).where(eq(runs.state, state)).limit(1))[0].id;
  const [person] = await db.insert(people).values({ email: `fuzz-${tag.toLowerCase()}@fuzz.test`, name: 'Fuzz target', role: 'technician', passwordHash: await bcrypt.hash('fuzz-target-password', 4) }).returning();
  const [project] = await db.insert(projects).values({ code: `FZ${tag.slice(-6)}`, name: 'Fuzz target project' }).returning();
  await db.insert(projectMembers).values({ projectId: project.id, personId: person.id });
  const [app] = await db.insert(apparatus).values({ tag: `FZ-${tag.slice(-6)}`, name: 'Fuzz target apparatus', kind: 'vessel' }).returning();
  const [inst] = await db.select({ id: instruments.id }).from(instruments).limit(1);
  return {
    ':draft': await first('draft'), ':submitted': await first('submitted'), ':approved': await first('approved'),
    ':instrument': inst.id, ':apparatus': app.id, ':person': person.id, ':project': project.id,
  };
}
