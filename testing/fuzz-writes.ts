import bcrypt from 'bcryptjs';
import { eq, sql } from 'drizzle-orm';
import type { Express } from 'express';
import fc from 'fast-check';
import type { Database } from '../db/client';
import { apparatus, balanceResults, instruments, people, projectMembers, projects, runs } from '../db/schema';
import { demoEmail } from '../db/seed/demo-lab';
import { approvalMeanings, returnMeanings } from '../server/runs/review-dto';
import { standardizationMeanings } from '../server/standardizations/standardization-dto';
import { ApiClient, DEMO_PASSWORD } from './api-harness';
import { loadFixture, runBodies } from './fixture-runs';
import { FUZZ_IMPORT_HEADERS, fuzzImportCommit, fuzzImportMapping, makeFuzzImport } from './fuzz-imports';

/**
 * Who sends a route's payloads: throwaway people made here for the run routes and for signing standardizations
 * (wrong passwords in the payloads must not lock a demo account), the demo quality officer and administrator for the registers.
 */
type Actor = 'fuzzTechnician' | 'fuzzInvestigator' | 'fuzzQuality' | 'quality' | 'admin';

/** Stands for the run's version at the moment of sending, so near-valid payloads get past the version check. */
const CURRENT_VERSION = '<current version>';

export interface FuzzTarget {
  method: 'POST' | 'PUT' | 'PATCH';
  path: string;
  actor: Actor;
  /** A payload the route accepts; near-misses are made from it one change at a time. */
  valid: (ids: FuzzIds) => Record<string, unknown>;
  /** Parameters made anew before each payload, for a route that acts once per record (an import commits once). */
  renew?: (db: Database, ids: FuzzIds) => Promise<FuzzIds>;
}

export type FuzzIds = Record<string, number>;

const FUZZ_PASSWORD = 'fuzz-target-password';
const fixture = loadFixture('isothermal');

/** Every write route; each with an actor that passes its role gate, so payloads reach validation and beyond. */
export const fuzzTargets: FuzzTarget[] = [
  { method: 'POST', path: '/api/balance', actor: 'fuzzTechnician', valid: () => ({ ...fixture }) },
  { method: 'POST', path: '/api/runs', actor: 'fuzzTechnician', valid: (ids) => runBodies(fixture, ids[':project']).create },
  { method: 'PATCH', path: '/api/runs/:draft', actor: 'fuzzTechnician', valid: () => ({ version: CURRENT_VERSION, title: 'Fuzzed title', runDate: '2026-05-03' }) },
  { method: 'PUT', path: '/api/runs/:draft/readings', actor: 'fuzzTechnician', valid: (ids) => ({ version: CURRENT_VERSION, ...runBodies(fixture, ids[':project']).readings }) },
  { method: 'POST', path: '/api/runs/:draft/submit', actor: 'fuzzTechnician', valid: () => ({ version: CURRENT_VERSION }) },
  { method: 'POST', path: '/api/runs/:submitted/approve', actor: 'fuzzInvestigator', valid: () => ({ version: CURRENT_VERSION, password: FUZZ_PASSWORD, meaning: approvalMeanings[0] }) },
  { method: 'POST', path: '/api/runs/:submitted/return', actor: 'fuzzInvestigator', valid: () => ({ version: CURRENT_VERSION, password: FUZZ_PASSWORD, meaning: returnMeanings[0], reason: 'The heater current channel is missing its instrument.' }) },
  { method: 'POST', path: '/api/runs/:approved/revisions', actor: 'fuzzTechnician', valid: () => ({ reason: 'Correct the ambient temperature' }) },
  { method: 'POST', path: '/api/instruments', actor: 'quality', valid: (ids) => ({ tag: `FZ-PT-${ids[':project']}`, name: 'Fuzz pressure transducer', kind: 'pressure', unit: 'kPa', rangeMin: 0, rangeMax: 700, spec: { percentOfReading: 0.1 } }) },
  { method: 'POST', path: '/api/instruments/:instrument/calibrations', actor: 'quality', valid: () => ({ calibratedOn: '2026-01-10', dueOn: '2027-01-10', certificate: 'FZ-CERT-1', expandedUncertainty: 0.2, coverageFactor: 2 }) },
  { method: 'POST', path: '/api/apparatus', actor: 'quality', valid: (ids) => ({ tag: `FZ-NEW-${ids[':project']}`, name: 'Fuzz piston cell', kind: 'piston-cell', bore: 0.05, ratedPressure: 1e6 }) },
  { method: 'PUT', path: '/api/apparatus/:apparatus', actor: 'quality', valid: (ids) => ({ tag: `FZ-CELL-${ids[':apparatus']}`, name: 'Fuzz target apparatus', kind: 'vessel', fixedVolume: 0.001 }) },
  { method: 'POST', path: '/api/apparatus/:apparatus/standardizations', actor: 'fuzzQuality', valid: (ids) => ({ runIds: STANDARDIZATION_RUN_KEYS.map((k) => ids[k]), password: FUZZ_PASSWORD, meaning: standardizationMeanings[0], reason: 'fuzz standardization' }) },
  { method: 'POST', path: '/api/apparatus/:apparatus/changes', actor: 'quality', valid: () => ({ description: 'Stirrer motor replaced', changedOn: '2026-05-02' }) },
  { method: 'POST', path: '/api/people', actor: 'admin', valid: (ids) => ({ email: `new-fuzz-${ids[':project']}@fuzz.test`, name: 'New fuzz person', role: 'assistant', password: 'a long enough password' }) },
  { method: 'PATCH', path: '/api/people/:person', actor: 'admin', valid: () => ({ name: 'Fuzz target renamed', role: 'assistant' }) },
  { method: 'POST', path: '/api/projects', actor: 'admin', valid: (ids) => ({ code: `FZN${ids[':project']}`, name: 'New fuzz project' }) },
  { method: 'PUT', path: '/api/projects/:project/members', actor: 'admin', valid: (ids) => ({ personIds: [ids[':technician'], ids[':investigator']] }) },
  { method: 'POST', path: '/api/imports/column-maps', actor: 'fuzzTechnician', valid: (ids) => ({ name: `Fuzz logger ${ids[':project']}`, headers: FUZZ_IMPORT_HEADERS, mapping: fuzzImportMapping(ids[':instrument']) }) },
  { method: 'POST', path: '/api/imports/:import/check', actor: 'fuzzTechnician', valid: (ids) => ({ mapping: fuzzImportMapping(ids[':instrument']) }) },
  {
    method: 'POST', path: '/api/imports/:import/commit', actor: 'fuzzTechnician', valid: fuzzImportCommit,
    renew: async (db, ids) => ({ ':import': await makeFuzzImport(db, ids[':technician']) }),
  },
];

