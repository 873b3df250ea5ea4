import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { auditEvents, imports, projects, uploads } from '../../db/schema';
import { toSi, type UnitKind } from '../engine/units';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { csv, importCounts, uploadFile } from '../../testing/import-spec-support';
import { xlsxBuffer } from '../../testing/import-test-files';

let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

type Channel = { unit: string; values: number[]; reference?: string };
const fixture = JSON.parse(readFileSync(join(__dirname, '../../fixtures/runs/isothermal.json'), 'utf8')) as { readings: Record<string, Channel> };
const r = fixture.readings;
const HEADERS: Array<[string, string]> = [
  ['time', 'Time (s)'], ['pressure', 'P (kPa)'], ['displacement', 'Piston position [mm]'], ['temperature', 'T/°C'], ['voltage', 'U/V'], ['current', 'Heater current (mA)'],
];
const KIND: Record<string, UnitKind> = { pressure: 'pressure', displacement: 'length', temperature: 'temperature', voltage: 'voltage', current: 'current' };

/** The isothermal fixture's readings as a logger workbook: a title row, a blank row, the header, the data. */
async function isothermalWorkbook(): Promise<Buffer> {
  const n = r['time'].values.length;
  const data = Array.from({ length: n }, (_, i) => HEADERS.map(([k]) => r[k].values[i]));
  return xlsxBuffer([{ name: 'Logger', rows: [['Harrowgate piston cell PC-3, logger export'], [], HEADERS.map(([, t]) => t), ...data], merges: ['A1:D1'] }]);
}

const newRun = (title: string) => ({ newRun: { projectId, title, process: 'isothermal', runDate: '2026-03-14' } });

describe('import of a logger workbook into a new draft', () => {
  let importId: number;
  let runId: number;
  let firstUploadId: number;
  let workbook: Buffer;

  it('previews: finds the header below a merged title, guesses every column, summarises, has no errors', async () => {
    workbook = await isothermalWorkbook();
    const res = await uploadFile(tech, 'pc3-isothermal.xlsx', workbook);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ filename: 'pc3-isothermal.xlsx', sheet: 'Logger', headerRow: 3, errors: [], errorCount: 0 });
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.duplicateOf).toBeUndefined();
    expect(res.body.columns.map((c: { guess: { channel: string; unit: string } }) => [c.guess.channel, c.guess.unit])).toEqual([
      ['time', 's'], ['pressure', 'kPa'], ['displacement', 'mm'], ['temperature', 'degC'], ['voltage', 'V'], ['current', 'mA'],
    ]);
    expect(res.body.rows).toHaveLength(20);
    expect(res.body.rows[0]).toEqual({ row: 4, cells: HEADERS.map(([k]) => r[k].values[0]) });
    expect(res.body.summary.rows).toBe(r['time'].values.length);
    expect(res.body.summary.timeSpan).toMatchObject({ from: r['time'].values[0], to: r['time'].values.at(-1), unit: 's' });
    expect(res.body.summary.perChannel.pressure).toEqual({ min: Math.min(...r['pressure'].values), max: Math.max(...r['pressure'].values), unit: 'kPa' });
    importId = res.body.importId;
    const [upload] = await h.handle.db.select().from(uploads).innerJoin(imports, eq(imports.uploadId, uploads.id)).where(eq(imports.id, importId));
    firstUploadId = upload.uploads.id;
    expect(upload.uploads.sha256).toBe(res.body.sha256);
    expect(upload.uploads.size).toBe(upload.uploads.content.length);
  });

  it('commits all-or-nothing into a new draft whose readings match the fixture in SI within 1e-9', async () => {
    const preview = await tech.get(`/api/imports/${importId}`);
    const mapping = preview.body.mapping;
    mapping.columns = mapping.columns.map((c: { channel: string }) => (c.channel === 'pressure' ? { ...c, reference: 'absolute' } : c));
    const res = await tech.post(`/api/imports/${importId}/commit`, { mapping, target: newRun('Isothermal expansion imported from PC-3') });
    expect(res.status).toBe(201);
    expect(res.body.readings).toBe(r['time'].values.length);
    runId = res.body.runId;
    const run = await tech.get(`/api/runs/${runId}`);
    expect(run.body).toMatchObject({ state: 'draft', title: 'Isothermal expansion imported from PC-3' });
    // The workbook's General cells carry their own digits: 99.53 kPa has two decimals, the most any pressure reading has.
    expect(run.body.setup.channels.pressure).toEqual({ unit: 'kPa', reference: 'absolute', decimals: 2 });
    for (const [k] of HEADERS) {
      const expected = k === 'time' ? r[k].values : r[k].values.map((v) => toSi(KIND[k], r[k].unit, v));
      const got = run.body.readings[k] as number[];
      expect(got).toHaveLength(expected.length);
      const worst = Math.max(...got.map((g, i) => Math.abs(g - expected[i]) / Math.max(Math.abs(expected[i]), 1e-300)));
      expect([k, worst <= 1e-9]).toEqual([k, true]);
    }
    const [link] = await h.handle.db.select().from(uploads).where(eq(uploads.id, firstUploadId));
    expect(link.runId).toBe(runId);
    const [commitEvent] = await h.handle.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'import.commit'), eq(auditEvents.entityId, String(importId))));
    expect(commitEvent.after).toMatchObject({ sha256: link.sha256, runId, readings: r['time'].values.length });
    const [created] = await h.handle.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'run.create'), eq(auditEvents.entityId, String(runId))));
    expect(created.after).toMatchObject({ importId, readings: r['time'].values.length });
  });

  it('answers 409 when the same import is committed twice, and stores nothing more', async () => {
    const preview = await tech.get(`/api/imports/${importId}`);
    expect(preview.body).toMatchObject({ status: 'committed', runId });
    const before = await importCounts(h.handle.db);
    const res = await tech.post(`/api/imports/${importId}/commit`, { mapping: preview.body.mapping, target: newRun('Second try of the same import') });
    expect(res.status).toBe(409);
    expect(res.body.detail).toMatch(/was committed already into run \d+/);
    expect(await importCounts(h.handle.db)).toEqual(before);
  });

  it('recognises the identical file uploaded again, naming the first upload and its run', async () => {
    const res = await uploadFile(tech, 'copy-of-pc3.xlsx', workbook);
    expect(res.status).toBe(201);
    expect(res.body.duplicateOf).toMatchObject({ uploadId: firstUploadId, runId });
    expect(res.body.notes.join(' ')).toMatch(/this exact file \(same SHA-256\) was uploaded before/);
  });
});

