import { emptyFile, unreadableFile, unsupportedFile } from './import-problems';

export type FileKind = 'xlsx' | 'csv';

const ZIP = Buffer.from([0x50, 0x4b, 0x03, 0x04]);
const OLE = Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]);
const EMPTY_ZIP = Buffer.from([0x50, 0x4b, 0x05, 0x06]);
/** "EncryptedPackage" as UTF-16LE: the stream an encrypted OOXML file keeps inside its OLE container. */
const ENCRYPTED_PACKAGE = Buffer.from('EncryptedPackage', 'utf16le');

const MAGIC_NAMES: Array<[Buffer, string]> = [
  [Buffer.from('%PDF'), 'a PDF document'],
  [Buffer.from([0x89, 0x50, 0x4e, 0x47]), 'a PNG image'],
  [Buffer.from([0xff, 0xd8, 0xff]), 'a JPEG image'],
  [Buffer.from([0x1f, 0x8b]), 'a gzip archive'],
  [Buffer.from('GIF8'), 'a GIF image'],
  [Buffer.from('7z'), 'a 7-Zip archive'],
  [Buffer.from('Rar!'), 'a RAR archive'],
];

function describe(buf: Buffer): string | null {
  for (const [magic, name] of MAGIC_NAMES) if (buf.subarray(0, magic.length).equals(magic)) return name;
  return null;
}

/** Text as a CSV needs it: valid UTF-8 (a BOM is fine) without NUL bytes in the first part. */
function looksLikeText(buf: Buffer): boolean {
  const head = buf.subarray(0, 64 * 1024);
  if (head.includes(0)) return false;
  // A cut in the middle of a multi-byte character at the end of the sample is not an error.
  const decoded = new TextDecoder('utf-8', { fatal: false }).decode(head);
  const bad = (decoded.match(/\uFFFD/g) ?? []).length;
  return bad <= 1;
}

/**
 * Decides what a file is from its name AND its first bytes; a file whose content does not match its
 * extension is refused rather than guessed at.
 */
export function detectKind(filename: string, buf: Buffer): FileKind {
  const ext = /\.([A-Za-z0-9]+)$/.exec(filename)?.[1]?.toLowerCase() ?? '';
  if (buf.length === 0) throw emptyFile(`"${filename}" is empty (0 bytes). Export the data from the logger again.`);
  const isZip = buf.subarray(0, 4).equals(ZIP);
  const isOle = buf.subarray(0, 8).equals(OLE);
  if (ext === 'xlsx' || ext === 'xlsm') {
    if (isOle) {
      if (buf.includes(ENCRYPTED_PACKAGE)) {
        throw unreadableFile(`"${filename}" is a password-protected workbook. Remove the password in your spreadsheet program (save a copy without protection) and upload that copy.`);
      }
      throw unsupportedFile(`"${filename}" is named .xlsx but holds an old-format (.xls) workbook. Save it as a workbook (.xlsx) and upload it again.`);
    }
    if (buf.subarray(0, 4).equals(EMPTY_ZIP)) throw emptyFile(`"${filename}" is an empty archive with no workbook in it.`);
    if (!isZip) {
      const what = describe(buf) ?? (looksLikeText(buf) ? 'text (perhaps CSV)' : 'not a workbook');
      throw unsupportedFile(`"${filename}" is named .xlsx but its content is ${what}: an .xlsx file is a ZIP archive. Upload the real workbook, or name a CSV file .csv.`);
    }
    return 'xlsx';
  }
  if (ext === 'csv' || ext === 'txt' || ext === 'tsv') {
    if (isZip || isOle) {
      throw unsupportedFile(`"${filename}" is named .${ext} but holds a ${isZip ? '.xlsx workbook (ZIP archive)' : 'binary Office file'}. Name it .xlsx, or export the data as CSV.`);
    }
    const what = describe(buf);
    if (what || !looksLikeText(buf)) {
      throw unsupportedFile(`"${filename}" is named .${ext} but its content is ${what ?? 'binary data, not text'}. A CSV file must be plain text.`);
    }
    if (buf.toString('utf8').replace(/^\uFEFF/, '').trim() === '') throw emptyFile(`"${filename}" holds no data, only blank space.`);
    return 'csv';
  }
  if (ext === 'xls') {
    throw unsupportedFile(`"${filename}" is an old-format (.xls) workbook. Save it as a workbook (.xlsx) or export it as CSV, then upload it again.`);
  }
  throw unsupportedFile(`"${filename}" is not a spreadsheet Qwell reads${describe(buf) ? ` (it is ${describe(buf)})` : ''}. Upload a .xlsx workbook or a .csv file exported from the logger.`);
}
