import { clientAs, startHarness, type ApiClient, type ApiHarness } from '../../testing/api-harness';
import { csv, importCounts, uploadFile } from '../../testing/import-spec-support';
import { encryptedWorkbookStub, lyingZip, xlsxBuffer, zipBomb } from '../../testing/import-test-files';

// Small limits so that "too large" and "too many rows" need only small files.
const saved = { rows: process.env['QWELL_IMPORT_MAX_ROWS'], mb: process.env['QWELL_UPLOAD_MAX_MB'] };
let h: ApiHarness;
let tech: ApiClient;
beforeAll(async () => {
  process.env['QWELL_IMPORT_MAX_ROWS'] = '50';
  process.env['QWELL_UPLOAD_MAX_MB'] = '1';
  h = await startHarness();
  tech = await clientAs(h.app, 'technician');
});
afterAll(async () => {
  await h.close();
  for (const [k, v] of [['QWELL_IMPORT_MAX_ROWS', saved.rows], ['QWELL_UPLOAD_MAX_MB', saved.mb]] as const) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
});

const header = ['Time (s)', 'P (kPa)', 'T/°C'];
const goodRows = [[0, 101.3, 25.1], [10, 102.0, 25.4], [20, 102.8, 25.9]];

/** Uploads a bad file and checks its status, its message and that nothing at all was stored. */
async function refused(filename: string, content: Buffer, status: number, detail: RegExp, fields: Record<string, string> = {}) {
  const before = await importCounts(h.handle.db);
  const res = await uploadFile(tech, filename, content, fields);
  expect({ status: res.status, type: res.headers['content-type'] }).toEqual({ status, type: expect.stringContaining('application/problem+json') });
  expect(res.body.detail).toMatch(detail);
  expect(await importCounts(h.handle.db)).toEqual(before);
  return res;
}

