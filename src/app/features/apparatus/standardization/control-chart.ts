import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartDataset, ChartOptions } from 'chart.js';

import { chartColors, lineChartOptions, linearAxis } from '../../../shared/charts/chart-theme';
import { ChartPoint as Point, LineChart } from '../../../shared/charts/line-chart';
import type { ChartSegment, SeriesRun } from './standardization.models';

/**
 * Individuals control chart of the energy equivalent: one point per run, centre line and 3σ limits per segment.
 * A recorded change to the apparatus starts a new segment; earlier segments stay, greyed, with their own limits.
 */
@Component({
  selector: 'qw-control-chart',
  imports: [LineChart],
  template: `<qw-line-chart [data]="data()" [options]="options()" [summary]="summary()" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ControlChart {
  readonly series = input.required<SeriesRun[]>();
  readonly segments = input.required<ChartSegment[]>();

  private readonly colors = chartColors({
    points: ['--mat-sys-primary', 'rgb(14, 92, 99)'],
    previous: ['--mat-sys-outline', 'rgb(120, 120, 120)'],
    out: ['--mat-sys-error', 'rgb(186, 26, 26)'],
    limits: ['--mat-sys-tertiary', 'rgb(181, 101, 58)'],
  });

  /** First and last x (1-based run position) of each segment. */
  private readonly spans = computed(() => this.segments().map((seg) => {
    const xs = this.series().flatMap((r, i) => (r.segment === seg.index ? [i + 1] : []));
    return { seg, from: xs.length ? xs[0] - 0.5 : this.series().length + 0.5, to: xs.length ? xs[xs.length - 1] + 0.5 : this.series().length + 0.5 };
  }));

  protected readonly summary = computed(() => {
    const current = this.segments().find((s) => s.current);
    const c = current?.chart;
    const out = this.series().filter((s) => s.outOfControl).map((s) => s.code);
    const change = current?.change ? ` The chart restarted after the change of ${current.change.date} (${current.change.description}); ${this.series().filter((s) => !s.current).length} earlier runs are shown as a previous segment.` : '';
    const limits = c ? `centre ${c.centre.toFixed(1)} J/K, limits ${c.lower.toFixed(1)} to ${c.upper.toFixed(1)} J/K` : 'too few runs since the change for limits';
    return `Control chart of the energy equivalent of ${this.series().length} runs: ${limits}; ${out.length ? `out of control: ${out.join(', ')}` : 'no run out of control'}.${change}`;
  });

  protected readonly data = computed((): ChartData<'line', Point[]> => {
    const s = this.series();
    const color = (r: SeriesRun) => (r.outOfControl ? this.colors.out : r.current ? this.colors.points : this.colors.previous);
    const datasets: ChartDataset<'line', Point[]>[] = [
      {
        label: 'ε per run (J/K)', data: s.map((r, i) => ({ x: i + 1, y: r.energyEquivalent.value })), borderColor: this.colors.points, borderWidth: 1,
        segment: { borderColor: (ctx) => (s[ctx.p1DataIndex]?.segment !== s[ctx.p0DataIndex]?.segment ? 'transparent' : s[ctx.p1DataIndex]?.current ? this.colors.points : this.colors.previous) },
        pointBackgroundColor: s.map(color), pointBorderColor: s.map(color),
        pointRadius: s.map((r) => (r.outOfControl ? 6 : 4)), pointStyle: s.map((r) => (r.outOfControl ? 'crossRot' : 'circle')),
      },
    ];
    const values = s.map((r) => r.energyEquivalent.value);
    for (const { seg, from, to } of this.spans()) {
      const c = seg.chart;
      if (c) {
        values.push(c.lower, c.upper);
        const line = (y: number): Point[] => [{ x: from, y }, { x: to, y }];
        const limitColor = seg.current ? this.colors.limits : this.colors.previous;
        datasets.push(
          { label: seg.current ? 'centre line' : 'earlier segment: centre', data: line(c.centre), borderColor: seg.current ? this.colors.text : this.colors.previous, borderWidth: 1, pointRadius: 0 },
          { label: seg.current ? 'control limits (±3σ)' : 'earlier segment: limits', data: line(c.upper), borderColor: limitColor, borderDash: [6, 3], borderWidth: seg.current ? 2 : 1, pointRadius: 0 },
          { label: 'lower limit', data: line(c.lower), borderColor: limitColor, borderDash: [6, 3], borderWidth: seg.current ? 2 : 1, pointRadius: 0 },
        );
      }
    }
    const lo = Math.min(...values), hi = Math.max(...values);
    for (const { seg, from } of this.spans()) {
      if (seg.change) {
        datasets.push({ label: 'apparatus change', data: [{ x: from, y: lo }, { x: from, y: hi }], borderColor: this.colors.text, borderDash: [2, 2], borderWidth: 2, pointRadius: 0 });
      }
    }
    return { datasets };
  });

  protected readonly options = computed(
    (): ChartOptions<'line'> =>
      lineChartOptions(this.colors, {
        scales: {
          x: linearAxis('run, in date order', this.colors, {
            min: 0.5,
            max: Math.max(1, this.series().length) + 0.5,
            // One tick per run at its position (the axis starts at 0.5, so stepped ticks would fall between runs).
            afterBuildTicks: (axis) => {
              axis.ticks = this.series().map((_, i) => ({ value: i + 1 }));
            },
            ticks: { callback: (v) => this.series()[Number(v) - 1]?.code ?? '' },
          }),
          y: linearAxis('energy equivalent ε / (J/K)', this.colors),
        },
        plugins: {
          // One legend entry per kind of line (the lower limit and repeated segments share their upper line's entry).
          legend: { labels: { filter: (item, data) => item.text !== 'lower limit' && data.datasets.findIndex((d) => d.label === item.text) === item.datasetIndex } },
          tooltip: { callbacks: { label: (ctx) => (ctx.datasetIndex === 0 ? `${this.series()[ctx.dataIndex]?.code}: ${ctx.parsed.y?.toFixed(1)} J/K` : `${ctx.dataset.label}: ${ctx.parsed.y?.toFixed(1)} J/K`) } },
        },
      }),
  );
}
