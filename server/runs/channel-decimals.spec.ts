import ExcelJS from 'exceljs';
import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { loadFixture, runBodies } from '../../testing/fixture-runs';
import { csv, uploadFile } from '../../testing/import-spec-support';
import { placesOfFormat, placesOfText } from '../imports/raw-table';

// A channel's `decimals` records the digits its readings were typed or imported with, so that the run
// page shows 3.000 V as 3.000 V although the stored number is 3.
let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
let draft: { id: number; version: number };
const fixture = loadFixture('isothermal');

beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
  const created = await tech.post('/api/runs', { ...runBodies(fixture, projectId).create, title: 'Decimals as entered' });
  expect(created.status).toBe(201);
  draft = { id: created.body.id, version: created.body.version };
});
afterAll(() => h.close());

const fields = (res: { body: { errors?: Array<{ field: string }> } }) => (res.body.errors ?? []).map((e) => e.field);

describe('setup.channels.<name>.decimals', () => {
  it.each([0, 3, 12])('accepts %i decimals and reads them back', async (decimals) => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup: { channels: { voltage: { unit: 'V', decimals } } } });
    expect(res.status).toBe(200);
    draft.version = res.body.version;
    const read = await tech.get(`/api/runs/${draft.id}`);
    expect(read.body.setup.channels.voltage).toEqual({ unit: 'V', decimals });
  });

  it.each([-1, 13, 2.5, '3', null])('refuses %j decimals with a 400 naming the field, and keeps the run as it was', async (decimals) => {
    const res = await tech.patch(`/api/runs/${draft.id}`, { version: draft.version, setup: { channels: { voltage: { unit: 'V', decimals } } } });
    expect(res.status).toBe(400);
    expect(fields(res)).toEqual(['setup.channels.voltage.decimals']);
    expect(res.body.errors[0].message).toContain('a whole number from 0 to 12');
    const read = await tech.get(`/api/runs/${draft.id}`);
    expect(read.body.version).toBe(draft.version);
  });

  it('PUT readings keeps the decimals sent with a channel in the setup, and refuses 13', async () => {
    const body = { time: { unit: 's', values: [0, 10, 20] }, channels: { voltage: { unit: 'V', decimals: 3, values: [3, 3, 3] } } };
    const put = await tech.put(`/api/runs/${draft.id}/readings`, { version: draft.version, ...body });
    expect(put.status).toBe(200);
    draft.version = put.body.version;
    const read = await tech.get(`/api/runs/${draft.id}`);
    expect(read.body.setup.channels.voltage).toEqual({ unit: 'V', decimals: 3 });
    expect(read.body.readings.voltage).toEqual([3, 3, 3]);
    const bad = await tech.put(`/api/runs/${draft.id}/readings`, { version: draft.version, ...body, channels: { voltage: { ...body.channels.voltage, decimals: 13 } } });
    expect(bad.status).toBe(400);
    expect(fields(bad)).toEqual(['channels.voltage.decimals']);
  });
});

describe('an import records the decimals of each column', () => {
  const mapping = {
    time: { index: 0, unit: 's' },
    columns: [{ index: 1, channel: 'pressure', unit: 'kPa', reference: 'absolute' }, { index: 2, channel: 'voltage', unit: 'V' }],
  };

  it('a CSV written "3.000" gives the voltage channel 3 decimals, the pressure column its most precise cell', async () => {
    const up = await uploadFile(tech, 'heater-log.csv', csv(['Time (s),P (kPa),U (V)', '0,101.3,3.000', '10,101.35,3.000', '20,101.4,3.000']));
    expect(up.status).toBe(201);
    const commit = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping, target: { newRun: { projectId, title: 'CSV with 3.000 V', process: 'isochoric', runDate: '2026-03-14' } } });
    expect(commit.status).toBe(201);
    const run = (await tech.get(`/api/runs/${commit.body.runId}`)).body;
    expect(run.setup.channels.voltage).toEqual({ unit: 'V', decimals: 3 });
    expect(run.setup.channels.pressure).toMatchObject({ unit: 'kPa', decimals: 2 });
    expect(run.readings.voltage).toEqual([3, 3, 3]);
  });

  it('a workbook cell formatted "0.000" holding 3 gives 3 decimals; a General cell its own digits', async () => {
    const wb = new ExcelJS.Workbook();
    const sheet = wb.addWorksheet('Log');
    sheet.addRow(['Time (s)', 'P (kPa)', 'U (V)']);
    for (const [t, p] of [[0, 101.3], [10, 101.35], [20, 101.4]]) sheet.addRow([t, p, 3]);
    sheet.getColumn(3).numFmt = '0.000';
    for (let r = 2; r <= 4; r++) sheet.getCell(r, 3).numFmt = '0.000';
    const up = await uploadFile(tech, 'heater-log.xlsx', Buffer.from(await wb.xlsx.writeBuffer()));
    expect(up.status).toBe(201);
    const commit = await tech.post(`/api/imports/${up.body.importId}/commit`, { mapping, target: { newRun: { projectId, title: 'Workbook with 3.000 V', process: 'isochoric', runDate: '2026-03-14' } } });
    expect(commit.status).toBe(201);
    const run = (await tech.get(`/api/runs/${commit.body.runId}`)).body;
    expect(run.setup.channels.voltage).toEqual({ unit: 'V', decimals: 3 });
    expect(run.setup.channels.pressure).toMatchObject({ decimals: 2 });
  });

  it('reads decimals from text and from number formats as spreadsheets write them', () => {
    expect([placesOfText('3.000'), placesOfText('12'), placesOfText('5e-4'), placesOfText('2.50E+3'), placesOfText('.5'), placesOfText('abc')]).toEqual([3, 0, 4, 0, 1, null]);
    expect([placesOfFormat('0.000'), placesOfFormat('#,##0.0'), placesOfFormat('0'), placesOfFormat('General'), placesOfFormat('0.00E+00'), placesOfFormat('0.00;[Red]-0.00'), placesOfFormat('yyyy-mm-dd')])
      .toEqual([3, 1, 0, null, null, 2, null]);
  });
});