describe('POST /api/imports refuses bad files and stores nothing', () => {
  it('refuses a file that is not a spreadsheet (415)', async () => {
    await refused('report.pdf', Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj\n'), 415, /"report\.pdf" is not a spreadsheet Qwell reads \(it is a PDF document\)/);
  });

  it('refuses content that does not match the extension, both ways (415)', async () => {
    await refused('logger.xlsx', csv(['Time (s),P (kPa)', '0,101.3']), 415, /named \.xlsx but its content is text \(perhaps CSV\).*ZIP archive/);
    await refused('logger.csv', await xlsxBuffer([{ rows: [header, ...goodRows] }]), 415, /named \.csv but holds a \.xlsx workbook/);
    await refused('photo.csv', Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 415, /content is a PNG image.*plain text/);
  });

  it('refuses an old .xls workbook with what to do (415)', async () => {
    await refused('old.xls', Buffer.concat([Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), Buffer.alloc(512)]), 415, /old-format \(\.xls\).*Save it as a workbook \(\.xlsx\)/);
  });

  it('refuses empty files: 0 bytes, blank CSV, a workbook with an empty sheet', async () => {
    await refused('empty.csv', Buffer.alloc(0), 400, /"empty\.csv" is empty \(0 bytes\)/);
    await refused('blank.csv', Buffer.from('\n\n  \n'), 400, /holds no data/);
    await refused('empty.xlsx', await xlsxBuffer([{ rows: [] }]), 422, /"empty\.xlsx" \(sheet "Sheet1"\) has no data/);
  });

  it('refuses a table without a header row (422)', async () => {
    await refused('numbers.csv', csv(['0,101.3,25.1', '10,102.0,25.4', '20,102.8,25.9']), 422, /No header row found in "numbers\.csv".*"Time \(s\)"/);
  });

  it('refuses merged header cells, naming the range (422)', async () => {
    const file = await xlsxBuffer([{ rows: [['Time (s)', 'Pressure', '', 'T/°C'], ...goodRows.map((r) => [r[0], r[1], r[1], r[2]])], merges: ['B1:C1'] }]);
    await refused('merged.xlsx', file, 422, /merged cells B1:C1 in the header row \(row 1\).*unmerge them/);
  });

  it('refuses a formula without a stored result, naming the cell (422)', async () => {
    const file = await xlsxBuffer([{ rows: [header, [0, 101.3, 25.1], [10, { formula: 'B2*1.01' }, 25.4]] }]);
    await refused('formula.xlsx', file, 422, /Cell B3 of sheet "Sheet1" holds a formula without a stored result.*recalculate/);
  });

  it('refuses more rows than QWELL_IMPORT_MAX_ROWS (422), from CSV and from a workbook', async () => {
    const rows = Array.from({ length: 60 }, (_, i) => [i, 100 + i / 10, 25]);
    await refused('long.csv', csv(['Time (s),P (kPa),T/°C', ...rows.map((r) => r.join(','))]), 422, /"long\.csv" has 60 rows of data; Qwell imports at most 50/);
    const many = Array.from({ length: 120 }, (_, i) => [i, 100, 25]);
    await refused('long.xlsx', await xlsxBuffer([{ rows: [header, ...many] }]), 422, /more than 50 rows of data/);
  });

  it('refuses a password-protected workbook (422)', async () => {
    await refused('locked.xlsx', encryptedWorkbookStub(), 422, /"locked\.xlsx" is a password-protected workbook\. Remove the password/);
  });

  it('refuses an archive that expands far beyond its size before exceljs reads it (422)', async () => {
    // 300 MB of zeros deflate to about 300 kB: a thousand times the file's size.
    const bomb = await zipBomb(300 * 1024 * 1024);
    expect(bomb.length).toBeLessThan(1024 * 1024);
    await refused('bomb.xlsx', bomb, 422, /expands far beyond its size.*ZIP bomb/);
    // An entry that claims 1 000 bytes but inflates to 20 MB is caught while inflating, within its claim.
    await refused('liar.xlsx', lyingZip(20 * 1024 * 1024), 422, /holds more than it declares.*ZIP bomb/);
  });

  it('refuses a ZIP that is not a workbook (415)', async () => {
    const { zipBuffer } = await import('../../testing/import-test-files');
    await refused('archive.xlsx', zipBuffer([{ name: 'readme.txt', data: Buffer.from('hello') }]), 415, /ZIP archive but not a workbook \(\.xlsx\)/);
  });

  it('refuses a ";"-separated CSV with decimal commas unless told, and says what to choose (422)', async () => {
    const file = csv(['Zeit (s);P (kPa);T/°C', '0;101,3;25,1', '10;102,0;25,4']);
    await refused('semicolon.csv', file, 422, /separates its columns with ";".*Choose the separator ";".*decimal mark ","/);
    await refused('semicolon.csv', file, 422, /decimal comma.*Choose the decimal mark ","/, { delimiter: ';' });
    await refused('semicolon.csv', file, 400, /"," both as the separator and as the decimal mark/, { delimiter: ',', decimal: ',' });
    const ok = await uploadFile(tech, 'semicolon.csv', file, { delimiter: ';', decimal: ',' });
    expect(ok.status).toBe(201);
    expect(ok.body.rows[0].cells).toEqual([0, 101.3, 25.1]);
    expect(ok.body.notes).toContain('read as CSV with separator ";" and decimal mark ","');
  });

  it('refuses a file over QWELL_UPLOAD_MAX_MB (413) and bad form fields (400)', async () => {
    const big = csv(['Time (s),P (kPa)', ...Array.from({ length: 70_000 }, (_, i) => `${i},101.325000`)]);
    expect(big.length).toBeGreaterThan(1024 * 1024);
    await refused('big.csv', big, 413, /larger than 1 MB, the most Qwell takes in one upload/);
    await refused('data.csv', csv([header.join(','), '0,1,2']), 400, /delimiter is ",", ";" or a tab/, { delimiter: '|' });
    const before = await importCounts(h.handle.db);
    const none = await tech.post('/api/imports', {});
    expect(none.status).toBe(400);
    expect(none.body.detail).toMatch(/Choose a \.xlsx or \.csv file/);
    expect(await importCounts(h.handle.db)).toEqual(before);
  });
});
