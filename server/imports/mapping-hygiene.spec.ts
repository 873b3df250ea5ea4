import { count, eq } from 'drizzle-orm';
import { columnMaps, instruments, projects } from '../../db/schema';
import { ApiClient, startHarness, type ApiHarness } from '../../testing/api-harness';
import { FUZZ_IMPORT_HEADERS, fuzzImportCsv, fuzzImportMapping } from '../../testing/fuzz-imports';
import { importCounts, uploadFile } from '../../testing/import-spec-support';
import { makeThrowawayPerson } from '../../testing/throwaway-people';

// Hostile and huge input to the import's JSON routes (issue 16): a mapping is kept (in the import's
// record and in saved maps that every importer's page lists), so nothing may ride along in it, and a
// refusal names the field without echoing megabytes back.

let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
let instrumentId: number;
let importId: number;

beforeAll(async () => {
  h = await startHarness();
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  [{ id: instrumentId }] = await h.handle.db.select({ id: instruments.id }).from(instruments).limit(1);
  const person = await makeThrowawayPerson(h.handle.db, 'mapping-hygiene', 'technician', [projectId]);
  tech = new ApiClient(h.app);
  expect((await tech.signIn(person.email, person.password)).status).toBe(200);
  const up = await uploadFile(tech, 'hygiene-logger.csv', fuzzImportCsv());
  expect(up.status).toBe(201);
  importId = up.body.importId;
});
afterAll(() => h.close());

const MB = 'x'.repeat(1_000_000);
const mapping = () => fuzzImportMapping(instrumentId);
const mapCount = async () => (await h.handle.db.select({ n: count() }).from(columnMaps))[0].n;
const fields = (res: { body: { errors?: Array<{ field: string }> } }) => (res.body.errors ?? []).map((e) => e.field);

describe('saved column maps keep only what a map is', () => {
  it.each([
    ['an unknown key beside time and columns', { ...mapping(), notes: MB }, 'mapping'],
    ['an unknown key in time', { ...mapping(), time: { index: 0, unit: 's', label: MB } }, 'mapping.time'],
  ])('refuses %s (400 naming it, nothing stored, a short answer)', async (_what, sent, field) => {
    const before = await mapCount();
    const res = await tech.post('/api/imports/column-maps', { name: 'Hygiene logger', headers: FUZZ_IMPORT_HEADERS, mapping: sent });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual([field]);
    expect(res.text.length).toBeLessThan(2000);
    expect(await mapCount()).toBe(before);
  });

  it('refuses a header longer than 500 characters', async () => {
    const before = await mapCount();
    const res = await tech.post('/api/imports/column-maps', { name: 'Hygiene logger', headers: [...FUZZ_IMPORT_HEADERS.slice(1), MB], mapping: mapping() });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ field: 'headers', message: expect.stringContaining('at most 500 characters') })]);
    expect(await mapCount()).toBe(before);
  });
});

describe('checking a mapping', () => {
  it('refuses a field other than mapping', async () => {
    const res = await tech.post(`/api/imports/${importId}/check`, { mapping: mapping(), dryRun: true });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['dryRun']);
  });

  it('refuses 100 000 columns with one short problem, not one per column', async () => {
    const columns = Array.from({ length: 100_000 }, (_, k) => ({ index: k + 1, channel: `channel ${k}`, unit: 'kPa' }));
    const res = await tech.post(`/api/imports/${importId}/check`, { mapping: { time: { index: 0, unit: 's' }, columns } });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['mapping.columns']);
    expect(res.text.length).toBeLessThan(2000);
  });

  it('quotes at most 40 characters of a megabyte channel or unit name', async () => {
    for (const column of [{ index: 1, channel: MB, unit: 'kPa' }, { index: 1, channel: 'pressure', unit: MB }]) {
      const res = await tech.post(`/api/imports/${importId}/check`, { mapping: { time: { index: 0, unit: 's' }, columns: [column] } });
      expect(res.status).toBe(400);
      expect(fields(res)).toEqual([column.channel === MB ? 'mapping.columns[0].channel' : 'mapping.columns[0].unit']);
      expect(res.text.length).toBeLessThan(2000);
    }
  });
});

describe('committing with ids past an id column', () => {
  // 2³¹ does not fit PostgreSQL's integer: it names no record, and the answer says which field.
  it.each([
    ['an instrument', () => ({ mapping: { ...mapping(), columns: [{ index: 1, channel: 'pressure', unit: 'kPa', reference: 'absolute', instrumentId: 2 ** 31 }] }, target: { newRun: { projectId, title: 'Too large an id', process: 'isothermal', runDate: '2026-05-07' } } }), 'mapping.columns[0].instrumentId'],
    ['a draft', () => ({ mapping: mapping(), target: { runId: 2 ** 31, version: 1 } }), 'target'],
  ])('refuses %s id of 2^31 (400 naming the field, nothing stored)', async (_what, body, field) => {
    const before = await importCounts(h.handle.db);
    const res = await tech.post(`/api/imports/${importId}/commit`, body());
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual([field]);
    expect(await importCounts(h.handle.db)).toEqual(before);
  });
});
