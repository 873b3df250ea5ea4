import ExcelJS from 'exceljs';
import { createDeflateRaw, crc32, deflateRawSync } from 'node:zlib';

/** Test and benchmark files, made on the spot so that no bad file has to live in the repository. */

export interface SheetSpec {
  name?: string;
  rows: unknown[][];
  merges?: string[];
  /** Cells given as { formula, result? } are written as formulas (exceljs keeps the result as the cached value). */
}

/** An .xlsx workbook with the given sheets, written by exceljs. */
export async function xlsxBuffer(sheets: SheetSpec[]): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  sheets.forEach((s, i) => {
    const ws = wb.addWorksheet(s.name ?? `Sheet${i + 1}`);
    for (const row of s.rows) ws.addRow(row);
    for (const m of s.merges ?? []) ws.mergeCells(m);
  });
  return Buffer.from(await wb.xlsx.writeBuffer());
}

interface ZipPart {
  name: string;
  data: Buffer;
  /** Compressed bytes; stored when absent. */
  deflated?: Buffer;
  /** The uncompressed size the archive claims (defaults to the truth). */
  declaredSize?: number;
  crc?: number;
}

/** A ZIP archive written by hand, so that a test can make its directory claim whatever it likes. */
export function zipBuffer(parts: ZipPart[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const p of parts) {
    const name = Buffer.from(p.name, 'utf8');
    const body = p.deflated ?? p.data;
    const size = p.declaredSize ?? p.data.length;
    const crc = p.crc ?? crc32(p.data);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(p.deflated ? 8 : 0, 8);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(body.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(name.length, 26);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(p.deflated ? 8 : 0, 10);
    central.writeUInt32LE(crc, 16);
    central.writeUInt32LE(body.length, 20);
    central.writeUInt32LE(size, 24);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    locals.push(local, name, body);
    centrals.push(central, name);
    offset += 30 + name.length + body.length;
  }
  const dir = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(parts.length, 8);
  end.writeUInt16LE(parts.length, 10);
  end.writeUInt32LE(dir.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, dir, end]);
}

const MINIMAL_WORKBOOK = '<?xml version="1.0"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>';

/** Deflates `bytes` zeros in 1 MB pieces (never holding them all), returning the small compressed result. */
export async function deflatedZeros(bytes: number): Promise<Buffer> {
  const out: Buffer[] = [];
  const z = createDeflateRaw({ level: 9 });
  z.on('data', (c: Buffer) => out.push(c));
  const done = new Promise<void>((resolve, reject) => z.on('end', resolve).on('error', reject));
  const chunk = Buffer.alloc(1024 * 1024);
  for (let left = bytes; left > 0; left -= chunk.length) {
    if (!z.write(left >= chunk.length ? chunk : chunk.subarray(0, left))) await new Promise((r) => z.once('drain', r));
  }
  z.end();
  await done;
  return Buffer.concat(out);
}

/** A workbook-shaped archive whose sheet honestly declares that it expands to `bytes` zeros. */
export async function zipBomb(bytes: number): Promise<Buffer> {
  const deflated = await deflatedZeros(bytes);
  return zipBuffer([
    { name: '[Content_Types].xml', data: Buffer.from('<Types/>') },
    { name: 'xl/workbook.xml', data: Buffer.from(MINIMAL_WORKBOOK) },
    { name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(0), deflated, declaredSize: bytes, crc: 0 },
  ]);
}

/** A workbook-shaped archive whose sheet claims to be small but inflates to `bytes` zeros. */
export function lyingZip(bytes: number): Buffer {
  const deflated = deflateRawSync(Buffer.alloc(bytes));
  return zipBuffer([
    { name: 'xl/workbook.xml', data: Buffer.from(MINIMAL_WORKBOOK) },
    { name: 'xl/worksheets/sheet1.xml', data: Buffer.alloc(0), deflated, declaredSize: 1000, crc: 0 },
  ]);
}

/** The start of an OLE compound file holding an encrypted OOXML package, as password-protected workbooks are. */
export function encryptedWorkbookStub(): Buffer {
  const header = Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]);
  const body = Buffer.alloc(4096);
  Buffer.from('EncryptionInfo', 'utf16le').copy(body, 512);
  Buffer.from('EncryptedPackage', 'utf16le').copy(body, 640);
  return Buffer.concat([header, body]);
}
