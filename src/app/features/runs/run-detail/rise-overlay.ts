import type { Chart, Plugin } from 'chart.js';

import { formatWithUncertainty } from '../../../shared/value-with-uncertainty/value-with-uncertainty-pipe';
import type { DriftLine, TemperatureRise } from '../calorimetry.models';

type Point = { x: number; y: number };

/** What the temperature chart draws for a calorimetric run: the three periods, the fitted drifts and the corrected rise. */
export interface RiseOverlay {
  bands: Array<{ from: number; to: number; label: string; main: boolean }>;
  /** Fore-drift line from the first reading to Dickinson's time b, after-drift line from b to the last reading. */
  foreLine: Point[];
  afterLine: Point[];
  /** Vertical segment at b between the two extrapolated drift lines: its length is the corrected rise (Dickinson's construction). */
  riseSegment: Point[];
  /** Two lines, `corrected rise` and `1.2345 ± 0.0012 K` (u standard): the value the run uses. */
  label: [string, string];
}

const onLine = (d: DriftLine, x: number): Point => ({ x, y: d.meanTemperature + d.rate * (x - d.meanTime) });

/** The overlay of a corrected rise on a time axis from t[0] to t[N − 1] (seconds). */
export function riseOverlay(time: readonly number[], rise: TemperatureRise): RiseOverlay {
  const t0 = time[0];
  const tN = time[time.length - 1];
  const p = rise.periods;
  const b = p.dickinsonTime;
  return {
    bands: [
      { from: t0, to: p.mainStart, label: 'fore-period', main: false },
      { from: p.mainStart, to: p.mainEnd, label: 'main period', main: true },
      { from: p.mainEnd, to: tN, label: 'after-period', main: false },
    ],
    foreLine: [onLine(rise.drift.fore, t0), onLine(rise.drift.fore, b)],
    afterLine: [onLine(rise.drift.after, b), onLine(rise.drift.after, tN)],
    riseSegment: [onLine(rise.drift.fore, b), onLine(rise.drift.after, b)],
    label: ['corrected rise', formatWithUncertainty(rise.corrected.value, rise.corrected.u, 'K', null)],
  };
}

export interface OverlayColors {
  outer: string;
  main: string;
  text: string;
  halo: string;
}

/** Shades the periods behind the datasets and writes the corrected rise beside its segment (chart.js has no annotations without a plugin). */
export function riseOverlayPlugin(overlay: () => RiseOverlay | null, colors: OverlayColors): Plugin<'line'> {
  const font = '13px "Source Sans 3", system-ui, sans-serif';
  return {
    id: 'qwRiseOverlay',
    beforeDatasetsDraw(chart: Chart<'line'>) {
      const o = overlay();
      if (!o) return;
      const { ctx, chartArea: a } = chart;
      const x = chart.scales['x'];
      ctx.save();
      ctx.font = font;
      ctx.textAlign = 'center';
      ctx.textBaseline = 'top';
      ctx.lineWidth = 3;
      ctx.strokeStyle = colors.halo;
      for (const band of o.bands) {
        const x0 = Math.max(a.left, x.getPixelForValue(band.from));
        const x1 = Math.min(a.right, x.getPixelForValue(band.to));
        if (!(x1 > x0)) continue;
        ctx.fillStyle = band.main ? colors.main : colors.outer;
        ctx.fillRect(x0, a.top, x1 - x0, a.bottom - a.top);
        if (x1 - x0 > ctx.measureText(band.label).width + 6) {
          ctx.strokeText(band.label, (x0 + x1) / 2, a.top + 4);
          ctx.fillStyle = colors.text;
          ctx.fillText(band.label, (x0 + x1) / 2, a.top + 4);
        }
      }
      ctx.restore();
    },
    afterDatasetsDraw(chart: Chart<'line'>) {
      const o = overlay();
      if (!o) return;
      const { ctx, chartArea: a } = chart;
      const x = chart.scales['x'];
      const y = chart.scales['y'];
      const px = x.getPixelForValue(o.riseSegment[0].x);
      const py = (y.getPixelForValue(o.riseSegment[0].y) + y.getPixelForValue(o.riseSegment[1].y)) / 2;
      ctx.save();
      ctx.font = font;
      ctx.textBaseline = 'middle';
      const width = Math.max(...o.label.map((line) => ctx.measureText(line).width));
      // Right of the segment when it fits, else left of it, else centred on it within the plot (a narrow screen).
      let tx: number;
      if (px + 8 + width <= a.right) { ctx.textAlign = 'left'; tx = px + 8; }
      else if (px - 8 - width >= a.left) { ctx.textAlign = 'right'; tx = px - 8; }
      else { ctx.textAlign = 'center'; tx = Math.min(Math.max(px, a.left + width / 2), a.right - width / 2); }
      ctx.lineWidth = 4;
      ctx.strokeStyle = colors.halo;
      ctx.fillStyle = colors.text;
      o.label.forEach((line, i) => {
        const ty = py + (i - 0.5) * 16;
        ctx.strokeText(line, tx, ty);
        ctx.fillText(line, tx, ty);
      });
      ctx.restore();
    },
  };
}
