import { REVIEW_DECISION_LABELS, RUN_STATE_LABELS } from '../../contract/runs';
import type { SessionPerson } from '../core/session';
import { drawPvDiagram } from './pv-diagram';
import { COLOURS, ensureSpace, keyValues, newPdf, pdfText, pdfToFile, sectionTitle, stampPages, table, type Pdf } from './pdf-layout';
import { auditActionLabel } from '../../contract/audit';
import { correctionSentence } from '../../contract/corrections';
import { storedWhy } from '../balance/balance-response';
import { formatMeasurement, percent, sig, verdictWords } from './report-format';
import type { RunReportData } from './run-report-data';

export const SAFETY_CAUTION =
  'Caution: pressurised vessels, electrical heaters and hot surfaces can injure. Stay within the vessel\'s rated pressure, guard heaters ' +
  'and hot surfaces, and follow your local codes and your lab\'s own safety review, which take precedence over anything in this report.';

/** One line of text in which every Δ is drawn as a vector triangle (Helvetica has no Greek). */
function textWithDelta(doc: Pdf, text: string, x: number, y: number, size: number, font = 'Helvetica'): void {
  doc.font(font).fontSize(size);
  let cx = x;
  text.split('Δ').forEach((part, i) => {
    if (i > 0) {
      const w = size * 0.6;
      const base = y + size * 0.72;
      doc.moveTo(cx + 0.3, base).lineTo(cx + w / 2 + 0.3, base - size * 0.7).lineTo(cx + w + 0.3, base).closePath()
        .lineWidth(size * 0.075).strokeColor(COLOURS.ink).stroke();
      cx += w + size * 0.08;
    }
    if (part) {
      const t = pdfText(part);
      doc.fillColor(COLOURS.ink).text(t, cx, y, { lineBreak: false });
      cx += doc.widthOfString(t);
    }
  });
}

function titleBlock(doc: Pdf, d: RunReportData, by: SessionPerson, at: Date): void {
  const r = d.run;
  doc.font('Helvetica').fontSize(9).fillColor(COLOURS.muted).text(pdfText(`${d.lab} · Qwell run report`));
  doc.font('Helvetica-Bold').fontSize(18).fillColor(COLOURS.ink).text(pdfText(`${r.code} revision ${r.revision}`));
  doc.font('Helvetica').fontSize(13).text(pdfText(r.title));
  doc.moveDown(0.5);
  keyValues(doc, [
    ['Process (claimed)', r.process],
    ['Gas', d.gas],
    ['Run date', r.runDate],
    ['Author', d.authorName],
    ['Project', d.project],
    ['State', `${STATE_WORDS[r.state] ?? r.state} (version ${r.version})${r.revisionReason ? `; revision reason: ${r.revisionReason}` : ''}${r.returnReason ? `; returned: ${r.returnReason}` : ''}`],
    ['Apparatus', d.apparatus],
    ['Lab', d.lab],
    ['Report generated', `${at.toISOString()} by ${by.name} <${by.email}>`],
  ]);
}

function caution(doc: Pdf, d: RunReportData): void {
  let text = SAFETY_CAUTION;
  if (d.ratedPressure !== null) {
    const peak = d.pv ? Math.max(...Array.from(d.pv.P)) : null;
    text += ` Rated pressure of ${d.apparatus}: ${sig(d.ratedPressure / 1000, 4)} kPa ${d.ratedPressureReference}` + (peak !== null ? `; highest pressure in this run: ${sig(peak / 1000, 4)} kPa absolute.` : '.');
  }
  const x = doc.page.margins.left;
  const width = doc.page.width - x - doc.page.margins.right;
  doc.font('Helvetica').fontSize(8);
  const h = doc.heightOfString(pdfText(text), { width: width - 16 }) + 10;
  ensureSpace(doc, h + 6);
  const y = doc.y + 4;
  doc.rect(x, y, width, h).lineWidth(0.8).fillAndStroke('#fff6ee', COLOURS.warn);
  doc.fillColor(COLOURS.warn).text(pdfText(text), x + 8, y + 5, { width: width - 16 });
  doc.y = y + h + 4;
  doc.fillColor(COLOURS.ink);
}

