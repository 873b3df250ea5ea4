import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import { EVENT_COLUMNS, eventCells, headerLines, type AuditExportHeader, type ExportRow } from './audit-export-data';
import { csvRecord } from './spreadsheet-safety';

/**
 * The audit trail as CSV (RFC 4180: CRLF, fields quoted when needed), UTF-8 with a byte-order mark so
 * spreadsheet programs read the accents right. The header block comes first as label,value records,
 * then an empty record, then the column names and one record per event.
 */
export async function writeAuditCsv(path: string, header: AuditExportHeader, pages: AsyncIterable<ExportRow[]>): Promise<void> {
  const out = createWriteStream(path, { encoding: 'utf8' });
  const write = async (text: string) => {
    if (!out.write(text)) await once(out, 'drain');
  };
  try {
    await write('\uFEFF');
    for (const [label, value] of headerLines(header)) await write(csvRecord([label, value]));
    await write('\r\n');
    await write(csvRecord([...EVENT_COLUMNS]));
    for await (const page of pages) {
      await write(page.map((row) => csvRecord(eventCells(row))).join(''));
    }
  } finally {
    out.end();
    await once(out, 'close');
  }
}
