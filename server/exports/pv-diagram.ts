import { COLOURS, type Pdf } from './pdf-layout';

/** Readings drawn at most; longer runs are thinned evenly (the first and last points always stay). */
export const MAX_PLOT_POINTS = 1500;

/** Evenly thinned indices 0 … n−1, at most `max` of them, always with both ends. */
export function thin(n: number, max = MAX_PLOT_POINTS): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const step = (n - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => Math.round(i * step));
}

/** "Nice" tick values (1, 2, 5 × 10ⁿ) covering [lo, hi]. */
export function niceTicks(lo: number, hi: number, target = 6): { min: number; max: number; step: number; ticks: number[] } {
  if (!(hi > lo)) {
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 0.05 : 1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / target;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw)!;
  const min = Math.floor(lo / step) * step;
  const max = Math.ceil(hi / step) * step;
  const ticks: number[] = [];
  for (let v = min; v <= max + step * 1e-9; v += step) ticks.push(Number(v.toPrecision(12)));
  return { min, max, step, ticks };
}

function tickLabel(v: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return v.toFixed(Math.min(decimals + (step / 10 ** Math.floor(Math.log10(step)) === 2.5 ? 1 : 0), 6));
}

export interface PvSeries {
  /** Pa, absolute. */
  P: ArrayLike<number>;
  /** m³. */
  V: ArrayLike<number>;
}

/**
 * The measured P–V path as vector paths: axes in L and kPa with ticks, the shaded area under the
 * path down to P = 0 (the work ∫P dV; its sign follows the direction of travel), arrows showing the
 * direction, and the start (1) and end (2) states.
 */
export function drawPvDiagram(doc: Pdf, s: PvSeries, box: { x: number; y: number; width: number; height: number }): void {
  const idx = thin(s.P.length);
  const Vl = idx.map((i) => s.V[i] * 1000);
  const Pk = idx.map((i) => s.P[i] / 1000);
  const vt = niceTicks(Math.min(...Vl), Math.max(...Vl));
  const pt = niceTicks(0, Math.max(...Pk) * 1.05);
  const left = box.x + 46;
  const bottom = box.y + box.height - 30;
  const w = box.width - 56;
  const h = box.height - 40;
  const X = (v: number) => left + ((v - vt.min) / (vt.max - vt.min)) * w;
  const Y = (p: number) => bottom - ((p - pt.min) / (pt.max - pt.min)) * h;

  doc.save();
  // Grid and ticks.
  doc.lineWidth(0.3).strokeColor(COLOURS.rule);
  for (const v of vt.ticks) doc.moveTo(X(v), bottom).lineTo(X(v), bottom - h).stroke();
  for (const p of pt.ticks) doc.moveTo(left, Y(p)).lineTo(left + w, Y(p)).stroke();
  doc.font('Helvetica').fontSize(7).fillColor(COLOURS.muted);
  for (const v of vt.ticks) doc.text(tickLabel(v, vt.step), X(v) - 20, bottom + 4, { width: 40, align: 'center', lineBreak: false });
  for (const p of pt.ticks) doc.text(tickLabel(p, pt.step), left - 44, Y(p) - 3, { width: 40, align: 'right', lineBreak: false });
  doc.fontSize(8).fillColor(COLOURS.ink);
  doc.text('volume V / L', left, bottom + 16, { width: w, align: 'center', lineBreak: false });
  doc.save().rotate(-90, { origin: [box.x + 6, bottom - h / 2] });
  doc.text('pressure P / kPa', box.x + 6 - 50, bottom - h / 2 - 4, { width: 100, align: 'center', lineBreak: false });
  doc.restore();
  // Axes.
  doc.lineWidth(0.8).strokeColor(COLOURS.ink).moveTo(left, bottom - h).lineTo(left, bottom).lineTo(left + w, bottom).stroke();

  // Shaded work area under the path (to P = 0).
  doc.moveTo(X(Vl[0]), Y(0));
  for (let i = 0; i < Vl.length; i++) doc.lineTo(X(Vl[i]), Y(Pk[i]));
  doc.lineTo(X(Vl[Vl.length - 1]), Y(0)).closePath().fillOpacity(0.25).fill(COLOURS.fill);
  doc.fillOpacity(1);

  // The measured path.
  doc.moveTo(X(Vl[0]), Y(Pk[0]));
  for (let i = 1; i < Vl.length; i++) doc.lineTo(X(Vl[i]), Y(Pk[i]));
  doc.lineWidth(1.4).strokeColor(COLOURS.accent).lineJoin('round').stroke();

  // Direction arrows at a quarter, half and three quarters of the drawn path length.
  const pts = Vl.map((v, i) => [X(v), Y(Pk[i])] as const);
  const seg = pts.slice(1).map((p, i) => Math.hypot(p[0] - pts[i][0], p[1] - pts[i][1]));
  const total = seg.reduce((a, b) => a + b, 0);
  if (total > 40) {
    for (const f of total > 150 ? [0.25, 0.5, 0.75] : [0.5]) {
      let acc = 0;
      let i = 0;
      while (i < seg.length - 1 && acc + seg[i] < f * total) acc += seg[i++];
      if (seg[i] === 0) continue;
      const t = (f * total - acc) / seg[i];
      const [x0, y0] = pts[i];
      const [x1, y1] = pts[i + 1];
      const cx = x0 + t * (x1 - x0);
      const cy = y0 + t * (y1 - y0);
      const a = Math.atan2(y1 - y0, x1 - x0);
      const L = 7;
      doc.moveTo(cx + L * Math.cos(a), cy + L * Math.sin(a))
        .lineTo(cx + L * Math.cos(a + 2.6), cy + L * Math.sin(a + 2.6))
        .lineTo(cx + L * Math.cos(a - 2.6), cy + L * Math.sin(a - 2.6))
        .closePath().fill(COLOURS.accent);
    }
  }
  // Start and end states.
  for (const [i, label] of [[0, '1'], [pts.length - 1, '2']] as const) {
    doc.circle(pts[i][0], pts[i][1], 2.6).fill(COLOURS.ink);
    doc.font('Helvetica-Bold').fontSize(8).fillColor(COLOURS.ink).text(label, pts[i][0] + 4, pts[i][1] - 11, { lineBreak: false });
  }
  doc.restore();
}
