import { inflateRawSync } from 'node:zlib';
import type { ImportLimits } from './import-limits';
import { unreadableFile, unsupportedFile } from './import-problems';
import { storedZip } from './stored-zip';

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
  /** The inspected parts of one sheet as a plain archive for exceljs (see normalisedWorkbook). */
  workbookPart: (sheet: string) => Buffer;
}

const EOCD = 0x06054b50;
const CENTRAL = 0x02014b50;
const LOCAL = 0x04034b50;
const ZIP64_MARK = 0xffffffff;

function readCentralDirectory(buf: Buffer): { entries: ZipEntry[]; dirOffset: number } {
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
  return { entries, dirOffset };
}

/**
 * What the central directory says the archive expands to, without inflating anything (0 when it
 * cannot be read: the inspection then refuses the file with its own message). Only a hint for where
 * to read the file: the inspection enforces the real sizes.
 */
export function declaredExpandedBytes(buf: Buffer): number {
  try {
    return readCentralDirectory(buf).entries.reduce((sum, e) => sum + e.uncompressedSize, 0);
  } catch {
    return 0;
  }
}

const DATA_DESCRIPTOR = 0x08074b50;
const disagree = (what: string) => unreadableFile(
  `The workbook's ZIP archive contradicts itself (${what}): its directory and its entries describe different content, so what Qwell checked ` +
  'might not be what it reads. Open the file in your spreadsheet program and save it again as .xlsx.',
);

/**
 * Walks the archive front to back as a streaming reader does and requires every local header to be
 * the entry the central directory lists at that offset, with the same name, method and sizes, and
 * nothing between or after the entries but the directory: an entry the directory leaves out (whose
 * values a streaming reader would read instead of the visible sheet's), or a header that lies about
 * its sizes, is refused here. Exceljs's reader then reads exactly the entries this module inspected.
 */
function requireLocalHeadersAgree(buf: Buffer, entries: readonly ZipEntry[], dirOffset: number): void {
  const sorted = [...entries].sort((a, b) => a.localHeaderOffset - b.localHeaderOffset);
  let pos = 0;
  for (const entry of sorted) {
    if (entry.localHeaderOffset !== pos) throw disagree(pos < entry.localHeaderOffset ? `bytes at offset ${pos} that the directory does not list` : `entry ${entry.name} overlaps another`);
    if (pos + 30 > buf.length || buf.readUInt32LE(pos) !== LOCAL) throw disagree(`no entry header where the directory puts ${entry.name}`);
    const flags = buf.readUInt16LE(pos + 6);
    const nameLength = buf.readUInt16LE(pos + 26);
    const name = buf.toString('utf8', pos + 30, pos + 30 + nameLength);
    if (name !== entry.name) throw disagree(`the directory names ${entry.name} where the archive holds ${name}`);
    if (buf.readUInt16LE(pos + 8) !== entry.method) throw disagree(`entry ${entry.name} has two compression methods`);
    const hasDescriptor = (flags & 0x08) !== 0;
    if (!hasDescriptor && (buf.readUInt32LE(pos + 18) !== entry.compressedSize || buf.readUInt32LE(pos + 22) !== entry.uncompressedSize)) {
      throw disagree(`entry ${entry.name} declares other sizes than the directory`);
    }
    pos += 30 + nameLength + buf.readUInt16LE(pos + 28) + entry.compressedSize;
    if (hasDescriptor) {
      if (pos + 12 > buf.length) throw disagree(`entry ${entry.name} is cut short`);
      const signed = buf.readUInt32LE(pos) === DATA_DESCRIPTOR ? 4 : 0;
      if (buf.readUInt32LE(pos + signed + 4) !== entry.compressedSize || buf.readUInt32LE(pos + signed + 8) !== entry.uncompressedSize) {
        throw disagree(`entry ${entry.name} declares other sizes after its data than the directory`);
      }
      pos += signed + 12;
    }
  }
  if (pos !== dirOffset) throw disagree(`bytes at offset ${pos} that the directory does not list`);
}

const DTD = Buffer.from('<!DOCTYPE');
const ENTITY = Buffer.from('<!ENTITY');