// Tables whose rows a refused request must leave alone (the audit trail and mail outbox may record refusals).
const counted = ['runs', 'readings', 'people', 'projects', 'project_members', 'instruments', 'calibrations', 'apparatus', 'balance_results', 'signatures', 'uploads', 'imports', 'standardizations', 'apparatus_changes', 'column_maps'];

/** Six standardization runs over three days on the fuzz apparatus (ASTM D240 §8.1), so a valid signing payload is accepted. */
const STANDARDIZATION_RUN_KEYS = [':std1', ':std2', ':std3', ':std4', ':std5', ':std6'];

export async function rowCounts(db: Database): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of counted) {
    const [row] = await db.execute<{ n: number }>(sql.raw(`SELECT count(*)::int AS n FROM ${table}`));
    out[table] = row.n;
  }
  return out;
}

const fieldNames = ['version', 'title', 'process', 'runDate', 'projectId', 'time', 'channels', 'password', 'meaning', 'reason', 'tag', 'name', 'kind', 'unit', 'email', 'role', 'personIds', 'calibratedOn', 'dueOn', 'certificate', 'expandedUncertainty', 'setup', 'format', 'readings', 'gas', 'mapping', 'target', 'newRun', 'headers', 'columns', 'index', 'runId', '__proto__', 'constructor'];

/** Values that break a field: wrong types, edges of numbers, empty, huge and odd text. */
const oddValue = fc.oneof(
  fc.jsonValue(),
  fc.constantFrom('', ' ', 'x'.repeat(5000), '2026-02-30', '1e3', '<script>', 'DROP TABLE runs', -1, 0, -0, 1e308, -1e308, 2 ** 53, 0.1, true, [], {}, null),
  fc.string({ unit: 'grapheme' }),
  fc.double(),
  fc.array(fc.oneof(fc.double(), fc.string(), fc.constant(null)), { maxLength: 5 }),
);