function diagram(doc: Pdf, d: RunReportData): void {
  if (d.pv) ensureSpace(doc, 320);
  sectionTitle(doc, 'Pressure–volume diagram');
  if (!d.pv) {
    doc.font('Helvetica-Oblique').fontSize(9).fillColor(COLOURS.muted).text(pdfText(d.pvNote ?? 'No diagram.'));
    return;
  }
  ensureSpace(doc, 280);
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const top = doc.y;
  drawPvDiagram(doc, d.pv, { x: doc.page.margins.left, y: top, width, height: 260 });
  doc.y = top + 264;
  doc.font('Helvetica').fontSize(7.5).fillColor(COLOURS.muted)
    .text('Measured path in reading order from state 1 to state 2 (arrows show the direction of travel); the shaded area under it is the work integral of P dV.', doc.page.margins.left);
}

function balance(doc: Pdf, d: RunReportData): void {
  ensureSpace(doc, 140);
  sectionTitle(doc, 'Energy balance');
  if (!d.result) {
    doc.font('Helvetica-Oblique').fontSize(9).fillColor(COLOURS.muted).text(`Run ${d.run.code} has no balance result yet: it is checked when it is submitted.`);
    return;
  }
  const b = d.result.value;
  const k = b.residual.k;
  const rows: [string, string][] = [
    ['Work done by the gas W', formatMeasurement(b.work.measured, b.work.U, 'J')],
    ['Heat in Q', formatMeasurement(b.heat.total, b.heat.U, 'J')],
    ['Internal energy change ΔU', formatMeasurement(b.internalEnergy.value, b.internalEnergy.U, 'J')],
    ['Residual r = ΔU - (Q - W)', formatMeasurement(b.residual.r, b.residual.U, 'J')],
    ['En = |r| / U(r)', b.En === null ? 'not defined' : b.En.toFixed(2)],
  ];
  const x = doc.page.margins.left;
  ensureSpace(doc, rows.length * 15 + 60);
  doc.font('Helvetica').fontSize(8).fillColor(COLOURS.muted).text(`Values as x ± U, expanded uncertainty U with coverage factor k = ${k}; U to two significant digits (GUM 7.2.6).`, x);
  doc.moveDown(0.3);
  for (const [label, value] of rows) {
    const y = doc.y;
    textWithDelta(doc, label, x, y, 10);
    doc.font('Helvetica-Bold').fontSize(10).fillColor(COLOURS.ink).text(pdfText(value), x + 200, y, { lineBreak: false });
    doc.y = y + 15;
    doc.x = x;
  }
  doc.moveDown(0.3);
  doc.font('Helvetica-Bold').fontSize(10).fillColor(b.verdict === 'closes' ? COLOURS.accent : COLOURS.warn).text(pdfText(verdictWords[b.verdict] ?? b.verdict), x);
  const why = storedWhy(b);
  if (why) doc.font('Helvetica').fontSize(10).fillColor(COLOURS.ink).text(pdfText(`Why: ${why}`), x);
  doc.moveDown(0.3);
  const notes: [string, string][] = [
    ['Heat', `electrical ${sig(b.heat.electrical, 5)} J, heat leak ${sig(b.heat.leak, 4)} J, wall uptake ${sig(b.heat.wall, 4)} J`],
    ['Model work', b.work.model === null ? b.work.modelFormula : `${sig(b.work.model, 5)} J (${b.work.modelFormula}); measured minus model ${sig(b.work.gap, 3)} J`],
    ['Internal energy', b.internalEnergy.method],
    // Results stored before engine 2.3 have no list: their readings were read as entered.
    ...(b.corrections ?? []).map((c): [string, string] => ['Readings corrected', `${correctionSentence(c)} The check read each reading as reading × gain + offset (GUM 3.2.3); the readings stored are as entered.`]),
    ['Monte Carlo', b.monteCarlo ? b.monteCarlo.note : 'not run'],
    ['Result', `engine ${b.engineVersion}, computed ${d.result.computedAt.toISOString()} for run version ${d.result.runVersion}; input SHA-256 ${b.inputHash}`],
  ];
  if (d.result.stale) notes.unshift(['Stale', 'The run changed after this result was computed; it does not describe the current readings.']);
  keyValues(doc, notes, 90);
}