describe('row errors, re-mapping and replacing a draft\'s readings', () => {
  const messy = csv([
    'Timestamp,Pressure [bar],Temp (degF),Notes',
    '2026-03-14T10:00:00Z,1.013,77.0,start',
    '2026-03-14T10:00:10Z,1.020,warm,',
    '2026-03-14T10:00:10Z,1.031,78.2,',
    '2026-03-14T10:00:05Z,1.040,78.9,',
    '2026-03-14T10:00:30Z,1.052,79.5,end',
  ]);

  it('lists every bad cell by row and column in the preview, and refuses the commit with the same list', async () => {
    const res = await uploadFile(tech, 'messy.csv', messy);
    expect(res.status).toBe(201);
    expect(res.body.columns[0].guess).toEqual({ channel: 'time', unit: 'iso' });
    expect(res.body.columns[3].guess.channel).toBeNull();
    expect(res.body.errors).toEqual([
      { row: 4, column: 'Timestamp', index: 0, message: 'duplicate timestamp: the same time as row 3' },
      { row: 5, column: 'Timestamp', index: 0, message: 'time goes backwards: earlier than row 4' },
      { row: 3, column: 'Temp (degF)', index: 2, message: 'text "warm" in a numeric column (temperature, °F)' },
    ]);
    const before = await importCounts(h.handle.db);
    const commit = await tech.post(`/api/imports/${res.body.importId}/commit`, { mapping: res.body.mapping, target: newRun('Messy logger file') });
    expect(commit.status).toBe(400);
    expect(commit.body.detail).toMatch(/3 problem\(s\) in the rows of "messy\.csv"; nothing was imported/);
    expect(commit.body.rowErrors).toHaveLength(3);
    expect(commit.body.errors[0]).toEqual({ field: 'row 4, column "Timestamp"', message: 'duplicate timestamp: the same time as row 3' });
    expect(await importCounts(h.handle.db)).toEqual(before);
  });

  it('checks a person\'s own mapping without storing anything, and refuses an impossible one (400)', async () => {
    const up = await uploadFile(tech, 'simple.csv', csv(['t/min,P (kPa),Column,T/°C', '0,100,5,20', '1,101,6,21', '2,102,7,22']));
    const id = up.body.importId;
    const check = await tech.post(`/api/imports/${id}/check`, { mapping: { time: { index: 0, unit: 'min' }, columns: [{ index: 1, channel: 'pressure', unit: 'bar' }, { index: 2, channel: 'volume', unit: 'L' }] } });
    expect(check.status).toBe(200);
    expect(check.body.summary.perChannel).toEqual({ pressure: { min: 100, max: 102, unit: 'bar' }, volume: { min: 5, max: 7, unit: 'L' } });
    expect(check.body.summary.timeSpan.seconds).toBe(120);
    const bad = await tech.post(`/api/imports/${id}/check`, { mapping: { time: { index: 0, unit: 'min' }, columns: [{ index: 1, channel: 'pressure', unit: 'degC' }, { index: 9, channel: 'pressure', unit: 'kPa' }] } });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field)).toEqual(['mapping.columns[0].unit', 'mapping.columns[1].index', 'mapping.columns[1].channel']);
  });

  it('replaces the readings of one\'s own draft (version checked: 409 on a stale one) and refuses someone else\'s draft (403)', async () => {
    const up = await uploadFile(tech, 'replace.csv', csv(['Time (s),P (kPa),T/°C', '0,100,20', '5,101,21']));
    const mapping = up.body.mapping;
    const own = await tech.post('/api/runs', { projectId, title: 'Draft to receive a logger file', process: 'isobaric', runDate: '2026-04-01' });
    const stale = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping, target: { runId: own.body.id, version: own.body.version + 3 } });
    expect(stale.status).toBe(409);
    const ok = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping, target: { runId: own.body.id, version: own.body.version } });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ runId: own.body.id, readings: 2, version: own.body.version + 1 });
    const run = await tech.get(`/api/runs/${own.body.id}`);
    expect(run.body.readings.pressure).toEqual([100_000, 101_000]);

    const assistant = await clientAs(h.app, 'assistant');
    const theirs = await assistant.post('/api/runs', { projectId, title: 'The assistant\'s own draft', process: 'isobaric', runDate: '2026-04-02' });
    const again = await uploadFile(tech, 'replace-2.csv', csv(['Time (s),P (kPa)', '0,100', '5,101']));
    const before = await importCounts(h.handle.db);
    const res = await tech.post(`/api/imports/${again.body.importId}/commit`, { mapping: again.body.mapping, target: { runId: theirs.body.id, version: theirs.body.version } });
    expect(res.status).toBe(403);
    expect(await importCounts(h.handle.db)).toEqual(before);
    // Nor may the assistant commit the technician's import.
    const foreign = await assistant.post(`/api/imports/${again.body.importId}/commit`, { mapping: again.body.mapping, target: newRun('Not my import') });
    expect(foreign.status).toBe(403);
    expect(foreign.body.detail).toMatch(/uploaded by someone else/);
  });

  it('uses cached formula results and says so; reads date cells as ISO date-times', async () => {
    const file = await xlsxBuffer([{ rows: [
      ['Timestamp', 'P (kPa)'],
      [new Date('2026-03-14T09:00:00Z'), 100],
      [new Date('2026-03-14T09:00:10Z'), { formula: 'B2*1.01', result: 101 }],
    ] }]);
    const res = await uploadFile(tech, 'formulas.xlsx', file);
    expect(res.status).toBe(201);
    expect(res.body.notes).toContain('formulas: cached values used (1 cell); the file\'s stored results were read, not recalculated');
    expect(res.body.rows.map((x: { cells: unknown[] }) => x.cells)).toEqual([['2026-03-14T09:00:00.000Z', 100], ['2026-03-14T09:00:10.000Z', 101]]);
    expect(res.body.summary.timeSpan.seconds).toBe(10);
  });

  it('reads the sheet the person names, and says which other sheets the workbook has', async () => {
    const file = await xlsxBuffer([
      { name: 'Notes', rows: [['Bench notes'], ['nothing to import here']] },
      { name: 'Run 2', rows: [['t/min', 'Pressure [bar]'], [0, 1.01], [1, 1.02]] },
    ]);
    const first = await uploadFile(tech, 'two-sheets.xlsx', file);
    expect(first.status).toBe(422);
    expect(first.body.detail).toMatch(/No header row found in "two-sheets\.xlsx" \(sheet "Notes"\)/);
    const chosen = await uploadFile(tech, 'two-sheets.xlsx', file, { sheet: 'Run 2' });
    expect(chosen.status).toBe(201);
    expect(chosen.body.sheet).toBe('Run 2');
    expect(chosen.body.notes).toContain('sheet "Run 2" was read; the workbook also has "Notes" (upload again with "sheet" to read another)');
    expect(chosen.body.mapping).toEqual({ time: { index: 0, unit: 'min' }, columns: [{ index: 1, channel: 'pressure', unit: 'bar' }] });
    const missing = await uploadFile(tech, 'two-sheets.xlsx', file, { sheet: 'Run 9' });
    expect(missing.body.detail).toBe('"two-sheets.xlsx" has no sheet "Run 9"; its sheets are "Notes", "Run 2".');
  });
});