/** Random JSON, and near-misses built from the right field names with wrong types. */
export const payload = fc.oneof(fc.jsonValue(), fc.dictionary(fc.constantFrom(...fieldNames), oddValue));

/** The route's valid payload itself, or with one field changed, dropped or added. */
export function nearValid(template: Record<string, unknown>): fc.Arbitrary<unknown> {
  const keys = Object.keys(template);
  return fc.oneof(
    fc.constant(template),
    fc.tuple(fc.constantFrom(...keys), oddValue).map(([key, value]) => ({ ...template, [key]: value })),
    fc.constantFrom(...keys).map((key) => Object.fromEntries(Object.entries(template).filter(([k]) => k !== key))),
    fc.tuple(fc.oneof(fc.constantFrom(...fieldNames), fc.string()), oddValue).map(([key, value]) => ({ ...template, [key]: value })),
  );
}

/** Payloads for a target: a third random, two thirds near-valid. */
export function payloadsFor(target: FuzzTarget, ids: FuzzIds): fc.Arbitrary<unknown> {
  const near = nearValid(target.valid(ids));
  return fc.oneof({ arbitrary: payload, weight: 1 }, { arbitrary: near, weight: 2 });
}

export interface FuzzFailure {
  route: string;
  status: number;
  body: unknown;
  payload: unknown;
  changed?: Record<string, [number, number]>;
}

/** Puts the run's version of the moment in place of CURRENT_VERSION. */
async function withCurrentVersion(db: Database, url: string, body: unknown): Promise<unknown> {
  if (!body || typeof body !== 'object' || (body as Record<string, unknown>)['version'] !== CURRENT_VERSION) return body;
  const runId = Number(/\/api\/runs\/(\d+)/.exec(url)?.[1]);
  const [run] = await db.select({ version: runs.version }).from(runs).where(eq(runs.id, runId));
  return { ...body, version: run?.version ?? 1 };
}

