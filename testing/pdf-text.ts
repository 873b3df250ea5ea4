/**
 * Text of an uncompressed pdfkit PDF (for tests): pdfkit writes text as hex strings in TJ arrays; the
 * pieces of one array are one run of text. Runs are joined by newlines.
 */
export function pdfTextRuns(pdf: Buffer): string {
  const raw = pdf.toString('latin1');
  const runs: string[] = [];
  for (const m of raw.matchAll(/\[((?:<[0-9a-fA-F]*>\s*-?[\d.]*\s*)+)\]\s*TJ/g)) {
    runs.push([...m[1].matchAll(/<([0-9a-fA-F]*)>/g)].map((h) => Buffer.from(h[1], 'hex').toString('latin1')).join(''));
  }
  return runs.join('\n');
}

/** Number of pages (page objects, not the page tree). */
export function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type \/Page\b(?!s)/g) ?? []).length;
}