describe('saved column maps', () => {
  it('saves a map, lists it for everyone, and suggests it when a file with the same headers comes', async () => {
    const headers = ['Zeit', 'Kanal 1', 'Kanal 2'];
    const mapping = { time: { index: 0, unit: 's' }, columns: [{ index: 1, channel: 'pressure', unit: 'mbar', reference: 'gauge' }, { index: 2, channel: 'temperature', unit: 'degC' }] };
    const saved = await tech.post('/api/imports/column-maps', { name: 'Bench logger BL-4', headers, mapping });
    expect(saved.status).toBe(201);
    const list = await (await clientAs(h.app, 'assistant')).get('/api/imports/column-maps');
    expect(list.body.items).toEqual(expect.arrayContaining([expect.objectContaining({ id: saved.body.id, name: 'Bench logger BL-4', own: false, ownerName: 'Lena Okonkwo' })]));
    const up = await uploadFile(tech, 'bl4.csv', csv(['zeit,Kanal 1,KANAL 2', '0,12,20.5', '1,13,20.6']));
    expect(up.body.suggestedColumnMap).toEqual({ id: saved.body.id, name: 'Bench logger BL-4', mapping });
    const bad = await tech.post('/api/imports/column-maps', { name: 'x', headers: [], mapping: {} });
    expect(bad.status).toBe(400);
    const badMap = await tech.post('/api/imports/column-maps', { name: 'Wrong map', headers, mapping: { time: { index: 0, unit: 's' }, columns: [{ index: 5, channel: 'pressure', unit: 'kPa' }] } });
    expect(badMap.status).toBe(400);
    expect(badMap.body.errors[0].field).toBe('mapping.columns[0].index');
  });
});