/** Sends one payload; reports a 5xx, or a refusal that changed rows. */
export async function fuzzOnce(db: Database, client: ApiClient, method: string, url: string, raw: unknown, statuses?: Set<number>): Promise<FuzzFailure | null> {
  const body = await withCurrentVersion(db, url, raw);
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
 * Ids for the fuzzed routes' parameters and the throwaway people who send them. The runs, people,
 * project and apparatus are made here, so that a payload that happens to be valid (and two thirds
 * are built to be nearly so) changes none of the demo records other tests read.
 */
export async function fuzzParams(db: Database): Promise<FuzzIds> {
  const tag = Date.now().toString(36).toUpperCase().slice(-6);
  const passwordHash = await bcrypt.hash(FUZZ_PASSWORD, 4);
  const person = async (name: string, role: 'technician' | 'investigator') =>
    (await db.insert(people).values({ email: `${name}-${tag.toLowerCase()}@fuzz.test`, name: `Fuzz ${name}`, role, passwordHash }).returning())[0].id;
  const technician = await person('technician', 'technician');
  const investigator = await person('investigator', 'investigator');
  const quality = (await db.insert(people).values({ email: `quality-${tag.toLowerCase()}@fuzz.test`, name: 'Fuzz quality', role: 'quality', passwordHash }).returning())[0].id;
  const target = await person('target', 'technician');
  const [project] = await db.insert(projects).values({ code: `FZ${tag}`, name: 'Fuzz target project' }).returning();
  await db.insert(projectMembers).values([{ projectId: project.id, personId: technician }, { projectId: project.id, personId: investigator }]);
  const run = async (state: 'draft' | 'submitted' | 'approved') =>
    (await db.insert(runs).values({
      code: `FZ-${tag}-${state}`, projectId: project.id, authorId: technician, title: `Fuzz ${state} run`, process: 'isothermal', runDate: '2026-05-02', state,
      setup: runBodies(fixture, project.id).create.setup as Record<string, unknown>,
    }).returning())[0].id;
  const [app] = await db.insert(apparatus).values({ tag: `FZ-${tag}`, name: 'Fuzz target apparatus', kind: 'vessel' }).returning();
  const [inst] = await db.select({ id: instruments.id }).from(instruments).limit(1);
  // Invented ε values within 0.1 % of each other, two runs a day: in control and within the default RSD limit.
  const standardizationRuns: FuzzIds = {};
  for (const [i, key] of STANDARDIZATION_RUN_KEYS.entries()) {
    const [std] = await db.insert(runs).values({
      code: `FZ-${tag}-S${i + 1}`, projectId: project.id, authorId: technician, title: `Fuzz standardization ${i + 1}`, process: 'calorimetric',
      runDate: `2026-04-0${1 + Math.floor(i / 2)}`, state: 'submitted', apparatusId: app.id, setup: { gas: { model: 'calorimeter' }, purpose: 'standardization', heatSource: { kind: 'electrical' } },
    }).returning();
    const ee = { value: 4850 + [0.5, -1.2, 2.1, -0.4, 1.0, -1.8][i], u: 3 };
    await db.insert(balanceResults).values({
      runId: std.id, runVersion: std.version, engineVersion: 'fuzz', inputHash: `fuzz-${tag}-${i}`, verdict: 'closes', en: 0.1, residual: 0, expandedUncertainty: 1,
      result: { energyEquivalent: ee, heatLeakFit: { h: { value: 0.08, u: 0.002 } } },
    });
    standardizationRuns[key] = std.id;
  }
  return {
    ...standardizationRuns,
    ':import': await makeFuzzImport(db, technician),
    ':quality': quality,
    ':draft': await run('draft'), ':submitted': await run('submitted'), ':approved': await run('approved'),
    ':instrument': inst.id, ':apparatus': app.id, ':person': target, ':project': project.id,
    ':technician': technician, ':investigator': investigator,
  };
}

/** Signed-in clients for each actor. */
export async function fuzzClients(app: Express, db: Database, ids: FuzzIds): Promise<Record<Actor, ApiClient>> {
  const signIn = async (email: string, password: string) => {
    const client = new ApiClient(app);
    const res = await client.signIn(email, password);
    if (res.status !== 200) throw new Error(`fuzz sign-in as ${email} failed: ${res.status}`);
    return client;
  };
  const emailOf = async (id: number) => (await db.select({ email: people.email }).from(people).where(eq(people.id, id)))[0].email;
  return {
    fuzzTechnician: await signIn(await emailOf(ids[':technician']), FUZZ_PASSWORD),
    fuzzInvestigator: await signIn(await emailOf(ids[':investigator']), FUZZ_PASSWORD),
    fuzzQuality: await signIn(await emailOf(ids[':quality']), FUZZ_PASSWORD),
    quality: await signIn(demoEmail('quality'), DEMO_PASSWORD),
    admin: await signIn(demoEmail('admin'), DEMO_PASSWORD),
  };
}

/** A target's URL with its parameters filled in. */
export const fuzzUrl = (target: FuzzTarget, ids: FuzzIds) => target.path.replace(/:[a-z]+/g, (p) => String(ids[p]));

/** The URL for the next payload: with fresh records first when the target renews them. */
export async function nextFuzzUrl(db: Database, target: FuzzTarget, ids: FuzzIds): Promise<string> {
  return fuzzUrl(target, target.renew ? { ...ids, ...(await target.renew(db, ids)) } : ids);
}

/** A body sent as this exact text (deep nesting, "__proto__" keys: what JSON.stringify of an object cannot write). */
export interface RawBody {
  raw: string;
}
const isRaw = (v: unknown): v is RawBody => typeof v === 'object' && v !== null && typeof (v as RawBody).raw === 'string' && Object.keys(v).length === 1;

/** Paths to every value inside a payload (arrays: their first three items), for changes deep inside it. */
export function pathsOf(value: unknown, prefix: Array<string | number> = [], out: Array<Array<string | number>> = []): Array<Array<string | number>> {
  if (prefix.length > 0) out.push(prefix);
  if (Array.isArray(value)) value.slice(0, 3).forEach((v, i) => pathsOf(v, [...prefix, i], out));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) pathsOf(v, [...prefix, k], out);
  return out;
}

export function setAt(value: unknown, path: Array<string | number>, replacement: unknown): unknown {
  if (path.length === 0) return replacement;
  const copy = (Array.isArray(value) ? [...value] : { ...(value as Record<string, unknown>) }) as Record<string | number, unknown>;
  copy[path[0]] = setAt((value as Record<string | number, unknown>)[path[0]], path.slice(1), replacement);
  return copy;
}

