import PDFDocument from 'pdfkit';
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';

export type Pdf = PDFKit.PDFDocument;

// pdfkit's built-in Helvetica speaks WinAnsi only; symbols outside it are spelled out so that nothing
// prints as a blank box. (ΔU in the balance table is drawn by drawDeltaLabel instead.)
const SPELLED: Record<string, string> = {
  '\u2212': '-', 'Δ': 'Delta ', 'δ': 'delta ', '∂': 'd', '∫': 'integral ', 'γ': 'gamma', '√': 'sqrt', '→': '->', '⇒': '=>',
  'Ω': 'Ohm', 'Σ': 'Sum ', '≈': '~', 'φ': 'phi', 'π': 'pi', 'β': 'beta', 'ν': 'nu', '∞': 'infinity', '≥': '>=', '≤': '<=',
  '⁰': '^0', '¹': '^1', '⁴': '^4', '⁵': '^5', '⁶': '^6', '⁷': '^7', '⁸': '^8', '⁹': '^9', '⁻': '^-', 'ᵀ': '^T', 'ȳ': 'y-bar',
  '\u2009': ' ', '\u202f': ' ', '\u00a0': ' ', '≠': '!=', 'σ': 'sigma', 'μ': 'µ', '×': 'x',
};

/** Text that Helvetica (WinAnsi) can print. */
export function pdfText(text: string): string {
  let out = '';
  for (const ch of text.normalize('NFC')) {
    if (SPELLED[ch] !== undefined) out += SPELLED[ch];
    else if (ch.charCodeAt(0) < 256 || '–—‘’“”…•€‰'.includes(ch)) out += ch;
    else if (/\p{M}/u.test(ch)) continue;
    else out += '?';
  }
  return out;
}

export const COLOURS = { ink: '#1d2430', muted: '#5b6472', rule: '#c9ced6', accent: '#1f5f8b', fill: '#7fb3d5', warn: '#9a3b00' };

/** A document that writes uncompressed (its text can be found in the file) with the Qwell metadata. */
export function newPdf(opts: { title: string; subject: string; author: string; landscape?: boolean; created: Date }): Pdf {
  return new PDFDocument({
    size: 'A4',
    layout: opts.landscape ? 'landscape' : 'portrait',
    margins: { top: 48, bottom: 56, left: 48, right: 48 },
    compress: false,
    bufferPages: true,
    info: { Title: opts.title, Subject: opts.subject, Author: opts.author, Creator: 'Qwell', CreationDate: opts.created },
    font: 'Helvetica',
  });
}

/** Writes "page i of n" and a footer line on every buffered page. */
export function stampPages(doc: Pdf, footer: string): number {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0; // writing inside the margin must not start a new page
    const y = doc.page.height - 36;
    const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
    doc.font('Helvetica').fontSize(7.5).fillColor(COLOURS.muted);
    doc.text(pdfText(footer), doc.page.margins.left, y, { width: width - 90, lineBreak: false });
    doc.text(`Page ${i + 1} of ${range.count}`, doc.page.margins.left + width - 90, y, { width: 90, align: 'right', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
  return range.count;
}

/** Ends the document into a file and waits until it is on disk. */
export async function pdfToFile(doc: Pdf, path: string): Promise<void> {
  const out = createWriteStream(path);
  doc.pipe(out);
  doc.end();
  await once(out, 'close');
}

/** Starts a new page when fewer than `needed` points are left above the bottom margin. */
export function ensureSpace(doc: Pdf, needed: number): void {
  if (doc.y + needed > doc.page.height - doc.page.margins.bottom) doc.addPage();
}

export function sectionTitle(doc: Pdf, title: string): void {
  ensureSpace(doc, 60);
  doc.moveDown(0.6);
  doc.font('Helvetica-Bold').fontSize(12).fillColor(COLOURS.accent).text(pdfText(title), doc.page.margins.left);
  const y = doc.y + 2;
  doc.moveTo(doc.page.margins.left, y).lineTo(doc.page.width - doc.page.margins.right, y).lineWidth(0.5).strokeColor(COLOURS.rule).stroke();
  doc.y = y + 6;
  doc.font('Helvetica').fontSize(9).fillColor(COLOURS.ink);
}

/** Label: value lines in two columns of text. */
export function keyValues(doc: Pdf, pairs: [string, string][], labelWidth = 120): void {
  const x = doc.page.margins.left;
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  for (const [label, value] of pairs) {
    const h = Math.max(doc.font('Helvetica').fontSize(9).heightOfString(pdfText(value), { width: width - labelWidth }), 11);
    ensureSpace(doc, h + 2);
    const y = doc.y;
    doc.font('Helvetica-Bold').fontSize(9).fillColor(COLOURS.muted).text(pdfText(label), x, y, { width: labelWidth - 8 });
    doc.font('Helvetica').fontSize(9).fillColor(COLOURS.ink).text(pdfText(value), x + labelWidth, y, { width: width - labelWidth });
    doc.y = Math.max(doc.y, y + h) + 2;
  }
}

export interface Column {
  title: string;
  width: number;
  align?: 'left' | 'right';
  font?: string;
}

/** A table that repeats its column titles on every page it runs onto. */
export function table(doc: Pdf, columns: Column[], rows: string[][], size = 8): void {
  const x0 = doc.page.margins.left;
  const drawHead = () => {
    const y = doc.y;
    let x = x0;
    doc.font('Helvetica-Bold').fontSize(size).fillColor(COLOURS.muted);
    for (const c of columns) {
      doc.text(pdfText(c.title), x, y, { width: c.width - 4, align: c.align ?? 'left' });
      x += c.width;
    }
    const bottom = Math.max(doc.y, y + size + 2) + 2;
    doc.moveTo(x0, bottom).lineTo(x, bottom).lineWidth(0.5).strokeColor(COLOURS.rule).stroke();
    doc.y = bottom + 3;
  };
  ensureSpace(doc, 3 * (size + 4));
  drawHead();
  for (const row of rows) {
    const heights = columns.map((c, i) => doc.font(c.font ?? 'Helvetica').fontSize(size).heightOfString(pdfText(row[i] ?? ''), { width: c.width - 4 }));
    const h = Math.max(...heights, size + 1);
    if (doc.y + h > doc.page.height - doc.page.margins.bottom) {
      doc.addPage();
      drawHead();
    }
    const y = doc.y;
    let x = x0;
    columns.forEach((c, i) => {
      doc.font(c.font ?? 'Helvetica').fontSize(size).fillColor(COLOURS.ink).text(pdfText(row[i] ?? ''), x, y, { width: c.width - 4, align: c.align ?? 'left' });
      x += c.width;
    });
    doc.y = y + h + 3;
  }
  doc.x = x0;
}