function budget(doc: Pdf, d: RunReportData): void {
  sectionTitle(doc, 'Uncertainty budget of the residual r');
  const entries = d.result ? [...d.result.value.budget].sort((a, b) => b.share - a.share) : [];
  if (entries.length === 0) {
    doc.font('Helvetica-Oblique').fontSize(9).fillColor(COLOURS.muted).text('No budget: the run has no balance result.');
    return;
  }
  if ((d.result?.value.corrections ?? []).length > 0) {
    doc.font('Helvetica').fontSize(8).fillColor(COLOURS.muted)
      .text(pdfText('The readings were corrected by their certificates before the check (see Readings corrected above); each certificate\'s U is the calibration row of its instrument.'), doc.page.margins.left);
    doc.moveDown(0.3);
  }
  table(doc, [
    { title: 'source', width: 150 }, { title: 'kind', width: 52 }, { title: 'distribution', width: 55 },
    { title: 'u (standard)', width: 66, align: 'right' }, { title: 'sensitivity c', width: 68, align: 'right' },
    { title: '|c|·u / J', width: 50, align: 'right' }, { title: 'share of u²(r)', width: 58, align: 'right' },
  ], entries.map((e) => ({ ...e, unit: e.unit.replace(/m3\b/g, 'm³').replace(/m2\b/g, 'm²') })).map((e) => [
    e.source, e.kind, e.distribution, ...(e.unit === '1' || e.unit === ''
      ? [`${sig(e.u)} (relative)`, `${sig(e.sensitivity)} J`]
      : [`${sig(e.u)} ${e.unit}`, `${sig(e.sensitivity)} J/${e.unit}`]), sig(Math.sqrt(e.contribution)), percent(e.share),
  ]));
}

function flags(doc: Pdf, d: RunReportData): void {
  sectionTitle(doc, 'Data-quality flags and hints');
  const list = d.result?.value.flags ?? [];
  const hints = d.result?.value.hints ?? [];
  if (list.length === 0) doc.font('Helvetica').fontSize(9).fillColor(COLOURS.ink).text(d.result ? 'No data-quality flags.' : 'No result, so no flags yet.');
  else table(doc, [{ title: 'flag', width: 110 }, { title: 'reading', width: 45 }, { title: 'what and why', width: 344 }], list.map((f) => [f.code, f.reading === null ? 'run' : String(f.reading), f.message]));
  if (hints.length > 0) {
    doc.moveDown(0.4);
    table(doc, [{ title: 'hint', width: 110 }, { title: 'what to look at', width: 389 }], hints.map((h) => [h.code, h.message]));
  }
}

// The report spells out what a returned run waits for.
const STATE_WORDS: Record<string, string> = { ...RUN_STATE_LABELS, returned: REVIEW_DECISION_LABELS.return };
const SIGNED_WORDS: Readonly<Record<string, string>> = REVIEW_DECISION_LABELS;

function signed(doc: Pdf, d: RunReportData): void {
  sectionTitle(doc, 'Signatures');
  if (d.signatures.length === 0) {
    doc.font('Helvetica').fontSize(9).fillColor(COLOURS.ink).text('Not signed.');
    return;
  }
  table(doc, [{ title: 'signer', width: 90 }, { title: 'meaning', width: 150 }, { title: 'signed at (UTC)', width: 80 }, { title: 'SHA-256 of what was signed', width: 179, font: 'Courier' }],
    d.signatures.map((s) => [s.signerName, `${SIGNED_WORDS[s.action] ?? s.action}: ${s.meaning}${s.reason ? ` (${s.reason})` : ''}`, s.signedAt.toISOString().replace('T', ' ').slice(0, 19), s.signedHash]), 7.5);
}

function history(doc: Pdf, d: RunReportData): void {
  sectionTitle(doc, 'Audit excerpt: the history of this run and its revisions');
  table(doc, [{ title: 'event', width: 38 }, { title: 'when (UTC)', width: 80 }, { title: 'who', width: 110 }, { title: 'action', width: 95 }, { title: 'run id', width: 36 }, { title: 'reason', width: 140 }],
    d.history.map((e) => [String(e.id), e.occurredAt.toISOString().replace('T', ' ').slice(0, 19), e.actorName ?? e.actorEmail ?? 'Qwell (system)', auditActionLabel(e.action), e.entityId ?? '', e.reason ?? '']), 7.5);
}

/** The printable run report; returns its page count. */
export async function writeRunReportPdf(path: string, d: RunReportData, by: SessionPerson, at: Date): Promise<number> {
  const doc = newPdf({ title: `Run report ${d.run.code} revision ${d.run.revision}`, subject: d.run.title, author: by.name, created: at });
  titleBlock(doc, d, by, at);
  caution(doc, d);
  diagram(doc, d);
  balance(doc, d);
  budget(doc, d);
  flags(doc, d);
  signed(doc, d);
  history(doc, d);
  const pages = stampPages(doc, `Qwell run report ${d.run.code} revision ${d.run.revision} · generated ${at.toISOString()} by ${by.name}`);
  await pdfToFile(doc, path);
  return pages;
}