const CONTROL_CHARS = ['\u0000', '\u0001', '\u0007', '\u0008', '\u000b', '\u001b', '\u007f', '\u0085', '\u009b'];
const OVERFLOW_NUMBERS = [1e306, -1e306, 1e308, -1.7976931348623157e308, 2 ** 31, -(2 ** 31) - 1, 2 ** 53 + 2, 5e-324, 1e-320];
/** Text lengths past any field's limit: 64 KiB, 1 MB and 8 MB (the JSON body limit is 20 MB). */
const HUGE_LENGTHS = [65_536, 1_000_000, 8_000_000];
const WRONG_NESTED = [5, -1, 'text', '', true, null, [], [[]], {}, { instruments: 5 }, [1, 'two', null], { unit: 5, values: 'many' }];

/**
 * The hostile families of issue 16, each built from a route's valid payload so that it gets past the
 * role gate and the first checks: a control character in a string anywhere, nesting from 33 to 10 000
 * deep, numbers that overflow once converted to SI or do not fit an id column, wrong types deep inside
 * nested objects (setup, channels), prototype keys written into the JSON text, and huge text in
 * place of any value.
 */
export function hostileFamilies(template: Record<string, unknown>): Record<string, fc.Arbitrary<unknown>> {
  const paths = pathsOf(template);
  const path = fc.constantFrom(...paths);
  const text = JSON.stringify(template);
  return {
    // In a value anywhere, or in a key of an object (the payload itself or one inside it).
    'control character': fc.tuple(path, fc.constantFrom(...CONTROL_CHARS), fc.string({ maxLength: 8 }), fc.boolean())
      .map(([p, c, s, asKey]) => {
        const parentPath = p.slice(0, -1);
        const parent = parentPath.reduce<unknown>((v, k) => (v as Record<string | number, unknown>)[k], template);
        return asKey && parent && typeof parent === 'object' && !Array.isArray(parent)
          ? setAt(template, parentPath, { ...parent, [`k${c}${s}`]: s })
          : setAt(template, p, `${s}${c}${s}`);
      }),
    'deep nesting': fc.tuple(fc.constantFrom(...Object.keys(template)), fc.integer({ min: 33, max: 10_000 }), fc.boolean())
      .map(([key, depth, arrays]): RawBody => {
        const deep = arrays ? `${'['.repeat(depth)}${']'.repeat(depth)}` : `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`;
        // Last in the text, so that it wins over the field's own value (JSON.parse keeps the last of duplicate keys).
        return { raw: text.replace(/\}$/, `,${JSON.stringify(key)}:${deep}}`) };
      }),
    'overflow after SI': fc.tuple(path, fc.constantFrom(...OVERFLOW_NUMBERS)).map(([p, n]) => setAt(template, p, n)),
    'wrong nested type': fc.tuple(path, fc.constantFrom(...WRONG_NESTED)).map(([p, v]) => setAt(template, p, v)),
    'prototype key': fc.tuple(fc.constantFrom('__proto__', 'constructor', 'prototype'), fc.boolean()).map(([key, nested]): RawBody => ({
      raw: nested && /":\{/.test(text) ? text.replace(/":\{/, `":{"${key}":{"polluted":true},`) : text.replace(/^\{/, `{"${key}":{"polluted":true},`),
    })),
    'huge string': fc.tuple(path, fc.constantFrom(...HUGE_LENGTHS), fc.constantFrom('x', 'é', '7')).map(([p, n, c]) => setAt(template, p, c.repeat(n))),
  };
}

/** Sends one payload (an object, or a RawBody as its exact text) and answers its status; the fuzz run's parallel sends use this. */
export async function sendOnce(db: Database, client: ApiClient, method: string, url: string, raw: unknown): Promise<{ status: number; body: unknown; sent: string }> {
  let text: string;
  if (isRaw(raw)) {
    const [run] = /\/api\/runs\/(\d+)/.test(url) ? await db.select({ version: runs.version }).from(runs).where(eq(runs.id, Number(/\/api\/runs\/(\d+)/.exec(url)![1]))) : [];
    text = raw.raw.replace(`"${CURRENT_VERSION}"`, String(run?.version ?? 1));
  } else {
    text = JSON.stringify(await withCurrentVersion(db, url, raw));
  }
  const req = method === 'POST' ? client.agent.post(url) : method === 'PUT' ? client.agent.put(url) : client.agent.patch(url);
  const res = await req.set('X-XSRF-TOKEN', client.xsrfToken).set('Content-Type', 'application/json').send(text);
  return { status: res.status, body: res.body, sent: text.length > 2000 ? `${text.slice(0, 2000)}…` : text };
}