describe('who may import', () => {
  it('answers 401 without a session, 403 for quality officers and administrators, 404 for an unknown import', async () => {
    const file = csv(['Time (s),P (kPa)', '0,100']);
    expect((await uploadFile(await clientAs(h.app, null), 'a.csv', file)).status).toBe(401);
    expect((await (await clientAs(h.app, null)).get('/api/imports/column-maps')).status).toBe(401);
    for (const role of ['quality', 'admin'] as const) {
      const c = await clientAs(h.app, role);
      expect((await uploadFile(c, 'a.csv', file)).status).toBe(403);
      expect((await c.get('/api/imports/column-maps')).status).toBe(403);
      expect((await c.post('/api/imports/1/commit', {})).status).toBe(403);
    }
    expect((await tech.get('/api/imports/987654')).status).toBe(404);
    expect((await tech.post('/api/imports/987654/commit', { mapping: { time: { index: 0, unit: 's' }, columns: [] }, target: newRun('Nothing') })).status).toBe(404);
    expect((await tech.get('/api/imports/abc')).status).toBe(404);
    const investigator = await clientAs(h.app, 'investigator');
    expect((await uploadFile(investigator, 'a.csv', file)).status).toBe(201);
  });

  it('answers 400 for a commit body of the wrong shape', async () => {
    const up = await uploadFile(tech, 'shape.csv', csv(['Time (s),P (kPa)', '0,100', '1,101']));
    const res = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping: up.body.mapping, target: { runId: 'seven' } });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].field).toBe('target');
    const noProject = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping: up.body.mapping, target: { newRun: { ...newRun('Somewhere else').newRun, projectId: 987654 } } });
    expect(noProject.status).toBe(403);
  });
});
