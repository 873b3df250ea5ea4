import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { projects } from '../../db/schema';
import { toSi, type UnitKind } from '../engine/units';
import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { importCounts, uploadFile } from '../../testing/import-spec-support';
import { zipBuffer } from '../../testing/import-test-files';

// Workbooks written by other writers than exceljs (fixtures/workbooks/README.md says which made
// each), and archives whose two descriptions of themselves disagree.
let h: ApiHarness;
let tech: ApiClient;
let projectId: number;
beforeAll(async () => {
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
  [{ id: projectId }] = await h.handle.db.select({ id: projects.id }).from(projects).where(eq(projects.code, 'GX'));
});
afterAll(() => h.close());

type Channel = { unit: string; values: number[] };
const run = JSON.parse(readFileSync(join(__dirname, '../../fixtures/runs/isothermal.json'), 'utf8')) as { readings: Record<string, Channel> };
const r = run.readings;
const workbook = (name: string) => readFileSync(join(__dirname, '../../fixtures/workbooks', name));
const KIND: Record<string, UnitKind> = { pressure: 'pressure', displacement: 'length', temperature: 'temperature', voltage: 'voltage', current: 'current' };
const CHANNELS = ['pressure', 'displacement', 'temperature', 'voltage', 'current'];
const GUESSES = [['pressure', 'kPa'], ['displacement', 'mm'], ['temperature', 'degC'], ['voltage', 'V'], ['current', 'mA']];

describe('workbooks from other writers import', () => {
  it.each([
    ['absolute-targets-shared-strings.xlsx', 'Log', 3],
    ['inline-strings.xlsx', 'Data', 3],
    ['libreoffice-calc.xlsx', 'libreoffice-calc', 3],
  ])('%s: sheet "%s", header on row %i, every column guessed, 201 rows, and committed readings equal the fixture in SI', async (file, sheet, headerRow) => {
    const res = await uploadFile(tech, file, workbook(file));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ sheet, headerRow, errorCount: 0 });
    expect(res.body.columns.map((c: { guess: { channel: string; unit: string } }) => [c.guess.channel, c.guess.unit])).toEqual([['time', 's'], ...GUESSES]);
    expect(res.body.summary.rows).toBe(r['time'].values.length);
    const mapping = res.body.mapping;
    mapping.columns = mapping.columns.map((c: { channel: string }) => (c.channel === 'pressure' ? { ...c, reference: 'absolute' } : c));
    const commit = await tech.post(`/api/imports/${res.body.importId}/commit`, { mapping, target: { newRun: { projectId, title: `Imported from ${file}`, process: 'isothermal', runDate: '2026-03-14' } } });
    expect(commit.status).toBe(201);
    const stored = (await tech.get(`/api/runs/${commit.body.runId}`)).body.readings as Record<string, number[]>;
    expect(stored['time']).toEqual(r['time'].values);
    for (const k of CHANNELS) {
      const expected = r[k].values.map((v) => toSi(KIND[k], r[k].unit, v));
      const worst = Math.max(...stored[k].map((g, i) => Math.abs(g - expected[i]) / Math.max(Math.abs(expected[i]), 1e-300)));
      expect({ k, worst: worst < 1e-9 }).toEqual({ k, worst: true });
    }
  });

  it.each([
    ['absolute-targets-date-serials.xlsx', 'Log', 3],
    ['libreoffice-calc-timestamps.xlsx', 'libreoffice-calc-timestamps', 1],
  ])('%s: date serials in the time column read as date-times, one second apart', async (file, sheet, headerRow) => {
    const res = await uploadFile(tech, file, workbook(file));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ sheet, headerRow, errorCount: 0 });
    expect(res.body.columns[0].guess).toMatchObject({ channel: 'time', unit: 'iso' });
    const times = (res.body.rows as Array<{ cells: unknown[] }>).map((row) => Date.parse(String(row.cells[0])));
    // The fixture starts at 10:00:00 on 2026-03-14 and logs once a second (times written as serial days).
    expect(new Date(times[0]).toISOString()).toBe('2026-03-14T10:00:00.000Z');
    expect(times.slice(1).map((t, i) => Math.round((t - times[i]) / 1000))).toEqual(times.slice(1).map(() => 1));
  });
});

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"';
const parts = (sheetXml: string) => [
  { name: 'xl/workbook.xml', data: Buffer.from(`<?xml version="1.0"?><workbook ${NS} xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>`) },
  { name: 'xl/_rels/workbook.xml.rels', data: Buffer.from('<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/></Relationships>') },
  { name: 'xl/worksheets/sheet1.xml', data: Buffer.from(sheetXml) },
];
const sheet = (values: number[], prolog = '') =>
  `<?xml version="1.0"?>${prolog}<worksheet ${NS}><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>Time (s)</t></is></c><c r="B1" t="inlineStr"><is><t>P (kPa)</t></is></c></row>` +
  values.map((v, i) => `<row r="${i + 2}"><c r="A${i + 2}"><v>${i}</v></c><c r="B${i + 2}"><v>${v}</v></c></row>`).join('') + '</sheetData></worksheet>';

