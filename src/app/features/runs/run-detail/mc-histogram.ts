import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';

import { chartColors, lineChartOptions, linearAxis, withAlpha } from '../../../shared/charts/chart-theme';
import { ChartPoint as Point, LineChart } from '../../../shared/charts/line-chart';
import type { McHistogram } from '../run-detail.models';

/** Histogram of the Monte Carlo draws of r, with the 95 % interval and the linear estimate marked. */
@Component({
  selector: 'qw-mc-histogram',
  imports: [LineChart],
  template: `<qw-line-chart [data]="data()" [options]="options()" [summary]="summary()" />`,
  styles: `qw-line-chart { height: 12rem; }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class McHistogramChart {
  readonly histogram = input.required<McHistogram>();
  /** Ends of the coverage interval, J. */
  readonly low = input.required<number>();
  readonly high = input.required<number>();
  /** The linear estimate of r, J. */
  readonly r = input.required<number>();

  private readonly colors = chartColors({
    bars: ['--mat-sys-primary', 'rgb(14, 92, 99)'],
    interval: ['--mat-sys-tertiary', 'rgb(181, 101, 58)'],
  });

  protected readonly summary = computed(() => {
    const h = this.histogram();
    const draws = h.counts.reduce((a, b) => a + b, 0) + h.outside;
    return `Histogram of ${draws} Monte Carlo draws of r in J; 95 % interval from ${this.low().toPrecision(3)} to ${this.high().toPrecision(3)} J`;
  });

  protected readonly data = computed((): ChartData<'line', Point[]> => {
    const h = this.histogram();
    // A stepped outline: each bin's count held from its left edge to its right edge.
    const steps: Point[] = h.counts.flatMap((c, i) => [{ x: h.start + i * h.width, y: c }, { x: h.start + (i + 1) * h.width, y: c }]);
    const top = Math.max(...h.counts, 1);
    const vertical = (x: number): Point[] => [{ x, y: 0 }, { x, y: top }];
    return {
      datasets: [
        { label: 'Draws per bin', data: steps, borderColor: this.colors.bars, backgroundColor: withAlpha(this.colors.bars, 0.3), fill: 'origin', pointRadius: 0, borderWidth: 1 },
        { label: '95 % interval', data: vertical(this.low()), borderColor: this.colors.interval, borderDash: [6, 3], pointRadius: 0, borderWidth: 2 },
        { label: '95 % interval (upper)', data: vertical(this.high()), borderColor: this.colors.interval, borderDash: [6, 3], pointRadius: 0, borderWidth: 2 },
        { label: 'r (linear)', data: vertical(this.r()), borderColor: this.colors.text, pointRadius: 0, borderWidth: 1 },
      ],
    };
  });

  protected readonly options = computed(
    (): ChartOptions<'line'> =>
      lineChartOptions(this.colors, {
        scales: {
          x: linearAxis('r / J', this.colors),
          y: linearAxis('draws', this.colors, { beginAtZero: true }),
        },
        plugins: { legend: { labels: { filter: (item) => item.text !== '95 % interval (upper)' } } },
      }),
  );
}
