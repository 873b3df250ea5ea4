import { inflateRawSync } from 'node:zlib';
import type { ImportLimits } from './import-limits';
import { unreadableFile, unsupportedFile } from './import-problems';

/** One file inside a ZIP archive, as its central directory describes it. */
interface ZipEntry {
  name: string;
  method: number;
  compressedSize: number;
  uncompressedSize: number;
  localHeaderOffset: number;
}

/** What the import needs to know of a workbook before exceljs reads it. */
export interface WorkbookInspection {
  /** Sheet names in workbook order. */
  sheets: string[];
  /** Merged ranges per sheet name, e.g. "A1:C1" (exceljs's streaming reader does not report them). */
  merges: Map<string, string[]>;
  /** Expanded size of all entries together. */
  expandedBytes: number;
}

const EOCD = 0x06054b50;
const CENTRAL = 0x02014b50;
const LOCAL = 0x04034b50;
const ZIP64_MARK = 0xffffffff;

function readCentralDirectory(buf: Buffer): ZipEntry[] {
  // The end-of-central-directory record sits in the last 22 + 65 535 (comment) bytes.
  const floor = Math.max(0, buf.length - 22 - 0xffff);
  let eocd = -1;
  for (let i = buf.length - 22; i >= floor; i--) {
    if (buf.readUInt32LE(i) === EOCD) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw unreadableFile('The workbook is a damaged ZIP archive (its directory is missing). Open it in your spreadsheet program and save it again as .xlsx.');
  const count = buf.readUInt16LE(eocd + 10);
  const dirOffset = buf.readUInt32LE(eocd + 16);
  if (count === 0xffff || dirOffset === ZIP64_MARK) {
    throw unreadableFile('The workbook is a ZIP64 archive, which only very large workbooks need; split the data into smaller files.');
  }
  const entries: ZipEntry[] = [];
  let p = dirOffset;
  for (let n = 0; n < count; n++) {
    if (p + 46 > buf.length || buf.readUInt32LE(p) !== CENTRAL) {
      throw unreadableFile('The workbook is a damaged ZIP archive (its directory does not match its content). Save it again as .xlsx.');
    }
    const nameLength = buf.readUInt16LE(p + 28);
    const extraLength = buf.readUInt16LE(p + 30);
    const commentLength = buf.readUInt16LE(p + 32);
    entries.push({
      method: buf.readUInt16LE(p + 10),
      compressedSize: buf.readUInt32LE(p + 20),
      uncompressedSize: buf.readUInt32LE(p + 24),
      localHeaderOffset: buf.readUInt32LE(p + 42),
      name: buf.toString('utf8', p + 46, p + 46 + nameLength),
    });
    p += 46 + nameLength + extraLength + commentLength;
  }
  return entries;
}

function inflateEntry(buf: Buffer, entry: ZipEntry, limit: number): Buffer {
  const at = entry.localHeaderOffset;
  if (at + 30 > buf.length || buf.readUInt32LE(at) !== LOCAL) throw unreadableFile(`The workbook is a damaged ZIP archive (entry ${entry.name}).`);
  const start = at + 30 + buf.readUInt16LE(at + 26) + buf.readUInt16LE(at + 28);
  const data = buf.subarray(start, start + entry.compressedSize);
  if (entry.method === 0) return data;
  if (entry.method !== 8) throw unreadableFile(`The workbook uses a compression method Qwell does not read (entry ${entry.name}); save it again as .xlsx.`);
  try {
    // The declared size is a claim: inflate no further than it, so a lying entry cannot fill memory.
    return inflateRawSync(data, { maxOutputLength: Math.max(1, Math.min(entry.uncompressedSize, limit)) });
  } catch (err) {
    if (err instanceof RangeError || (err as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') {
      throw unreadableFile(`The archive expands far beyond its size: entry ${entry.name} holds more than it declares. Qwell refuses it as a possible ZIP bomb.`);
    }
    throw unreadableFile(`The workbook is a damaged ZIP archive (entry ${entry.name} does not decompress).`);
  }
}

const attr = (tag: string, name: string) => new RegExp(`\\s${name}="([^"]*)"`).exec(tag)?.[1];
const xmlText = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, '&');

/** Every mergeCell ref of a worksheet's XML, found without turning the whole sheet into a string. */
function mergesOf(xml: Buffer): string[] {
  const at = xml.indexOf('<mergeCells');
  if (at < 0) return [];
  const end = xml.indexOf('</mergeCells>', at);
  const part = xml.toString('utf8', at, end < 0 ? xml.length : end);
  return [...part.matchAll(/<mergeCell\s[^>]*ref="([^"]+)"/g)].map((m) => m[1]);
}

/**
 * Checks a .xlsx before exceljs touches it: a ZIP whose entries really expand to what they declare, within
 * the limits (a ZIP bomb is refused here), with a workbook inside; returns its sheets and merged ranges.
 */
export function inspectWorkbook(buf: Buffer, limits: ImportLimits): WorkbookInspection {
  const entries = readCentralDirectory(buf);
  const declared = entries.reduce((sum, e) => sum + (e.uncompressedSize === ZIP64_MARK ? Infinity : e.uncompressedSize), 0);
  const tooBig = (bytes: number) => bytes > limits.maxExpandedBytes && bytes > limits.maxExpansionRatio * buf.length;
  if (tooBig(declared)) {
    throw unreadableFile(`The archive expands far beyond its size (${buf.length} bytes would become ${Number.isFinite(declared) ? declared : 'more than 4 GB of'} bytes). Qwell refuses it as a possible ZIP bomb.`);
  }
  const names = new Set(entries.map((e) => e.name));
  if (!names.has('xl/workbook.xml')) {
    throw unsupportedFile('The file is a ZIP archive but not a workbook (.xlsx) (it has no xl/workbook.xml). Upload a .xlsx or a .csv file.');
  }
  const files = new Map<string, Buffer>();
  let expandedBytes = 0;
  for (const entry of entries) {
    if (entry.name.endsWith('/')) continue;
    const out = inflateEntry(buf, entry, limits.maxExpandedBytes);
    expandedBytes += out.length;
    if (tooBig(expandedBytes)) throw unreadableFile('The archive expands far beyond its size. Qwell refuses it as a possible ZIP bomb.');
    if (entry.name === 'xl/workbook.xml' || entry.name === 'xl/_rels/workbook.xml.rels' || /^xl\/worksheets\/[^/]+\.xml$/.test(entry.name)) {
      files.set(entry.name, out);
    }
  }
  const workbookXml = files.get('xl/workbook.xml')!.toString('utf8');
  const relsXml = files.get('xl/_rels/workbook.xml.rels')?.toString('utf8') ?? '';
  const targets = new Map<string, string>();
  for (const m of relsXml.matchAll(/<Relationship\s[^>]*>/g)) {
    const id = attr(m[0], 'Id');
    const target = attr(m[0], 'Target');
    if (id && target) targets.set(id, target.replace(/^\/?(xl\/)?/, 'xl/'));
  }
  const sheets: string[] = [];
  const merges = new Map<string, string[]>();
  for (const m of workbookXml.matchAll(/<sheet\s[^>]*>/g)) {
    const name = xmlText(attr(m[0], 'name') ?? `Sheet${sheets.length + 1}`);
    sheets.push(name);
    const target = targets.get(attr(m[0], 'r:id') ?? '');
    const xml = target ? files.get(target) : undefined;
    merges.set(name, xml ? mergesOf(xml) : []);
  }
  return { sheets, merges, expandedBytes };
}
