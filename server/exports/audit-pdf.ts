import { changesText } from '../audit/audit-readable';
import { headerLines, type AuditExportHeader, type ExportRow } from './audit-export-data';
import { COLOURS, keyValues, newPdf, pdfText, pdfToFile, stampPages, type Pdf } from './pdf-layout';

/** A before/after value longer than this is shortened in print; the spreadsheet exports keep it whole. */
export const PDF_JSON_LIMIT = 600;

const COLUMNS = [
  { title: 'id', width: 36 },
  { title: 'occurred at (UTC)', width: 96 },
  { title: 'who', width: 110 },
  { title: 'action', width: 94 },
  { title: 'record', width: 72 },
  { title: 'reason', width: 120 },
  { title: 'change, field by field', width: 218 },
];

function shortJson(v: unknown): string {
  if (v === null || v === undefined) return '-';
  const text = JSON.stringify(v);
  return text.length <= PDF_JSON_LIMIT ? text : `${text.slice(0, PDF_JSON_LIMIT)} … (${text.length} characters; whole in the .xlsx and CSV exports)`;
}

function cells(r: ExportRow): string[] {
  const when = r.occurredAt.replace('T', ' ').replace('Z', '');
  if (r.readable) {
    // People by name, records by code, the change as the fields that differ (the JSON stays in the .xlsx and CSV).
    const e = r.readable;
    const change = changesText(e.changes);
    const who = e.actorName ? `${e.actorName}${r.actorEmail ? ` <${r.actorEmail}>` : ''}` : r.actorEmail ?? 'Qwell (system)';
    return [String(r.id), when, who, e.actionLabel, `${e.recordType} ${e.record}`.trim(), r.reason ?? '', change.length > PDF_JSON_LIMIT ? `${change.slice(0, PDF_JSON_LIMIT)} … (whole in the .xlsx and CSV exports)` : change || '-'].map(pdfText);
  }
  const parts = [r.before === null ? '' : `before ${shortJson(r.before)}`, r.after === null ? '' : `after ${shortJson(r.after)}`].filter(Boolean);
  const change = parts.length ? parts.join('; ') : '-';
  return [
    String(r.id), when, r.actorEmail ?? '(no signed-in person)', r.action,
    `${r.entityType}${r.entityId === null ? '' : ` ${r.entityId}`}`, r.reason ?? '', change,
  ].map(pdfText);
}

function drawHead(doc: Pdf): void {
  const y = doc.y;
  let x = doc.page.margins.left;
  doc.font('Helvetica-Bold').fontSize(7.5).fillColor(COLOURS.muted);
  for (const c of COLUMNS) {
    doc.text(c.title, x, y, { width: c.width - 4, lineBreak: false });
    x += c.width;
  }
  doc.moveTo(doc.page.margins.left, y + 11).lineTo(x, y + 11).lineWidth(0.5).strokeColor(COLOURS.rule).stroke();
  doc.y = y + 15;
}

function drawEvent(doc: Pdf, r: ExportRow): void {
  const texts = cells(r);
  doc.font('Helvetica').fontSize(7.5);
  const h = Math.max(...COLUMNS.map((c, i) => doc.heightOfString(texts[i], { width: c.width - 4 })), 9);
  const needed = h + 14;
  if (doc.y + needed > doc.page.height - doc.page.margins.bottom) {
    doc.addPage();
    drawHead(doc);
  }
  const y = doc.y;
  let x = doc.page.margins.left;
  COLUMNS.forEach((c, i) => {
    doc.font(i === 0 ? 'Helvetica-Bold' : 'Helvetica').fontSize(7.5).fillColor(COLOURS.ink).text(texts[i], x, y, { width: c.width - 4 });
    x += c.width;
  });
  const hy = y + h + 1;
  doc.font('Courier').fontSize(6).fillColor(COLOURS.muted)
    .text(`prev ${r.prevHash}   hash ${r.hash}`, doc.page.margins.left + COLUMNS[0].width, hy, { lineBreak: false });
  doc.moveTo(doc.page.margins.left, hy + 9).lineTo(doc.page.width - doc.page.margins.right, hy + 9).lineWidth(0.25).strokeColor(COLOURS.rule).stroke();
  doc.y = hy + 12;
}

/** The audit trail as a printable PDF (A4 landscape): header block, then every event with its hashes. */
export async function writeAuditPdf(path: string, header: AuditExportHeader, pages: AsyncIterable<ExportRow[]>): Promise<number> {
  const doc = newPdf({ title: 'Qwell audit trail export', subject: `Audit trail, ${header.rows} events`, author: header.generatedBy.name, landscape: true, created: header.generatedAt });
  doc.font('Helvetica-Bold').fontSize(16).fillColor(COLOURS.ink).text('Qwell audit trail export');
  doc.font('Helvetica').fontSize(9).fillColor(COLOURS.muted).text(pdfText(header.lab));
  doc.moveDown(0.6);
  keyValues(doc, headerLines(header).slice(1).map(([k, v]) => [k, v]), 170);
  doc.moveDown(0.8);
  drawHead(doc);
  let any = false;
  for await (const page of pages) {
    for (const row of page) {
      drawEvent(doc, row);
      any = true;
    }
  }
  if (!any) doc.font('Helvetica-Oblique').fontSize(9).fillColor(COLOURS.muted).text('No events match these filters.', doc.page.margins.left);
  const count = stampPages(doc, `Qwell audit trail export · generated ${header.generatedAt.toISOString()} · rows SHA-256 ${header.rowsSha256}`);
  await pdfToFile(doc, path);
  return count;
}