/** A workbook part with a document type or entity declarations: no spreadsheet program writes one, and an XML parser could be made to fetch or expand them. */
function refuseDtd(name: string, xml: Buffer): void {
  if (xml.indexOf(DTD) >= 0 || xml.indexOf(ENTITY) >= 0) {
    throw unsupportedFile(`The workbook's part ${name} declares a document type (DTD) or entities, which spreadsheet programs never write; Qwell does not read such files. Save the data again as .xlsx from your spreadsheet program.`);
  }
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

/** The import's time budget is spent: the file is refused rather than holding the server. */
export const tookTooLong = (limits: ImportLimits) => unreadableFile(
  `Reading the workbook took longer than ${limits.maxSeconds} s, the most Qwell spends on one file. Split the data into smaller files, or export it as CSV.`,
);

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
export function inspectWorkbook(buf: Buffer, limits: ImportLimits, deadline = Date.now() + limits.maxSeconds * 1000): WorkbookInspection {
  const { entries, dirOffset } = readCentralDirectory(buf);
  requireLocalHeadersAgree(buf, entries, dirOffset);
  const declared = entries.reduce((sum, e) => sum + (e.uncompressedSize === ZIP64_MARK ? Infinity : e.uncompressedSize), 0);
  const tooBig = (bytes: number) => bytes > limits.maxExpandedBytes && bytes > limits.maxExpansionRatio * buf.length;
  if (tooBig(declared)) {
    throw unreadableFile(`The archive expands far beyond its size (${buf.length} bytes would become ${Number.isFinite(declared) ? declared : 'more than 4 GB of'} bytes). Qwell refuses it as a possible ZIP bomb.`);
  }
  const names = new Set(entries.map((e) => e.name));
  if (names.size !== entries.length) throw disagree('two entries have the same name');
  if (!names.has('xl/workbook.xml')) {
    throw unsupportedFile('The file is a ZIP archive but not a workbook (.xlsx) (it has no xl/workbook.xml). Upload a .xlsx or a .csv file.');
  }
  const files = new Map<string, Buffer>();
  let expandedBytes = 0;
  for (const entry of entries) {
    if (entry.name.endsWith('/')) continue;
    if (Date.now() > deadline) throw tookTooLong(limits);
    const out = inflateEntry(buf, entry, Math.max(0, limits.maxExpandedBytes - expandedBytes));
    if (out.length !== entry.uncompressedSize) throw disagree(`entry ${entry.name} expands to ${out.length} bytes, not the ${entry.uncompressedSize} it declares`);
    expandedBytes += out.length;
    if (tooBig(expandedBytes)) throw unreadableFile('The archive expands far beyond its size. Qwell refuses it as a possible ZIP bomb.');
    if (/\.(xml|rels|vml)$/i.test(entry.name)) refuseDtd(entry.name, out);
    if (/^xl\/[^/]+\.xml$/.test(entry.name) || entry.name === 'xl/_rels/workbook.xml.rels' || /^xl\/worksheets\/[^/]+\.xml$/.test(entry.name)) {
      files.set(entry.name, out);
    }
  }
  const workbookXml = files.get('xl/workbook.xml')!.toString('utf8');
  const relsXml = files.get('xl/_rels/workbook.xml.rels')?.toString('utf8') ?? '';
  const targets = new Map<string, string>();
  let sharedStringsPath = 'xl/sharedStrings.xml';
  let stylesPath = 'xl/styles.xml';
  for (const m of relsXml.matchAll(/<Relationship\s[^>]*>/g)) {
    const id = attr(m[0], 'Id');
    const target = attr(m[0], 'Target');
    // Relative to xl/ (what most writers put) or absolute from the package root ("/xl/worksheets/sheet1.xml").
    if (id && target) targets.set(id, target.startsWith('/') ? target.slice(1) : `xl/${target.replace(/^\.\//, '')}`);
    const type = attr(m[0], 'Type') ?? '';
    if (target && /\/sharedStrings$/.test(type)) sharedStringsPath = targets.get(id ?? '') ?? sharedStringsPath;
    if (target && /\/styles$/.test(type)) stylesPath = targets.get(id ?? '') ?? stylesPath;
  }
  const sheets: string[] = [];
  const merges = new Map<string, string[]>();
  const sheetParts = new Map<string, { rId: string; xml: Buffer }>();
  for (const m of workbookXml.matchAll(/<sheet\s[^>]*>/g)) {
    const name = xmlText(attr(m[0], 'name') ?? `Sheet${sheets.length + 1}`);
    sheets.push(name);
    const rId = attr(m[0], 'r:id') ?? '';
    const target = targets.get(rId);
    const xml = target ? files.get(target) : undefined;
    merges.set(name, xml ? mergesOf(xml) : []);
    if (xml) sheetParts.set(name, { rId, xml });
  }
  const workbookPart = (sheet: string): Buffer => {
    const part = sheetParts.get(sheet);
    if (!part) throw unreadableFile(`The workbook lists sheet "${sheet}" but holds no worksheet for it; save it again as .xlsx.`);
    return normalisedWorkbook(files.get('xl/workbook.xml')!, part, files.get(sharedStringsPath), files.get(stylesPath));
  };
  return { sheets, merges, expandedBytes, workbookPart };
}

/**
 * The inspected parts of one sheet as a plain archive with the standard part names exceljs's reader
 * looks for: the workbook, one relationship (relative target) to the sheet, shared strings and
 * styles before the sheet. Whatever path the writer used (absolute, another file name), exceljs
 * reads the sheet the inspection checked and names it as the workbook does.
 */
function normalisedWorkbook(workbook: Buffer, sheet: { rId: string; xml: Buffer }, sharedStrings?: Buffer, styles?: Buffer): Buffer {
  const rels = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n' +
    '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
    `<Relationship Id="${sheet.rId}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/>` +
    '</Relationships>';
  return storedZip([
    ['xl/_rels/workbook.xml.rels', Buffer.from(rels, 'utf8')],
    ['xl/workbook.xml', workbook],
    ...(sharedStrings ? [['xl/sharedStrings.xml', sharedStrings] as const] : []),
    ...(styles ? [['xl/styles.xml', styles] as const] : []),
    ['xl/worksheets/sheet1.xml', sheet.xml],
  ]);
}