/** Puts the local entry of `hidden` between the archive's last entry and its directory, which does not list it. */
function withHiddenEntry(visible: Buffer, hidden: Buffer): Buffer {
  const eocd = visible.length - 22;
  const dir = visible.readUInt32LE(eocd + 16);
  const hiddenLocal = hidden.subarray(0, hidden.readUInt32LE(hidden.length - 22 + 16));
  const out = Buffer.concat([visible.subarray(0, dir), hiddenLocal, visible.subarray(dir)]);
  out.writeUInt32LE(dir + hiddenLocal.length, out.length - 22 + 16);
  return out;
}

describe('archives that contradict themselves, and XML with a DTD, are refused; nothing is stored', () => {
  async function refused(name: string, content: Buffer, status: number, detail: RegExp) {
    const before = await importCounts(h.handle.db);
    const res = await uploadFile(tech, name, content);
    expect({ status: res.status, type: res.headers['content-type'] }).toEqual({ status, type: expect.stringContaining('application/problem+json') });
    expect(res.body.detail).toMatch(detail);
    expect(await importCounts(h.handle.db)).toEqual(before);
  }

  it('the plain archive these cases start from imports, so each refusal below is for its one flaw', async () => {
    const res = await uploadFile(tech, 'plain.xlsx', zipBuffer(parts(sheet([101.3, 102.0, 102.8]))));
    expect(res.status).toBe(201);
    expect(res.body.rows.map((row: { cells: unknown[] }) => row.cells[1])).toEqual([101.3, 102.0, 102.8]);
  });

  it('a local entry missing from the central directory (a streaming reader would read its values instead)', async () => {
    const visible = zipBuffer(parts(sheet([101.3, 102.0, 102.8])));
    const hidden = zipBuffer([{ name: 'xl/worksheets/sheet1.xml', data: Buffer.from(sheet([999, 999, 999])) }]);
    await refused('hidden.xlsx', withHiddenEntry(visible, hidden), 422, /contradicts itself.*bytes at offset \d+ that the directory does not list/);
  });

  it('a local header that declares other sizes than the directory (a lie about a 300 MB sheet)', async () => {
    const archive = zipBuffer(parts(sheet([101.3, 102.0])));
    const sheetAt = archive.indexOf(Buffer.from('xl/worksheets/sheet1.xml')) - 30;
    archive.writeUInt32LE(300 * 1024 * 1024, sheetAt + 22);
    await refused('liar.xlsx', archive, 422, /contradicts itself.*declares other sizes than the directory/);
  });

  it('two entries of the same name', async () => {
    const twice = zipBuffer([...parts(sheet([1, 2])), { name: 'xl/worksheets/sheet1.xml', data: Buffer.from(sheet([3, 4])) }]);
    await refused('twice.xlsx', twice, 422, /two entries have the same name/);
  });

  it('a worksheet with a DTD and an entity (415), before any XML parser sees it', async () => {
    const dtd = '<!DOCTYPE worksheet [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;">]>';
    await refused('dtd.xlsx', zipBuffer(parts(sheet([1, 2], dtd))), 415, /declares a document type \(DTD\) or entities/);
  });
});
