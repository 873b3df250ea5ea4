import request from 'supertest';
import { HttpProblem } from '../core/problem';
import { startHarness, type ApiHarness } from '../../testing/api-harness';
import type { ImportLimits } from './import-limits';
import { deflatedZeros, xlsxBuffer, zipBomb, zipBuffer } from '../../testing/import-test-files';
import { OFF_THREAD_FROM_EXPANDED_BYTES, readWorkbook } from './xlsx-off-thread';
import { readXlsx } from './xlsx-reader';
import { declaredExpandedBytes } from './zip-inspection';

const limits: ImportLimits = { maxBytes: 25 * 1024 * 1024, maxRows: 200_000, maxExpansionRatio: 100, maxExpandedBytes: 200 * 1024 * 1024, maxSeconds: 60 };

let h: ApiHarness;
let heavy: Buffer;
beforeAll(async () => {
  h = await startHarness();
  // 20 000 rows of six channels: seconds of parsing, well past the off-thread size.
  const rows = Array.from({ length: 20_000 }, (_, i) => [i * 0.5, 101.325 + i / 1e4, 25 + Math.sin(i / 100), 12.01, 0.251, 3.01 + i / 1e5]);
  heavy = await xlsxBuffer([{ name: 'Log', rows: [['Time (s)', 'P (kPa)', 'T/°C', 'U (V)', 'I (A)', 'P_el (W)'], ...rows] }]);
}, 120_000);
afterAll(() => h.close());

describe('workbooks are read off the request thread', () => {
  it('reads a large workbook in a worker to exactly what the inline reader gives', async () => {
    expect(declaredExpandedBytes(heavy)).toBeGreaterThan(OFF_THREAD_FROM_EXPANDED_BYTES);
    const off = await readWorkbook(heavy, 'heavy.xlsx', limits);
    expect(off.rows).toHaveLength(20_001);
    // Each cell also carries the decimals it was written with; these "General" cells give the value's own digits (at most 12).
    expect(off.rows[20_000]).toEqual({ n: 20_001, cells: [9_999.5, 101.325 + 19_999 / 1e4, 25 + Math.sin(19_999 / 100), 12.01, 0.251, 3.01 + 19_999 / 1e5], places: [1, 4, 12, 2, 3, 5] });
    expect(off).toEqual(await readXlsx(heavy, 'heavy.xlsx', limits));
  }, 120_000);

  it('answers /api/health while a workbook inflating to 150 MB is inspected, before the inspection refuses its DTD (415)', async () => {
    // Within the byte budget (200 MB), so every part is inflated and checked before the last one is refused.
    const xml = (text: string) => Buffer.from(`<?xml version="1.0"?>${text}`);
    const file = zipBuffer([
      { name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(0), deflated: await deflatedZeros(150 * 1024 * 1024), declaredSize: 150 * 1024 * 1024, crc: 0 },
      { name: 'xl/workbook.xml', data: xml('<workbook><sheets><sheet name="Log" sheetId="1" r:id="rId1"/></sheets></workbook>') },
      { name: 'xl/styles.xml', data: xml('<!DOCTYPE styleSheet [<!ENTITY big "big">]><styleSheet/>') },
    ]);
    const order: string[] = [];
    const parsing = readWorkbook(file, 'dtd-last.xlsx', limits).finally(() => order.push('parse'));
    const health = request(h.app).get('/api/health').then((res) => {
      order.push('health');
      return res;
    });
    const [parsed, res] = await Promise.allSettled([parsing, health]);
    expect(parsed).toMatchObject({ status: 'rejected', reason: { status: 415, detail: expect.stringMatching(/xl\/styles\.xml declares a document type \(DTD\)/) } });
    expect(res).toMatchObject({ status: 'fulfilled', value: { status: 200 } });
    // On the request thread, the inspection would have finished (and refused) before the health request was even sent.
    expect(order).toEqual(['health', 'parse']);
  }, 120_000);

  it('still refuses a ZIP bomb with a 422 from the worker, and a spent time budget with a 422', async () => {
    const bomb = await zipBomb(300 * 1024 * 1024);
    expect(declaredExpandedBytes(bomb)).toBeGreaterThan(OFF_THREAD_FROM_EXPANDED_BYTES);
    await expect(readWorkbook(bomb, 'bomb.xlsx', limits)).rejects.toMatchObject({ status: 422, detail: expect.stringMatching(/expands far beyond its size.*ZIP bomb/) });
    const late = readWorkbook(heavy, 'heavy.xlsx', { ...limits, maxSeconds: 0.001 });
    await expect(late).rejects.toBeInstanceOf(HttpProblem);
    await expect(late).rejects.toMatchObject({ status: 422, detail: expect.stringMatching(/took longer than 0\.001 s/) });
  }, 120_000);
});
