import { and, count, eq, sql } from 'drizzle-orm';
import { auditEvents, columnMaps, imports, instruments, projects, readings, runs, uploads } from '../../db/schema';
import { ApiClient, startHarness, type ApiHarness } from '../../testing/api-harness';
import { FUZZ_IMPORT_HEADERS, fuzzImportCsv, fuzzImportMapping } from '../../testing/fuzz-imports';
import { importCounts, uploadFile } from '../../testing/import-spec-support';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

// Identical requests sent at once (a double click, a client that retries): issue 16 asks that none
// answers 5xx and that each write happens once. A throwaway technician sends them, so no demo account is touched.

const AT_ONCE = 8;
/** Time points in fixtures/runs/isothermal.json, the file fuzzImportCsv writes as a logger export. */
const ROWS = 201;

let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
let instrumentId: number;

beforeAll(async () => {
  h = await startHarness();
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  [{ id: instrumentId }] = await h.handle.db.select({ id: instruments.id }).from(instruments).limit(1);
  const person = await makeThrowawayPerson(h.handle.db, 'import-parallel', 'technician', [projectId]);
  tech = new ApiClient(h.app);
  expect((await tech.signIn(person.email, person.password)).status).toBe(200);
});
afterAll(() => h.close());

const upload = async () => {
  const res = await uploadFile(tech, 'parallel-logger.csv', fuzzImportCsv());
  expect(res.status).toBe(201);
  return res.body.importId as number;
};
const atOnce = <T>(send: () => Promise<T>) => Promise.all(Array.from({ length: AT_ONCE }, send));
const auditCount = async (action: string, entityId: number) =>
  (await h.handle.db.select({ n: count() }).from(auditEvents).where(and(eq(auditEvents.action, action), eq(auditEvents.entityId, String(entityId)))))[0].n;
const readingsOf = async (runId: number) => (await h.handle.db.select({ n: count() }).from(readings).where(eq(readings.runId, runId)))[0].n;

describe('the same import request sent 8 times at once', () => {
  it('commit into a new draft: one run with one set of readings; the other seven answer 409 naming that run', async () => {
    const importId = await upload();
    const before = await importCounts(h.handle.db);
    const body = { mapping: fuzzImportMapping(instrumentId), target: { newRun: { projectId, title: 'Parallel commit of one logger file', process: 'isothermal', runDate: '2026-05-05' } } };
    const answers = await atOnce(() => tech.post(`/api/imports/${importId}/commit`, body));
    expect(answers.map((a) => a.status).sort()).toEqual([201, ...Array(AT_ONCE - 1).fill(409)]);
    const runId = answers.find((a) => a.status === 201)!.body.runId as number;
    for (const refused of answers.filter((a) => a.status === 409)) {
      expect(refused.body.detail).toBe(`Import ${importId} ("parallel-logger.csv") was committed already into run ${runId}; upload the file again to import it once more.`);
    }
    expect(await importCounts(h.handle.db)).toEqual({ ...before, runs: before.runs + 1, readings: before.readings + ROWS });
    expect(await readingsOf(runId)).toBe(ROWS);
    const [imp] = await h.handle.db.select().from(imports).where(eq(imports.id, importId));
    expect([imp.status, imp.runId]).toEqual(['committed', runId]);
    expect(await auditCount('import.commit', importId)).toBe(1);
    expect(await auditCount('run.create', runId)).toBe(1);
  });

  it('commit of eight uploads into one draft at the same version: one replaces the readings, seven answer 409 and stay uncommitted', async () => {
    const importIds = await Promise.all(Array.from({ length: AT_ONCE }, upload));
    const draft = await tech.post('/api/runs', { projectId, title: 'Draft that eight logger files race for', process: 'isothermal', runDate: '2026-05-06' });
    expect(draft.status).toBe(201);
    const answers = await Promise.all(importIds.map((id) =>
      tech.post(`/api/imports/${id}/commit`, { mapping: fuzzImportMapping(instrumentId), target: { runId: draft.body.id, version: draft.body.version } })));
    expect(answers.map((a) => a.status).sort()).toEqual([201, ...Array(AT_ONCE - 1).fill(409)]);
    for (const refused of answers.filter((a) => a.status === 409)) expect(refused.body.detail).toMatch(/was changed by someone else since you opened it/);
    expect(await readingsOf(draft.body.id)).toBe(ROWS);
    const [run] = await h.handle.db.select({ version: runs.version }).from(runs).where(eq(runs.id, draft.body.id));
    expect(run.version).toBe(draft.body.version + 1);
    const rows = await h.handle.db.select({ status: imports.status, uploadRun: uploads.runId }).from(imports).innerJoin(uploads, eq(uploads.id, imports.uploadId))
      .where(sql`${imports.id} IN ${importIds}`);
    expect(rows.map((r) => `${r.status} ${r.uploadRun}`).sort()).toEqual([`committed ${draft.body.id}`, ...Array(AT_ONCE - 1).fill('previewed null')]);
    expect(await auditCount('run.readings-replace', draft.body.id)).toBe(1);
  });

  it('check: eight identical answers, nothing stored', async () => {
    const importId = await upload();
    const before = await importCounts(h.handle.db);
    const answers = await atOnce(() => tech.post(`/api/imports/${importId}/check`, { mapping: fuzzImportMapping(instrumentId) }));
    expect(answers.map((a) => a.status)).toEqual(Array(AT_ONCE).fill(200));
    expect(answers.every((a) => JSON.stringify(a.body) === JSON.stringify(answers[0].body))).toBe(true);
    expect(answers[0].body).toMatchObject({ errorCount: 0, summary: { rows: ROWS } });
    expect(await importCounts(h.handle.db)).toEqual(before);
  });

  it('column map: each 201 is one stored map with its one audit event', async () => {
    const name = `Parallel logger ${Date.now()}`;
    const answers = await atOnce(() => tech.post('/api/imports/column-maps', { name, headers: FUZZ_IMPORT_HEADERS, mapping: fuzzImportMapping(instrumentId) }));
    expect(answers.map((a) => a.status)).toEqual(Array(AT_ONCE).fill(201));
    const stored = await h.handle.db.select({ id: columnMaps.id }).from(columnMaps).where(eq(columnMaps.name, name));
    expect(stored.map((m) => m.id).sort()).toEqual(answers.map((a) => a.body.id).sort());
    for (const m of stored) expect(await auditCount('column-map.create', m.id)).toBe(1);
  });
});
